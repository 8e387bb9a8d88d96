import { z } from 'zod';
import { defineJob } from './types';

// A tiny job kind for the runner's own tests and health checks: counts to `to`, emitting
// every `every`-th number, optionally sleeping `stepMs` per step (busy-wait, to act like
// CPU-bound engine code that only polls shouldStop()).
const params = z.object({
  to: z.number().int().min(0).max(10_000_000),
  every: z.number().int().min(1).default(1),
  stepMs: z.number().min(0).max(1000).default(0),
  failAt: z.number().int().optional(),
});

export const handler = defineJob({
  kind: 'test-count',
  parseParams: (raw) => params.parse(raw),
  run(ctx) {
    const { to, every, stepMs, failAt } = ctx.params;
    let found = 0;
    for (let i = 1; i <= to; i++) {
      if (ctx.shouldStop()) return { counted: i - 1, found, stopped: ctx.stopReason() };
      if (failAt === i) throw new Error(`asked to fail at ${i}`);
      if (stepMs > 0) {
        const until = Date.now() + stepMs;
        while (Date.now() < until) { /* busy */ }
      }
      if (i % every === 0) { ctx.emit({ n: i }); found++; }
      ctx.progress({ done: i, total: to, found, phase: 'counting' });
    }
    return { counted: to, found, stopped: null };
  },
});
