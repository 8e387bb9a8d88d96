import { z } from 'zod';
import { defineJob } from './types';

// A tiny job kind for the job system's own tests and health checks: counts to `to`, emitting
// every `every`-th number, optionally sleeping `stepMs` per step (busy-wait, to act like
// CPU-bound engine code that only polls shouldStop()). A job split into parts counts the
// numbers i with i % count === index in each part.
const params = z.object({
  to: z.number().int().min(0).max(10_000_000),
  every: z.number().int().min(1).default(1),
  stepMs: z.number().min(0).max(1000).default(0),
  failAt: z.number().int().optional(),
  /** how many parts the test sink splits the job into (read by the sink, not here) */
  parts: z.number().int().min(1).max(64).optional(),
  /** a part that sleeps this long per step instead (to kill it mid-way in a test) */
  slowPart: z.object({ index: z.number().int(), stepMs: z.number().min(0).max(1000) }).optional(),
});

export const handler = defineJob({
  kind: 'test-count',
  parseParams: (raw) => params.parse(raw),
  run(ctx) {
    const { to, every, failAt, slowPart } = ctx.params;
    const part = ctx.part ?? { index: 0, count: 1 };
    const stepMs = slowPart && slowPart.index === part.index ? slowPart.stepMs : ctx.params.stepMs;
    let found = 0;
    let counted = 0;
    for (let i = 1; i <= to; i++) {
      if (ctx.shouldStop()) return { counted, found, stopped: ctx.stopReason() };
      if (i % part.count !== part.index % part.count) continue;
      if (failAt === i) throw new Error(`asked to fail at ${i}`);
      if (stepMs > 0) {
        const until = Date.now() + stepMs;
        while (Date.now() < until) { /* busy */ }
      }
      counted++;
      if (i % every === 0) { ctx.emit({ n: i }); found++; }
      ctx.progress({ done: i, total: to, found, phase: 'counting' });
    }
    return { counted, found, stopped: null };
  },
});
