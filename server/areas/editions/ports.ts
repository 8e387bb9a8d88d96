import type { PublicationFeesInput } from '../../../shared/contracts/ledger';
import type { DbOrTx } from '../../platform/db/client';
import type { PlatformDeps } from '../../platform/deps';
import type { LayoutRect, SolvedTiling } from '../print/index';

// The editions area's ports: what it needs from other areas. The puzzles area implements
// PuzzleSource (print's view of a puzzle), the payouts area FeeRecorder (fees into the ledger
// when an edition is published). What editions offers others (EditionUsage, for the puzzles
// and the stock's history) is typed in ../puzzles/ports.ts and implemented in ./editions.ts.
// Everything is wired in server/compose.ts.

/** What print needs of one puzzle. */
export type PuzzleForPrint = {
  id: string;
  kind: 'assembly' | 'deduction';
  title: string;
  grade: number;
  /** the canonical key of the stock tiling it was made from (the reuse guard compares these) */
  tilingKey: string;
  /** who is paid when it is printed; null for tilings without a setter (foundry, demo) */
  setterId: string | null;
  /** the uniqueness certificate; `current` = made by the engine version in use for this puzzle as it is now */
  certificate: { current: boolean; summary: string } | null;
  assembly?: { frame: { W: number; H: number }; pieces: number[]; starters: { size: number; x: number; y: number }[] } | undefined;
  deduction?: { layout: { W: number; H: number; rects: LayoutRect[] }; givens: { rect: number; size: number }[] } | undefined;
  solution: { tiling: SolvedTiling; steps?: string[] | undefined };
};

/** The puzzle store as print reads it (implemented by the puzzles area). */
export interface PuzzleSource {
  getPuzzleForPrint(db: DbOrTx, puzzleId: string): PuzzleForPrint | null;
  /** ids of puzzles that could go into an edition (certificate current), newest first; used by the demo seeder */
  listPrintablePuzzleIds(db: DbOrTx): string[];
}

/** Fees into the ledger, inside the publishing transaction (implemented by the payouts area). */
export interface FeeRecorder {
  recordPublicationFees(tx: DbOrTx, input: PublicationFeesInput): void;
}

/** What the editions area's routes and services are given. */
export type EditionsDeps = PlatformDeps & { puzzles: PuzzleSource; fees: FeeRecorder };
