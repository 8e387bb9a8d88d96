import { richTextProblems, type RichTextProblem } from '../../../shared/rich-text/editor-schema';
import { Unprocessable } from './errors';

// Rich text in request bodies is checked against the editor's own schema (the tiptap
// extensions of the client's editor, shared/rich-text/editor-schema.ts) after the zod contract
// has parsed it. A rich text document is what richTextDocSchema (shared/contracts/editions.ts)
// parses: an object whose `type` is 'doc' with a `content` list; no other contract uses that
// type. route() calls this for every body; a document the editor could not hold is a 422
// saying where, and nothing is stored.

const MAX_WALK = 100_000;

/** Every rich text document inside a parsed body, with its path ('body.slots.2.instructions'). */
export function richTextDocsIn(value: unknown, root: string): { doc: unknown; path: string }[] {
  const out: { doc: unknown; path: string }[] = [];
  const stack: { v: unknown; path: string }[] = [{ v: value, path: root }];
  let seen = 0;
  for (let e = stack.pop(); e !== undefined && seen < MAX_WALK; e = stack.pop(), seen += 1) {
    const v = e.v;
    if (v === null || typeof v !== 'object') continue;
    if (!Array.isArray(v) && (v as { type?: unknown }).type === 'doc' && Array.isArray((v as { content?: unknown }).content)) {
      out.push({ doc: v, path: e.path });
      continue;
    }
    const entries: [string, unknown][] = Array.isArray(v) ? v.map((x, i) => [String(i), x]) : Object.entries(v);
    for (const [k, x] of entries) stack.push({ v: x, path: `${e.path}.${k}` });
  }
  return out.reverse();
}

/** Throws 422 naming each rich text document of `body` that the editor's schema does not allow. */
export function assertRichTextFitsEditor(body: unknown): void {
  const problems: RichTextProblem[] = [];
  for (const { doc, path } of richTextDocsIn(body, 'body')) problems.push(...richTextProblems(doc, path));
  if (problems.length === 0) return;
  const first = problems[0]!;
  throw new Unprocessable(`The rich text at ${first.path} is not one the editor can hold: ${first.message}`, problems);
}
