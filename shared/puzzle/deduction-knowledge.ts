/**
 * What a solver knows about the segment coordinates of one direction, as a weighted
 * union-find (union-find with offsets, common practice): within a class, every member's
 * coordinate is known relative to the class root. Knowing a square's size relates its two
 * sides; two segments are related exactly when a chain of known lengths links them.
 */
export class WeightedUnionFind {
  private readonly parent: Int32Array;
  /** coordinate of v minus coordinate of parent[v] */
  private readonly offset: Float64Array;

  constructor(size: number) {
    this.parent = new Int32Array(size);
    this.offset = new Float64Array(size);
    for (let i = 0; i < size; i++) this.parent[i] = i;
  }

  /** The root of v's class; compresses the path and keeps offsets to the root. */
  find(v: number): number {
    let root = v;
    while (this.parent[root] !== root) root = this.parent[root]!;
    // second pass: point every node on the path at the root, summing offsets
    let cur = v;
    let acc = 0;
    const path: number[] = [];
    while (this.parent[cur] !== cur) { path.push(cur); cur = this.parent[cur]!; }
    for (let i = path.length - 1; i >= 0; i--) {
      const p = path[i]!;
      acc += this.offset[p]!;
      this.offset[p] = acc;
      this.parent[p] = root;
    }
    return root;
  }

  /** coordinate(b) - coordinate(a) if known, else null */
  relation(a: number, b: number): number | null {
    const ra = this.find(a);
    const rb = this.find(b);
    if (ra !== rb) return null;
    return this.offset[b]! - this.offset[a]!;
  }

  /**
   * Record coordinate(b) - coordinate(a) = d. Returns false when it was already known
   * (throws if the new fact contradicts what was known).
   */
  union(a: number, b: number, d: number): boolean {
    const ra = this.find(a);
    const rb = this.find(b);
    if (ra === rb) {
      const known = this.offset[b]! - this.offset[a]!;
      if (known !== d) throw new Error(`contradiction: known ${known}, new ${d}`);
      return false;
    }
    // coord(rb) - coord(ra) = offA + d - offB
    this.parent[rb] = ra;
    this.offset[rb] = this.offset[a]! + d - this.offset[b]!;
    return true;
  }
}
