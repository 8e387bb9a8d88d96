// The puzzle commands of the command line (issue 4, item 6):
//   assemble --frame WxH --pieces a,b,c,... [--starters s@x,y;...] [--budget-ms N]
//     -> {"verdict","classes","complete","solutions":[Bouwkamp codes],"nodes","ms"}
//   deduce CODE [--level k|closure] [--seed S]
//     -> {"givens":[{x,y,size}],"steps":[...],"grade","unique","level"}
// Exit codes as for `verify`: 0 answered (unique / puzzle found), 1 not (multiple, none,
// undecided, not unique, bad tiling), 2 usage error.
import { parseArgs, type ParseArgsConfig } from 'node:util';
import {
  PuzzleInputError,
  assembleAnswer,
  deduceAnswer,
  makeDeductionPuzzle,
  parseFrameArg,
  parseLevelArg,
  parsePiecesArg,
  parseStartersArg,
  solveAssembly,
} from '../../shared/puzzle/index';
import { TilingInputError, parseTiling } from '../../shared/tiling/index';
import { CliUsageError } from './tiling';

type Write = (s: string) => void;

type Options = NonNullable<ParseArgsConfig['options']>;

/** Parsed flags as strings (every flag of these commands takes a value). */
function parse(argv: readonly string[], options: Options, usage: string): { values: Record<string, string | undefined>; positionals: string[] } {
  try {
    const r = parseArgs({ args: [...argv], options, allowPositionals: true, strict: true });
    const values: Record<string, string | undefined> = {};
    for (const [k, v] of Object.entries(r.values)) values[k] = typeof v === 'string' ? v : undefined;
    return { values, positionals: r.positionals };
  } catch (e) {
    throw new CliUsageError(`${(e as Error).message}\n${usage}`);
  }
}

/** Argument errors of the puzzle engine are usage errors (exit 2). */
function usageOnBadArgument<T>(f: () => T): T {
  try {
    return f();
  } catch (e) {
    if (e instanceof PuzzleInputError) throw new CliUsageError(e.message);
    throw e;
  }
}

const assembleUsage = 'usage: assemble --frame WxH --pieces a,b,c,... [--starters s@x,y;...] [--budget-ms N]';

export function runAssemble(argv: readonly string[], write: Write): number {
  const { values, positionals } = parse(
    argv,
    { frame: { type: 'string' }, pieces: { type: 'string' }, starters: { type: 'string' }, 'budget-ms': { type: 'string' } },
    assembleUsage,
  );
  if (positionals.length > 0) throw new CliUsageError(`unexpected argument "${positionals[0]}"\n${assembleUsage}`);
  if (typeof values.frame !== 'string' || typeof values.pieces !== 'string') throw new CliUsageError(assembleUsage);
  const frameText = values.frame;
  const piecesText = values.pieces;
  const startersText = typeof values.starters === 'string' ? values.starters : '';
  const budgetText = typeof values['budget-ms'] === 'string' ? values['budget-ms'] : undefined;
  const { frame, pieces, starters } = usageOnBadArgument(() => ({
    frame: parseFrameArg(frameText),
    pieces: parsePiecesArg(piecesText),
    starters: parseStartersArg(startersText),
  }));
  let maxMs: number | undefined;
  if (budgetText !== undefined) {
    maxMs = Number(budgetText);
    if (!Number.isInteger(maxMs) || maxMs <= 0) throw new CliUsageError(`--budget-ms: expected a positive whole number of milliseconds, got "${budgetText}"`);
  }
  try {
    const result = solveAssembly(
      { width: frame.width, height: frame.height, pieces, starters },
      maxMs === undefined ? {} : { budget: { maxMs } },
    );
    write(JSON.stringify(assembleAnswer(result)));
    return result.verdict === 'unique' ? 0 : 1;
  } catch (e) {
    if (e instanceof PuzzleInputError) {
      write(JSON.stringify({ ok: false, error: e.message }));
      return 1;
    }
    throw e;
  }
}

const deduceUsage = 'usage: deduce CODE [--level k|closure] [--seed S]  (quote the code)';

export function runDeduce(argv: readonly string[], write: Write): number {
  const { values, positionals } = parse(argv, { level: { type: 'string' }, seed: { type: 'string' } }, deduceUsage);
  if (positionals.length === 0) throw new CliUsageError(deduceUsage);
  const levelText = typeof values.level === 'string' ? values.level : undefined;
  const level = levelText === undefined ? undefined : usageOnBadArgument(() => parseLevelArg(levelText));
  let seed: number | undefined;
  if (typeof values.seed === 'string') {
    seed = Number(values.seed);
    if (!Number.isInteger(seed) || seed < 0 || seed > 2 ** 32 - 1) throw new CliUsageError(`--seed: expected a whole number from 0 to 4294967295, got "${values.seed}"`);
  }
  try {
    const tiling = parseTiling(positionals.join(' '));
    const puzzle = makeDeductionPuzzle(tiling, { ...(level === undefined ? {} : { level }), ...(seed === undefined ? {} : { seed }) });
    const answer = deduceAnswer(puzzle);
    write(JSON.stringify(answer));
    return answer.unique ? 0 : 1;
  } catch (e) {
    if (e instanceof TilingInputError || e instanceof PuzzleInputError) {
      write(JSON.stringify({ ok: false, error: e.message }));
      return 1;
    }
    throw e;
  }
}
