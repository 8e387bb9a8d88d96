// The puzzles area's public face: routes, the demo seeder, and what it offers other areas
// (print's PuzzleSource and the stock's StockUsage), wired in server/compose.ts.
export { registerPuzzleRoutes } from './routes';
export { seedDemoPuzzles } from './demo-seed';
export { createPuzzleSource, createStockUsage, puzzleProofSink } from './puzzles';
// read-only joins for the reader area (grade calibration): the table and the level column's reader
export { puzzle } from './schema';
export { levelOf } from './stored';
