import type { StockReader } from './stock-reader';
import type { Provenance, StockDetail, StockSummary } from '../../../shared/contracts/stock';
import type { Tiling } from '../../../shared/tiling/index';
import type { DbOrTx } from '../../platform/db/client';
import type { PlatformDeps } from '../../platform/deps';

// The stock's ports. What it offers (StockPort: the one way into the stock, and reading a
// stock tiling) is implemented in ./stock.ts; what it needs from other areas (where a tiling
// was used; who submitted it) is implemented by those areas. Everything is wired in
// server/compose.ts.

export interface AddToStockInput {
  tiling: Tiling;
  provenance: Provenance;
  setterId?: string | null;
  params?: Record<string, unknown> | null;
  acceptedAt?: Date | null;
  /** stored by a job (a foundry run's results), not by someone's action: lists may show it up to a second late */
  background?: boolean;
}

export interface AddToStockResult {
  id: number;
  /** false when the tiling (up to symmetry and scale) was already in the stock: nothing changed */
  created: boolean;
  canonicalKey: string;
  /** when it was a scaled copy of stock row `id`: the scale, e.g. "2x" */
  scale?: string;
}

export interface StockTiling {
  tiling: Tiling;
  canonicalKey: string;
  setterId: string | null;
}

/** What the stock offers the intake, the foundry and the puzzles. */
export interface StockPort {
  /** Put a verified tiling into the stock inside the caller's transaction; idempotent by canonical key. */
  add(tx: DbOrTx, input: AddToStockInput): AddToStockResult;
  /** Count one more (or fewer) puzzle derived from a stock tiling. */
  markUsed(tx: DbOrTx, stockId: number, delta?: number): void;
  /** A stock tiling in its stored (canonical) orientation; 404 when there is none. */
  tiling(db: DbOrTx, stockId: number): StockTiling;
  /** The id of the stock row with this canonical key, if any. */
  findByKey(db: DbOrTx, canonicalKey: string): number | null;
  /** The stock row of this tiling at any scale (same reduced key), if any. */
  findByReducedKey(db: DbOrTx, reducedKey: string): { id: number; canonicalKey: string } | null;
  /** Every canonical key in the stock (the foundry skips what is known). */
  allKeys(db: DbOrTx): string[];
  /** Perfect rectangles that are not squares, oldest first, at most `limit` (the foundry joins them). */
  perfectRectangles(db: DbOrTx, limit: number): { id: number; tiling: Tiling }[];
}

/** Where stock tilings were used (the puzzles area implements it, with the editions' help). */
export interface StockUsage {
  puzzlesFor(db: DbOrTx, stockId: number): StockDetail['history']['puzzles'];
  editionsFor(db: DbOrTx, stockId: number): StockDetail['history']['editions'];
  gradeCounts(db: DbOrTx): StockSummary['byGrade'];
}

/** Accepted submissions of a stock tiling, oldest first (the intake implements it). */
export interface SubmissionHistory {
  acceptedFor(db: DbOrTx, stockId: number): { submissionId: number; submittedAt: Date; acceptedAt: Date | null }[];
}

/** What the stock's routes and services are given. */
export type StockDeps = PlatformDeps & { stockUsage: StockUsage; submissionHistory: SubmissionHistory; stockReader?: StockReader | null };
