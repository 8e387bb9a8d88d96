import { z } from 'zod';
import { jobProgressSchema, jobRetrySchema, jobStateSchema } from './jobs';
import { tilingFactsSchema } from './tilings';

// Contracts for the foundry's runs (POST/GET /api/foundry/runs ...). One schema per contract:
// the page's form validates with runRequestSchema, the handler parses with it.

/** Orders the exhaustive mode accepts from the API (order 21 squares-only is the largest published run). */
export const EXHAUSTIVE_ORDER_MIN = 9;
export const EXHAUSTIVE_ORDER_MAX = 21;
/** Without squaresOnly, orders above this take too long for an interactive run. */
export const EXHAUSTIVE_ALL_MAX = 18;
export const RANDOM_ORDER_MIN = 9;
export const RANDOM_ORDER_MAX = 40;

const exhaustiveSchema = z
  .object({
    mode: z.literal('exhaustive'),
    order: z.number().int().min(EXHAUSTIVE_ORDER_MIN).max(EXHAUSTIVE_ORDER_MAX),
    squaresOnly: z.boolean().default(false),
    /** also put the simple imperfect tilings into the stock (by default only the perfect ones go in; all are listed in the run's results) */
    includeImperfect: z.boolean().default(false),
  })
  .strict()
  .refine((v) => v.squaresOnly || v.order <= EXHAUSTIVE_ALL_MAX, {
    path: ['order'],
    message: `orders above ${EXHAUSTIVE_ALL_MAX} need squaresOnly (all rectangles would take hours)`,
  });

const randomSchema = z
  .object({
    mode: z.literal('random'),
    count: z.number().int().min(1).max(1000),
    orderMin: z.number().int().min(RANDOM_ORDER_MIN).max(RANDOM_ORDER_MAX),
    orderMax: z.number().int().min(RANDOM_ORDER_MIN).max(RANDOM_ORDER_MAX),
    maxSide: z.number().int().min(2).max(100_000_000).optional(),
    aspectMin: z.number().min(1).max(100).optional(),
    aspectMax: z.number().min(1).max(100).optional(),
    squaresOnly: z.boolean().default(false),
    seed: z.number().int().min(0).max(4_294_967_295),
  })
  .strict()
  .refine((v) => v.orderMax >= v.orderMin, { path: ['orderMax'], message: 'orderMax must be at least orderMin' })
  .refine((v) => v.aspectMin === undefined || v.aspectMax === undefined || v.aspectMax >= v.aspectMin, {
    path: ['aspectMax'],
    message: 'aspectMax must be at least aspectMin',
  });

const joiningSchema = z.object({ mode: z.literal('joining') }).strict();

export const runRequestSchema = z.discriminatedUnion('mode', [exhaustiveSchema, randomSchema, joiningSchema]);
export type RunRequest = z.infer<typeof runRequestSchema>;
export type RunRequestInput = z.input<typeof runRequestSchema>;
export type RunMode = RunRequest['mode'];

export const runStateSchema = jobStateSchema;
export type RunState = z.infer<typeof runStateSchema>;

/** A run's progress: the job system's (search phases over all shards, then storing). */
export const runProgressSchema = jobProgressSchema;

/** A run's closing summary as its job returned it (counts, what stopped it): shown as is. */
export const runSummarySchema = z.record(z.string(), z.unknown());

export const runSchema = z.object({
  id: z.string(),
  state: runStateSchema,
  params: runRequestSchema,
  progress: runProgressSchema.nullable(),
  summary: runSummarySchema.nullable(),
  error: z.string().nullable(),
  /** distinct tilings this run found */
  found: z.number().int().nonnegative(),
  /** of those, perfect (all sizes different) and imperfect */
  foundPerfect: z.number().int().nonnegative(),
  foundImperfect: z.number().int().nonnegative(),
  /** of those, how many were new to the stock */
  addedToStock: z.number().int().nonnegative(),
  /** an interrupted, failed or cancelled run may run again (resume: its finished shards are kept) */
  retry: jobRetrySchema,
  createdAt: z.string(),
  startedAt: z.string().nullable(),
  finishedAt: z.string().nullable(),
});
export type Run = z.infer<typeof runSchema>;

export const runListSchema = z.object({ items: z.array(runSchema) });
export type RunList = z.infer<typeof runListSchema>;

export const runResultSchema = z.object({
  code: z.string(),
  canonicalKey: z.string(),
  ...tilingFactsSchema.shape,
  maxSize: z.number().int(),
  stockId: z.number().int().nullable(),
});
export type RunResult = z.infer<typeof runResultSchema>;

export const runResultsSchema = z.object({ items: z.array(runResultSchema), total: z.number().int() });
export type RunResults = z.infer<typeof runResultsSchema>;

export const runIdParamsSchema = z.object({ id: z.uuid({ error: 'run id must be a UUID' }) });
export const runRetrySchema = z.object({ how: z.enum(['resume', 'restart']).default('resume') }).strict();
export type RunRetry = z.infer<typeof runRetrySchema>;

export const runResultsQuerySchema = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(500).default(100),
}).strict();
