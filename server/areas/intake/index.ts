// The intake area's public face: routes, the demo seeder, and the stock's view of
// accepted submissions (SubmissionHistory, wired in server/compose.ts).
export { registerSubmissionRoutes } from './routes';
export { registerTilingRoutes } from './check-routes';
export { seedDemoStock } from './demo-seed';
export { fillSubmissionReducedKeys, submissionHistory } from './submissions';
export { uploadSink } from './uploads';
