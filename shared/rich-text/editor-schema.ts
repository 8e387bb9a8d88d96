import { getSchema, type AnyExtension } from '@tiptap/core';
import { Node as PmNode, type Schema } from '@tiptap/pm/model';
import StarterKit from '@tiptap/starter-kit';

// The rich text editor's own schema, shared by the client's editor (its extensions) and the
// server (which checks every stored document against it). Built from the same tiptap
// extensions by tiptap's getSchema, without a DOM. What the print layout renders, no more:
// paragraphs, headings (levels 2 and 3), bullet and numbered lists, hard breaks, bold, italic.

export const RICH_TEXT_HEADING_LEVELS = [2, 3] as const;

/** The extensions of the editor (src/features/editions/components/rich-text-editor.tsx uses these). */
export const richTextExtensions: AnyExtension[] = [
  StarterKit.configure({
    blockquote: false,
    code: false,
    codeBlock: false,
    horizontalRule: false,
    strike: false,
    underline: false,
    link: false,
    heading: { levels: [...RICH_TEXT_HEADING_LEVELS] },
  }),
];

let schema: Schema | undefined;
/** The ProseMirror schema of the editor (built once, on first use). */
export function richTextSchema(): Schema {
  schema ??= getSchema(richTextExtensions);
  return schema;
}

export type RichTextProblem = { path: string; message: string };

type JsonNode = { type?: unknown; attrs?: unknown; content?: unknown };

/** Attribute values the schema's types cannot express: heading levels, list starts. */
function attrProblems(node: JsonNode, path: string, out: RichTextProblem[]): void {
  const attrs = node.attrs !== null && typeof node.attrs === 'object' ? (node.attrs as Record<string, unknown>) : {};
  if (node.type === 'heading' && 'level' in attrs && !(RICH_TEXT_HEADING_LEVELS as readonly unknown[]).includes(attrs.level)) {
    out.push({ path: `${path}.attrs.level`, message: `a heading has level ${RICH_TEXT_HEADING_LEVELS.join(' or ')}` });
  }
  if (node.type === 'orderedList' && 'start' in attrs && !(Number.isInteger(attrs.start) && (attrs.start as number) >= 1 && (attrs.start as number) <= 100_000)) {
    out.push({ path: `${path}.attrs.start`, message: 'a numbered list starts at a whole number from 1' });
  }
  if (Array.isArray(node.content)) {
    node.content.forEach((child: unknown, i) => {
      if (child !== null && typeof child === 'object') attrProblems(child as JsonNode, `${path}.content.${i}`, out);
    });
  }
}

/** Where the first node that breaks the schema sits: ProseMirror names the parent type in its message. */
function locate(doc: JsonNode, path: string, s: Schema): string {
  // walk down while a child still parses on its own but its parent does not accept the children
  let node = doc;
  let at = path;
  for (;;) {
    const content = Array.isArray(node.content) ? (node.content as JsonNode[]) : [];
    const bad = content.findIndex((child) => {
      try {
        PmNode.fromJSON(s, child).check();
        return false;
      } catch {
        return true;
      }
    });
    if (bad < 0) return at;
    node = content[bad]!;
    at = `${at}.content.${bad}`;
  }
}

/**
 * Problems of a rich text document (already of the contract's shape) against the editor's
 * schema: node types where they may not stand ("a doc inside a paragraph"), empty text nodes,
 * marks a node may not carry, attribute values the editor cannot make. An empty document
 * (`{ type: 'doc', content: [] }`, the contract's default) is allowed: the editor opens it as
 * one empty paragraph. `path` is where the document sits in the request, e.g. 'body.introduction'.
 */
export function richTextProblems(doc: unknown, path: string): RichTextProblem[] {
  if (doc === null || typeof doc !== 'object') return [{ path, message: 'a rich text document is an object' }];
  const d = doc as JsonNode;
  if (d.type === 'doc' && Array.isArray(d.content) && d.content.length === 0) return [];
  const s = richTextSchema();
  const out: RichTextProblem[] = [];
  try {
    PmNode.fromJSON(s, d).check();
  } catch (err) {
    const reason = err instanceof Error ? err.message : String(err);
    out.push({ path: locate(d, path, s), message: `the editor cannot hold this: ${reason.length > 160 ? `${reason.slice(0, 157)}...` : reason}` });
  }
  attrProblems(d, path, out);
  return out;
}
