// The tiling engine's data model: one integer model everywhere, origin top-left, y downward.

/** One square of a tiling: integer top-left corner (x, y) and side s. */
export interface Square {
  x: number;
  y: number;
  s: number;
}

/** A rectangle W x H cut into squares. */
export interface Tiling {
  W: number;
  H: number;
  squares: Square[];
}

/**
 * A plane graph given by its rotation system: adj[v] lists the neighbours of v in one
 * cyclic order, the same sense (all clockwise or all counter-clockwise) at every vertex.
 */
export interface PlaneGraph {
  n: number;
  adj: number[][];
}

/** An axis-parallel rectangle inside a tiling (used for sub-rectangles of compound tilings). */
export interface Rect {
  x: number;
  y: number;
  w: number;
  h: number;
}

export interface Classification {
  order: number;
  width: number;
  height: number;
  /** W = H */
  square: boolean;
  /** all sizes distinct */
  perfect: boolean;
  /** no proper sub-rectangle of two or more squares */
  simple: boolean;
  /** some square spans the full width or the full height */
  trivialCompound: boolean;
  /** the proper sub-rectangles (two or more squares) that are exact unions of squares; at most 1000 listed */
  subRectangles: Rect[];
  /** true when more sub-rectangles exist than are listed */
  subRectanglesTruncated: boolean;
  /** gcd of all sizes (1 = reduced) */
  gcd: number;
  minSize: number;
  maxSize: number;
}

export type Direction = 'horizontal' | 'vertical';

/**
 * A node of the Smith diagram: a maximal segment. For the horizontal diagram `at` is its y
 * and [start, end] its x-range; for the vertical diagram `at` is its x and [start, end] its
 * y-range. `potential` is the distance from the bottom side (horizontal, H - y) or from the
 * right side (vertical, W - x), so current always flows from the positive pole (top or left
 * side) to the negative pole (bottom or right side).
 */
export interface SmithNode {
  id: number;
  at: number;
  start: number;
  end: number;
  potential: number;
  pole?: 'positive' | 'negative';
  /** drawing data in tiling coordinates (x right, y down) */
  line: { x1: number; y1: number; x2: number; y2: number };
}

/** An edge of the Smith diagram: one square, unit resistance, current = its side. */
export interface SmithEdge {
  square: number;
  from: number;
  to: number;
  current: number;
  /** drawing data in tiling coordinates: a line through the square's centre */
  line: { x1: number; y1: number; x2: number; y2: number };
}

export interface SmithDiagram {
  direction: Direction;
  width: number;
  height: number;
  nodes: SmithNode[];
  edges: SmithEdge[];
  /**
   * The pole edge (battery) from the positive to the negative pole; current = W (horizontal) or
   * H (vertical). `path` is a polyline for drawing it as an arc outside the rectangle (to the
   * right of a horizontal diagram, below a vertical one), in tiling coordinates.
   */
  pole: { from: number; to: number; current: number; path: { x: number; y: number }[] };
  /**
   * The c-net (squares plus pole edge) as a rotation system; vertex v = node v. Parallel edges
   * (two squares between the same two segments) appear as repeated neighbours; such graphs
   * are not accepted by solvePlaneNetwork, which needs a simple graph.
   */
  graph: PlaneGraph;
}

export interface KirchhoffViolation {
  law: 'current' | 'voltage';
  direction?: Direction;
  node?: number;
  square?: number;
  message: string;
}

/** `square` is the 0-based index into `squares` of the offending square (messages count from 1). */
export type VerifyResult = { ok: true } | { ok: false; message: string; square?: number };

export type SolveResult =
  | {
      ok: true;
      tiling: Tiling;
      /** tau(G - e): the unreduced width */
      fullWidth: bigint;
      /** tau(G / e): the unreduced height */
      fullHeight: bigint;
      /** tau(G) = fullWidth + fullHeight */
      spanningTrees: bigint;
      gcd: bigint;
      /** unreduced node potentials (negative pole 0, positive pole fullHeight), by vertex */
      potentials: bigint[];
    }
  | { ok: false; code: 'zero-current' | 'disconnected' | 'not-plane' | 'bad-pole' | 'too-large'; message: string };
