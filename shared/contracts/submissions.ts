import { z } from 'zod';
import { jobProgressSchema, jobRetrySchema, jobStateSchema } from './jobs';
import { numericIdParamSchema, pageOf } from './common';
import { sortParam } from './stock';
import { duplicateOfSchema, MAX_CODE_LENGTH, smithDrawingSchema, squaresInputSchema, tilingErrorSchema, tilingSchema, classificationSchema, tilingFactsSchema } from './tilings';

// Contracts for setters' submissions and the editors' review of them.

export const submissionSourceSchema = z.enum(['paste', 'sketch', 'file']);
export const submissionStatusSchema = z.enum(['pending', 'accepted', 'rejected']);
export type SubmissionStatus = z.infer<typeof submissionStatusSchema>;

export const MAX_TITLE = 120;
export const MAX_NOTE = 2000;
/** Upload limits (issue 6): at most 5 MB (413) and 20,000 lines (422). */
export const MAX_UPLOAD_BYTES = 5 * 1024 * 1024;
export const MAX_UPLOAD_LINES = 20_000;

const titleSchema = z.string().trim().max(MAX_TITLE, `title is longer than ${MAX_TITLE} characters`);
const noteSchema = z.string().trim().max(MAX_NOTE, `note is longer than ${MAX_NOTE} characters`);

/** POST /api/submissions: exactly one of code (paste) or squares (sketch). */
export const createSubmissionSchema = z
  .object({
    code: z.string().trim().min(1, 'code is empty').max(MAX_CODE_LENGTH).optional(),
    squares: squaresInputSchema.optional(),
    title: titleSchema.optional(),
    note: noteSchema.optional(),
    source: z.enum(['paste', 'sketch']),
  })
  .strict()
  .superRefine((v, ctx) => {
    if ((v.code === undefined) === (v.squares === undefined)) {
      ctx.addIssue({ code: 'custom', path: ['code'], message: 'give exactly one of code or squares' });
    }
  });
export type CreateSubmission = z.infer<typeof createSubmissionSchema>;

/** A submission's name in words: its title, or "Untitled (file)" etc. (the setter's table and mail say the same). */
export function submissionTitle(title: string | null, source: 'paste' | 'sketch' | 'file'): string {
  return title ?? `Untitled (${source})`;
}

/** Which stock tiling a submission is, and at what scale ("1x" the same size, "2x" twice as large): editors only. */
export const sameAsSchema = z.object({ stockId: z.number().int(), scale: z.string() });

export const submissionSchema = z.object({
  id: z.number().int(),
  setterId: z.string(),
  setterName: z.string().nullable(),
  title: z.string().nullable(),
  note: z.string().nullable(),
  source: submissionSourceSchema,
  code: z.string(),
  canonicalCode: z.string(),
  canonicalKey: z.string(),
  ...tilingFactsSchema.shape,
  status: submissionStatusSchema,
  /** live: the same tiling (up to symmetry and scale) is in the stock now, or pending in another submission */
  duplicateOf: duplicateOfSchema.nullable(),
  /** editors only: the stock tiling it is, and at what scale; null for setters and when it is not in the stock */
  sameAs: sameAsSchema.nullable(),
  editorNote: z.string().nullable(),
  stockId: z.number().int().nullable(),
  createdAt: z.string(),
  reviewedAt: z.string().nullable(),
});
export type Submission = z.infer<typeof submissionSchema>;

/** GET /api/submissions/:id adds drawing data and classification. */
export const submissionDetailSchema = submissionSchema.extend({
  tiling: tilingSchema,
  smith: smithDrawingSchema.nullable(),
  classification: classificationSchema,
  bouwkamp: z.string(),
  /** editors only (empty for setters): the same tiling elsewhere */
  duplicates: z.object({
    stockId: z.number().int().nullable(),
    /** the scale of this tiling against the stock tiling ("2x"), when there is one */
    scale: z.string().nullable(),
    submissions: z.array(z.object({ id: z.number().int(), status: submissionStatusSchema })),
  }),
});
export type SubmissionDetail = z.infer<typeof submissionDetailSchema>;

export const submissionSortKeys = ['createdAt', 'title', 'order', 'width', 'height', 'status'] as const;
const intParam = (min: number, max: number) => z.coerce.number().int().min(min).max(max);

export const submissionListQuerySchema = z
  .object({
    status: submissionStatusSchema.optional(),
    q: z.string().trim().max(200).optional(),
    duplicate: z.enum(['true', 'false']).optional(),
    sort: sortParam(submissionSortKeys, '-createdAt'),
    page: intParam(1, 1_000_000).default(1),
    pageSize: intParam(1, 200).default(25),
  })
  .strict();
export type SubmissionListQuery = z.infer<typeof submissionListQuerySchema>;

export const submissionListSchema = pageOf(submissionSchema);
export type SubmissionList = z.infer<typeof submissionListSchema>;

export const idParamsSchema = numericIdParamSchema;

export const reviewSchema = z.object({ note: noteSchema.optional() }).strict();
export const rejectSchema = z
  .object({ note: noteSchema.min(1, 'say why in a note: the setter reads it') })
  .strict();

export const bulkReviewSchema = z
  .object({
    ids: z.array(z.number().int().positive()).min(1, 'choose at least one submission').max(500),
    action: z.enum(['accept', 'reject']),
    note: noteSchema.optional(),
  })
  .strict()
  .superRefine((v, ctx) => {
    if (v.action === 'reject' && !v.note) ctx.addIssue({ code: 'custom', path: ['note'], message: 'say why in a note: the setter reads it' });
  });
export type BulkReview = z.infer<typeof bulkReviewSchema>;

export const bulkResultSchema = z.object({
  results: z.array(z.object({ id: z.number().int(), ok: z.boolean(), status: submissionStatusSchema.optional(), error: z.string().optional() })),
});

/** One line of the upload report. */
export const uploadLineSchema = z.object({
  line: z.number().int(),
  verdict: z.enum(['valid', 'invalid', 'duplicate']),
  error: tilingErrorSchema.optional(),
  submissionId: z.number().int().optional(),
  duplicateOf: duplicateOfSchema.optional(),
  order: z.number().int().optional(),
  width: z.number().int().optional(),
  height: z.number().int().optional(),
});
export type UploadLine = z.infer<typeof uploadLineSchema>;

export const uploadReportSchema = z.object({
  fileName: z.string(),
  lines: z.array(uploadLineSchema),
  summary: z.object({ valid: z.number().int(), invalid: z.number().int(), duplicate: z.number().int(), created: z.number().int() }),
});
export type UploadReport = z.infer<typeof uploadReportSchema>;

/**
 * An upload is checked and stored by a job (decision 051): POST /api/submissions/upload answers
 * at once with it, GET /api/submissions/uploads/:id follows it. `summary` counts the lines stored
 * so far; `report` lists them once the job has ended (done, cancelled, failed or interrupted).
 */
export const uploadJobSchema = z.object({
  id: z.string(),
  fileName: z.string(),
  state: jobStateSchema,
  progress: jobProgressSchema.nullable(),
  error: z.string().nullable(),
  retry: jobRetrySchema,
  summary: uploadReportSchema.shape.summary.extend({ lines: z.number().int() }),
  report: uploadReportSchema.nullable(),
  createdAt: z.string(),
});
export type UploadJob = z.infer<typeof uploadJobSchema>;
export const uploadIdParamsSchema = z.object({ id: z.uuid({ error: 'upload id must be a UUID' }) });
export const uploadRetrySchema = z.object({ how: z.enum(['resume', 'restart']).default('resume') }).strict();
