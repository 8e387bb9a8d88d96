import { exhaustiveTilings, joinStock, randomTilings, type FoundTiling } from '../../../shared/foundry/index';
import { runRequestSchema } from '../../../shared/contracts/foundry';
import type { Tiling } from '../../../shared/tiling/index';
import { defineJob } from '../../platform/jobs/types';

// A foundry run in the worker pool: exhaustive by order, random with filters, or joining.
// Input from the main thread: `knownKeys` (random mode: the stock's canonical keys) and
// `parts` (joining: the stock's perfect rectangles).

/** One result of a run, as the engine describes it (verified and classified). */
export type FoundryItem = FoundTiling;

export interface FoundryInput {
  knownKeys?: string[];
  parts?: { id: string; tiling: Tiling }[];
}

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
    const input = (ctx.input ?? {}) as FoundryInput;
    let found = 0;
    const onFound = (t: FoundTiling) => {
      found++;
      ctx.emit(t);
    };
    if (p.mode === 'exhaustive') {
      return exhaustiveTilings({
        order: p.order,
        squaresOnly: p.squaresOnly,
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
