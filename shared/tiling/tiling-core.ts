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
// corner square is largest are ordered, row by row from the segments (orientationLines), and
// the winner's code and key are written digit by digit into byte buffers.
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
  /** per square: top (subRectangles) and bottom ends of the segment through its left side; top end through its right side (subRectangles) */
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
  /** per horizontal segment: the first square whose bottom lies on it (member list, -1 for the top edge) and its y */
  private segHead = new Int32Array(0);
  private segY = new Float64Array(0);
  /** per horizontal segment: its left and right ends */
  private segStart = new Float64Array(0);
  private segEnd = new Float64Array(0);
  /** per last square of a group: the first member of the piece to its right at placement (-1 at the frame) */
  private rightNb = new Int32Array(0);
  /** per square: the bottom end of the segment through its right side (isSimple) */
  private rightEnd = new Float64Array(0);
  /** per square: the square above with the same right end (or -1), the one below (canonical form only) */
  private upR = new Int32Array(0);
  private downR = new Int32Array(0);
  /** group starts of two reading orders; chain heads and their order; text buffers */
  private gsA = new Uint8Array(0);
  private gsB = new Uint8Array(0);
  private heads = new Int32Array(0);
  private perm = new Int32Array(0);
  private codeBuf = new Uint8Array(0);
  private keyBuf = new Uint8Array(0);
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
    this.segHead = i();
    this.segY = f();
    this.segStart = f();
    this.segEnd = f();
    this.rightNb = i();
    this.rightEnd = f();
    this.upR = i();
    this.downR = i();
    this.gsA = new Uint8Array(c + 1);
    this.gsB = new Uint8Array(c + 1);
    this.heads = i();
    this.perm = i();
    // a number has at most 16 digits on the fast path (below 10^15)
    this.codeBuf = new Uint8Array(18 * (c + 4));
    this.keyBuf = new Uint8Array(18 * (c + 4));
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
    const { xs, ys, ss, up, down, leftEnd, tailAbove, last, nextMember, topSeg, botSeg, segHead, segY, segStart, segEnd, rightNb, kx, kw, ky, kh, kt, kn, kp } = this;
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
        segHead[seg] = kh[b]!;
        segY[seg] = ky[b]!;
        segStart[seg] = a;
        segEnd[seg] = a + kw[b]!;
        for (let m = kh[b]!; m >= 0; m = nextMember[m]!) botSeg[m] = seg;
        mp = kh[b]!;
        gTail = kt[b]!;
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
      topSeg[k] = seg;
      while (mp >= 0 && xs[mp]! < x) mp = nextMember[mp]!;
      up[k] = mp >= 0 && xs[mp] === x ? mp : -1;
      down[k] = -1;
      nextMember[k] = -1;
      const ny = y + s;
      leftEnd[k] = ny;
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
        rightNb[k] = r >= 0 ? kh[r]! : -1;
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
    segHead[seg] = kh[head]!;
    segY[seg] = this.H;
    segStart[seg] = 0;
    segEnd[seg] = W;
    for (let m = kh[head]!; m >= 0; m = nextMember[m]!) botSeg[m] = seg;
    this.segCount = seg + 1;
    this.finishSegments();
    return 0;
  }

  /** The chains of left sides downwards and their bottom ends (after decode; a square's chain successor comes later). */
  private finishSegments(): void {
    const { n, up, down, leftEnd } = this;
    for (let k = n - 1; k > 0; k--) {
      const u = up[k]!;
      if (u >= 0) {
        down[u] = k;
        leftEnd[u] = leftEnd[k]!;
      }
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
    const { n, xs, ys, ss } = this;
    const squares: { x: number; y: number; s: number }[] = [];
    // small integers (|0 below 2^31) are stored unboxed in the objects' fields
    for (let i = 0; i < n; i++) squares.push({ x: small(xs[i]!), y: small(ys[i]!), s: small(ss[i]!) });
    return { W: this.W, H: this.H, squares };
  }

  /** Visits the proper sub-rectangles of >= 2 squares; stops when visit returns false. */
  subRectangles(visit: (x: number, y: number, w: number, h: number) => boolean): void {
    const { n, xs, ys, ss, W, H, up, last, tailAbove, chainTop, leftEnd, rightStart, topSeg, botSeg, segStart, segEnd } = this;
    // the top ends of the segments through the squares' left and right sides
    for (let k = 0; k < n; k++) chainTop[k] = up[k]! >= 0 ? chainTop[up[k]!]! : ys[k]!;
    for (let k = 0; k < n; k++) {
      if (!last[k]) rightStart[k] = chainTop[k + 1]!;
      else if (xs[k]! + ss[k]! === W || tailAbove[k]! < 0) rightStart[k] = 0;
      else rightStart[k] = rightStart[tailAbove[k]!]!;
    }
    for (let i = 0; i < n; i++) {
      const x1 = xs[i]!;
      const y1 = ys[i]!;
      const te = segEnd[topSeg[i]!]!;
      const le = leftEnd[i]!;
      for (let j = i + 1; j < n; j++) {
        const yj = ys[j]!;
        if (yj >= le) break;
        const x2 = xs[j]! + ss[j]!;
        if (x2 <= x1 || x2 > te) continue;
        const y2 = yj + ss[j]!;
        if (y2 > le || segStart[botSeg[j]!]! > x1 || rightStart[j]! > y1) continue;
        if (x1 === 0 && y1 === 0 && x2 === W && y2 === H) continue;
        if (!visit(x1, y1, x2 - x1, y2 - y1)) return;
      }
    }
  }

  /**
   * True when no proper sub-rectangle of two or more squares is a union of squares. Such a
   * rectangle with top-left corner at square i has its right side at the right end of a square
   * g of i's group (g >= i: the squares under its top side) and its bottom at the bottom of a
   * square c of the chain of left sides down from i (the squares along its left side); it is a
   * union of squares when the segment through c's bottom reaches x2 and the one through g's
   * right side reaches y2 (the top and left sides lie in segments by construction).
   */
  isSimple(): boolean {
    const { n, xs, ys, ss, W, H, last, down, leftEnd, rightNb, rightEnd, botSeg, segEnd } = this;
    for (let g = 0; g < n; g++) {
      if (!last[g]) rightEnd[g] = leftEnd[g + 1]!;
      else if (xs[g]! + ss[g]! === W || rightNb[g]! < 0) rightEnd[g] = H;
      else rightEnd[g] = leftEnd[rightNb[g]!]!;
    }
    for (let i = 0; i < n; i++) {
      const x1 = xs[i]!;
      const y1 = ys[i]!;
      for (let c = i; c >= 0; c = down[c]!) {
        const y2 = ys[c]! + ss[c]!;
        const be = segEnd[botSeg[c]!]!;
        for (let g = i; g < n; g++) {
          const x2 = xs[g]! + ss[g]!;
          if (x2 > be) break;
          if (rightEnd[g]! >= y2 && (c !== i || g !== i) && !(x1 === 0 && y1 === 0 && x2 === W && y2 === H)) return false;
          if (last[g]) break;
        }
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

  /** The chains of right sides: per square the square above with the same right end (or -1) and the one below. */
  private rightChains(): void {
    const { n, xs, ss, last, topSeg, segHead, nextMember, upR, downR } = this;
    for (let k = 0; k < n; k++) downR[k] = -1;
    let mq = -1;
    for (let k = 0; k < n; k++) {
      // the members above k's group, left to right (their right ends increase)
      if (k === 0 || last[k - 1]) mq = segHead[topSeg[k]!]!;
      const r = xs[k]! + ss[k]!;
      while (mq >= 0 && xs[mq]! + ss[mq]! < r) mq = nextMember[mq]!;
      if (mq >= 0 && xs[mq]! + ss[mq]! === r) {
        upR[k] = mq;
        downR[mq] = k;
      } else upR[k] = -1;
    }
  }

  /**
   * The reading order of orientation o into out[0..n) and its bracket groups (gs[k] = 1 where a
   * group starts), without sorting the squares. After transposing (x' = y, y' = x) and flipping,
   * the rows of the reading order are the maximal segments through the squares' tops (no
   * transpose, no flip of y: the decode's groups), their bottoms (flip of y: the member lists),
   * their left sides (transpose: the chains of left sides) or their right sides (transpose and
   * flip of y: the chains of right sides); a flip of x reverses each row. Horizontal segments
   * come from the decode in order (y, then x); only the vertical ones are sorted (about n / 2).
   */
  private orientationLines(o: number, out: Int32Array, gs: Uint8Array): void {
    const [tr, fx, fy] = ORIENTATIONS[o]!;
    const { n, xs, ys, ss, last } = this;
    if (!tr && !fy) {
      for (let a = 0; a < n; ) {
        let b = a + 1;
        while (b < n && ys[b] === ys[a]) b++;
        for (let k = a; k < b; k++) {
          if (fx) {
            const i = a + b - 1 - k;
            out[k] = i;
            gs[k] = last[i]!;
          } else {
            out[k] = k;
            gs[k] = k === a ? 1 : last[k - 1]!;
          }
        }
        a = b;
      }
      return;
    }
    let p = 0;
    if (!tr) {
      // segments 1.. (0 is the top edge) by y descending, then x ascending (descending with fx)
      const { segHead, segY, nextMember } = this;
      for (let hi = this.segCount - 1; hi >= 1; ) {
        let lo = hi;
        while (lo > 1 && segY[lo - 1] === segY[hi]) lo--;
        for (let t = lo; t <= hi; t++) {
          const sg = fx ? lo + hi - t : t;
          const start = p;
          for (let m = segHead[sg]!; m >= 0; m = nextMember[m]!) {
            out[p] = m;
            gs[p] = 0;
            p++;
          }
          gs[start] = 1;
          if (fx) reverseRange(out, start, p);
        }
        hi = lo - 1;
      }
      return;
    }
    let chainUp: Int32Array;
    let chainDown: Int32Array;
    if (fy) {
      this.rightChains();
      chainUp = this.upR;
      chainDown = this.downR;
    } else {
      chainUp = this.up;
      chainDown = this.down;
    }
    const { heads, perm, keys, W, H } = this;
    let m = 0;
    for (let k = 0; k < n; k++) if (chainUp[k]! < 0) heads[m++] = k;
    // rows: the left x (W minus the right x with fy); in a row, by the top y
    const span = H + 1;
    if ((W + 1) * span * m < P52) {
      for (let j = 0; j < m; j++) {
        const k = heads[j]!;
        keys[j] = (fy ? W - xs[k]! - ss[k]! : xs[k]!) * span + ys[k]!;
      }
      sortIndex(keys, m, perm, this.keys2);
    } else {
      const rowOf = (k: number) => (fy ? W - xs[k]! - ss[k]! : xs[k]!);
      const idx = Array.from({ length: m }, (_, j) => j);
      idx.sort((a, b) => rowOf(heads[a]!) - rowOf(heads[b]!) || ys[heads[a]!]! - ys[heads[b]!]!);
      for (let j = 0; j < m; j++) perm[j] = idx[j]!;
    }
    for (let a = 0; a < m; ) {
      const ka = heads[perm[a]!]!;
      const ra = fy ? xs[ka]! + ss[ka]! : xs[ka]!;
      let b = a + 1;
      while (b < m) {
        const kb = heads[perm[b]!]!;
        if ((fy ? xs[kb]! + ss[kb]! : xs[kb]!) !== ra) break;
        b++;
      }
      for (let t = a; t < b; t++) {
        const start = p;
        for (let k = heads[perm[fx ? a + b - 1 - t : t]!]!; k >= 0; k = chainDown[k]!) {
          out[p] = k;
          gs[p] = 0;
          p++;
        }
        gs[start] = 1;
        if (fx) reverseRange(out, start, p);
      }
      a = b;
    }
  }

  /** The canonical orientation's index; its reading order in this.best, its groups in this.gsA. */
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
    let best = this.best;
    let bestGs = this.gsA;
    let cand = this.order;
    let candGs = this.gsB;
    for (let o = 0; o < 8; o++) {
      if (firsts[o] !== top) continue;
      if (chosen < 0) {
        chosen = o;
        this.orientationLines(o, best, bestGs);
        continue;
      }
      this.orientationLines(o, cand, candGs);
      for (let k = 1; k < n; k++) {
        const d = ss[cand[k]!]! - ss[best[k]!]!;
        if (d === 0) continue;
        if (d > 0) {
          chosen = o;
          const t = best;
          best = cand;
          cand = t;
          const g = bestGs;
          bestGs = candGs;
          candGs = g;
        }
        break;
      }
    }
    this.best = best;
    this.gsA = bestGs;
    this.order = cand;
    this.gsB = candGs;
    return chosen;
  }

  /** The canonical orientation: its code with header, its stock key and, when asked, the oriented tiling. */
  canonical(withTiling: boolean): { code: string; key: string; tiling: Tiling | null } {
    const o = this.canonicalOrientation();
    const [tr, fx, fy] = ORIENTATIONS[o]!;
    const { n, xs, ys, ss, best, gsA: gs } = this;
    const W2 = tr ? this.H : this.W;
    const H2 = tr ? this.W : this.H;
    let squares: { x: number; y: number; s: number }[] | null = null;
    if (withTiling) {
      squares = [];
      for (let k = 0; k < n; k++) {
        const i = best[k]!;
        const s = ss[i]!;
        let x = tr ? ys[i]! : xs[i]!;
        let y = tr ? xs[i]! : ys[i]!;
        if (fx) x = W2 - x - s;
        if (fy) y = H2 - y - s;
        squares.push({ x, y, s });
      }
    }
    const tiling = squares ? { W: W2, H: H2, squares } : null;
    // code "n W H (a,b)(c)...", key "WxH:a,b,c": for a longer code, digits written into byte
    // buffers when every number is an integer below 10^15 (always, for a code read or a verified
    // tiling); string concatenation for short codes (cheaper below about 16 squares)
    let plain = n >= 16 && isPlain(W2) && isPlain(H2);
    for (let k = 0; k < n && plain; k++) plain = isPlain(ss[k]!);
    if (!plain) {
      let code = `${n} ${W2} ${H2} `;
      let key = `${W2}x${H2}:`;
      for (let k = 0; k < n; k++) {
        const s = ss[best[k]!]!;
        code += k === 0 ? `(${s}` : gs[k] ? `)(${s}` : `,${s}`;
        key += k === 0 ? `${s}` : `,${s}`;
      }
      if (n > 0) code += ')';
      return { code, key, tiling };
    }
    const cb = this.codeBuf;
    const kb = this.keyBuf;
    let p = putNum(cb, 0, n);
    cb[p++] = 32;
    p = putNum(cb, p, W2);
    cb[p++] = 32;
    p = putNum(cb, p, H2);
    cb[p++] = 32;
    let q = putNum(kb, 0, W2);
    kb[q++] = 120; // x
    q = putNum(kb, q, H2);
    kb[q++] = 58; // :
    for (let k = 0; k < n; k++) {
      if (k === 0) cb[p++] = 40;
      else {
        if (gs[k]) {
          cb[p++] = 41;
          cb[p++] = 40;
        } else cb[p++] = 44;
        kb[q++] = 44;
      }
      const len = putNum2(cb, p, kb, q, ss[best[k]!]!);
      p += len;
      q += len;
    }
    if (n > 0) cb[p++] = 41;
    return { code: TEXT.decode(cb.subarray(0, p)), key: TEXT.decode(kb.subarray(0, q)), tiling };
  }
}

const TEXT = new TextDecoder();

/** A non-negative integer below 10^15 (written digit by digit). */
function isPlain(v: number): boolean {
  return v >= 0 && v < 1e15 && Math.floor(v) === v;
}

/** The value as an int32 when it is one (the engine then keeps it unboxed), else itself. */
function small(v: number): number {
  return v <= 0x7fffffff && v >= 0 && (v | 0) === v ? v | 0 : v;
}

/** Writes the decimal digits of a plain number at b[p..); returns the end. */
function putNum(b: Uint8Array, p: number, v: number): number {
  if (v < 2147483648) {
    let x = v | 0;
    let len = 1;
    for (let t = 10; t <= x && len < 10; t *= 10) len++;
    for (let i = p + len - 1; i >= p; i--) {
      const d = (x / 10) | 0;
      b[i] = 48 + x - d * 10;
      x = d;
    }
    return p + len;
  }
  let len = 1;
  for (let t = 10; t <= v; t *= 10) len++;
  for (let i = p + len - 1; i >= p; i--) {
    const d = Math.floor(v / 10);
    b[i] = 48 + v - d * 10;
    v = d;
  }
  return p + len;
}

/** Writes the decimal digits of a plain number at a[p..) and b[q..); returns their count. */
function putNum2(a: Uint8Array, p: number, b: Uint8Array, q: number, v: number): number {
  if (v < 2147483648) {
    let x = v | 0;
    let len = 1;
    for (let t = 10; t <= x && len < 10; t *= 10) len++;
    for (let i = len - 1; i >= 0; i--) {
      const d = (x / 10) | 0;
      const ch = 48 + x - d * 10;
      a[p + i] = ch;
      b[q + i] = ch;
      x = d;
    }
    return len;
  }
  const len = putNum(a, p, v) - p;
  for (let i = 0; i < len; i++) b[q + i] = a[p + i]!;
  return len;
}

function reverseRange(a: Int32Array, from: number, to: number): void {
  for (let i = from, j = to - 1; i < j; i++, j--) {
    const t = a[i]!;
    a[i] = a[j]!;
    a[j] = t;
  }
}

/** One core per thread, reused by the engine's entry points (no state survives a call). */
export const core = new TilingCore();
