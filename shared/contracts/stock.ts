import { z } from 'zod';
import { classificationSchema, smithDrawingSchema, tilingSchema, type TilingData } from './tilings';

// Contracts for the stock of accepted tilings.

/**
 * A list's `sort` query parameter as the client's tables send it: a column key, prefixed
 * with `-` for descending (`sort=-createdAt`). Parses to `{ key, desc }`.
 */
export function sortParam<const K extends readonly [string, ...string[]]>(keys: K, fallback: `${K[number]}` | `-${K[number]}`) {
  return z
    .string()
    .default(fallback)
    .refine((v) => (keys as readonly string[]).includes(v.replace(/^-/, '')), {
      message: `sort by one of ${keys.join(', ')} (prefix - for descending)`,
    })
    .transform((v) => ({ key: v.replace(/^-/, '') as K[number], desc: v.startsWith('-') }));
}

export const provenanceSchema = z.enum(['setter', 'foundry', 'demo']);
export type Provenance = z.infer<typeof provenanceSchema>;

const intParam = (min: number, max: number) =>
  z.coerce
    .number({ error: 'must be a whole number, e.g. 12' })
    .pipe(z.number().int('must be a whole number, e.g. 12').min(min, `must be at least ${min}`).max(max, `must be at most ${max}`));
const boolParam = z.enum(['true', 'false']).transform((v) => v === 'true');

export const stockSortKeys = ['createdAt', 'order', 'width', 'height', 'id'] as const;

/** Filters for GET /api/stock and its exports (query parameters). */
export const stockFilterSchema = z.object({
  orderMin: intParam(1, 100_000).optional(),
  orderMax: intParam(1, 100_000).optional(),
  widthMin: intParam(1, 2_147_483_647).optional(),
  widthMax: intParam(1, 2_147_483_647).optional(),
  heightMin: intParam(1, 2_147_483_647).optional(),
  heightMax: intParam(1, 2_147_483_647).optional(),
  square: boolParam.optional(),
  perfect: boolParam.optional(),
  simple: boolParam.optional(),
  provenance: provenanceSchema.optional(),
  used: z.enum(['used', 'unused']).optional(),
  setterId: z.string().trim().min(1).max(200).optional(),
});

const rangeCheck = (v: Record<string, unknown>, ctx: z.RefinementCtx) => {
  for (const k of ['order', 'width', 'height']) {
    const lo = v[`${k}Min`];
    const hi = v[`${k}Max`];
    if (typeof lo === 'number' && typeof hi === 'number' && lo > hi) {
      ctx.addIssue({ code: 'custom', path: [`${k}Min`], message: `${k}Min (${lo}) is larger than ${k}Max (${hi})` });
    }
  }
};

export const stockListQuerySchema = stockFilterSchema
  .extend({
    sort: sortParam(stockSortKeys, '-createdAt'),
    page: intParam(1, 1_000_000).default(1),
    pageSize: intParam(1, 200).default(25),
  })
  .strict()
  .superRefine(rangeCheck);
export type StockListQuery = z.infer<typeof stockListQuerySchema>;

export const stockExportQuerySchema = stockFilterSchema
  // no limit: every row of the selection (streamed); `limit` asks for the first rows only
  .extend({ limit: intParam(1, 10_000_000).optional() })
  .strict()
  .superRefine(rangeCheck);
export type StockExportQuery = z.infer<typeof stockExportQuerySchema>;

export const stockItemSchema = z.object({
  id: z.number().int(),
  canonicalKey: z.string(),
  canonicalCode: z.string(),
  width: z.number().int(),
  height: z.number().int(),
  order: z.number().int(),
  square: z.boolean(),
  perfect: z.boolean(),
  simple: z.boolean(),
  provenance: provenanceSchema,
  setterId: z.string().nullable(),
  useCount: z.number().int(),
  createdAt: z.string(),
  acceptedAt: z.string().nullable(),
});
export type StockItem = z.infer<typeof stockItemSchema>;

/**
 * A list row: what the stock table shows, plus the squares as compact [x, y, s] triples (the
 * canonical orientation, as stored) so the table draws thumbnails without another request.
 * The codes are on the detail (GET /api/stock/:id) and in the exports.
 */
export const stockListItemSchema = stockItemSchema
  .omit({ canonicalKey: true, canonicalCode: true })
  .extend({ squares: z.array(z.tuple([z.number().int(), z.number().int(), z.number().int()])) });
export type StockListItem = z.infer<typeof stockListItemSchema>;

/** The drawing data of a list row. */
export function listItemTiling(item: Pick<StockListItem, 'width' | 'height' | 'squares'>): TilingData {
  return { W: item.width, H: item.height, squares: item.squares.map(([x, y, s]) => ({ x, y, s })) };
}

export const stockListSchema = z.object({
  items: z.array(stockListItemSchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});
export type StockList = z.infer<typeof stockListSchema>;

export const stockHistoryEventSchema = z.object({
  kind: z.enum(['submitted', 'accepted', 'added']),
  at: z.string(),
  submissionId: z.number().int().optional(),
  note: z.string().optional(),
});

export const stockDetailSchema = stockItemSchema.extend({
  bouwkamp: z.string(),
  params: z.record(z.string(), z.unknown()).nullable(),
  tiling: tilingSchema,
  smith: smithDrawingSchema.nullable(),
  classification: classificationSchema,
  history: z.object({
    events: z.array(stockHistoryEventSchema),
    puzzles: z.array(z.object({ id: z.number().int(), kind: z.string(), grade: z.number().int().nullable(), createdAt: z.string() })),
    editions: z.array(z.object({ id: z.string(), title: z.string(), date: z.string() })),
  }),
});
export type StockDetail = z.infer<typeof stockDetailSchema>;

/** GET /api/stock/summary: counts by order (and grade, once puzzles exist). */
export const stockSummarySchema = z.object({
  total: z.number().int(),
  byOrder: z.array(z.object({ order: z.number().int(), count: z.number().int() })),
  byGrade: z.array(z.object({ grade: z.number().int(), count: z.number().int() })),
});
export type StockSummary = z.infer<typeof stockSummarySchema>;

export const imageQuerySchema = z.object({ size: z.enum(['thumb', 'full']).default('full') }).strict();
