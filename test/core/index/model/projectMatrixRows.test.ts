import { describe, expect, it, vi } from 'vitest';
import {
  modelMatrix,
  projectMatrixRows,
  projectTerms,
  wholeTermVectorsForProjection,
} from '../../../../src/core/index/model/conceptModel.js';
import { IndexBuilder } from '../../../../src/core/index/model/indexBuilder.js';
import { serialExecutor } from '../../../../src/core/matrix/executor.js';
import { createWasmExecutor } from '../../../../src/core/matrix/wasm/wasmExecutor.js';
import { loadCollection } from '../../../helpers/shared.js';

// Reference: projectTerms, the per-document fold-in that queries and changed files go through.
// Build documents must get exactly its vectors, so an unchanged file never moves when refolded.
const cisi = loadCollection('cisi');

describe('projectMatrixRows', () => {
  it('gives projectTerms bit for bit on every CISI document, with either executor, in one block of columns or several, in one block of rows or several (U_k then whole, as f32)', () => {
    const builder = new IndexBuilder({ k: 40 });
    for (const d of cisi.docs.slice(0, 600)) builder.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
    const index = builder.build();
    const docs = index.slots().map((s) => s!.terms);
    const m = modelMatrix(index.model, docs);
    const k = index.k;
    const small = 8 * m.cols * 7; // blocks of 7 columns (40 = 5 × 7 + 5: a narrower last block)
    // Several blocks of rows on a WebAssembly executor: U_k goes in whole, once, as f32.
    const wasm = createWasmExecutor();
    const f32 = wasm ? vi.spyOn(wasm, 'float32') : undefined;
    const whole = wasm
      ? projectMatrixRows(index.model, m, wasm, small, 8 * k * 13)
      : projectMatrixRows(index.model, m, serialExecutor, small, 8 * k * 13);
    if (f32) expect(f32.mock.calls.filter(([n]) => n === m.cols * k)).toHaveLength(1);
    expect(wholeTermVectorsForProjection(600, 8)).toBe(true);
    expect(wholeTermVectorsForProjection(600, 600)).toBe(false);
    for (const rows of [
      whole,
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
