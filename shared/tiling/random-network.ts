// Seeded random plane c-nets (3-connected plane graphs), the one generator of both engines:
// the foundry's random squared rectangles (engine.md 6.3) and the tests' and benchmarks' random
// networks. Start from a wheel W_k, k >= 4 (3-connected, Tutte's wheel theorem; K4 = W_3 admits
// neither a face split nor a vertex split), then add random face splits or vertex splits (a
// face split of the dual, dualised back) up to the asked number of edges; a chord across a face
// keeps a plane graph 3-connected (Bondy & Murty, Graph Theory with Applications, 12.2). Not
// uniform over graphs; reproducible from the seed. `rng` returns uniform numbers in [0, 1),
// e.g. mulberry32(seed) (./prng).

import { dualOf, edgeCount, facesOf, splitFace, wheel } from './plane-graph';
import { randomInt } from './prng';
import type { PlaneGraph } from './types';

/** A chord across a random face of at least 4 corners between two non-consecutive corners; null when every face is a triangle. */
function randomChord(g: PlaneGraph, rng: () => number): PlaneGraph | null {
  const faces = facesOf(g).filter((f) => f.length >= 4);
  if (faces.length === 0) return null;
  const f = faces[randomInt(rng, faces.length)]!;
  const k = f.length;
  for (;;) {
    const i = randomInt(rng, k);
    const j = randomInt(rng, k);
    const d = Math.abs(i - j);
    if (d >= 2 && d !== k - 1) return splitFace(g, f, Math.min(i, j), Math.max(i, j));
  }
}

/**
 * A random 3-connected plane graph with exactly `edges` edges: 6 gives K4; no 3-connected plane
 * graph has fewer edges or 7 (RangeError).
 */
export function randomCNet(edges: number, rng: () => number): PlaneGraph {
  if (!Number.isInteger(edges) || edges < 6 || edges === 7) throw new RangeError(`no 3-connected plane graph has ${edges} edges`);
  if (edges === 6) return wheel(3);
  let g = wheel(4 + randomInt(rng, Math.floor(edges / 2) - 3));
  while (edgeCount(g) < edges) {
    if (rng() < 0.5) {
      const h = randomChord(g, rng);
      if (h) { g = h; continue; }
    }
    const h = randomChord(dualOf(g), rng);
    if (h) g = dualOf(h);
    else {
      const h2 = randomChord(g, rng);
      if (!h2) throw new Error('randomCNet: neither a face split nor a vertex split exists');
      g = h2;
    }
  }
  return g;
}
