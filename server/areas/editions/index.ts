// The editions area's public face: routes (editions, proofs, publications), demo seeders,
// and where puzzles are printed (EditionUsage, wired in server/compose.ts).
export { registerEditionRoutes } from './routes';
export { registerEditionDueRoutes } from './due';
export { registerPublicationRoutes } from './publication-routes';
export { seedDemoEditions } from './demo-seed';
export { seedDemoPublications } from './publications';
export { editionUsage } from './editions';
// read-only joins for the reader area (public pages): the tables and the JSON columns' readers
export { edition, editionSlot } from './schema';
export { publication } from './publication-schema';
export { introductionOf, instructionsOf } from './stored-json';
