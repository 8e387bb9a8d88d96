// Encoding a tiling as Bouwkamp code: header "order width height", then the sizes in reading
// order (top y, then left x), bracketed so that one group holds the squares hanging directly
// below one maximal horizontal segment, left to right (S. E. Anderson, squaring.net,
// "Bouwkamp code"). Squares with the same top that touch always share such a segment.

import type { Tiling } from './types';

function inReadingOrder(t: Tiling) {
  const sq = t.squares;
  for (let i = 1; i < sq.length; i++) {
    const a = sq[i - 1]!;
    const b = sq[i]!;
    if (a.y > b.y || (a.y === b.y && a.x >= b.x)) return sq.slice().sort((p, q) => p.y - q.y || p.x - q.x);
  }
  return sq;
}

export function toBouwkamp(t: Tiling, opts?: { header?: boolean }): string {
  const sq = inReadingOrder(t);
  let body = '';
  for (let i = 0; i < sq.length; i++) {
    const q = sq[i]!;
    const prev = i > 0 ? sq[i - 1]! : undefined;
    const cont = prev !== undefined && prev.y === q.y && prev.x + prev.s === q.x;
    if (!cont) body += i === 0 ? '(' : ')(';
    else body += ',';
    body += String(q.s);
  }
  if (sq.length > 0) body += ')';
  return opts?.header === false ? body : `${sq.length} ${t.W} ${t.H} ${body}`;
}

/** Table code: the sizes in reading order without brackets, e.g. "18 15 7 8 14 4 10 1 9". */
export function toTableCode(t: Tiling, opts?: { header?: boolean }): string {
  const sizes = inReadingOrder(t)
    .map((q) => q.s)
    .join(' ');
  return opts?.header === false ? sizes : `${t.squares.length} ${t.W} ${t.H} ${sizes}`;
}
