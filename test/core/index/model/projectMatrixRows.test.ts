import { describe, expect, it } from 'vitest';
import { modelMatrix, projectMatrixRows, projectTerms } from '../../../../src/core/index/model/conceptModel.js';
import { IndexBuilder } from '../../../../src/core/index/model/indexBuilder.js';
import { serialExecutor } from '../../../../src/core/matrix/executor.js';
import { loadCollection } from '../../../helpers/shared.js';

// Reference: projectTerms, the per-document fold-in that queries and changed files go through.
// Build documents must get exactly its vectors, so an unchanged file never moves when refolded.
const cisi = loadCollection('cisi');

describe('projectMatrixRows', () => {
  it('gives projectTerms bit for bit on every CISI document, with either executor, in one block of columns or several, in one block of rows or several', () => {
    const builder = new IndexBuilder({ k: 40 });
    for (const d of cisi.docs.slice(0, 600)) builder.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
    const index = builder.build();
    const docs = index.slots().map((s) => s!.terms);
    const m = modelMatrix(index.model, docs);
    const k = index.k;
    const small = 8 * m.cols * 7; // blocks of 7 columns (40 = 5 × 7 + 5: a narrower last block)
    for (const rows of [
      projectMatrixRows(index.model, m),
      projectMatrixRows(index.model, m, serialExecutor),
      projectMatrixRows(index.model, m, undefined, small),
      projectMatrixRows(index.model, m, serialExecutor, small),
      // Blocks of 13 rows (600 = 46 × 13 + 2: a shorter last block).
      projectMatrixRows(index.model, m, undefined, small, 8 * k * 13),
      projectMatrixRows(index.model, m, serialExecutor, undefined, 8 * k * 13),
    ]) {
      docs.forEach((d, i) => {
        const want = projectTerms(index.model, d).vector;
        expect(Buffer.from(rows.buffer, i * k * 4, k * 4).equals(Buffer.from(want.buffer))).toBe(true);
      });
    }
    // And the index built them that way.
    docs.forEach((d, i) =>
      expect(Array.from(index.vectors().subarray(i * k, (i + 1) * k))).toEqual(Array.from(projectTerms(index.model, d).vector)),
    );
  });
});
