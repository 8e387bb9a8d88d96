import { z } from 'zod';

// Shapes every area shares: roles, the error body, ids and paging.

export const roles = ['admin', 'editor', 'setter', 'printer'] as const;
export const roleSchema = z.enum(roles);
export type Role = z.infer<typeof roleSchema>;

/** Every error answer of the API: `{ "error": { "code", "message", "details"? } }`. */
export const errorCodeSchema = z.enum([
  'bad_request',
  'unauthorized',
  'forbidden',
  'not_found',
  'conflict',
  'payload_too_large',
  'unprocessable',
  'rate_limited',
  'internal',
]);
export type ErrorCode = z.infer<typeof errorCodeSchema>;

export const errorIssueSchema = z.object({
  /** where: `body.email`, `query.page`, `params.id`, or an area-specific place */
  path: z.string(),
  message: z.string(),
});
export type ErrorIssue = z.infer<typeof errorIssueSchema>;

export const errorBodySchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    details: z.unknown().optional(),
  }),
});
export type ErrorBody = z.infer<typeof errorBodySchema>;

export const idParamSchema = z.object({ id: z.string().min(1).max(100) });
export const numericIdParamSchema = z.object({ id: z.coerce.number().int().positive() });

export const pageQuerySchema = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
});
export type PageQuery = z.infer<typeof pageQuerySchema>;

export function pageOf<T extends z.ZodType>(item: T) {
  return z.object({
    items: z.array(item),
    total: z.number().int().nonnegative(),
    page: z.number().int().min(1),
    pageSize: z.number().int().min(1),
  });
}

/** ISO 8601 timestamp as sent over the wire. */
export const isoDateTimeSchema = z.iso.datetime({ offset: true });

export const okSchema = z.object({ ok: z.literal(true) });
