// The foundry's public API: graph generation, exhaustive and random tilings, joining.
// Plane graphs (faces, dual, face split, wheel) and random c-nets are the tiling engine's
// (shared/tiling/index.ts); the foundry builds on them.
export { FoundryInputError } from './errors';
export { canonicalForm, canonicalGraphKey, edgeOrbits, graphFromCode } from './canonical-graph';
export type { CanonicalForm } from './canonical-graph';
export { countPlaneGraphs, faceSplits, graphFromKey, planeGraphsWithEdges, MAX_EDGES, MIN_EDGES } from './generate-graphs';
export type { GeneratedGraph, GenerateOptions } from './generate-graphs';
export type { FoundryRunControl, FoundTiling } from './found-tiling';
export { describeTiling } from './found-tiling';
export { exhaustiveTilings, passesGambini, MAX_EXHAUSTIVE_ORDER, MIN_ORDER } from './exhaustive';
export type { ExhaustiveOptions, ExhaustiveSummary } from './exhaustive';
export { randomTilings, MAX_RANDOM_ORDER, MIN_RANDOM_ORDER } from './random-tilings';
export type { RandomOptions, RandomSummary } from './random-tilings';
export { joinCornerToCorner, joinOverlapping, joinStock } from './joining';
export type { JoinOptions, JoinPart, JoinSummary } from './joining';

// seeded randomness is the tiling engine's (shared/tiling/prng.ts), re-exported for callers of this API
export { mulberry32 } from '../tiling/index';
