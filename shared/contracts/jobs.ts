import { z } from 'zod';

// Contracts of the job system (server/platform/jobs): a job's progress as every area shows it,
// and the generic job view (GET /api/jobs/:id).

/** Progress of a job: the current phase (all parts together) with rate and time left, and how much is stored. */
export const jobProgressSchema = z.object({
  phase: z.string().optional(),
  /** units done in the current phase */
  done: z.number(),
  total: z.number().optional(),
  /** results found so far */
  found: z.number().optional(),
  /** units of the phase per second */
  rate: z.number().optional(),
  /** time left, ms (the search's and the storing's, whichever ends later) */
  etaMs: z.number().optional(),
  elapsedMs: z.number().optional(),
  /** results stored so far / received from the workers so far */
  stored: z.number().optional(),
  received: z.number().optional(),
  /** a job split into parts: how many are finished */
  parts: z.object({ done: z.number(), count: z.number() }).optional(),
});
export type JobProgressView = z.infer<typeof jobProgressSchema>;

export const jobStateSchema = z.enum(['queued', 'running', 'done', 'cancelled', 'failed', 'interrupted']);
export type JobStateView = z.infer<typeof jobStateSchema>;

/** Whether a finished job may run again: from where it stopped, or from the start. */
export const jobRetrySchema = z.object({ resume: z.boolean(), restart: z.boolean() });

export const jobSchema = z.object({
  id: z.string(),
  kind: z.string(),
  state: jobStateSchema,
  progress: jobProgressSchema.nullable(),
  /** the kind's closing summary (its own shape), with `stored` / `received` counts */
  summary: z.record(z.string(), z.unknown()).nullable(),
  error: z.string().nullable(),
  retry: jobRetrySchema,
  createdAt: z.string(),
  startedAt: z.string().nullable(),
  finishedAt: z.string().nullable(),
});
export type JobView = z.infer<typeof jobSchema>;

export const jobIdParamsSchema = z.object({ id: z.uuid({ error: 'job id must be a UUID' }) });
export const jobRetryRequestSchema = z.object({ how: z.enum(['resume', 'restart']).default('resume') }).strict();
export type JobRetryRequest = z.infer<typeof jobRetryRequestSchema>;
