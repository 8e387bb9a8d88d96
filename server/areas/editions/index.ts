// The editions area's public face: routes (editions, proofs, publications), demo seeders,
// and where puzzles are printed (EditionUsage, wired in server/compose.ts).
export { registerEditionRoutes } from './routes';
export { registerPublicationRoutes } from './publication-routes';
export { seedDemoEditions } from './demo-seed';
export { seedDemoPublications } from './publications';
export { editionUsage } from './editions';
