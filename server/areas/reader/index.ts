// The reader area's public face: its API routes and HTML pages, its demo seeder, and what it
// offers other areas: PublishedContent (THE release rule of published content, typed in
// ./ports.ts, wired in server/compose.ts) and the pure rule itself.
export { registerReaderRoutes } from './routes';
export { registerReaderPages } from './page-routes';
export { seedDemoSolves } from './demo-seed';
export { publishedContent } from './published';
// the play data of a printed puzzle (never its solution): the integrations' feed shows the same
export { playOf } from './public-view';
export { releaseMoment, releasesOf, type Release, type ReleaseEdition, type ReleaseSettings } from './release';
