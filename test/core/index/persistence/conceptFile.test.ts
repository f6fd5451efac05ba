/**
 * The portable concept model file: round trip of a model built from real text (the ADI
 * collection, test/fixtures/corpora/adi), and refusal of damage: every single byte of a small
 * model flipped in turn (seeded values), seeded multi-byte damage and truncation of a real one.
 */
import { describe, expect, it } from 'vitest';
import { IndexBuilder } from '../../../../src/core/index/model/indexBuilder.js';
import {
  CorruptModelError,
  decodeConceptFile,
  encodeConceptFile,
  type PortableModel,
} from '../../../../src/core/index/persistence/conceptFile.js';
import { portableFromIndex } from '../../../../src/core/index/model/portableFromIndex.js';
import { createRandom } from '../../../../src/core/random.js';
import { loadCollection } from '../../../helpers/shared.js';

const adi = loadCollection('adi');

function tiny(): Omit<PortableModel, 'checksum'> {
  return {
    createdAt: '2026-12-02T00:00:00.000Z',
    producer: 'test',
    weighting: 'log-entropy',
    tokenize: { stem: true, keepCompounds: true },
    prune: { minDocs: 2, maxDocFraction: 0.5, maxTerms: 100000 },
    powerIterations: 5,
    oversampling: 10,
    seed: 1,
    k: 2,
    documents: 4,
    nonZeros: 9,
    frobeniusSquared: 4,
    terms: ['ferri', 'harbour', 'isl'],
    weights: Float64Array.from([0.5, 0.25, 0.75]),
    singularValues: Float64Array.from([2, 1]),
    termVectors: Float32Array.from([0.6, 0, 0, 1, 0.8, 0]),
    files: ['a.md', 'b.md'],
    fileVectors: Float32Array.from([1, 0, 0, 1]),
  };
}

describe('concept model file', () => {
  it('round-trips every field', () => {
    const m = tiny();
    const back = decodeConceptFile(encodeConceptFile(m));
    const { checksum, ...rest } = back;
    expect(rest).toEqual(m);
    expect(checksum).toBeGreaterThan(0);
  });

  it('refuses the file when any one byte is changed (every position, seeded values)', () => {
    const bytes = encodeConceptFile(tiny());
    const rnd = createRandom(2026);
    let refused = 0;
    for (let i = 0; i < bytes.length; i++) {
      const copy = bytes.slice();
      copy[i] ^= 1 + Math.floor(rnd.next() * 255);
      expect(() => decodeConceptFile(copy), `byte ${i}`).toThrow(CorruptModelError);
      refused++;
    }
    expect(refused).toBe(bytes.length);
    for (let n = 0; n < bytes.length; n += 7) expect(() => decodeConceptFile(bytes.subarray(0, n))).toThrow(CorruptModelError);
  });

  it('holds a model built from real text, refusing seeded damage', () => {
    const b = new IndexBuilder({ k: 12 });
    for (const d of adi.docs) b.addText({ path: `${d.id}.txt`, size: d.text.length, mtimeMs: 0 }, d.text);
    const index = b.build();
    const model = portableFromIndex(index, { withFiles: true, createdAt: '2026-12-02T00:00:00.000Z' });
    const bytes = encodeConceptFile(model);
    const back = decodeConceptFile(bytes);
    expect(back.terms.length).toBe(index.model.keptIds.length);
    expect(Array.from(back.termVectors)).toEqual(Array.from(index.model.termVectors));
    expect(back.files.length).toBe(adi.docs.length);
    const rnd = createRandom(7);
    for (let trial = 0; trial < 300; trial++) {
      const copy = bytes.slice();
      const hits = 1 + Math.floor(rnd.next() * 4);
      for (let h = 0; h < hits; h++) copy[Math.floor(rnd.next() * copy.length)] ^= 1 + Math.floor(rnd.next() * 255);
      expect(() => decodeConceptFile(copy)).toThrow(CorruptModelError);
    }
  });
});
