// Reading tilings from outside: Bouwkamp code (with or without the "order width height"
// header; groups in (), [] or {}; commas or spaces; a caption after '*' ignored), table code
// (the same sizes without brackets) and explicit squares. Decoding places each size at the
// highest, then leftmost, free point of the skyline (S. E. Anderson, squaring.net, "Bouwkamp
// code"); a bracket group must fill its free segment exactly. Every problem is a
// TilingInputError that says what and where; sizes, counts and input length are bounded.

import { TilingInputError } from './errors';
import { MAX_SIDE, MAX_SQUARES, verifyTiling } from './verify';
import { readFast } from './read-fast';
import { core } from './tiling-core';
import type { Square, Tiling } from './types';

export const MAX_INPUT_LENGTH = 65_536;
/** Widths tried for table code without a header (each try is one decode). */
export const MAX_WIDTH_GUESSES = 64;

interface Token {
  kind: 'num' | 'open' | 'close';
  value: number;
  column: number;
  ch: string;
}

const CLOSE_OF: Record<string, string> = { '(': ')', '[': ']', '{': '}' };

function position(input: string, offset: number): { line: number; column: number } {
  let line = 1;
  let lineStart = 0;
  for (let i = 0; i < offset; i++) {
    if (input.charCodeAt(i) === 10) {
      line++;
      lineStart = i + 1;
    }
  }
  return { line, column: offset - lineStart + 1 };
}

function at(input: string, offset: number): string {
  const p = position(input, offset);
  return p.line > 1 ? `line ${p.line}, column ${p.column}` : `column ${p.column}`;
}

function tokenize(input: string, end: number): Token[] {
  const tokens: Token[] = [];
  let i = 0;
  while (i < end) {
    const c = input.charCodeAt(i);
    if (c === 32 || c === 44 || c === 9 || c === 10 || c === 13 || c === 59) {
      i++;
      continue;
    }
    if (c >= 48 && c <= 57) {
      const s = i;
      let v = 0;
      while (i < end) {
        const d = input.charCodeAt(i);
        if (d < 48 || d > 57) break;
        v = v * 10 + (d - 48);
        i++;
      }
      const next = i < end ? input.charCodeAt(i) : 0;
      if (next === 46 || next === 101 || next === 69 || (next >= 65 && next <= 90) || (next >= 97 && next <= 122) || next === 95) {
        let e = i;
        while (e < end && !/[\s,;()[\]{}]/.test(input[e]!)) e++;
        const word = input.slice(s, e);
        throw new TilingInputError('not-an-integer', `"${word}" at ${at(input, s)} is not a whole number`, position(input, s));
      }
      if (v > MAX_SIDE) {
        throw new TilingInputError('too-large', `${input.slice(s, i)} at ${at(input, s)} exceeds the limit of 2^31 (${MAX_SIDE})`, position(input, s));
      }
      tokens.push({ kind: 'num', value: v, column: s, ch: '' });
      continue;
    }
    const ch = input[i]!;
    if (ch === '(' || ch === '[' || ch === '{') {
      tokens.push({ kind: 'open', value: 0, column: i, ch });
      i++;
      continue;
    }
    if (ch === ')' || ch === ']' || ch === '}') {
      tokens.push({ kind: 'close', value: 0, column: i, ch });
      i++;
      continue;
    }
    if (ch === '-' || ch === '+') {
      const m = /^[-+]\d+/.exec(input.slice(i, Math.min(end, i + 40)));
      if (m && ch === '-') {
        throw new TilingInputError('non-positive', `${m[0]} at ${at(input, i)} is negative; sizes must be positive whole numbers`, position(input, i));
      }
    }
    let e = i + 1;
    while (e < end && !/[\s,;()[\]{}]/.test(input[e]!)) e++;
    const word = input.slice(i, Math.min(e, i + 20));
    throw new TilingInputError('not-a-number', `unexpected "${word}" at ${at(input, i)}: expected a whole number, a bracket, a comma or a space`, position(input, i));
  }
  return tokens;
}

export interface ParsedCode {
  header?: { order: number; W: number; H: number };
  sizes: number[];
  /** group number (1-based) of each size; empty when the code has no brackets (table code) */
  groupOf: number[];
  /** source offsets of each size, for messages */
  offsets: number[];
}

/** Reads the numbers and brackets of a code (no decoding). */
export function readCode(input: string): ParsedCode {
  if (typeof input !== 'string') throw new TilingInputError('not-text', 'the code must be text');
  if (input.length > MAX_INPUT_LENGTH) {
    throw new TilingInputError('too-long', `the input has ${input.length} characters; at most ${MAX_INPUT_LENGTH} (64 kB) are accepted`);
  }
  const star = input.indexOf('*');
  const end = star < 0 ? input.length : star;
  const tokens = tokenize(input, end);
  const sizes: number[] = [];
  const groupOf: number[] = [];
  const offsets: number[] = [];
  const lead: Token[] = [];
  let group = 0;
  let open: Token | null = null;
  let sawGroup = false;
  for (const tk of tokens) {
    if (tk.kind === 'open') {
      if (open) throw new TilingInputError('bad-bracket', `bracket "${tk.ch}" at ${at(input, tk.column)} opens inside group ${group}; groups cannot nest`, { ...position(input, tk.column), group });
      open = tk;
      group++;
      sawGroup = true;
      continue;
    }
    if (tk.kind === 'close') {
      if (!open) throw new TilingInputError('bad-bracket', `bracket "${tk.ch}" at ${at(input, tk.column)} closes a group that was never opened`, position(input, tk.column));
      if (CLOSE_OF[open.ch] !== tk.ch) {
        throw new TilingInputError('bad-bracket', `bracket "${tk.ch}" at ${at(input, tk.column)} does not match "${open.ch}" at ${at(input, open.column)}`, { ...position(input, tk.column), group });
      }
      if (groupOf.length === 0 || groupOf[groupOf.length - 1] !== group) {
        throw new TilingInputError('empty-group', `group ${group} at ${at(input, open.column)} is empty`, { ...position(input, open.column), group });
      }
      open = null;
      continue;
    }
    if (open) {
      sizes.push(tk.value);
      groupOf.push(group);
      offsets.push(tk.column);
    } else if (sawGroup) {
      throw new TilingInputError('outside-group', `the number ${tk.value} at ${at(input, tk.column)} stands outside any group; after the first group every size must be in brackets`, position(input, tk.column));
    } else {
      lead.push(tk);
    }
  }
  if (open) throw new TilingInputError('bad-bracket', `group ${group} opened with "${open.ch}" at ${at(input, open.column)} is never closed`, { ...position(input, open.column), group });
  let header: ParsedCode['header'];
  if (sawGroup) {
    if (lead.length === 3) header = { order: lead[0]!.value, W: lead[1]!.value, H: lead[2]!.value };
    else if (lead.length !== 0) {
      throw new TilingInputError('bad-header', `the header before the first group has ${lead.length} number(s); it must be "order width height" (3 numbers) or absent`, position(input, lead[0]!.column));
    }
  } else {
    if (lead.length === 0) throw new TilingInputError('empty', 'the input holds no sizes');
    if (lead.length >= 4 && lead[0]!.value === lead.length - 3) {
      header = { order: lead[0]!.value, W: lead[1]!.value, H: lead[2]!.value };
      lead.splice(0, 3);
    }
    for (const tk of lead) {
      sizes.push(tk.value);
      offsets.push(tk.column);
    }
  }
  if (sizes.length === 0) throw new TilingInputError('empty', 'the input holds no sizes');
  if (sizes.length > MAX_SQUARES) throw new TilingInputError('too-many', `the code lists ${sizes.length} squares; at most ${MAX_SQUARES} are accepted`);
  if (header) {
    if (header.order !== sizes.length) {
      throw new TilingInputError('header-mismatch', `the header gives order ${header.order} but the code lists ${sizes.length} sizes`, { element: 0 });
    }
    if (header.W === 0 || header.H === 0) throw new TilingInputError('non-positive', `the header's width and height must be positive (got ${header.W} x ${header.H})`);
  }
  for (let k = 0; k < sizes.length; k++) {
    if (sizes[k] === 0) {
      throw new TilingInputError('non-positive', `element ${k + 1} at ${at(input, offsets[k]!)} is 0; sizes must be positive`, elementWhere(input, offsets[k]!, k, groupOf));
    }
  }
  return header ? { header, sizes, groupOf, offsets } : { sizes, groupOf, offsets };
}

function elementWhere(input: string, offset: number, k: number, groupOf: number[]) {
  const w: { line: number; column: number; element: number; group?: number } = { ...position(input, offset), element: k + 1 };
  const g = groupOf[k];
  if (g !== undefined) w.group = g;
  return w;
}

/**
 * Decodes sizes on a W-wide frame by the highest-then-leftmost rule; H may be unknown (0).
 * Throws TilingInputError naming the element and position when a size does not fit.
 */
export function decodeSizes(sizes: readonly number[], W: number, H: number, groupOf: readonly number[] = [], describe?: (k: number) => { line?: number; column?: number }): Tiling {
  const n = sizes.length;
  // skyline: parallel arrays of segments left to right
  const sx: number[] = [0];
  const sw: number[] = [W];
  const sy: number[] = [0];
  const squares: Square[] = [];
  const grouped = groupOf.length === n;
  let gStartW = 0;
  let gStartX = 0;
  let gStartY = 0;
  let gSum = 0;
  const limitH = H > 0 ? H : Infinity;
  const where = (k: number) => {
    const w: { line?: number; column?: number; element: number; group?: number } = { ...(describe ? describe(k) : {}), element: k + 1 };
    if (grouped) w.group = groupOf[k]!;
    return w;
  };
  for (let k = 0; k < n; k++) {
    const s = sizes[k]!;
    // highest (smallest y), then leftmost free segment
    let best = 0;
    for (let i = 1; i < sy.length; i++) if (sy[i]! < sy[best]!) best = i;
    const x = sx[best]!;
    const y = sy[best]!;
    const w = sw[best]!;
    const first = grouped && (k === 0 || groupOf[k - 1] !== groupOf[k]);
    if (grouped && !first && gSum >= gStartW) {
      throw new TilingInputError(
        'group-overfull',
        `group ${groupOf[k]} already fills its free segment (${gStartW}) at x=${gStartX}, y=${gStartY}; element ${k + 1} (size ${s}) is one too many`,
        where(k),
      );
    }
    if (first) {
      gStartW = w;
      gStartX = x;
      gStartY = y;
      gSum = 0;
    }
    if (y >= limitH) {
      throw new TilingInputError('too-many-squares', `element ${k + 1} (size ${s}) has no room: the ${W} x ${H} rectangle is already full`, where(k));
    }
    if (s > w) {
      throw new TilingInputError('too-wide', `element ${k + 1} (size ${s}) is wider than the free segment (${w}) at x=${x}, y=${y}`, where(k));
    }
    if (y + s > limitH) {
      throw new TilingInputError('too-tall', `element ${k + 1} (size ${s}) at x=${x}, y=${y} reaches below the bottom of the rectangle (height ${H})`, where(k));
    }
    squares.push({ x, y, s });
    gSum += s;
    // update the skyline
    const ny = y + s;
    if (s === w) {
      sy[best] = ny;
    } else {
      sx.splice(best + 1, 0, x + s);
      sw.splice(best + 1, 0, w - s);
      sy.splice(best + 1, 0, y);
      sw[best] = s;
      sy[best] = ny;
    }
    // merge with equal neighbours
    if (best + 1 < sy.length && sy[best + 1] === ny && s === w) {
      sw[best] = sw[best]! + sw[best + 1]!;
      sx.splice(best + 1, 1);
      sw.splice(best + 1, 1);
      sy.splice(best + 1, 1);
    }
    if (best > 0 && sy[best - 1] === ny) {
      sw[best - 1] = sw[best - 1]! + sw[best]!;
      sx.splice(best, 1);
      sw.splice(best, 1);
      sy.splice(best, 1);
    }
    const last = k === n - 1 || (grouped && groupOf[k + 1] !== groupOf[k]);
    if (grouped && last && gSum < gStartW) {
      throw new TilingInputError(
        'group-short',
        `group ${groupOf[k]} fills ${gSum} of its free segment (${gStartW}) at x=${gStartX}, y=${gStartY}; a group must fill its segment exactly`,
        where(k),
      );
    }
  }
  const top = sy.reduce((m, v) => Math.min(m, v), Infinity);
  if (sy.length > 1 || (H > 0 && top !== H)) {
    let hi = 0;
    for (let i = 1; i < sy.length; i++) if (sy[i]! < sy[hi]!) hi = i;
    const frame = H > 0 ? `${W} x ${H}` : `${W}-wide`;
    throw new TilingInputError(
      'incomplete',
      `the squares leave the ${frame} rectangle incomplete: the free segment (${sw[hi]}) at x=${sx[hi]}, y=${sy[hi]} is not covered`,
    );
  }
  return { W, H: H > 0 ? H : top, squares };
}

/** Parses and decodes one code (Bouwkamp, table code or explicit-squares JSON) into a verified tiling. */
export function parseTiling(input: string): Tiling {
  // a well-formed code takes the fast reader (a decoded code tiles its frame by construction)
  if (typeof input === 'string' && readFast(input)) return core.tiling();
  return readCarefully(input);
}

/**
 * The careful reader behind parseTiling: every format, and the precise error (what and
 * where) for every problem. The fast reader (read-fast.ts) answers only for well-formed
 * codes; tests check the two agree.
 */
export function readCarefully(input: string): Tiling {
  if (typeof input !== 'string') throw new TilingInputError('not-text', 'the code must be text');
  if (input.length > MAX_INPUT_LENGTH) {
    throw new TilingInputError('too-long', `the input has ${input.length} characters; at most ${MAX_INPUT_LENGTH} (64 kB) are accepted`);
  }
  const trimmed = input.trim();
  if (trimmed.startsWith('{') && trimmed.includes('"')) {
    let data: unknown;
    try {
      data = JSON.parse(trimmed);
    } catch (e) {
      throw new TilingInputError('bad-json', `the explicit-squares input is not valid JSON: ${(e as Error).message}`);
    }
    return tilingFromSquares(data as Parameters<typeof tilingFromSquares>[0]);
  }
  const code = readCode(input);
  const describe = (k: number) => position(input, code.offsets[k]!);
  const { sizes, groupOf, header } = code;
  let t: Tiling;
  if (header) {
    t = decodeSizes(sizes, header.W, header.H, groupOf, describe);
  } else if (groupOf.length > 0) {
    let W = 0;
    for (let k = 0; k < sizes.length && groupOf[k] === 1; k++) W += sizes[k]!;
    t = decodeSizes(sizes, W, 0, groupOf, describe);
  } else {
    // table code without a header: the first row runs across, so W is a prefix sum
    let area = 0;
    for (const s of sizes) area += s * s;
    let W = 0;
    let firstError: TilingInputError | null = null;
    let found: Tiling | null = null;
    let attempts = 0;
    for (let k = 0; k < sizes.length && !found; k++) {
      W += sizes[k]!;
      if (area % W !== 0) continue;
      if (++attempts > MAX_WIDTH_GUESSES) {
        throw new TilingInputError('no-frame', `table code without a header: no width found among the first ${MAX_WIDTH_GUESSES} candidates; add the header "order width height"`);
      }
      try {
        found = decodeSizes(sizes, W, area / W, [], describe);
      } catch (e) {
        if (!(e instanceof TilingInputError)) throw e;
        firstError ??= e;
      }
    }
    if (!found) {
      throw new TilingInputError(
        'no-frame',
        `table code without a header: no width (a sum of the first sizes) lets these ${sizes.length} sizes fill a rectangle${firstError ? ` (for example: ${firstError.message})` : ''}`,
      );
    }
    t = found;
  }
  const v = verifyTiling(t);
  if (!v.ok) throw new TilingInputError('invalid-tiling', v.message, v.square === undefined ? undefined : { square: v.square + 1 });
  return t;
}

/** An explicit list of squares, e.g. from a form or an upload; validated and verified. */
export function tilingFromSquares(input: { width: number; height: number; squares: { x: number; y: number; size: number }[] }): Tiling {
  if (input === null || typeof input !== 'object') throw new TilingInputError('bad-squares', 'expected an object { width, height, squares: [{ x, y, size }] }');
  const { width, height, squares } = input;
  const dim = (v: unknown, name: string) => {
    if (typeof v !== 'number' || !Number.isInteger(v) || v <= 0 || v > MAX_SIDE) {
      throw new TilingInputError('bad-squares', `${name} must be a whole number from 1 to 2^31 (got ${JSON.stringify(v) ?? String(v)})`);
    }
    return v;
  };
  const W = dim(width, 'width');
  const H = dim(height, 'height');
  if (!Array.isArray(squares)) throw new TilingInputError('bad-squares', 'squares must be an array of { x, y, size }');
  if (squares.length === 0) throw new TilingInputError('empty', 'the list of squares is empty');
  if (squares.length > MAX_SQUARES) throw new TilingInputError('too-many', `${squares.length} squares; at most ${MAX_SQUARES} are accepted`);
  const out: Square[] = [];
  for (let i = 0; i < squares.length; i++) {
    const q = squares[i] as unknown;
    if (q === null || typeof q !== 'object') throw new TilingInputError('bad-squares', `square ${i + 1} must be an object { x, y, size }`, { square: i + 1 });
    const r = q as Record<string, unknown>;
    for (const key of ['x', 'y', 'size'] as const) {
      const v = r[key];
      const okRange = key === 'size' ? typeof v === 'number' && v >= 1 : typeof v === 'number' && v >= 0;
      if (typeof v !== 'number' || !Number.isInteger(v) || !okRange || v > MAX_SIDE) {
        throw new TilingInputError('bad-squares', `square ${i + 1}: ${key} must be a whole number ${key === 'size' ? 'from 1' : 'from 0'} to 2^31 (got ${JSON.stringify(v) ?? String(v)})`, { square: i + 1 });
      }
    }
    out.push({ x: r.x as number, y: r.y as number, s: r.size as number });
  }
  const t: Tiling = { W, H, squares: out };
  const v = verifyTiling(t);
  if (!v.ok) throw new TilingInputError('invalid-tiling', v.message, v.square === undefined ? undefined : { square: v.square + 1 });
  return t;
}
