/**
 * Disjoint-set forest with union by size and path halving (Tarjan 1975; Tarjan & van Leeuwen
 * 1984): near-linear grouping of verified pairs into connected components. Similarity is not
 * transitive, so a component can hold two files that are not alike themselves; each group keeps
 * the pairs that joined it.
 */
export class UnionFind {
  private readonly parent: Int32Array;
  private readonly size: Int32Array;

  constructor(readonly count: number) {
    this.parent = new Int32Array(count);
    this.size = new Int32Array(count).fill(1);
    for (let i = 0; i < count; i++) this.parent[i] = i;
  }

  find(i: number): number {
    const parent = this.parent;
    while (parent[i] !== i) {
      parent[i] = parent[parent[i]];
      i = parent[i];
    }
    return i;
  }

  /** Joins the sets of a and b; returns false if they were already one set. */
  union(a: number, b: number): boolean {
    let ra = this.find(a);
    let rb = this.find(b);
    if (ra === rb) return false;
    if (this.size[ra] < this.size[rb]) [ra, rb] = [rb, ra];
    this.parent[rb] = ra;
    this.size[ra] += this.size[rb];
    return true;
  }

  /** Components with at least minSize members, each listed in ascending order, ordered by first member. */
  components(minSize = 2): number[][] {
    const byRoot = new Map<number, number[]>();
    for (let i = 0; i < this.count; i++) {
      const r = this.find(i);
      if (this.size[r] < minSize) continue;
      let list = byRoot.get(r);
      if (!list) {
        list = [];
        byRoot.set(r, list);
      }
      list.push(i);
    }
    return [...byRoot.values()].sort((x, y) => x[0] - y[0]);
  }
}
