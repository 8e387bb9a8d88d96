import { z } from 'zod';
import type { JobProgress, StopReason } from './types';

// What the server and the worker processes agree on in Redis (decision 032): the queue names
// under one prefix, a part's queue job and the events a worker sends back.
//
//   <prefix>:bulk / <prefix>:interactive   parts of stored jobs (queue job id `${jobId}_${idx}`)
//                                           and compute requests (interactive, name 'compute')
//   <prefix>:results                        a worker's events for the server, in order
//   <prefix>:cancel:<jobId>                 a key a worker polls: the job was cancelled

export const QUEUE = { bulk: 'bulk', interactive: 'interactive', results: 'results' } as const;

export const partQueueId = (jobId: string, idx: number) => `${jobId}_${idx}`;
export function parsePartQueueId(id: string | undefined): { jobId: string; idx: number } | null {
  const m = id ? /^(.+)_(\d+)$/.exec(id) : null;
  return m ? { jobId: m[1]!, idx: Number(m[2]) } : null;
}
export const cancelKey = (prefix: string, jobId: string) => `${prefix}:cancel:${jobId}`;
export const workerKey = (prefix: string, id: string) => `${prefix}:worker:${id}`;

/** A part of a stored job as queued. */
export const partDataSchema = z.object({
  jobId: z.string(),
  kind: z.string(),
  params: z.unknown(),
  input: z.unknown(),
  part: z.object({ index: z.number().int(), count: z.number().int() }).nullable(),
  budgetMs: z.number().nullable(),
});
export type PartData = z.infer<typeof partDataSchema>;

export const computeDataSchema = z.object({ kind: z.string(), params: z.unknown() });

const progressSchema = z.object({ done: z.number(), total: z.number().optional(), found: z.number().optional(), phase: z.string().optional() }) satisfies z.ZodType<JobProgress>;

/** One event of a part, as a worker sends it through the results queue. */
export const resultEventSchema = z.object({
  jobId: z.string(),
  idx: z.number().int(),
  event: z.discriminatedUnion('type', [
    z.object({ type: z.literal('started') }),
    z.object({ type: z.literal('progress'), progress: progressSchema }),
    z.object({ type: z.literal('results'), items: z.array(z.unknown()) }),
    z.object({ type: z.literal('done'), summary: z.unknown(), stopped: z.enum(['cancel', 'budget']).nullable() satisfies z.ZodType<StopReason | null> }),
    z.object({ type: z.literal('failed'), error: z.string() }),
  ]),
});
export type ResultEvent = z.infer<typeof resultEventSchema>;
