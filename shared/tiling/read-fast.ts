// The fast reader of Bouwkamp and table codes: one pass over the text straight into the core's
// decode (tiling-core.ts), no token or square objects. It handles well-formed codes only (with
// brackets, with or without the "order width height" header; or table code with the header);
// for anything else (a problem to report, JSON squares, table code without a header) it answers
// false and parse.ts reads the text the careful way, which names the problem and where.
import { MAX_INPUT_LENGTH_FAST, core } from './tiling-core';
import { MAX_SIDE, MAX_SQUARES } from './verify';

let sizes = new Float64Array(256);
let starts = new Uint8Array(256);

function grow(): void {
  const s = new Float64Array(sizes.length * 2);
  s.set(sizes);
  sizes = s;
  const g = new Uint8Array(starts.length * 2);
  g.set(starts);
  starts = g;
}

// character classes: 1 separator (space, comma, tab, CR, LF, semicolon), 2 opening bracket,
// 3 closing bracket; digits are tested directly; anything else is 0
const CLASS = new Uint8Array(128);
for (const c of [32, 44, 9, 10, 13, 59]) CLASS[c] = 1;
for (const c of [40, 91, 123]) CLASS[c] = 2;
for (const c of [41, 93, 125]) CLASS[c] = 3;

/** Reads and decodes a code into the core; false when the careful reader must take over. */
export function readFast(text: string): boolean {
  if (text.length > MAX_INPUT_LENGTH_FAST) return false;
  const star = text.indexOf('*');
  const end = star < 0 ? text.length : star;
  let count = 0;
  let lead = 0; // numbers before the first bracket
  let open = 0; // the closing bracket expected, 0 outside a group
  let sawGroup = false;
  let first = false;
  let groupSize = 0;
  let i = 0;
  while (i < end) {
    let c = text.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      let v = c - 48;
      i++;
      c = i < end ? text.charCodeAt(i) : 32;
      while (c >= 48 && c <= 57) {
        v = v * 10 + (c - 48);
        i++;
        c = i < end ? text.charCodeAt(i) : 32;
      }
      // a number must be followed by a separator, a bracket or the end
      if (c > 127 || CLASS[c] === 0 || v === 0 || v > MAX_SIDE) return false;
      if (count === sizes.length) grow();
      sizes[count] = v;
      if (open !== 0) {
        starts[count] = first ? 1 : 0;
        first = false;
        groupSize++;
      } else {
        if (sawGroup) return false; // a number outside the groups
        starts[count] = 0;
        lead++;
      }
      count++;
      continue;
    }
    const k = c > 127 ? 0 : CLASS[c]!;
    if (k === 1) {
      i++;
      continue;
    }
    if (k === 2) {
      if (open !== 0) return false;
      open = c === 40 ? 41 : c + 2;
      sawGroup = true;
      first = true;
      groupSize = 0;
      i++;
      continue;
    }
    if (k === 3) {
      if (open !== c || groupSize === 0) return false;
      open = 0;
      i++;
      continue;
    }
    return false;
  }
  if (open !== 0 || count === 0) return false;
  let off = 0;
  let W = 0;
  let H = 0;
  if (sawGroup) {
    if (lead === 3) {
      off = 3;
      W = sizes[1]!;
      H = sizes[2]!;
      if (sizes[0] !== count - 3) return false;
    } else if (lead === 0) {
      for (let k = 0; k < count && (k === 0 || starts[k] === 0); k++) W += sizes[k]!;
    } else return false;
  } else {
    if (count < 4 || sizes[0] !== count - 3) return false; // table code without a header: width guessing
    off = 3;
    W = sizes[1]!;
    H = sizes[2]!;
  }
  const n = count - off;
  if (n > MAX_SQUARES || n < 1) return false;
  return core.decode(sizes, n, W, H, sawGroup ? starts : null, off) === 0;
}
