import { z } from 'zod';

// Contracts for tilings as they cross the wire: the drawing data every screen uses,
// and the verdict of POST /api/tilings/check (which stores nothing).

/** Largest code we accept in one request (the engine's own guard is 64 kB). */
export const MAX_CODE_LENGTH = 64 * 1024;

export const squareSchema = z.object({
  x: z.number().int().nonnegative(),
  y: z.number().int().nonnegative(),
  s: z.number().int().positive(),
});

/** A tiling: W x H, squares with top-left corner (y downward) and side. */
export const tilingSchema = z.object({
  W: z.number().int().positive(),
  H: z.number().int().positive(),
  squares: z.array(squareSchema).min(1).max(2000),
});
export type TilingData = z.infer<typeof tilingSchema>;

/** Squares given explicitly (the sketch tab and JSON users send these). */
export const squaresInputSchema = z.object({
  width: z.number().int().positive(),
  height: z.number().int().positive(),
  squares: z
    .array(z.object({ x: z.number().int().nonnegative(), y: z.number().int().nonnegative(), size: z.number().int().positive() }))
    .min(1)
    .max(2000),
});
export type SquaresInput = z.infer<typeof squaresInputSchema>;

/**
 * The Smith diagram as drawing data (our own shape, independent of the engine's):
 * a node per maximal horizontal segment at height y over [x0, x1]; an edge per square
 * from its top node to its bottom node, drawn at the square's centre x, carrying the
 * square's side as its current. The pole edge joins the top and the bottom node.
 */
export const smithDrawingSchema = z.object({
  width: z.number().positive(),
  height: z.number().positive(),
  nodes: z.array(z.object({ id: z.number().int(), y: z.number(), x0: z.number(), x1: z.number() })),
  edges: z.array(
    z.object({ square: z.number().int(), from: z.number().int(), to: z.number().int(), x: z.number(), current: z.number() }),
  ),
  pole: z.object({ top: z.number().int(), bottom: z.number().int() }),
});
export type SmithDrawing = z.infer<typeof smithDrawingSchema>;

export const rectSchema = z.object({ x: z.number(), y: z.number(), w: z.number(), h: z.number() });

/** The class of a tiling at a glance: order, size, and whether it is square, perfect, simple. */
export const tilingFactsSchema = z.object({
  order: z.number().int(),
  width: z.number().int(),
  height: z.number().int(),
  square: z.boolean(),
  perfect: z.boolean(),
  simple: z.boolean(),
});
export type TilingFactsData = z.infer<typeof tilingFactsSchema>;

export const classificationSchema = z.object({
  ...tilingFactsSchema.shape,
  trivialCompound: z.boolean(),
  subRectangles: z.array(rectSchema),
  gcd: z.number().int(),
  minSize: z.number().int(),
  maxSize: z.number().int(),
});
export type ClassificationData = z.infer<typeof classificationSchema>;

/** Where a problem is in the input (1-based line/column; group/element/square as the engine counts). */
export const whereSchema = z
  .object({
    line: z.number().int().optional(),
    column: z.number().int().optional(),
    group: z.number().int().optional(),
    element: z.number().int().optional(),
    square: z.number().int().optional(),
    /** for sketches: the two edges (0-based) that cross */
    edges: z.tuple([z.number().int(), z.number().int()]).optional(),
  })
  .partial();

export const tilingErrorSchema = z.object({
  code: z.string(),
  message: z.string(),
  where: whereSchema.optional(),
});
export type TilingError = z.infer<typeof tilingErrorSchema>;

/**
 * The scale of a tiling against another of the same reduced form, from the gcd of each
 * one's sizes: "2x" (twice as large), "1/2x", "3/2x"; "1x" for the same size.
 */
export function scaleText(gcdOfThis: number, gcdOfOther: number): string {
  const g = (a: number, b: number): number => (b === 0 ? a : g(b, a % b));
  const d = g(gcdOfThis, gcdOfOther) || 1;
  const num = gcdOfThis / d;
  const den = gcdOfOther / d;
  return den === 1 ? `${num}x` : `${num}/${den}x`;
}

/** What a duplicate is a duplicate of: never whose. */
export const duplicateOfSchema = z.enum(['stock', 'pending', 'this-file']);
export type DuplicateOf = z.infer<typeof duplicateOfSchema>;

export const checkRequestSchema = z.object({
  code: z
    .string({ error: 'code must be a string' })
    .trim()
    .min(1, 'code is empty: paste a Bouwkamp or table code')
    .max(MAX_CODE_LENGTH, `code is longer than ${MAX_CODE_LENGTH} characters`),
});
export type CheckRequest = z.infer<typeof checkRequestSchema>;

export const validVerdictSchema = z.object({
  valid: z.literal(true),
  ...tilingFactsSchema.shape,
  bouwkamp: z.string(),
  canonicalCode: z.string(),
  canonicalKey: z.string(),
  classification: classificationSchema,
  tiling: tilingSchema,
  smith: smithDrawingSchema.nullable(),
  duplicate: z.boolean(),
  duplicateOf: duplicateOfSchema.nullable(),
});
export type ValidVerdict = z.infer<typeof validVerdictSchema>;

export const invalidVerdictSchema = z.object({
  valid: z.literal(false),
  error: tilingErrorSchema,
});

export const verdictSchema = z.discriminatedUnion('valid', [validVerdictSchema, invalidVerdictSchema]);
export type Verdict = z.infer<typeof verdictSchema>;
