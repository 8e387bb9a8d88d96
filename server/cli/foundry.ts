import { z } from 'zod';
import { exhaustiveTilings, randomTilings, type FoundTiling } from '../../shared/foundry/index';

// `npm run -s cli -- foundry --order N [--squares-only] [--random --count K --max-side S --seed X]`
// One JSON line per tiling found, then one summary line.

const argsSchema = z
  .object({
    order: z.coerce.number({ error: '--order must be a number' }).int().min(5, '--order must be at least 5').max(40, '--order must be at most 40'),
    squaresOnly: z.boolean(),
    random: z.boolean(),
    count: z.coerce.number().int().min(1, '--count must be at least 1').default(10),
    maxSide: z.coerce.number().int().min(2, '--max-side must be at least 2').optional(),
    seed: z.coerce.number().int('--seed must be an integer').default(1),
  })
  .refine((a) => a.random || a.order <= 25, { path: ['order'], message: 'exhaustive --order must be at most 25' })
  .refine((a) => !a.random || a.order >= 9, { path: ['order'], message: '--random needs --order >= 9' });

export function parseFoundryArgs(argv: readonly string[]) {
  const raw: Record<string, unknown> = { squaresOnly: false, random: false };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i]!;
    const value = () => {
      const v = argv[++i];
      if (v === undefined) throw new Error(`${a} needs a value`);
      return v;
    };
    if (a === '--order') raw.order = value();
    else if (a === '--squares-only') raw.squaresOnly = true;
    else if (a === '--random') raw.random = true;
    else if (a === '--count') raw.count = value();
    else if (a === '--max-side') raw.maxSide = value();
    else if (a === '--seed') raw.seed = value();
    else throw new Error(`unknown option ${a} (foundry --order N [--squares-only] [--random --count K --max-side S --seed X])`);
  }
  if (raw.order === undefined) throw new Error('foundry: --order N is required');
  const r = argsSchema.safeParse(raw);
  if (!r.success) throw new Error(`foundry: ${r.error.issues.map((i) => i.message).join('; ')}`);
  return r.data;
}

function line(t: FoundTiling): string {
  return JSON.stringify({ code: t.code, order: t.order, width: t.width, height: t.height, perfect: t.perfect, simple: t.simple });
}

export function runFoundryCli(argv: readonly string[], write: (s: string) => void): void {
  const a = parseFoundryArgs(argv);
  if (a.random) {
    let squares = 0;
    const s = randomTilings({
      count: a.count, orderMin: a.order, orderMax: a.order, seed: a.seed, squaresOnly: a.squaresOnly,
      ...(a.maxSide !== undefined ? { maxSide: a.maxSide } : {}),
      onFound: (t) => { if (t.square) squares++; write(line(t)); },
    });
    write(JSON.stringify({ summary: { order: a.order, graphs: s.tries, pairs: s.tries, simplePerfect: s.found, simpleImperfect: 0, squares, ms: s.ms } }));
    return;
  }
  const s = exhaustiveTilings({ order: a.order, squaresOnly: a.squaresOnly, onFound: (t) => write(line(t)) });
  write(JSON.stringify({ summary: { order: s.order, graphs: s.graphs, pairs: s.pairs, simplePerfect: s.simplePerfect, simpleImperfect: s.simpleImperfect, squares: s.squares, ms: s.ms } }));
}
