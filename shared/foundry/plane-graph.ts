// Plane graphs as rotation systems (combinatorial embeddings).
// adj[v] lists the neighbours of v in one cyclic order, the same sense at every vertex.
// Face tracing rule [common practice]: the dart after (u -> v) is (v -> w), where w is the
// neighbour that follows u in adj[v].

/** Structurally identical to PlaneGraph in shared/tiling (the tiling engine's contract). */
export interface RotationSystem {
  n: number;
  adj: number[][];
}

export class FoundryInputError extends Error {
  readonly code: string;
  constructor(code: string, message: string) {
    super(message);
    this.name = 'FoundryInputError';
    this.code = code;
  }
}

export function edgeCount(g: RotationSystem): number {
  let s = 0;
  for (const a of g.adj) s += a.length;
  return s / 2;
}

/** Every undirected edge once, as [u, v] with u < v. */
export function edgesOf(g: RotationSystem): [number, number][] {
  const out: [number, number][] = [];
  for (let u = 0; u < g.n; u++) for (const v of g.adj[u] ?? []) if (u < v) out.push([u, v]);
  return out;
}

/** Faces as vertex cycles: face[i] = a_0, a_1, ... with darts a_t -> a_(t+1). */
export function facesOf(g: RotationSystem): number[][] {
  const seen = g.adj.map((a) => new Uint8Array(a.length));
  const faces: number[][] = [];
  for (let u0 = 0; u0 < g.n; u0++) {
    const a0 = g.adj[u0]!;
    for (let i0 = 0; i0 < a0.length; i0++) {
      if (seen[u0]![i0]) continue;
      const face: number[] = [];
      let u = u0;
      let i = i0;
      while (!seen[u]![i]) {
        seen[u]![i] = 1;
        face.push(u);
        const v = g.adj[u]![i]!;
        const av = g.adj[v]!;
        const j = av.indexOf(u);
        u = v;
        i = (j + 1) % av.length;
      }
      faces.push(face);
    }
  }
  return faces;
}

/**
 * The planar dual: one vertex per face; the rotation of a face lists the faces across its
 * boundary darts in traversal order [common practice].
 */
export function dualOf(g: RotationSystem): RotationSystem {
  // faceOfDart[u][i] = face traced by dart (u -> adj[u][i])
  const faceOfDart = g.adj.map((a) => new Int32Array(a.length).fill(-1));
  const boundary: [number, number][][] = [];
  for (let u0 = 0; u0 < g.n; u0++) {
    for (let i0 = 0; i0 < g.adj[u0]!.length; i0++) {
      if (faceOfDart[u0]![i0] !== -1) continue;
      const f = boundary.length;
      const darts: [number, number][] = [];
      let u = u0;
      let i = i0;
      while (faceOfDart[u]![i] === -1) {
        faceOfDart[u]![i] = f;
        darts.push([u, i]);
        const v = g.adj[u]![i]!;
        const av = g.adj[v]!;
        const j = av.indexOf(u);
        u = v;
        i = (j + 1) % av.length;
      }
      boundary.push(darts);
    }
  }
  const adj = boundary.map((darts) =>
    darts.map(([u, i]) => {
      const v = g.adj[u]![i]!;
      return faceOfDart[v]![g.adj[v]!.indexOf(u)]!;
    }),
  );
  return { n: adj.length, adj };
}

/**
 * Split face `face` (as returned by facesOf) by a chord between positions i and j
 * (non-consecutive). Returns a new graph; the input is not changed.
 */
export function splitFace(g: RotationSystem, face: readonly number[], i: number, j: number): RotationSystem {
  const k = face.length;
  const a = face[i]!;
  const b = face[j]!;
  const aPrev = face[(i - 1 + k) % k]!;
  const bPrev = face[(j - 1 + k) % k]!;
  const adj = g.adj.map((r) => r.slice());
  const ra = adj[a]!;
  ra.splice(ra.indexOf(aPrev) + 1, 0, b);
  const rb = adj[b]!;
  rb.splice(rb.indexOf(bPrev) + 1, 0, a);
  return { n: g.n, adj };
}

/** The wheel with k spokes: hub 0, rim 1..k (2k edges). */
export function wheel(k: number): RotationSystem {
  if (!Number.isInteger(k) || k < 3) throw new FoundryInputError('bad-wheel', `wheel: k must be an integer >= 3, got ${k}`);
  const adj: number[][] = [];
  adj.push(Array.from({ length: k }, (_, i) => i + 1));
  for (let i = 1; i <= k; i++) {
    const prev = i === 1 ? k : i - 1;
    const next = i === k ? 1 : i + 1;
    // hub, then rim neighbours so that the faces are the k triangles and the rim
    adj.push([0, prev, next]);
  }
  return { n: k + 1, adj };
}
