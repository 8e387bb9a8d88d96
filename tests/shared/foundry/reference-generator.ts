// The straightforward generator of 3-connected planar graphs, kept as the reference the
// foundry's tree walk (shared/foundry/generate-maps.ts) is checked against: levels by edges
// (Bondy & Murty, Graph Theory with Applications, 12.2; Tutte's wheel theorem): L[6] = {K4};
// L[m] = {wheel W_(m/2) if m is even} + face splits of L[m-1] + their duals (vertex splits),
// deduplicated by the canonical code of the embedding in a table of every map seen.
import { canonicalGraphKey, graphFromCode } from '../../../shared/foundry/canonical-graph';
import { dualOf, facesOf, splitFace, wheel, type PlaneGraph } from '../../../shared/tiling/index';

const keyOf = (g: PlaneGraph) => canonicalGraphKey(g);
const fromKey = (k: string) => graphFromCode(Array.from(k, (c) => c.charCodeAt(0)));

function* faceSplits(g: PlaneGraph): Generator<PlaneGraph> {
  for (const f of facesOf(g)) {
    const k = f.length;
    if (k < 4) continue;
    for (let i = 0; i < k; i++) {
      for (let j = i + 2; j < k; j++) {
        if (i === 0 && j === k - 1) continue;
        yield splitFace(g, f, i, j);
      }
    }
  }
}

/** The canonical keys of every 3-connected planar graph with m edges. */
export function referenceGraphKeys(m: number): Set<string> {
  let prev = new Set<string>([keyOf(wheel(3))]);
  for (let e = 7; e <= m; e++) {
    const seen = new Set<string>();
    if (e % 2 === 0) seen.add(keyOf(wheel(e / 2)));
    for (const gk of prev) {
      for (const h of faceSplits(fromKey(gk))) {
        seen.add(keyOf(h));
        seen.add(keyOf(dualOf(h)));
      }
    }
    prev = seen;
  }
  return prev;
}
