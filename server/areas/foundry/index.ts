// The foundry area's public face: its routes and its demo seeder (composition root only).
export { registerFoundryRoutes } from './routes';
export { seedDemoFoundry } from './demo-seed';
export { foundryRunSink } from './runs';
