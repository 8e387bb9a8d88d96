import type { RichTextNode } from '../../../shared/contracts/editions';

// HTML for the readers' server-rendered pages: escaping, a tagged template that escapes
// every value it is given (raw HTML only through `raw`), and the editions' rich text
// (tiptap JSON: paragraphs, headings, lists, hard breaks, bold and italic) as HTML.

const escapes: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => escapes[c]!);
}

/** Markup that is already safe (built by `html` or by the functions here). */
export class Raw {
  constructor(readonly text: string) {}
  toString(): string {
    return this.text;
  }
}
export const raw = (text: string) => new Raw(text);

type Value = string | number | Raw | null | undefined | false | readonly Value[];

function render(v: Value): string {
  if (v === null || v === undefined || v === false) return '';
  if (v instanceof Raw) return v.text;
  if (Array.isArray(v)) return v.map(render).join('');
  return escapeHtml(String(v));
}

/** html`<p>${text}</p>`: every interpolated value is escaped unless it is Raw (or a list of them). */
export function html(strings: TemplateStringsArray, ...values: Value[]): Raw {
  let out = strings[0] ?? '';
  values.forEach((v, i) => {
    out += render(v) + (strings[i + 1] ?? '');
  });
  return new Raw(out);
}

/** JSON for a <script type="application/json"> block: '<' escaped so no text can close the element. */
export function jsonForScript(value: unknown): Raw {
  return raw(JSON.stringify(value).replace(/</g, '\\u003c').replace(/\u2028/g, '\\u2028').replace(/\u2029/g, '\\u2029'));
}

function marksOf(node: RichTextNode, text: string): string {
  let out = escapeHtml(text);
  for (const m of node.marks ?? []) {
    if (m.type === 'bold') out = `<strong>${out}</strong>`;
    else if (m.type === 'italic') out = `<em>${out}</em>`;
  }
  return out;
}

function nodeHtml(node: RichTextNode, headingBase: number): string {
  const inner = () => (node.content ?? []).map((c) => nodeHtml(c, headingBase)).join('');
  switch (node.type) {
    case 'text':
      return marksOf(node, node.text ?? '');
    case 'hardBreak':
      return '<br>';
    case 'paragraph':
      return `<p>${inner()}</p>`;
    case 'heading': {
      const level = typeof node.attrs?.level === 'number' ? node.attrs.level : 1;
      const h = Math.min(6, Math.max(headingBase, headingBase + level - 1));
      return `<h${h}>${inner()}</h${h}>`;
    }
    case 'bulletList':
      return `<ul>${inner()}</ul>`;
    case 'orderedList':
      return `<ol>${inner()}</ol>`;
    case 'listItem':
      return `<li>${inner()}</li>`;
    default:
      // a node type we do not draw keeps its text
      return inner();
  }
}

/** Rich text as HTML; its headings start at `headingBase` (so they sit under the page's own). */
export function richTextHtml(doc: { content?: RichTextNode[] | undefined }, headingBase = 3): Raw {
  return raw((doc.content ?? []).map((n) => nodeHtml(n, headingBase)).join(''));
}
