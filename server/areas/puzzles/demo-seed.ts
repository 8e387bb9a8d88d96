import { and, asc, eq, gte, lte } from 'drizzle-orm';
import { user } from '../../platform/auth/schema';
import { puzzle } from './schema';
import { stock } from '../stock/index';
import type { PuzzlesDeps } from './ports';
import { solveAssembly } from '../../../shared/puzzle/index';
import { provePuzzle, type PuzzleJobInput } from './rules';
import { puzzleTitle, storeResult } from './puzzles';
import { levelText } from './stored';
import { demoAccounts } from '../accounts/index';

// Demo puzzles: from the smallest tilings of the demo stock, three Deduction puzzles (levels
// 2, 3 and the closure) and three Assembly puzzles (the last, when the stock has one, from a
// tiling whose bare set assembles in several ways, so it carries starter pieces), each proved by our engine at seed time
// on the main thread (small tilings, a few milliseconds each), stored with its certificate.

/** Per-puzzle time limit at seed time, so a slow case can never hold up start-up (our choice). */
const SEED_MS_PER_PUZZLE = 3000;

export function seedDemoPuzzles(deps: PuzzlesDeps): void {
  const db = deps.db;
  const editorEmail = demoAccounts.find((a) => a.role === 'editor')?.email;
  const editor = editorEmail ? db.select({ id: user.id }).from(user).where(eq(user.email, editorEmail)).get() : undefined;
  const rows = db
    .select({ id: stock.id })
    .from(stock)
    .where(and(gte(stock.order, 9), lte(stock.order, 16), eq(stock.perfect, true)))
    .orderBy(asc(stock.order), asc(stock.id))
    .all();
  const chosen = rows.slice(0, 6);
  // show starter pieces too: the last Assembly goes to a tiling whose bare set assembles in more than one way, if the stock has one
  const several = rows.slice(6).find((r) => {
    const { tiling } = deps.stock.tiling(db, r.id);
    return solveAssembly({ width: tiling.W, height: tiling.H, pieces: tiling.squares.map((q) => q.s) }, { budget: { maxNodes: 200_000 } }).verdict === 'multiple';
  });
  if (several && chosen.length === 6) chosen[5] = several;
  const plan: Pick<PuzzleJobInput, 'kind' | 'level'>[] = [
    { kind: 'deduction', level: 2 },
    { kind: 'assembly', level: null },
    { kind: 'deduction', level: 3 },
    { kind: 'assembly', level: null },
    { kind: 'deduction', level: 'closure' },
    { kind: 'assembly', level: null },
  ];
  let made = 0;
  chosen.forEach((s, i) => {
    const p = plan[i];
    if (!p) return;
    const { tiling } = deps.stock.tiling(db, s.id);
    const input: PuzzleJobInput = { kind: p.kind, tiling, level: p.level, showFrame: false, starters: null, givens: null, grade: null, seed: 7 + i };
    const until = Date.now() + SEED_MS_PER_PUZZLE;
    const summary = provePuzzle(input, 'make', 1, { shouldStop: () => Date.now() > until, now: () => deps.clock.now() });
    db.transaction((tx) => {
      const row = tx
        .insert(puzzle)
        .values({
          stockId: s.id, kind: p.kind, title: puzzleTitle(p.kind, tiling),
          status: 'proving', level: levelText(p.level), inputHash: '', createdBy: editor?.id ?? null,
        })
        .returning({ id: puzzle.id })
        .get();
      deps.stock.markUsed(tx, s.id);
      storeResult(tx, row.id, summary, deps.clock.now());
    });
    made++;
  });
  deps.log.info(`demo puzzles: ${made} made and proved from the demo stock`);
}
