/**
 * The list of each f32 row of a block under a two-level coarse quantizer: the best group centre
 * (highest dot product), then the best centroid of that group
 * (../../../sections/sectionLists.ts, SectionLists.file with one group filed under, holds the
 * plain twin). out[j] = the list of row j, for j in [r0, r1).
 *
 * Arguments (byte offsets into the one shared memory):
 *   rows       f32[n × k]   row-major, k numbers a row
 *   groups     f32[g × k]   the group centres
 *   centroids  f32[L × k]   the centroids, group by group
 *   starts     i32[g + 1]   group c holds centroids starts[c] … starts[c + 1] − 1
 *   q          f64[k]       scratch: the row being filed, promoted to f64 (exact)
 *   out        i32[n]       entries r0 … r1 − 1 are written
 * Each dot product is rowDot of ./dots.ts with that q, so the scores are the same bits as dots();
 * a score wins only when it is greater than the best so far (the first of equal scores wins; NaN
 * never does), and a row no group or centroid wins goes to list 0, as in the twin.
 */
import { rowDot } from './dots';

export function file_rows(rows: usize, k: i32, r0: i32, r1: i32, groups: usize, g: i32, centroids: usize, starts: usize, q: usize, out: usize): void {
  const rowBytes = <usize>k << 2;
  for (let j = r0; j < r1; j++) {
    // The row in f64 (exact), once for all its products.
    const row = rows + <usize>j * rowBytes;
    for (let c: usize = 0; c < <usize>k; c++) store<f64>(q + (c << 3), <f64>load<f32>(row + (c << 2)));
    let group = -1;
    let best = -Infinity;
    for (let c = 0; c < g; c++) {
      const s = rowDot(groups + <usize>c * rowBytes, q, k);
      if (s > best) {
        best = s;
        group = c;
      }
    }
    let list = 0;
    if (group >= 0) {
      const from = load<i32>(starts + (<usize>group << 2));
      const to = load<i32>(starts + (<usize>group << 2), 4);
      let top = -Infinity;
      for (let c = from; c < to; c++) {
        const s = rowDot(centroids + <usize>c * rowBytes, q, k);
        if (s > top) {
          top = s;
          list = c;
        }
      }
    }
    store<i32>(out + (<usize>j << 2), list);
  }
}
