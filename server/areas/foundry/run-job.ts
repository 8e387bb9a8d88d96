import { exhaustiveTilings, joinStock, randomTilings, type FoundTiling } from '../../../shared/foundry/index';
import { z } from 'zod';
import { runRequestSchema } from '../../../shared/contracts/foundry';
import { tilingSchema } from '../../../shared/contracts/tilings';
import type { Tiling } from '../../../shared/tiling/index';
import { defineJob } from '../../platform/jobs/types';

// A foundry run on a job worker (a thread, or `npm run worker`): exhaustive by order (one shard
// of it when the job is split: ctx.part), random with filters, or joining. Input from the
// server: `knownKeys` (random mode: the stock's canonical keys) and `parts` (joining: the
// stock's perfect rectangles).

/** One result of a run, as the engine describes it (verified and classified); parsed when it reaches the main thread. */
export const foundryItemSchema = z.object({
  key: z.string().min(1),
  code: z.string().min(1),
  order: z.number().int().positive(),
  width: z.number().int().positive(),
  height: z.number().int().positive(),
  perfect: z.boolean(),
  simple: z.boolean(),
  square: z.boolean(),
  maxSize: z.number().int().positive(),
  tiling: tilingSchema,
  origin: z.record(z.string(), z.unknown()),
}) satisfies z.ZodType<FoundTiling>;
export type FoundryItem = z.infer<typeof foundryItemSchema>;

/** What the main thread hands the job (not persisted): the stock's keys, or its rectangles to join. */
export const foundryInputSchema = z.object({
  knownKeys: z.array(z.string()).optional(),
  parts: z.array(z.object({ id: z.string(), tiling: tilingSchema })).optional(),
});
export type FoundryInput = { knownKeys?: string[]; parts?: { id: string; tiling: Tiling }[] };

const phaseLabel = {
  levels: 'graph levels built',
  'last-level': 'smaller graphs extended',
  solving: 'graphs solved',
} as const;

export const handler = defineJob({
  kind: 'foundry-run',
  parseParams: (raw) => runRequestSchema.parse(raw),
  run(ctx) {
    const p = ctx.params;
    const input = foundryInputSchema.parse(ctx.input ?? {});
    let found = 0;
    const onFound = (t: FoundTiling) => {
      found++;
      ctx.emit(t);
    };
    if (p.mode === 'exhaustive') {
      return exhaustiveTilings({
        order: p.order,
        squaresOnly: p.squaresOnly,
        ...(ctx.part ? { shard: ctx.part } : {}),
        shouldStop: () => ctx.shouldStop(),
        onProgress: (q) => ctx.progress({ phase: phaseLabel[q.phase], done: q.done, total: q.total, found: q.found }),
        onFound,
      });
    }
    if (p.mode === 'random') {
      const known = new Set(input.knownKeys ?? []);
      const { mode: _mode, ...opts } = p;
      return randomTilings({
        ...opts,
        isKnown: (k) => known.has(k),
        shouldStop: () => ctx.shouldStop(),
        onProgress: (q) => ctx.progress({ phase: 'tilings found', done: q.done, total: q.total, found }),
        onFound,
      });
    }
    return joinStock(input.parts ?? [], {
      shouldStop: () => ctx.shouldStop(),
      onProgress: (q) => ctx.progress({ phase: 'size groups joined', done: q.done, total: q.total, found: q.found }),
      onFound,
    });
  },
});
