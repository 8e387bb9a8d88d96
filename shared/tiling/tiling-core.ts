// The fast core behind reading, classification and canonical codes: one skyline decode of the
// sizes in reading order (top y, then left x) into scratch typed arrays, no object per square,
// which yields the positions and every maximal segment at the same time.
//
// Decoding (S. E. Anderson, squaring.net, "Bouwkamp code"): each size goes to the highest, then
// leftmost, free point of the skyline. The skyline is kept merged (neighbouring pieces at
// different heights), so the piece chosen for a new group is lower than both neighbours, the
// squares placed on it fill it left to right, and at both its ends a square crosses the line.
// Hence every maximal horizontal segment inside the frame is exactly one skyline piece, covered
// by the tops of one group (a run of the reading order) and by the bottoms of the squares that
// formed that piece (its members, kept as a list). Vertically, a square's left side continues
// the left side of the member above it that starts at the same x, so vertical runs are chained
// as the decode goes; the segment through a square's right side is the left-side run of the next
// square of its group, or (for the last one) the segment through the right side of the last
// member above it. A rectangle spanned by the top-left corner of square i and the bottom-right
// corner of square j is a union of squares exactly when its four sides lie in these segments
// (engine.md section 3): an O(1) test per pair, pairs taken in reading order.
//
// A tiling given by positions is checked by decoding its sizes in reading order: the decode
// reproduces every position exactly when, and only when, the squares tile the frame.
//
// Canonical form: of the orientations with W >= H, the one whose table code is largest
// (squaring.net). Its first size is its top-left corner square, so only the orientations whose
// corner square is largest are ordered (a sort by row, then by position in the row).
import type { Classification, Rect, Tiling } from './types';

export const MAX_LISTED_SUBRECTANGLES = 1000;
/** Longest text the fast reader takes (parse.ts's limit, 64 kB). */
export const MAX_INPUT_LENGTH_FAST = 65_536;

const P52 = 2 ** 52;

/** Decode outcomes other than 0 (ok): the caller asks the careful reader for the message. */
export const DECODE_FAILED = 1;

/**
 * Sorts out[0..n) = 0..n-1 by keys[i] (distinct keys): insertion sort for the short lists of
 * everyday tilings, the native numeric sort of index-packed keys otherwise (callers check that
 * key * n + i stays below 2^52).
 */
function sortIndex(keys: Float64Array, n: number, out: Int32Array, scratch: Float64Array): void {
  if (n > 48) {
    for (let i = 0; i < n; i++) scratch[i] = keys[i]! * n + i;
    const sub = scratch.subarray(0, n);
    sub.sort();
    for (let r = 0; r < n; r++) {
      const v = sub[r]!;
      out[r] = v - Math.floor(v / n) * n;
    }
    return;
  }
  for (let i = 0; i < n; i++) {
    const v = keys[i]!;
    let j = i - 1;
    while (j >= 0 && keys[out[j]!]! > v) {
      out[j + 1] = out[j]!;
      j--;
    }
    out[j + 1] = i;
  }
}

function gcdN(a: number, b: number): number {
  if (a < 2 ** 31 && b < 2 ** 31) {
    let x = a | 0;
    let y = b | 0;
    while (y !== 0) {
      const t = x % y;
      x = y;
      y = t;
    }
    return x;
  }
  while (b !== 0) {
    const t = a % b;
    a = b;
    b = t;
  }
  return a;
}

/** An orientation: transpose first, then flip x, then flip y. */
const ORIENTATIONS: readonly (readonly [boolean, boolean, boolean])[] = [
  [false, false, false],
  [false, true, false],
  [false, false, true],
  [false, true, true],
  [true, false, false],
  [true, true, false],
  [true, false, true],
  [true, true, true],
];

export class TilingCore {
  n = 0;
  W = 0;
  H = 0;
  private cap = 0;
  /** squares in reading order */
  xs = new Float64Array(0);
  ys = new Float64Array(0);
  ss = new Float64Array(0);
  /** per square: right end of the segment through its top; left end of the one through its bottom */
  private topEnd = new Float64Array(0);
  private botStart = new Float64Array(0);
  /** per square: top and bottom ends of the segment through its left side; top end through its right side */
  private chainTop = new Float64Array(0);
  private leftEnd = new Float64Array(0);
  private rightStart = new Float64Array(0);
  /** per square: the square above with the same left x (or -1), the one below, the last member above its group, last in its group */
  private up = new Int32Array(0);
  private down = new Int32Array(0);
  private tailAbove = new Int32Array(0);
  private last = new Uint8Array(0);
  /** member lists: next square whose bottom lies on the same skyline piece */
  private nextMember = new Int32Array(0);
  /** per square: the maximal horizontal segment through its top and through its bottom (0 = the top edge) */
  topSeg = new Int32Array(0);
  botSeg = new Int32Array(0);
  /** how many maximal horizontal segments the decode found (the bottom edge is the last) */
  segCount = 0;
  /** skyline pieces */
  private kx = new Float64Array(0);
  private kw = new Float64Array(0);
  private ky = new Float64Array(0);
  private kh = new Int32Array(0);
  private kt = new Int32Array(0);
  private kn = new Int32Array(0);
  private kp = new Int32Array(0);
  /** sort keys and orders */
  private keys = new Float64Array(0);
  private keys2 = new Float64Array(0);
  private order = new Int32Array(0);
  private best = new Int32Array(0);
  private hash = new Float64Array(0);
  private stamp = new Int32Array(0);
  private gen = 0;
  private readonly firsts = new Float64Array(8);
  /** sizes for load() */
  private sizes = new Float64Array(0);

  ensure(n: number): void {
    if (n <= this.cap) return;
    const c = Math.max(n, 64, 2 * this.cap);
    this.cap = c;
    const f = () => new Float64Array(c + 1);
    const i = () => new Int32Array(c + 1);
    this.xs = f();
    this.ys = f();
    this.ss = f();
    this.topEnd = f();
    this.botStart = f();
    this.chainTop = f();
    this.leftEnd = f();
    this.rightStart = f();
    this.up = i();
    this.down = i();
    this.tailAbove = i();
    this.last = new Uint8Array(c + 1);
    this.nextMember = i();
    this.topSeg = i();
    this.botSeg = i();
    // at most one piece per square plus the first
    this.kx = f();
    this.kw = f();
    this.ky = f();
    this.kh = i();
    this.kt = i();
    this.kn = i();
    this.kp = i();
    this.keys = f();
    this.keys2 = f();
    this.order = i();
    this.best = i();
    this.sizes = f();
    let h = 64;
    while (h < 2 * c) h *= 2;
    this.hash = new Float64Array(h);
    this.stamp = new Int32Array(h);
  }

  /**
   * Decodes sizes[0..n) on a W-wide frame (H = 0: height unknown, the flat top at the end).
   * With group starts (bracket codes), each bracket group must be exactly one group of the
   * decode. Returns 0, or DECODE_FAILED (any problem: the careful reader names it).
   */
  decode(sizes: Float64Array, n: number, W: number, H: number, groupStart: Uint8Array | null, off = 0): number {
    this.ensure(n);
    this.n = n;
    this.W = W;
    const { xs, ys, ss, topEnd, botStart, chainTop, up, tailAbove, last, nextMember, topSeg, botSeg, kx, kw, ky, kh, kt, kn, kp } = this;
    // a group fills one skyline piece, and a piece is a maximal segment (equal neighbours merge):
    // each group start opens the next horizontal segment
    let seg = -1;
    const limitH = H > 0 ? H : Infinity;
    // the skyline: a doubly linked list of pieces (x, width, y, member list), left to right
    kx[0] = 0;
    kw[0] = W;
    ky[0] = 0;
    kh[0] = -1;
    kt[0] = -1;
    kn[0] = -1;
    kp[0] = -1;
    let head = 0;
    let pieces = 1;
    let rem = -1; // the current group's remaining piece, -1 between groups
    let mp = -1; // walk through the members above the current group
    let gTail = -1;
    let gEnd = 0;
    for (let k = 0; k < n; k++) {
      const s = sizes[off + k]!;
      let b: number;
      if (rem < 0) {
        if (groupStart !== null && groupStart[off + k] === 0) return DECODE_FAILED; // a bracket group overfull
        b = head;
        let by = ky[head]!;
        for (let i = kn[head]!; i >= 0; i = kn[i]!) {
          if (ky[i]! < by) {
            by = ky[i]!;
            b = i;
          }
        }
        // a new group on piece b: its members' bottoms lie on the segment starting here
        const a = kx[b]!;
        seg++;
        for (let m = kh[b]!; m >= 0; m = nextMember[m]!) {
          botStart[m] = a;
          botSeg[m] = seg;
        }
        mp = kh[b]!;
        gTail = kt[b]!;
        gEnd = a + kw[b]!;
      } else {
        if (groupStart !== null && groupStart[off + k] === 1) return DECODE_FAILED; // the previous bracket group short
        b = rem;
      }
      const x = kx[b]!;
      const y = ky[b]!;
      const w = kw[b]!;
      if (y >= limitH || s > w || y + s > limitH || !(s > 0)) return DECODE_FAILED;
      xs[k] = x;
      ys[k] = y;
      ss[k] = s;
      topEnd[k] = gEnd;
      topSeg[k] = seg;
      while (mp >= 0 && xs[mp]! < x) mp = nextMember[mp]!;
      if (mp >= 0 && xs[mp] === x) {
        up[k] = mp;
        chainTop[k] = chainTop[mp]!;
      } else {
        up[k] = -1;
        chainTop[k] = y;
      }
      botStart[k] = 0;
      nextMember[k] = -1;
      const ny = y + s;
      let c: number; // the piece now under k's bottom
      if (s === w) {
        last[k] = 1;
        tailAbove[k] = gTail;
        rem = -1;
        c = b;
        ky[c] = ny;
        kh[c] = k;
        kt[c] = k;
        const r = kn[c]!;
        if (r >= 0 && ky[r] === ny) {
          kw[c] = w + kw[r]!;
          nextMember[k] = kh[r]!;
          kt[c] = kt[r]!;
          const rr = kn[r]!;
          kn[c] = rr;
          if (rr >= 0) kp[rr] = c;
        }
      } else {
        last[k] = 0;
        c = pieces++;
        kx[c] = x;
        kw[c] = s;
        ky[c] = ny;
        kh[c] = k;
        kt[c] = k;
        const l = kp[b]!;
        kp[c] = l;
        kn[c] = b;
        kp[b] = c;
        if (l >= 0) kn[l] = c;
        else head = c;
        kx[b] = x + s;
        kw[b] = w - s;
        kh[b] = -1;
        kt[b] = -1;
        rem = b;
      }
      const l = kp[c]!;
      if (l >= 0 && ky[l] === ny) {
        kw[l] = kw[l]! + kw[c]!;
        nextMember[kt[l]!] = kh[c]!;
        kt[l] = kt[c]!;
        const r = kn[c]!;
        kn[l] = r;
        if (r >= 0) kp[r] = l;
      }
    }
    if (rem >= 0) return DECODE_FAILED; // the last group short
    if (kn[head]! >= 0 || (H > 0 && ky[head] !== H)) return DECODE_FAILED; // incomplete
    this.H = ky[head]!;
    seg++;
    for (let m = kh[head]!; m >= 0; m = nextMember[m]!) botSeg[m] = seg;
    this.segCount = seg + 1;
    this.finishSegments();
    return 0;
  }

  /** Vertical segment ends from the chains (after decode). */
  private finishSegments(): void {
    const { n, xs, ss, W, up, down, last, tailAbove, chainTop, leftEnd, rightStart, ys } = this;
    for (let k = 0; k < n; k++) down[k] = -1;
    for (let k = 0; k < n; k++) if (up[k]! >= 0) down[up[k]!] = k;
    for (let k = n - 1; k >= 0; k--) leftEnd[k] = down[k]! >= 0 ? leftEnd[down[k]!]! : ys[k]! + ss[k]!;
    for (let k = 0; k < n; k++) {
      if (!last[k]) rightStart[k] = chainTop[k + 1]!;
      else if (xs[k]! + ss[k]! === W || tailAbove[k]! < 0) rightStart[k] = 0;
      else rightStart[k] = rightStart[tailAbove[k]!]!;
    }
  }

  /**
   * Loads a tiling given by positions: sorted into reading order and decoded from its sizes.
   * True when the decode reproduces every position (the squares tile the frame exactly).
   */
  load(t: Tiling): boolean {
    const sq = t.squares;
    const n = sq.length;
    this.ensure(n);
    const sizes = this.sizes;
    const order = this.order;
    let sorted = true;
    for (let i = 1; i < n; i++) {
      const a = sq[i - 1]!;
      const b = sq[i]!;
      if (a.y > b.y || (a.y === b.y && a.x >= b.x)) {
        sorted = false;
        break;
      }
    }
    if (sorted) {
      for (let i = 0; i < n; i++) order[i] = i;
    } else if ((t.H + 1) * (t.W + 1) * n < P52) {
      const w1 = t.W + 1;
      const keys = this.keys;
      for (let i = 0; i < n; i++) keys[i] = sq[i]!.y * w1 + sq[i]!.x;
      sortIndex(keys, n, order, this.keys2);
    } else {
      const idx = Array.from(sq.keys()).sort((a, b) => sq[a]!.y - sq[b]!.y || sq[a]!.x - sq[b]!.x);
      for (let r = 0; r < n; r++) order[r] = idx[r]!;
    }
    for (let r = 0; r < n; r++) sizes[r] = sq[order[r]!]!.s;
    if (n === 0 || this.decode(sizes, n, t.W, t.H, null) !== 0) return false;
    const { xs, ys } = this;
    for (let r = 0; r < n; r++) {
      const q = sq[order[r]!]!;
      if (q.x !== xs[r] || q.y !== ys[r]) return false;
    }
    return true;
  }

  /** The squares as a tiling (reading order). */
  tiling(): Tiling {
    const squares: { x: number; y: number; s: number }[] = [];
    for (let i = 0; i < this.n; i++) squares.push({ x: this.xs[i]!, y: this.ys[i]!, s: this.ss[i]! });
    return { W: this.W, H: this.H, squares };
  }

  /** Visits the proper sub-rectangles of >= 2 squares; stops when visit returns false. */
  subRectangles(visit: (x: number, y: number, w: number, h: number) => boolean): void {
    const { n, xs, ys, ss, W, H, topEnd, botStart, leftEnd, rightStart } = this;
    for (let i = 0; i < n; i++) {
      const x1 = xs[i]!;
      const y1 = ys[i]!;
      const te = topEnd[i]!;
      const le = leftEnd[i]!;
      for (let j = i + 1; j < n; j++) {
        const yj = ys[j]!;
        if (yj >= le) break;
        const x2 = xs[j]! + ss[j]!;
        if (x2 <= x1 || x2 > te) continue;
        const y2 = yj + ss[j]!;
        if (y2 > le || botStart[j]! > x1 || rightStart[j]! > y1) continue;
        if (x1 === 0 && y1 === 0 && x2 === W && y2 === H) continue;
        if (!visit(x1, y1, x2 - x1, y2 - y1)) return;
      }
    }
  }

  isSimple(): boolean {
    const { n, xs, ys, ss, W, H, topEnd, botStart, leftEnd, rightStart } = this;
    for (let i = 0; i < n; i++) {
      const x1 = xs[i]!;
      const y1 = ys[i]!;
      const te = topEnd[i]!;
      const le = leftEnd[i]!;
      for (let j = i + 1; j < n; j++) {
        const yj = ys[j]!;
        if (yj >= le) break;
        const x2 = xs[j]! + ss[j]!;
        if (x2 <= x1 || x2 > te) continue;
        const y2 = yj + ss[j]!;
        if (y2 > le || botStart[j]! > x1 || rightStart[j]! > y1) continue;
        if (x1 === 0 && y1 === 0 && x2 === W && y2 === H) continue;
        return false;
      }
    }
    return true;
  }

  /** True when all sizes differ. */
  isPerfect(): boolean {
    const { n, ss, hash, stamp } = this;
    const mask = hash.length - 1;
    const g = ++this.gen;
    for (let i = 0; i < n; i++) {
      const s = ss[i]!;
      let h = (Math.imul(s | 0, 0x9e3779b1) >>> 7) & mask;
      for (;;) {
        if (stamp[h] !== g) {
          stamp[h] = g;
          hash[h] = s;
          break;
        }
        if (hash[h] === s) return false;
        h = (h + 1) & mask;
      }
    }
    return true;
  }

  classify(limit = MAX_LISTED_SUBRECTANGLES): Classification {
    const { n, ss, W, H } = this;
    let g = 0;
    let minSize = Infinity;
    let maxSize = 0;
    let trivialCompound = false;
    for (let i = 0; i < n; i++) {
      const s = ss[i]!;
      if (g !== 1) g = gcdN(s, g);
      if (s < minSize) minSize = s;
      if (s > maxSize) maxSize = s;
      if (n > 1 && (s === W || s === H)) trivialCompound = true;
    }
    const rects: Rect[] = [];
    let truncated = false;
    if (!this.isSimple()) {
      this.subRectangles((x, y, w, h) => {
        if (rects.length >= limit) {
          truncated = true;
          return false;
        }
        rects.push({ x, y, w, h });
        return true;
      });
    }
    return {
      order: n,
      width: W,
      height: H,
      square: W === H,
      perfect: this.isPerfect(),
      simple: rects.length === 0,
      trivialCompound,
      subRectangles: rects,
      subRectanglesTruncated: truncated,
      gcd: g,
      minSize: n > 0 ? minSize : 0,
      maxSize,
    };
  }

  // ---- canonical orientation ----

  /** The index of the square at a corner of the frame (right: x + s = W; bottom: y + s = H). */
  private corner(right: boolean, bottom: boolean): number {
    const { n, xs, ys, ss, W, H } = this;
    if (!bottom) {
      if (!right) return 0;
      let i = 0;
      while (i + 1 < n && ys[i + 1] === 0) i++;
      return i;
    }
    for (let i = n - 1; i >= 0; i--) {
      if (ys[i]! + ss[i]! !== H) continue;
      if (right ? xs[i]! + ss[i]! === W : xs[i] === 0) return i;
    }
    return 0;
  }

  /**
   * The reading order of orientation o into out[0..n): after transposing (x' = y, y' = x) and
   * flipping, the result is read by y'' then x''; y'' comes from the original y (x when
   * transposed), reversed by a flip of y, and x'' from the original x (y), reversed by a flip of x.
   */
  private orientationOrder(o: number, out: Int32Array): void {
    const [tr, fx, fy] = ORIENTATIONS[o]!;
    const { n, ss, keys } = this;
    if (!tr && !fy) {
      // rows of the reading order, each reversed by a flip of x
      for (let a = 0; a < n; ) {
        let b = a + 1;
        while (b < n && this.ys[b] === this.ys[a]) b++;
        for (let k = a; k < b; k++) out[k] = fx ? a + b - 1 - k : k;
        a = b;
      }
      return;
    }
    const rowBy = tr ? this.xs : this.ys;
    const inBy = tr ? this.ys : this.xs;
    const rowMax = tr ? this.W : this.H;
    const inMax = tr ? this.H : this.W;
    const span = inMax + 1;
    if ((rowMax + 1) * span * n < P52) {
      for (let i = 0; i < n; i++) {
        const r = fy ? rowMax - (rowBy[i]! + ss[i]!) : rowBy[i]!;
        const c = fx ? inMax - (inBy[i]! + ss[i]!) : inBy[i]!;
        keys[i] = r * span + c;
      }
      sortIndex(keys, n, out, this.keys2);
    } else {
      const idx = Array.from({ length: n }, (_, i) => i);
      const rk = (i: number) => (fy ? -(rowBy[i]! + ss[i]!) : rowBy[i]!);
      const ck = (i: number) => (fx ? -(inBy[i]! + ss[i]!) : inBy[i]!);
      idx.sort((a, b) => rk(a) - rk(b) || ck(a) - ck(b));
      for (let k = 0; k < n; k++) out[k] = idx[k]!;
    }
  }

  /** The canonical orientation's index; its reading order in this.best. */
  private canonicalOrientation(): number {
    const { n, ss, W, H } = this;
    // first sizes (the top-left corner squares) of the orientations with W >= H
    const firsts = this.firsts;
    let top = -1;
    for (let o = 0; o < 8; o++) {
      const [tr, fx, fy] = ORIENTATIONS[o]!;
      if ((tr ? H : W) < (tr ? W : H)) {
        firsts[o] = -1;
        continue;
      }
      const f = ss[this.corner(tr ? fy : fx, tr ? fx : fy)]!;
      firsts[o] = f;
      if (f > top) top = f;
    }
    let chosen = -1;
    const best = this.best;
    const order = this.order;
    for (let o = 0; o < 8; o++) {
      if (firsts[o] !== top) continue;
      if (chosen < 0) {
        chosen = o;
        this.orientationOrder(o, best);
        continue;
      }
      this.orientationOrder(o, order);
      for (let k = 1; k < n; k++) {
        const d = ss[order[k]!]! - ss[best[k]!]!;
        if (d === 0) continue;
        if (d > 0) {
          chosen = o;
          best.set(order.subarray(0, n));
        }
        break;
      }
    }
    return chosen;
  }

  /** The canonical orientation: its code with header, its stock key and, when asked, the oriented tiling. */
  canonical(withTiling: boolean): { code: string; key: string; tiling: Tiling | null } {
    const o = this.canonicalOrientation();
    const [tr, fx, fy] = ORIENTATIONS[o]!;
    const { n, xs, ys, ss, best } = this;
    const W2 = tr ? this.H : this.W;
    const H2 = tr ? this.W : this.H;
    // code "n W H (a,b)(c)...", key "WxH:a,b,c" (string concatenation is the engine's cheapest way)
    let code = `${n} ${W2} ${H2} `;
    let key = `${W2}x${H2}:`;
    const squares: { x: number; y: number; s: number }[] | null = withTiling ? [] : null;
    let px = -1;
    let py = -1;
    let ps = 0;
    for (let k = 0; k < n; k++) {
      const i = best[k]!;
      const s = ss[i]!;
      let x = tr ? ys[i]! : xs[i]!;
      let y = tr ? xs[i]! : ys[i]!;
      if (fx) x = W2 - x - s;
      if (fy) y = H2 - y - s;
      if (k === 0) {
        code += `(${s}`;
        key += `${s}`;
      } else {
        code += y === py && px + ps === x ? `,${s}` : `)(${s}`;
        key += `,${s}`;
      }
      if (squares) squares.push({ x, y, s });
      px = x;
      py = y;
      ps = s;
    }
    if (n > 0) code += ')';
    return { code, key, tiling: squares ? { W: W2, H: H2, squares } : null };
  }
}

/** One core per thread, reused by the engine's entry points (no state survives a call). */
export const core = new TilingCore();
