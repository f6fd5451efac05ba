import { describe, expect, it } from 'vitest';
import { IndexBuilder } from '../../../../src/core/index/model/indexBuilder.js';
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
