import { z } from 'zod';
import { preflightSchema } from './preflight';

// ---- Rich text (tiptap / ProseMirror JSON) -------------------------------------------
// Stored as JSON and rendered by our own print layout, so the accepted shape is narrow:
// paragraphs, headings, bullet and ordered lists, hard breaks, bold and italic.

export type RichTextNode = {
  type: string;
  text?: string | undefined;
  attrs?: Record<string, unknown> | undefined;
  marks?: { type: string; attrs?: Record<string, unknown> | undefined }[] | undefined;
  content?: RichTextNode[] | undefined;
};

export const RICH_TEXT_NODE_TYPES = ['doc', 'paragraph', 'heading', 'text', 'bulletList', 'orderedList', 'listItem', 'hardBreak'] as const;
export const RICH_TEXT_MARK_TYPES = ['bold', 'italic'] as const;

export const richTextNodeSchema: z.ZodType<RichTextNode> = z.lazy(() =>
  z.object({
    type: z.enum(RICH_TEXT_NODE_TYPES, { error: `node type must be one of ${RICH_TEXT_NODE_TYPES.join(', ')}` }),
    text: z.string().max(20_000).optional(),
    attrs: z.record(z.string(), z.unknown()).optional(),
    marks: z
      .array(z.object({ type: z.enum(RICH_TEXT_MARK_TYPES, { error: `mark must be one of ${RICH_TEXT_MARK_TYPES.join(', ')}` }), attrs: z.record(z.string(), z.unknown()).optional() }))
      .max(8)
      .optional(),
    content: z.array(richTextNodeSchema).max(2000).optional(),
  }),
);

/** Nodes nested deeper than this (doc > list > item > list > ... > text) are refused with 422. */
export const MAX_RICH_TEXT_DEPTH = 16;

/** The path of the first node nested deeper than MAX_RICH_TEXT_DEPTH (iterative), or null. */
export function richTextTooDeep(doc: RichTextNode): (string | number)[] | null {
  const stack: { node: RichTextNode; depth: number; path: (string | number)[] }[] = [{ node: doc, depth: 1, path: [] }];
  for (let e = stack.pop(); e !== undefined; e = stack.pop()) {
    if (e.depth > MAX_RICH_TEXT_DEPTH) return e.path;
    (e.node.content ?? []).forEach((child, i) => stack.push({ node: child, depth: e.depth + 1, path: [...e.path, 'content', i] }));
  }
  return null;
}

export const richTextDocSchema = z
  .object({ type: z.literal('doc', { error: 'a rich text document starts with type "doc"' }), content: z.array(richTextNodeSchema).max(2000).default([]) })
  .refine((d) => JSON.stringify(d).length <= 100_000, 'rich text may be at most 100 000 characters of JSON')
  // too deep is well-formed but more than the editor and the print layout hold: 422 (params.status)
  .superRefine((d, ctx) => {
    const at = richTextTooDeep(d);
    if (at) ctx.addIssue({ code: 'custom', path: at, params: { status: 422 }, message: `rich text may nest at most ${MAX_RICH_TEXT_DEPTH} levels (lists within lists)` });
  });
export type RichTextDoc = z.infer<typeof richTextDocSchema>;

export const emptyRichText = (): RichTextDoc => ({ type: 'doc', content: [] });

/** A doc with one paragraph per string (demo data, tests). */
export function plainRichText(...paragraphs: string[]): RichTextDoc {
  return { type: 'doc', content: paragraphs.map((p) => ({ type: 'paragraph', content: p ? [{ type: 'text', text: p }] : [] })) };
}

/** Plain text of a rich text doc (search, mail bodies, tests). */
export function richTextToPlain(node: RichTextNode): string {
  if (node.type === 'text') return node.text ?? '';
  if (node.type === 'hardBreak') return '\n';
  const inner = (node.content ?? []).map(richTextToPlain);
  const block = ['paragraph', 'heading', 'listItem'].includes(node.type);
  return block ? `${inner.join('')}\n` : inner.join('');
}

// ---- Editions ----------------------------------------------------------------------------

export const editionStates = ['draft', 'in_proof', 'approved', 'published'] as const;
export const editionStateSchema = z.enum(editionStates);
export type EditionState = z.infer<typeof editionStateSchema>;

/** Words for the state badges (text, never colour alone). */
export const editionStateLabels: Record<EditionState, string> = {
  draft: 'Draft',
  in_proof: 'In proof',
  approved: 'Approved',
  published: 'Published',
};

/** A calendar date, YYYY-MM-DD (and a real one). */
export const editionDateSchema = z
  .string({ error: 'date must be a string YYYY-MM-DD' })
  .regex(/^\d{4}-(0[1-9]|1[0-2])-(0[1-9]|[12]\d|3[01])$/, 'date must be YYYY-MM-DD')
  // zod runs this check even when the pattern failed: only a YYYY-MM-DD string is a candidate
  // (new Date('xT00:00:00Z').toISOString() throws a RangeError)
  .refine((v) => {
    if (!/^\d{4}-\d{2}-\d{2}$/.test(v)) return true;
    const d = new Date(`${v}T00:00:00Z`);
    return !Number.isNaN(d.getTime()) && d.toISOString().startsWith(v);
  }, 'date does not exist in the calendar');

export const MAX_SLOTS = 60;

export const slotInputSchema = z
  .object({
    puzzleId: z.string({ error: 'puzzleId is required' }).min(1, 'puzzleId must not be empty').max(100),
    instructions: richTextDocSchema.default({ type: 'doc', content: [] }),
  })
  .strict();
export type SlotInput = z.infer<typeof slotInputSchema>;

const slotsSchema = z
  .array(slotInputSchema)
  .max(MAX_SLOTS, `an edition holds at most ${MAX_SLOTS} slots`)
  .superRefine((slots, ctx) => {
    const seen = new Map<string, number>();
    slots.forEach((s, i) => {
      const first = seen.get(s.puzzleId);
      if (first !== undefined) ctx.addIssue({ code: 'custom', path: [i, 'puzzleId'], message: `puzzle ${s.puzzleId} is already in slot ${first + 1}` });
      else seen.set(s.puzzleId, i);
    });
  });

const editionNumberSchema = z.number({ error: 'number must be a whole number' }).int('number must be a whole number').min(1, 'number must be at least 1').max(1_000_000);

export const editionCreateSchema = z
  .object({
    publicationId: z.string({ error: 'publicationId is required' }).min(1).max(100),
    number: editionNumberSchema,
    date: editionDateSchema,
    introduction: richTextDocSchema.optional(),
  })
  .strict();
export type EditionCreate = z.infer<typeof editionCreateSchema>;

/** Changes to a draft; `slots` replaces the whole list (add, remove and reorder in one). */
export const editionPatchSchema = z
  .object({
    number: editionNumberSchema.optional(),
    date: editionDateSchema.optional(),
    introduction: richTextDocSchema.optional(),
    slots: slotsSchema.optional(),
  })
  .strict()
  .refine((p) => Object.keys(p).length > 0, 'send at least one field to change');
export type EditionPatch = z.infer<typeof editionPatchSchema>;

export const editionIdParamsSchema = z.object({ id: z.string().min(1).max(100) });
export const proofParamsSchema = z.object({
  id: z.string().min(1).max(100),
  version: z.coerce.number({ error: 'version must be a whole number' }).int('version must be a whole number').min(1, 'version must be at least 1'),
});
export const proofFileParamsSchema = z.object({
  id: z.string().min(1).max(100),
  file: z.string().regex(/^[1-9]\d{0,5}\.pdf$/, 'the file is <version>.pdf, for example 1.pdf'),
});

export const returnProofSchema = z
  .object({ notes: z.string({ error: 'notes are required' }).trim().min(1, 'say what needs changing').max(4000, 'notes may be at most 4000 characters') })
  .strict();
export type ReturnProof = z.infer<typeof returnProofSchema>;

export const editionListQuerySchema = z.object({
  month: z.string().regex(/^\d{4}-(0[1-9]|1[0-2])$/, 'month must be YYYY-MM').optional(),
  publicationId: z.string().min(1).max(100).optional(),
  state: editionStateSchema.optional(),
});
export type EditionListQuery = z.infer<typeof editionListQuerySchema>;

// The preflight report (PDF/X facts per page, error codes) lives in ./preflight.ts.
export { preflightSchema, type PreflightReport } from './preflight';

export const proofStatusSchema = z.enum(['pending', 'approved', 'returned', 'superseded']);
export type ProofStatus = z.infer<typeof proofStatusSchema>;

export const proofSchema = z.object({
  version: z.number().int(),
  sha256: z.string().regex(/^[0-9a-f]{64}$/),
  bytes: z.number().int(),
  pages: z.number().int(),
  status: proofStatusSchema,
  notes: z.string().nullable(),
  createdAt: z.string(),
  createdByName: z.string().nullable(),
  decidedAt: z.string().nullable(),
  decidedByName: z.string().nullable(),
  preflight: preflightSchema,
});
export type Proof = z.infer<typeof proofSchema>;

export const pressFileSchema = z.object({
  version: z.number().int(),
  sha256: z.string().regex(/^[0-9a-f]{64}$/),
  bytes: z.number().int(),
  pages: z.number().int(),
  createdAt: z.string(),
});
export type PressFile = z.infer<typeof pressFileSchema>;

export const slotPuzzleSchema = z.object({
  kind: z.enum(['assembly', 'deduction']),
  title: z.string(),
  grade: z.number().int(),
  size: z.string(),
  certificateCurrent: z.boolean(),
});

export const slotSchema = z.object({
  position: z.number().int().min(1),
  puzzleId: z.string(),
  instructions: richTextDocSchema,
  /** null when the puzzle cannot be found (deleted, or the puzzle store is not wired) */
  puzzle: slotPuzzleSchema.nullable(),
});
export type Slot = z.infer<typeof slotSchema>;

// ---- Guards and their overrides -------------------------------------------------------------

/** A reason given for going ahead although a guard refused (recorded with who and when). */
export const overrideSchema = z
  .object({ reason: z.string({ error: 'reason is required' }).trim().min(5, 'say why in a few words (at least 5 characters)').max(2000, 'reason may be at most 2000 characters') })
  .strict();
export type Override = z.infer<typeof overrideSchema>;

/**
 * POST /api/editions/:id/proofs. `updatedAt` is the edition's updatedAt as the composer
 * last loaded or saved it: the server sends only that saved state (409 when it changed).
 * `override` lets preflight errors through, with a reason.
 */
export const sendProofSchema = z
  .object({
    updatedAt: z.string().max(40).optional(),
    override: overrideSchema.optional(),
  })
  .strict();
export type SendProof = z.infer<typeof sendProofSchema>;

/** POST /api/editions/:id/publish. `override` (admins only) publishes before the date or ahead of an earlier edition. */
export const publishSchema = z.object({ override: overrideSchema.optional() }).strict();
export type PublishRequest = z.infer<typeof publishSchema>;

export const overrideKindSchema = z.enum(['preflight', 'publish-early', 'publish-out-of-order']);
export type OverrideKind = z.infer<typeof overrideKindSchema>;
export const overrideKindLabels: Record<OverrideKind, string> = {
  preflight: 'Sent to proof despite preflight errors',
  'publish-early': 'Published before its date',
  'publish-out-of-order': 'Published ahead of an earlier edition',
};

export const editionOverrideSchema = z.object({
  kind: overrideKindSchema,
  reason: z.string(),
  /** what the guard said when it refused */
  refused: z.string(),
  proofVersion: z.number().int().nullable(),
  byName: z.string().nullable(),
  at: z.string(),
});
export type EditionOverride = z.infer<typeof editionOverrideSchema>;

/** Why publishing is refused now (an admin may override each with a reason). */
export const publishBlockerSchema = z.object({ code: z.enum(['early', 'out-of-order']), message: z.string() });
export type PublishBlocker = z.infer<typeof publishBlockerSchema>;

/** GET /api/editions/:id/publish-check: what publishing would do, and what stands in its way. */
export const publishCheckSchema = z.object({
  date: z.string(),
  today: z.string(),
  blockers: z.array(publishBlockerSchema),
  fees: z.object({
    currency: z.string(),
    totalMinor: z.number().int(),
    entries: z.array(z.object({ slot: z.number().int(), title: z.string(), kind: z.enum(['assembly', 'deduction']), setterName: z.string().nullable(), amountMinor: z.number().int() })),
  }),
});
export type PublishCheck = z.infer<typeof publishCheckSchema>;

/** An edition as the desk (editor, admin) sees it. */
export const editionSchema = z.object({
  id: z.string(),
  publicationId: z.string(),
  publicationTitle: z.string(),
  templateId: z.string(),
  number: z.number().int(),
  date: z.string(),
  state: editionStateSchema,
  introduction: richTextDocSchema,
  slots: z.array(slotSchema),
  returnNotes: z.string().nullable(),
  proofs: z.array(proofSchema),
  pressFile: pressFileSchema.nullable(),
  publishedAt: z.string().nullable(),
  /** guards an editor or admin went past, with their reasons */
  overrides: z.array(editionOverrideSchema),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Edition = z.infer<typeof editionSchema>;

/** An edition as a printer sees it: the files and their history, nothing of the stock, setters or fees. */
export const printerEditionSchema = z.object({
  id: z.string(),
  publicationTitle: z.string(),
  templateId: z.string(),
  number: z.number().int(),
  date: z.string(),
  state: editionStateSchema,
  proofs: z.array(proofSchema),
  pressFile: pressFileSchema.nullable(),
});
export type PrinterEdition = z.infer<typeof printerEditionSchema>;

export const editionSummarySchema = z.object({
  id: z.string(),
  publicationId: z.string(),
  publicationTitle: z.string(),
  number: z.number().int(),
  date: z.string(),
  state: editionStateSchema,
  slotCount: z.number().int(),
  latestProofVersion: z.number().int().nullable(),
  latestProofAt: z.string().nullable(),
  latestProofPages: z.number().int().nullable(),
  latestProofStatus: proofStatusSchema.nullable(),
  latestPreflightOk: z.boolean().nullable(),
  latestWarnings: z.number().int().nullable(),
  returnNotes: z.string().nullable(),
  hasPressFile: z.boolean(),
});
export type EditionSummary = z.infer<typeof editionSummarySchema>;

export const editionListSchema = z.object({ items: z.array(editionSummarySchema) });
export type EditionList = z.infer<typeof editionListSchema>;

export const editionCheckSchema = z.object({
  code: z.enum(['has-slots', 'certificate', 'reuse', 'solution-once', 'fits-template', 'legibility', 'puzzle-found']),
  ok: z.boolean(),
  message: z.string(),
  slot: z.number().int().optional(),
  /** a failed check the editor may override with a reason when sending to proof (the preflight's errors) */
  overridable: z.boolean().optional(),
});
export type EditionCheck = z.infer<typeof editionCheckSchema>;

export const editionChecksSchema = z.object({ ok: z.boolean(), checks: z.array(editionCheckSchema), preflight: preflightSchema.nullable() });
export type EditionChecks = z.infer<typeof editionChecksSchema>;

/** GET /api/editions/due (editor): editions dated within the next days (or past their date) and not yet published, with what each still needs. */
export const dueEditionSchema = z.object({
  id: z.string(),
  publicationTitle: z.string(),
  number: z.number().int(),
  date: z.string(),
  /** days from today to the edition's date (negative: overdue) */
  daysLeft: z.number().int(),
  state: editionStateSchema,
  /** what it still needs, in words ("2 more puzzles", "send it to proof", "the printer's answer on proof v2") */
  needs: z.array(z.string()),
});
export type DueEdition = z.infer<typeof dueEditionSchema>;
export const dueEditionsSchema = z.object({ days: z.number().int(), items: z.array(dueEditionSchema) });
export const dueEditionsQuerySchema = z.object({ days: z.coerce.number({ error: 'days must be a whole number' }).int('days must be a whole number').min(1).max(90).default(14) }).strict();

/** Which moves the server allows (also used by the client to show only possible actions). */
export const editionTransitions: Record<EditionState, EditionState[]> = {
  draft: ['in_proof'],
  in_proof: ['approved', 'draft'],
  approved: ['published'],
  published: [],
};

export function canMove(from: EditionState, to: EditionState): boolean {
  return editionTransitions[from].includes(to);
}
