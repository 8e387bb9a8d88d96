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
    const parent = this.parent;
    const offset = this.offset;
    let root = v;
    let acc = 0; // coord(v) - coord(root), summed along the path
    while (parent[root] !== root) { acc += offset[root]!; root = parent[root]!; }
    // second pass: point every node on the path at the root with its offset to the root
    let cur = v;
    while (parent[cur] !== root && cur !== root) {
      const next = parent[cur]!;
      const off = offset[cur]!;
      offset[cur] = acc;
      parent[cur] = root;
      acc -= off;
      cur = next;
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
