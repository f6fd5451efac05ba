import { describe, expect, it } from 'vitest';
import { countTerms, Vocabulary } from '../../../../src/core/counting/termCounts.js';
import { weightedMatrix } from '../../../../src/core/index/model/conceptModel.js';
import { IndexBuilder } from '../../../../src/core/index/model/indexBuilder.js';
import { tokenize } from '../../../../src/core/text/tokenize.js';
import { globalWeights, weightDocument, WEIGHTING_SCHEMES } from '../../../../src/core/weighting/termWeighting.js';
import { pruneVocabulary } from '../../../../src/core/weighting/prune.js';
import { serialExecutor } from '../../../../src/core/matrix/executor.js';
import { loadCollection } from '../../../helpers/shared.js';
import { memorySpill } from '../../../helpers/memorySpill.js';

// Reference: the same build without a spill (the SVD itself is checked against ml-matrix and
// ARPACK in test/core/svd/randomizedSvd.test.ts). Data: the CISI abstracts (test/fixtures/corpora/cisi).
const cisi = loadCollection('cisi');

describe('buildConceptModelAndVectors', () => {
  it('tells the caller once the weighted matrix is parked, before the first pass, and gives the same model and vectors', () => {
    const build = (progress: Parameters<IndexBuilder['build']>[0]) => {
      const builder = new IndexBuilder({ k: 30 });
      for (const d of cisi.docs.slice(0, 300)) builder.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
      return builder.build(progress);
    };
    for (const executor of [undefined, serialExecutor]) {
      const plain = build({ executor });
      const spill = memorySpill();
      const events: string[] = [];
      const parked = build({
        executor,
        spill: spill.open,
        parkFromBytes: 0,
        onParked: () => events.push('parked'),
        onProgress: (stage, done) => events.push(`${stage} ${done}`),
      });
      // Parked once the matrix is in the executor's memory: after the weighting, before the first pass.
      expect(events.indexOf('parked')).toBeGreaterThan(events.indexOf('weighting 1'));
      expect(events.filter((e) => e === 'parked')).toHaveLength(1);
      expect(events.indexOf('parked')).toBeLessThan(events.indexOf('svd 1'));
      expect(spill.opened()).toBeGreaterThanOrEqual(1);
      expect(spill.closes()).toBe(spill.opened());
      expect(Buffer.from(parked.model!.termVectors.buffer).equals(Buffer.from(plain.model!.termVectors.buffer))).toBe(true);
      expect(Buffer.from(parked.vectors().buffer).equals(Buffer.from(plain.vectors().buffer))).toBe(true);
    }
    // Nothing parked (no spill): no call.
    let calls = 0;
    build({ parkFromBytes: 0, onParked: () => calls++ });
    expect(calls).toBe(0);
  });
});

// Reference: weightDocument (src/core/weighting/termWeighting.ts), the one-document weighting that
// folds queries and edited files, whose formulas test/core/weighting/termWeighting.test.ts checks
// against scikit-learn and gensim. Data: the CRAN abstracts (test/fixtures/corpora/cran); the
// pruned vocabulary leaves some abstracts without one kept term (empty rows).
describe('weightedMatrix', () => {
  it('holds in each row exactly the numbers weightDocument gives that document, for both schemes', () => {
    const vocab = new Vocabulary();
    const docs = loadCollection('cran')
      .docs.slice(0, 400)
      .map((d) => countTerms(tokenize(d.text), vocab, true));
    // A document with no term at all, and one whose terms are all unknown to the model.
    docs.push(countTerms([], vocab, true), { termIds: Int32Array.of(vocab.size + 5), counts: Float32Array.of(2), length: 2 });
    const pruned = pruneVocabulary(docs, vocab.size);
    for (const scheme of WEIGHTING_SCHEMES) {
      const weights = globalWeights(docs, pruned.columnOf, pruned.keptIds.length, scheme);
      const { matrix, frobeniusSquared } = weightedMatrix(docs, pruned.columnOf, weights, scheme);
      expect(matrix.rows).toBe(docs.length);
      expect(matrix.cols).toBe(pruned.keptIds.length);
      let frob = 0;
      let empty = 0;
      docs.forEach((d, r) => {
        const w = weightDocument(d, pruned.columnOf, weights, scheme);
        const from = matrix.indptr[r];
        const to = matrix.indptr[r + 1];
        expect(Array.from(matrix.indices.subarray(from, to))).toEqual(Array.from(w.columns));
        // Bit for bit: the build's rows and a folded document's must agree exactly.
        expect(Buffer.from(matrix.values.slice(from, to).buffer).equals(Buffer.from(w.values.buffer))).toBe(true);
        for (const v of w.values) frob += v * v;
        if (to === from) empty++;
      });
      expect(empty).toBeGreaterThanOrEqual(2);
      expect(matrix.indices.length).toBe(matrix.indptr[docs.length]);
      expect(frobeniusSquared).toBe(frob);
    }
  });
});
