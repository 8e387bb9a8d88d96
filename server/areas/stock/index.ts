// The stock area's public face: what other areas and the composition root may import.
// Other areas reach the stock's services only through the StockPort they are given
// (./ports.ts, wired in server/compose.ts); the tiling analysis is pure and imported directly.
export { registerStockRoutes } from './routes';
export { StockReader } from './stock-reader';
export { fillStockReducedKeys, stockPort } from './stock';
export { stock } from './schema';
export {
  analyseCode,
  analyseSquares,
  analyseTiling,
  canonicalFormOf,
  classificationOf,
  gcdOfKey,
  reducedFormOf,
  smithDrawingOf,
  toSmithDrawing,
  type AnalysisResult,
  type TilingAnalysis,
} from './tiling-analysis';
export { squaresToJson, storedTiling } from './stored-json';
