import type { EditionsDeps } from './areas/editions/ports';
import type { FoundryDeps } from './areas/foundry/ports';
import type { IntakeDeps } from './areas/intake/ports';
import type { IntegrationsDeps } from './areas/integrations/ports';
import type { MoneyDeps } from './areas/payouts/ports';
import type { PuzzlesDeps } from './areas/puzzles/ports';
import type { ReaderDeps } from './areas/reader/ports';
import type { StockDeps } from './areas/stock/ports';
import type { PlatformDeps } from './platform/deps';

/**
 * Everything the app is built from: the platform's machinery plus every area's ports,
 * one object that satisfies each area's own deps type. Built by buildDeps (./compose.ts).
 */
export type AppDeps = PlatformDeps & StockDeps & IntakeDeps & FoundryDeps & PuzzlesDeps & EditionsDeps & MoneyDeps & IntegrationsDeps & ReaderDeps;
