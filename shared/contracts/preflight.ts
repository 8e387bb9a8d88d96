import { z } from 'zod';
import { pressSettingsSchema } from './press';

// The preflight report of one PDF (a proof, a press file, a placeable graphic). `ok` is
// false exactly when there is an error; errors come first in `warnings`, each code
// prefixed `error:` (the codes: README, "Press files"). The
// fields after `warnings` came with PDF/X (issue 17): reports stored before have none.

const boxSchema = z.tuple([z.number(), z.number(), z.number(), z.number()]);

export const pagePreflightSchema = z.object({
  page: z.number().int(),
  boxes: z.object({ media: boxSchema.nullable(), crop: boxSchema.nullable(), bleed: boxSchema.nullable(), trim: boxSchema.nullable(), art: boxSchema.nullable() }),
  /** TrimBox inside BleedBox inside MediaBox */
  boxesNested: z.boolean(),
  trimMm: z.object({ width: z.number(), height: z.number() }).nullable(),
  /** bleed on each side (BleedBox beyond TrimBox), mm */
  bleedMm: z.object({ left: z.number(), bottom: z.number(), right: z.number(), top: z.number() }).nullable(),
  colourSpaces: z.array(z.string()),
  fonts: z.array(z.object({ name: z.string(), subtype: z.string(), embedded: z.boolean() })),
  smallestTypePt: z.number().nullable(),
  thinnestLinePt: z.number().nullable(),
  /** text or lines painted in a colour that is not on the black plate only */
  offBlackPlate: z.number().int(),
  transparency: z.boolean(),
});
export type PagePreflight = z.infer<typeof pagePreflightSchema>;

export const pdfxFactsSchema = z.object({
  /** Info /GTS_PDFXVersion, null when missing */
  version: z.string().nullable(),
  pdfVersion: z.string(),
  title: z.string().nullable(),
  trapped: z.string().nullable(),
  documentId: z.string().nullable(),
  xmp: z.boolean(),
  outputIntent: z
    .object({ identifier: z.string().nullable(), condition: z.string().nullable(), registry: z.string().nullable(), profileEmbedded: z.boolean() })
    .nullable(),
});
export type PdfxFacts = z.infer<typeof pdfxFactsSchema>;

export const preflightSchema = z.object({
  ok: z.boolean(),
  templateId: z.string(),
  pages: z.number().int(),
  trimMm: z.object({ width: z.number(), height: z.number() }),
  bleedMm: z.number(),
  pageSizePt: z.object({ width: z.number(), height: z.number() }),
  fontsRegistered: z.array(z.string()),
  embeddedFontFiles: z.number().int(),
  fontsEmbedded: z.boolean(),
  smallestSquareMm: z.number().nullable(),
  smallestDigitPt: z.number().nullable(),
  omittedLabels: z.array(z.object({ slot: z.number().int(), where: z.enum(['puzzle', 'solution']), size: z.number().int() })),
  warnings: z.array(z.object({ code: z.string(), message: z.string() })),
  // ---- PDF/X (issue 17) ----
  spec: pressSettingsSchema.optional(),
  pdfx: pdfxFactsSchema.optional(),
  smallestTypePt: z.number().nullable().optional(),
  thinnestLinePt: z.number().nullable().optional(),
  pageReports: z.array(pagePreflightSchema).optional(),
});
export type PreflightReport = z.infer<typeof preflightSchema>;
