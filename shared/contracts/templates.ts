import { z } from 'zod';
import { HAIRLINE_PT, templatePressSchema, type PressSettings } from './press';

// Page templates are data (templates/pages/*.json). One schema serves the start-up
// loader on the server and the admin Templates screen in the client.

const mm = (what: string, max: number) =>
  z.number({ error: `${what} must be a number of millimetres` }).positive(`${what} must be above 0 mm`).max(max, `${what} may be at most ${max} mm`);
const pt = (what: string, min: number, max: number) =>
  z.number({ error: `${what} must be a number of points` }).min(min, `${what} must be at least ${min} pt`).max(max, `${what} may be at most ${max} pt`);

export const templateIdSchema = z
  .string()
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'template id must be kebab-case (a-z, 0-9 and single hyphens)');

export const pageTemplateSchema = z
  .object({
    id: templateIdSchema,
    name: z.string().min(1, 'name must not be empty').max(80),
    description: z.string().max(400).default(''),
    trim: z.object({ widthMm: mm('trim width', 1000), heightMm: mm('trim height', 1500) }).strict(),
    // Page size = trim + 2 x bleed; the crop marks sit in the bleed, outside the trim.
    bleedMm: z.number({ error: 'bleed must be a number of millimetres' }).min(1, 'bleed must be at least 1 mm (the crop marks sit in it)').max(20, 'bleed may be at most 20 mm'),
    cropMarks: z
      .object({
        offsetMm: z.number().min(0, 'crop mark offset must not be negative').max(10),
        lengthMm: mm('crop mark length', 20),
      })
      .strict(),
    marginsMm: z
      .object({ top: mm('top margin', 100), right: mm('right margin', 100), bottom: mm('bottom margin', 100), left: mm('left margin', 100) })
      .strict(),
    columns: z.number().int('columns must be a whole number').min(1, 'at least 1 column').max(4, 'at most 4 columns'),
    gutterMm: z.number().min(0, 'gutter must not be negative').max(30),
    type: z
      .object({
        titlePt: pt('title size', 8, 72),
        headingPt: pt('heading size', 6, 48),
        bodyPt: pt('body size', 5, 24),
        captionPt: pt('caption size', 4, 18),
        digitsPt: pt('largest digit size', 4, 36),
        lineHeight: z.number().min(1, 'line height must be at least 1').max(2, 'line height may be at most 2'),
      })
      .strict(),
    drawing: z
      .object({
        maxHeightMm: mm('largest drawing height', 400),
        strokePt: pt('line weight', 0.1, 4),
      })
      .strict(),
    // Legibility floors checked by the preflight (the values in the shipped templates
    // are common practice for print: digits of 6 pt and more, squares of 3 mm and more).
    minimums: z
      .object({
        digitPt: pt('smallest legible digit', 3, 24),
        squareMm: mm('smallest legible square', 50),
        bodyPt: pt('smallest legible body text', 4, 24),
      })
      .strict(),
    maxSlots: z.number().int('maxSlots must be a whole number').min(1).max(60),
    // The press defaults a publication on this template starts from (its press spec may
    // override each): PDF/X standard, output condition, smallest type and thinnest line.
    press: templatePressSchema.optional(),
  })
  .strict()
  .superRefine((t, ctx) => {
    if (t.cropMarks.offsetMm + t.cropMarks.lengthMm > t.bleedMm) {
      ctx.addIssue({
        code: 'custom',
        path: ['cropMarks', 'lengthMm'],
        message: `crop marks (offset ${t.cropMarks.offsetMm} mm + length ${t.cropMarks.lengthMm} mm) must fit inside the ${t.bleedMm} mm bleed`,
      });
    }
    const contentW = t.trim.widthMm - t.marginsMm.left - t.marginsMm.right;
    const contentH = t.trim.heightMm - t.marginsMm.top - t.marginsMm.bottom;
    if (contentW <= 20) ctx.addIssue({ code: 'custom', path: ['marginsMm'], message: `left and right margins leave only ${contentW.toFixed(1)} mm of width (need more than 20 mm)` });
    if (contentH <= 40) ctx.addIssue({ code: 'custom', path: ['marginsMm'], message: `top and bottom margins leave only ${contentH.toFixed(1)} mm of height (need more than 40 mm)` });
    const columnW = (contentW - (t.columns - 1) * t.gutterMm) / t.columns;
    if (columnW < 30) ctx.addIssue({ code: 'custom', path: ['columns'], message: `${t.columns} columns with a ${t.gutterMm} mm gutter leave ${columnW.toFixed(1)} mm per column (need at least 30 mm)` });
    if (t.drawing.maxHeightMm > contentH) ctx.addIssue({ code: 'custom', path: ['drawing', 'maxHeightMm'], message: `largest drawing height ${t.drawing.maxHeightMm} mm exceeds the ${contentH.toFixed(1)} mm content height` });
    if (t.type.bodyPt < t.minimums.bodyPt) ctx.addIssue({ code: 'custom', path: ['type', 'bodyPt'], message: `body size ${t.type.bodyPt} pt is below the template's own minimum of ${t.minimums.bodyPt} pt` });
    if (t.type.digitsPt < t.minimums.digitPt) ctx.addIssue({ code: 'custom', path: ['type', 'digitsPt'], message: `largest digit size ${t.type.digitsPt} pt is below the template's own minimum of ${t.minimums.digitPt} pt` });
  });

export type PageTemplate = z.infer<typeof pageTemplateSchema>;

/** The press spec a template gives a publication that sets none of its own. */
export function templatePressDefaults(t: PageTemplate): Omit<PressSettings, 'profileSha256'> {
  return {
    standard: t.press?.standard ?? 'pdfx-1a',
    condition: t.press?.condition ?? 'FOGRA39',
    bleedMm: t.bleedMm,
    minTypePt: t.press?.minTypePt ?? Math.min(t.minimums.digitPt, t.minimums.bodyPt),
    minLinePt: t.press?.minLinePt ?? HAIRLINE_PT,
  };
}

/** Derived measurements of a template, in millimetres. */
export function templateGeometry(t: PageTemplate) {
  const contentWidthMm = t.trim.widthMm - t.marginsMm.left - t.marginsMm.right;
  const contentHeightMm = t.trim.heightMm - t.marginsMm.top - t.marginsMm.bottom;
  const columnWidthMm = (contentWidthMm - (t.columns - 1) * t.gutterMm) / t.columns;
  return {
    pageWidthMm: t.trim.widthMm + 2 * t.bleedMm,
    pageHeightMm: t.trim.heightMm + 2 * t.bleedMm,
    contentWidthMm,
    contentHeightMm,
    columnWidthMm,
  };
}

/** Summary served by GET /api/templates. */
export const templateSummarySchema = z.object({
  template: pageTemplateSchema,
  pageWidthMm: z.number(),
  pageHeightMm: z.number(),
  columnWidthMm: z.number(),
});
export type TemplateSummary = z.infer<typeof templateSummarySchema>;

export const templateListResponseSchema = z.object({ templates: z.array(templateSummarySchema) });
export type TemplateListResponse = z.infer<typeof templateListResponseSchema>;

/** Turns zod issues into "field.path: message" lines for error reports. */
export function describeTemplateIssues(error: z.ZodError): string[] {
  return error.issues.map((i) => `${i.path.length > 0 ? i.path.join('.') : '(top level)'}: ${i.message}`);
}
