/**
 * The topic-tree fixtures (test/fixtures/topic-trees: the CMake and Django manuals, provenance in
 * its README) as an index, and their raw counts over the index's model columns for scikit-learn's
 * NMF on TF-IDF. Shared by test/core/topics/topicQuality.test.ts and the research script
 * scripts/fixtures/topicNamesHeldOut.ts, so both score the same matrices.
 */
import type { LsiIndex } from '../../src/core/index/lsiIndex.js';
import { IndexBuilder } from '../../src/core/index/model/indexBuilder.js';
import type { CsrMatrix } from '../../src/core/matrix/sparse.js';
import { npmiCoherence } from '../../src/core/topics/coherence.js';
import { weightedMatrix } from '../../src/core/topics/indexMatrix.js';
import { isUnnameable } from '../../src/core/topics/topicNames.js';

export interface TreeDoc {
  path: string;
  text: string;
}

/** An index of the documents, built as the product builds one. */
export function indexOf(docs: readonly TreeDoc[]): LsiIndex {
  const b = new IndexBuilder();
  for (const d of docs) b.addText({ path: d.path, size: d.text.length, mtimeMs: 0 }, d.text);
  return b.build();
}

/** Raw counts over the model's columns, rows in weightedMatrix's order (for NMF's TF-IDF). */
export function modelCounts(index: LsiIndex) {
  const im = weightedMatrix(index);
  const model = index.model;
  const indptr = [0];
  const indices: number[] = [];
  const data: number[] = [];
  const slots = index.slots();
  for (const s of im.slots) {
    const t = slots[s]!.terms;
    const row: [number, number][] = [];
    t.termIds.forEach((id, j) => {
      const col = id < model.columnOf.length ? model.columnOf[id] : -1;
      if (col >= 0) row.push([col, t.counts[j]]);
    });
    row.sort((x, y) => x[0] - y[0]);
    for (const [c, v] of row) {
      indices.push(c);
      data.push(v);
    }
    indptr.push(indices.length);
  }
  const nameable = Array.from(model.keptIds, (id) => !isUnnameable(index.vocab.termOf(id)));
  return { im, counts: { rows: im.paths.length, cols: model.keptIds.length, indptr, indices, data }, nameable };
}

/**
 * NPMI of term sets (term strings) over documents the sets were not chosen on: a boolean file ×
 * term matrix of the given index's files, its columns the distinct terms of the sets.
 */
export function heldOutNpmi(scoring: LsiIndex, termSets: readonly (readonly string[])[]): number[] {
  const colOf = new Map<string, number>();
  for (const set of termSets) for (const t of set) if (!colOf.has(t)) colOf.set(t, colOf.size);
  const indptr = [0];
  const indices: number[] = [];
  for (const slot of scoring.slots()) {
    if (!slot) continue;
    const cols = [...new Set(Array.from(slot.terms.termIds, (id) => colOf.get(scoring.vocab.termOf(id)) ?? -1))]
      .filter((c) => c >= 0)
      .sort((a, b) => a - b);
    indices.push(...cols);
    indptr.push(indices.length);
  }
  const matrix: CsrMatrix = {
    rows: indptr.length - 1,
    cols: colOf.size,
    indptr: Int32Array.from(indptr),
    indices: Int32Array.from(indices),
    values: new Float64Array(indices.length).fill(1),
  };
  return npmiCoherence(
    matrix,
    termSets.map((set) => set.map((t) => colOf.get(t)!)),
  );
}
