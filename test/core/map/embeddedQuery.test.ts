import { describe, expect, it } from 'vitest';
import { EmbeddedQueryEngine, localWeight } from '../../../src/core/map/embeddedQuery.js';
import { buildEmbeddedQueryData } from '../../../src/core/map/embeddedQueryData.js';
import { quickLayout } from '../../../src/core/map/quickLayout.js';
import { projectQuick } from '../../../src/core/map/quickProjection.js';
import { InvalidInputError, NoKnownTermsError } from '../../../src/core/errors.js';
import { createRandom } from '../../../src/core/random.js';
import { tokenize } from '../../../src/core/text/tokenize.js';

const K = 8;
const rng = createRandom(12);
const terms = ['orbit', 'lantern', 'harbor', 'meadow', 'cipher', 'quartz', 'ember', 'willow'];
const termVectors = Float32Array.from({ length: terms.length * K }, () => rng.normal());
const globalWeights = Float32Array.from({ length: terms.length }, () => 0.2 + rng.next());
const n = 40;
const files = new Float32Array(n * K);
for (let i = 0; i < n; i++) {
  let s = 0;
  for (let c = 0; c < K; c++) s += (files[i * K + c] = rng.normal()) ** 2;
  for (let c = 0; c < K; c++) files[i * K + c] /= Math.sqrt(s);
}
const quick = quickLayout(files, n, K);
const data = buildEmbeddedQueryData({
  count: n,
  dimensions: K,
  fileVectors: files,
  terms,
  termVectors,
  globalWeights,
  localWeighting: 'log1p',
  quick,
});
const split = (t: string) => t.toLowerCase().split(/\s+/).filter(Boolean);

/** Exact float64 fold and ranking, written out independently. */
function exact(text: string) {
  const tf = new Map<string, number>();
  for (const w of split(text)) if (terms.includes(w)) tf.set(w, (tf.get(w) ?? 0) + 1);
  const q = new Float64Array(K);
  for (const [w, c] of tf) {
    const t = terms.indexOf(w);
    for (let d = 0; d < K; d++) q[d] += Math.log(1 + c) * globalWeights[t] * termVectors[t * K + d];
  }
  const norm = Math.hypot(...q);
  const sims = Array.from({ length: n }, (_, i) => [q.reduce((s, v, d) => s + v * files[i * K + d], 0) / norm, i]);
  return { q: Array.from(q, (v) => v / norm), order: sims.sort((a, b) => b[0] - a[0]).map(([, i]) => i) };
}

describe('EmbeddedQueryEngine', () => {
  const engine = new EmbeddedQueryEngine(JSON.parse(JSON.stringify(data)), split);

  it('folds a query like the exact float computation, to int8 precision (cosine > 0.999)', () => {
    const text = 'harbor lantern lantern quartz unknownword';
    const { vector, knownTerms } = engine.fold(text);
    const ref = exact(text).q;
    expect(vector.reduce((s, v, d) => s + v * ref[d], 0)).toBeGreaterThan(0.999);
    expect(knownTerms).toBe(3);
  });

  it('ranks the files nearly as the exact cosine ranking does (top 3 agree)', () => {
    const text = 'meadow ember cipher';
    const r = engine.search(text, 5);
    expect(Array.from(r.neighbours.subarray(0, 3))).toEqual(exact(text).order.slice(0, 3));
    for (let t = 1; t < r.similarities.length; t++) expect(r.similarities[t]).toBeLessThanOrEqual(r.similarities[t - 1]);
  });

  it('places the query on the quick layout with the layout’s own linear map', () => {
    const r = engine.search('orbit willow');
    const ref = projectQuick(quick, exact('orbit willow').q);
    expect(Math.hypot(r.quick.x - ref.x, r.quick.y - ref.y)).toBeLessThan(0.02);
  });

  it('throws NoKnownTermsError when no word is in the vocabulary', () => {
    expect(() => engine.search('nothing here')).toThrow(NoKnownTermsError);
  });

  it('uses the tokenizer it is given: with the engine’s tokenizer, inflected words reach stemmed terms', () => {
    const stemmed = buildEmbeddedQueryData({
      count: n,
      dimensions: K,
      fileVectors: files,
      terms: terms.map((t) => tokenize(t)[0]),
      termVectors,
      globalWeights,
      localWeighting: 'log1p',
      quick,
    });
    const withTokenizer = new EmbeddedQueryEngine(stemmed, (t) => tokenize(t));
    expect(withTokenizer.fold('Harbors and lanterns').knownTerms).toBe(2);
  });

  it('rejects data whose parts disagree', () => {
    expect(() =>
      buildEmbeddedQueryData({
        count: n,
        dimensions: K,
        fileVectors: files,
        terms,
        termVectors,
        globalWeights: [1],
        localWeighting: 'raw',
        quick,
      }),
    ).toThrow(InvalidInputError);
  });
});

describe('localWeight', () => {
  it('implements log(1+tf), raw tf and binary local weights', () => {
    expect(localWeight(3, 'log1p')).toBeCloseTo(Math.log(4), 15);
    expect(localWeight(3, 'raw')).toBe(3);
    expect(localWeight(3, 'binary')).toBe(1);
  });
});
