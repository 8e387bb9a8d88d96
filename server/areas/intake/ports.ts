import type { PlatformDeps } from '../../platform/deps';
import type { StockPort } from '../stock/ports';

// The intake's ports: it needs the stock (to check for duplicates and to accept into it).
// What it offers others (the stock's SubmissionHistory) is implemented in ./submissions.ts.
// Wired in server/compose.ts.

export type IntakeDeps = PlatformDeps & { stock: StockPort };
