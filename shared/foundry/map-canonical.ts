// Canonical code of a plane map (the foundry's PlaneMap), the same code as canonical-graph.ts
// computes for a PlaneGraph (Weinberg-type breadth-first numbering from every start dart with
// the largest (deg tail, deg head), in both senses; lexicographic minimum with early abort;
// Weinberg, IEEE Trans. Circuit Theory 13 (1966)), without allocation per call. The starts
// that reach the minimum are the map's automorphisms (reflections included); their vertex
// numberings are kept for orbit tests.
import type { PlaneMap } from './plane-map';

export class MapCanonizer {
  /** the canonical code of the last call: code[0 .. length) */
  code = new Uint8Array(256);
  length = 0;
  /** number of starts reaching the minimum (= automorphisms of the map) */
  automorphisms = 0;
  /** vertex numbering of each minimal start (first `automorphisms` entries; when asked for) */
  labels: Int32Array[] = [];
  private cur = new Uint8Array(256);
  private label = new Int32Array(64);
  private queue = new Int32Array(64);
  private entry = new Int32Array(64);

  /**
   * Computes the canonical code of m (into code/length). With `keepLabels`, also the numbering
   * of every minimal start (labels[i][v] = canonical number of vertex v under start i).
   */
  run(m: PlaneMap, keepLabels: boolean): void {
    const n = m.n;
    const D = m.D;
    const len = n + D;
    if (len > this.code.length) {
      this.code = new Uint8Array(2 * len);
      this.cur = new Uint8Array(2 * len);
    }
    if (n > this.label.length) {
      this.label = new Int32Array(2 * n);
      this.queue = new Int32Array(2 * n);
      this.entry = new Int32Array(2 * n);
    }
    const { tail, head, next, prev, rev, deg } = m;
    const best = this.code;
    const cur = this.cur;
    const label = this.label;
    const queue = this.queue;
    const entry = this.entry;
    let bestKey = -1;
    for (let x = 0; x < D; x++) {
      const k = deg[tail[x]!]! * 256 + deg[head[x]!]!;
      if (k > bestKey) bestKey = k;
    }
    let haveBest = false;
    let count = 0;
    for (let s0 = 0; s0 < D; s0++) {
      if (deg[tail[s0]!]! * 256 + deg[head[s0]!]! !== bestKey) continue;
      for (let sense = 0; sense < 2; sense++) {
        const step = sense === 0 ? next : prev;
        let cmp = haveBest ? 0 : -1;
        label.fill(-1, 0, n);
        const u0 = tail[s0]!;
        label[u0] = 0;
        queue[0] = u0;
        entry[u0] = s0;
        let nLab = 1;
        let pos = 0;
        let aborted = false;
        for (let qi = 0; qi < n; qi++) {
          const x = queue[qi]!;
          const dx = deg[x]!;
          if (cmp === 0) {
            const b = best[pos]!;
            if (dx > b) { aborted = true; break; }
            if (dx < b) cmp = -1;
          }
          cur[pos++] = dx;
          let dart = entry[x]!;
          for (let k = 0; k < dx; k++) {
            const w = head[dart]!;
            let lw = label[w]!;
            if (lw < 0) {
              lw = nLab++;
              label[w] = lw;
              queue[lw] = w;
              entry[w] = rev[dart]!;
            }
            if (cmp === 0) {
              const b = best[pos]!;
              if (lw > b) { aborted = true; break; }
              if (lw < b) cmp = -1;
            }
            cur[pos++] = lw;
            dart = step[dart]!;
          }
          if (aborted) break;
        }
        if (aborted) continue;
        if (cmp < 0) {
          best.set(cur.subarray(0, len));
          haveBest = true;
          count = 1;
          if (keepLabels) this.keep(0, n);
        } else {
          if (keepLabels) this.keep(count, n);
          count++;
        }
      }
    }
    this.length = len;
    this.automorphisms = count;
  }

  private keep(i: number, n: number): void {
    let a = this.labels[i];
    if (!a || a.length < n) {
      a = new Int32Array(Math.max(n, 64));
      this.labels[i] = a;
    }
    a.set(this.label.subarray(0, n));
  }

  /** The last code as a string key (one character per entry). */
  key(): string {
    let s = '';
    for (let i = 0; i < this.length; i++) s += String.fromCharCode(this.code[i]!);
    return s;
  }
}
