// A PDF content stream read as operators with their operands (PDF 32000-1, 7.8.2 and
// annex A): what the press post-processing rewrites (colour operators) and what the
// preflight interprets (sizes, line weights, colours). Strings are kept as their raw
// text; nothing here changes a byte it does not have to.

export type Operand =
  | { t: 'num'; v: number; raw: string }
  | { t: 'name'; v: string; raw: string }
  | { t: 'str'; raw: string }
  | { t: 'bool'; v: boolean; raw: string }
  | { t: 'null'; raw: string }
  | { t: 'array'; items: Operand[]; raw: string }
  | { t: 'dict'; raw: string };

export type ContentOp = {
  op: string;
  operands: Operand[];
  /** where the operator and its operands start and end in the stream's text */
  start: number;
  end: number;
};

const WS = new Set([0x00, 0x09, 0x0a, 0x0c, 0x0d, 0x20]);
const DELIM = new Set(['(', ')', '<', '>', '[', ']', '{', '}', '/', '%']);

function isWs(c: string | undefined): boolean {
  return c !== undefined && WS.has(c.charCodeAt(0));
}

function isRegular(c: string | undefined): boolean {
  return c !== undefined && !isWs(c) && !DELIM.has(c);
}

/** The content stream's bytes as text, one character per byte (latin1). */
export function contentText(bytes: Uint8Array): string {
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('latin1');
}

class Reader {
  i = 0;
  constructor(readonly s: string) {}

  skipSpace() {
    const s = this.s;
    while (this.i < s.length) {
      const c = s[this.i];
      if (isWs(c)) this.i++;
      else if (c === '%') {
        while (this.i < s.length && s[this.i] !== '\n' && s[this.i] !== '\r') this.i++;
      } else break;
    }
  }

  literalString(): string {
    const s = this.s;
    const start = this.i;
    let depth = 0;
    while (this.i < s.length) {
      const c = s[this.i++];
      if (c === '\\') this.i++;
      else if (c === '(') depth++;
      else if (c === ')') {
        depth--;
        if (depth === 0) return s.slice(start, this.i);
      }
    }
    throw new Error(`content stream: unterminated string at ${start}`);
  }

  until(close: string): string {
    const end = this.s.indexOf(close, this.i);
    if (end < 0) throw new Error(`content stream: missing ${close} after ${this.i}`);
    const raw = this.s.slice(this.i, end + close.length);
    this.i = end + close.length;
    return raw;
  }

  dict(): string {
    const s = this.s;
    const start = this.i;
    let depth = 0;
    while (this.i < s.length) {
      if (s.startsWith('<<', this.i)) {
        depth++;
        this.i += 2;
      } else if (s.startsWith('>>', this.i)) {
        depth--;
        this.i += 2;
        if (depth === 0) return s.slice(start, this.i);
      } else if (s[this.i] === '(') this.literalString();
      else this.i++;
    }
    throw new Error(`content stream: unterminated dictionary at ${start}`);
  }

  word(): string {
    const start = this.i;
    while (this.i < this.s.length && isRegular(this.s[this.i])) this.i++;
    return this.s.slice(start, this.i);
  }

  /** One operand, or an operator name (returned as a string), or null at the end. */
  next(): Operand | string | null {
    this.skipSpace();
    const s = this.s;
    if (this.i >= s.length) return null;
    const c = s[this.i]!;
    const start = this.i;
    if (c === '(') return { t: 'str', raw: this.literalString() };
    if (c === '<') {
      if (s[this.i + 1] === '<') return { t: 'dict', raw: this.dict() };
      return { t: 'str', raw: this.until('>') };
    }
    if (c === '[') {
      this.i++;
      const items: Operand[] = [];
      for (;;) {
        this.skipSpace();
        if (s[this.i] === ']') {
          this.i++;
          return { t: 'array', items, raw: s.slice(start, this.i) };
        }
        const item = this.next();
        if (item === null) throw new Error(`content stream: unterminated array at ${start}`);
        if (typeof item === 'string') throw new Error(`content stream: operator ${item} inside an array at ${start}`);
        items.push(item);
      }
    }
    if (c === '/') {
      this.i++;
      const name = this.word();
      return { t: 'name', v: name.replace(/#([0-9a-fA-F]{2})/g, (_, h: string) => String.fromCharCode(parseInt(h, 16))), raw: s.slice(start, this.i) };
    }
    if (c === ']' || c === ')' || c === '>' || c === '{' || c === '}') {
      throw new Error(`content stream: unexpected ${c} at ${start}`);
    }
    const w = this.word();
    if (w === '') throw new Error(`content stream: unreadable byte at ${start}`);
    if (/^[+-]?(\d+\.?\d*|\.\d+)$/.test(w)) return { t: 'num', v: Number(w), raw: w };
    if (w === 'true' || w === 'false') return { t: 'bool', v: w === 'true', raw: w };
    if (w === 'null') return { t: 'null', raw: w };
    return w;
  }
}

/** Reads a content stream into its operators (inline images are kept whole as one `BI` operator). */
export function parseContent(text: string): ContentOp[] {
  const r = new Reader(text);
  const ops: ContentOp[] = [];
  let operands: Operand[] = [];
  let start = -1;
  for (;;) {
    r.skipSpace();
    const at = r.i;
    const tok = r.next();
    if (tok === null) break;
    if (start < 0) start = at;
    if (typeof tok !== 'string') {
      operands.push(tok);
      continue;
    }
    if (tok === 'BI') {
      // an inline image: its data runs from ID to the EI that stands alone
      const m = /\sEI(?=[\s]|$)/g;
      m.lastIndex = text.indexOf('ID', r.i);
      const hit = m.exec(text);
      if (!hit) throw new Error(`content stream: inline image without EI at ${at}`);
      r.i = hit.index + hit[0].length;
      ops.push({ op: 'BI', operands: [], start, end: r.i });
    } else {
      ops.push({ op: tok, operands, start, end: r.i });
    }
    operands = [];
    start = -1;
  }
  if (operands.length > 0) throw new Error('content stream: operands without an operator at the end');
  return ops;
}

export function num(o: Operand | undefined): number {
  if (!o || o.t !== 'num') throw new Error(`content stream: expected a number, got ${o ? o.raw : 'nothing'}`);
  return o.v;
}

export type Matrix = [number, number, number, number, number, number];
export const IDENTITY: Matrix = [1, 0, 0, 1, 0, 0];

/** m x n (apply m, then n), PDF's row-vector convention (8.3.4). */
export function multiply(m: Matrix, n: Matrix): Matrix {
  return [
    m[0] * n[0] + m[1] * n[2],
    m[0] * n[1] + m[1] * n[3],
    m[2] * n[0] + m[3] * n[2],
    m[2] * n[1] + m[3] * n[3],
    m[4] * n[0] + m[5] * n[2] + n[4],
    m[4] * n[1] + m[5] * n[3] + n[5],
  ];
}

/** How much a matrix scales a length along a unit vector (dx, dy) of user space. */
export function scaleAlong(m: Matrix, dx: number, dy: number): number {
  return Math.hypot(dx * m[0] + dy * m[2], dx * m[1] + dy * m[3]);
}
