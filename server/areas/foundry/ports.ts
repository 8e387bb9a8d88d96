import type { PlatformDeps } from '../../platform/deps';
import type { StockPort } from '../stock/ports';

// The foundry's ports: it needs the stock (what is known; where found tilings go).
// Wired in server/compose.ts.

export type FoundryDeps = PlatformDeps & { stock: StockPort };
