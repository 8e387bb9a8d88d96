import { z } from 'zod';

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

export const richTextDocSchema = z
  .object({ type: z.literal('doc', { error: 'a rich text document starts with type "doc"' }), content: z.array(richTextNodeSchema).max(2000).default([]) })
  .refine((d) => JSON.stringify(d).length <= 100_000, 'rich text may be at most 100 000 characters of JSON');
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
