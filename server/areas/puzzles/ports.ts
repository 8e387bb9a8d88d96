import type { EditionState } from '../../../shared/contracts/editions';
import type { DbOrTx } from '../../platform/db/client';
import type { PlatformDeps } from '../../platform/deps';
import type { StockPort } from '../stock/ports';

// The puzzles area's ports: it needs the stock (the tiling a puzzle is made from) and the
// editions (where a puzzle is printed: shown in lists, and a puzzle in proof is locked).
// What it offers others is typed where they need it: PuzzleSource in ../editions/ports.ts
// (print's view of a puzzle) and StockUsage in ../stock/ports.ts (the stock's history);
// both are implemented in ./puzzles.ts. Everything is wired in server/compose.ts.

/** One use of a puzzle in an edition. */
export type PuzzleEditionUse = {
  puzzleId: number;
  editionId: string;
  publicationTitle: string;
  number: number;
  editionDate: string;
  state: EditionState;
};

/** Where puzzles are printed (implemented by the editions area). */
export interface EditionUsage {
  /** every slot holding one of these puzzles, oldest edition first */
  usesOf(db: DbOrTx, puzzleIds: number[]): PuzzleEditionUse[];
}

export type PuzzlesDeps = PlatformDeps & { stock: StockPort; editionUsage: EditionUsage };
