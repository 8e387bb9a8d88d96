// Where an Assembly piece may go, in frame units. A square in a squared rectangle always sits
// against the frame or against other squares, so the board offers the places where a piece
// touches an edge: its left side on the frame's left edge or another piece's right edge (or
// its right side against a left edge, the frame's right edge), and the same up and down. The
// keyboard cursor steps between these places and a dropped piece snaps to the nearest one.

export type Square = { x: number; y: number; s: number };

export function overlaps(a: Square, b: Square): boolean {
  return a.x < b.x + b.s && b.x < a.x + a.s && a.y < b.y + b.s && b.y < a.y + a.s;
}

export function fits(frame: { W: number; H: number }, q: Square): boolean {
  return q.x >= 0 && q.y >= 0 && q.x + q.s <= frame.W && q.y + q.s <= frame.H;
}

/** The places a piece of size s may take along one axis, ascending. */
export function edgeStops(length: number, s: number, others: readonly { at: number; s: number }[]): number[] {
  const set = new Set<number>([0, length - s]);
  for (const o of others) {
    set.add(o.at + o.s); // against its far side
    set.add(o.at - s); // against its near side
    set.add(o.at); // level with it
    set.add(o.at + o.s - s); // level with its far side
  }
  return [...set].filter((v) => v >= 0 && v <= length - s).sort((a, b) => a - b);
}

export function stopsFor(frame: { W: number; H: number }, s: number, others: readonly Square[]) {
  return {
    xs: edgeStops(frame.W, s, others.map((o) => ({ at: o.x, s: o.s }))),
    ys: edgeStops(frame.H, s, others.map((o) => ({ at: o.y, s: o.s }))),
  };
}

/** The stop nearest to v, if it lies within `reach`; else v rounded to a whole unit. */
export function snap(v: number, stops: readonly number[], reach: number): number {
  let best: number | null = null;
  for (const s of stops) if (Math.abs(s - v) <= reach && (best === null || Math.abs(s - v) < Math.abs(best - v))) best = s;
  return best ?? Math.round(v);
}

/** The next stop after (dir 1) or before (dir -1) v, or v itself at the end. */
export function step(v: number, stops: readonly number[], dir: 1 | -1): number {
  if (dir === 1) return stops.find((s) => s > v) ?? v;
  for (let i = stops.length - 1; i >= 0; i--) if (stops[i]! < v) return stops[i]!;
  return v;
}

/** The first place, top to bottom and left to right, where a piece of size s fits without overlapping. */
export function firstFreePlace(frame: { W: number; H: number }, s: number, others: readonly Square[]): { x: number; y: number } {
  const { xs, ys } = stopsFor(frame, s, others);
  for (const y of ys) for (const x of xs) if (!others.some((o) => overlaps({ x, y, s }, o))) return { x, y };
  return { x: 0, y: 0 };
}

/** Every piece placed with no overlap inside the frame: the frame is covered exactly (areas add up). */
export function isComplete(frame: { W: number; H: number }, squares: readonly Square[], pieces: number): boolean {
  if (squares.length !== pieces) return false;
  const area = squares.reduce((a, q) => a + q.s * q.s, 0);
  if (area !== frame.W * frame.H) return false;
  for (let i = 0; i < squares.length; i++) {
    if (!fits(frame, squares[i]!)) return false;
    for (let j = i + 1; j < squares.length; j++) if (overlaps(squares[i]!, squares[j]!)) return false;
  }
  return true;
}
