/**
 * The map's input taken from an index. Text: ADI abstracts (test/fixtures/corpora/adi). References:
 * log-entropy weights written out from the published formula (Dumais 1991: local log(1 + tf),
 * global 1 + Σ p log p / log(n + 1) as the weighting module states it) and counted from the
 * tokenizer's output, for each file's top terms and the vocabulary cap; an exact dense SVD by
 * ml-matrix (a general-purpose reference library) for the spectrum and for folding a query; the
 * topic report itself for topic ids; plain counting for ‖A‖²_F (unit columns: one per non-empty file).
 */
import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { IndexBuilder } from '../../../src/core/index/model/indexBuilder.js';
import type { LsiIndex } from '../../../src/core/index/lsiIndex.js';
import { EmbeddedQueryEngine } from '../../../src/core/map/embeddedQuery.js';
import { buildEmbeddedQueryData } from '../../../src/core/map/embeddedQueryData.js';
import { embeddedSourceFromIndex, mapSourceFromIndex, topicLabel } from '../../../src/core/map/fromIndex.js';
import { checkMapSource } from '../../../src/core/map/mapData.js';
import { quickLayout } from '../../../src/core/map/quickLayout.js';
import { tokenize } from '../../../src/core/text/tokenize.js';
import { findTopics } from '../../../src/core/topics/topics.js';
import { loadCollection } from '../../helpers/shared.js';

const adi = loadCollection('adi');
/** A file of words found nowhere else: pruning keeps none of them, so it has no concept vector. */
const LONER = { id: 'zz-loner', text: 'quokkaish zebrafinch xylophonic' };

interface Reference {
  index: LsiIndex;
  /** Model terms (index term strings) in model column order. */
  terms: string[];
  /** tf per file (in index path order) over model terms. */
  tf: Map<string, number>[];
  g: Map<string, number>;
}

function build(): Reference {
  const b = new IndexBuilder();
  for (const d of [...adi.docs, LONER]) b.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
  const index = b.build();
  const terms = Array.from(index.model.keptIds, (id) => index.vocab.termOf(id));
  const model = new Set(terms);
  const textOf = new Map([...adi.docs, LONER].map((d) => [d.id, d.text]));
  const tf = index.paths().map((p) => {
    const m = new Map<string, number>();
    for (const t of tokenize(textOf.get(p)!)) if (model.has(t)) m.set(t, (m.get(t) ?? 0) + 1);
    return m;
  });
  // Global log-entropy weight from the formula, over every file (n = all files, as built).
  const n = tf.length;
  const g = new Map<string, number>();
  for (const t of terms) {
    const gf = tf.reduce((s, m) => s + (m.get(t) ?? 0), 0);
    let h = 0;
    for (const m of tf) {
      const c = m.get(t);
      if (c) h += (c / gf) * Math.log(c / gf);
    }
    g.set(t, 1 + h / Math.log(n + 1));
  }
  return { index, terms, tf, g };
}

/** Dense weighted matrix, terms × files, unit columns (methods notes §8.1). */
function weighted(r: Reference): Matrix {
  const a = new Matrix(r.terms.length, r.tf.length);
  r.tf.forEach((m, j) => {
    let ss = 0;
    r.terms.forEach((t, i) => {
      const w = Math.log1p(m.get(t) ?? 0) * r.g.get(t)!;
      a.set(i, j, w);
      ss += w * w;
    });
    if (ss > 0) for (let i = 0; i < r.terms.length; i++) a.set(i, j, a.get(i, j) / Math.sqrt(ss));
  });
  return a;
}

describe('map source from an index', () => {
  const ref = adi ? build() : (null as unknown as Reference);

  it('lists every indexed file once, in path order, with its own concept vector and token count', () => {
    const s = mapSourceFromIndex(ref.index, null);
    checkMapSource(s);
    expect(s.count).toBe(adi.docs.length + 1);
    expect(s.paths).toEqual(ref.index.paths());
    s.paths.forEach((p, i) => {
      expect(Array.from(s.vectors.subarray(i * s.k, (i + 1) * s.k))).toEqual(Array.from(ref.index.vectorOf(p)));
      expect(s.tokenCounts[i]).toBe(tokenize([...adi.docs, LONER].find((d) => d.id === p)!.text).length);
    });
    expect(s.topicLabels).toEqual([]);
    expect(Array.from(s.topicIds).every((t) => t === -1)).toBe(true);
  });

  it('names each file by its heaviest log-entropy terms, as the formula ranks them', () => {
    const s = mapSourceFromIndex(ref.index, null, { termsPerFile: 6 });
    ref.tf.forEach((m, j) => {
      const weight = (t: string) => Math.log1p(m.get(t) ?? 0) * ref.g.get(t)!;
      const expected = [...m.keys()]
        .filter((t) => weight(t) > 0)
        .sort((x, y) => weight(y) - weight(x) || (x < y ? -1 : 1))
        .slice(0, 6);
      // Same weights in the same order (a swap of two equal weights would be allowed).
      expect(s.topTerms[j].map((t) => weight(t))).toEqual(expected.map((t) => expect.closeTo(weight(t), 12)));
      expect(new Set(s.topTerms[j]).size).toBe(s.topTerms[j].length);
    });
    expect(s.topTerms[s.paths.indexOf(LONER.id)]).toEqual([]);
  });

  it('carries the spectrum: the SVD’s leading singular values and ‖A‖²_F, one per non-empty file', () => {
    const s = mapSourceFromIndex(ref.index, null);
    const exact = new SingularValueDecomposition(weighted(ref), { autoTranspose: true }).diagonal;
    expect(Array.from(s.singularValues)).toEqual(Array.from(ref.index.model.singularValues));
    expect(s.singularValues.length).toBeGreaterThanOrEqual(s.k);
    for (let c = 0; c < s.k; c++) {
      // The index's randomized SVD is never above the exact value (Rayleigh–Ritz values are lower
      // bounds; 1e-6 allows for the matrix entries stored as f32) and a little low: measured on
      // ADI within 0.05% for the leading three values and at most 1.3% for the trailing ones (k = 27).
      expect(s.singularValues[c]).toBeLessThanOrEqual(exact[c] * (1 + 1e-6));
      expect(s.singularValues[c]).toBeGreaterThan(exact[c] * (c < 3 ? 1 - 1e-3 : 1 - 2e-2));
    }
    const nonEmpty = ref.tf.filter((m) => m.size > 0).length;
    expect(s.totalEnergy).toBeCloseTo(nonEmpty, 9);
    expect(nonEmpty).toBe(adi.docs.length);
  });

  it('gives every topic member its topic and label, and files the topics left out -1', () => {
    const report = findTopics(ref.index, { topics: 5 });
    const s = mapSourceFromIndex(ref.index, report, { labelWords: 2 });
    expect(s.topicLabels).toEqual(
      report.topics.map((t) =>
        t.terms
          .slice(0, 2)
          .map((x) => x.term)
          .join(', '),
      ),
    );
    report.topics.forEach((t, i) => {
      for (const p of t.members) expect(s.topicIds[s.paths.indexOf(p)]).toBe(i);
    });
    const counted = report.topics.reduce((n, t) => n + t.size, 0);
    expect(Array.from(s.topicIds).filter((t) => t >= 0)).toHaveLength(counted);
    expect(report.unplaced).toEqual([LONER.id]);
    expect(s.topicIds[s.paths.indexOf(LONER.id)]).toBe(-1);
    expect(topicLabel({ ...report.topics[0], terms: [] }, 3)).toBe('no distinctive words');
  });

  it('leaves removed files out', () => {
    const b = build().index;
    const gone = b.paths()[3];
    b.remove(gone);
    const s = mapSourceFromIndex(b, null);
    expect(s.count).toBe(b.size);
    expect(s.paths).not.toContain(gone);
    expect(s.vectors.length).toBe(b.size * b.k);
    const p = s.paths[3];
    expect(Array.from(s.vectors.subarray(3 * b.k, 4 * b.k))).toEqual(Array.from(b.vectorOf(p)));
  });

  it('lets the page fold a query as an exact SVD of the same matrix does', () => {
    const s = mapSourceFromIndex(ref.index, null);
    const quick = quickLayout(s.vectors, s.count, s.k);
    const engine = new EmbeddedQueryEngine(buildEmbeddedQueryData(embeddedSourceFromIndex(ref.index, s, quick)), (t) => tokenize(t));
    const u = new SingularValueDecomposition(weighted(ref), { autoTranspose: true }).leftSingularVectors;
    const k = s.k;
    // Compared on the leading axes, where the randomized SVD matches the exact one closely; each
    // axis's sign is arbitrary in an SVD, so the exact axis is turned to agree with the model's.
    const lead = Math.min(6, k);
    const sign = Array.from({ length: lead }, (_, d) => {
      let dot = 0;
      ref.terms.forEach((_, i) => (dot += u.get(i, d) * ref.index.model.termVectors[i * k + d]));
      return Math.sign(dot);
    });
    let checked = 0;
    for (const q of adi.queries.slice(0, 12)) {
      const tf = new Map<string, number>();
      for (const t of tokenize(q.text)) if (ref.g.has(t)) tf.set(t, (tf.get(t) ?? 0) + 1);
      if (tf.size === 0) continue;
      const exact = new Float64Array(lead);
      for (const [t, c] of tf)
        for (let d = 0; d < lead; d++) exact[d] += sign[d] * Math.log1p(c) * ref.g.get(t)! * u.get(ref.terms.indexOf(t), d);
      const folded = engine.fold(q.text).vector;
      const own = ref.index.projectText(q.text);
      let cosOwn = 0;
      for (let d = 0; d < k; d++) cosOwn += folded[d] * own[d];
      expect(cosOwn).toBeGreaterThan(0.9999); // int8 rows (quantize.ts): measured ≥ 0.99998 on ADI
      const head = folded.subarray(0, lead);
      let cos = 0;
      for (let d = 0; d < lead; d++) cos += exact[d] * head[d];
      expect(cos / (Math.hypot(...exact) * Math.hypot(...head))).toBeGreaterThan(0.999); // measured ≥ 0.9995
      checked++;
    }
    expect(checked).toBeGreaterThanOrEqual(10);
  });

  it('keeps the most frequent model terms when the page vocabulary is capped', () => {
    const s = mapSourceFromIndex(ref.index, null);
    const quick = quickLayout(s.vectors, s.count, s.k);
    const full = embeddedSourceFromIndex(ref.index, s, quick);
    expect(full.terms.length).toBe(ref.terms.length);
    expect(full.modelTerms).toBe(ref.terms.length);
    const capped = embeddedSourceFromIndex(ref.index, s, quick, { maxTerms: 100 });
    expect(capped.terms).toHaveLength(100);
    const freq = (t: string) => ref.tf.reduce((n, m) => n + (m.get(t) ?? 0), 0);
    const kept = new Set(capped.terms);
    const least = Math.min(...capped.terms.map(freq));
    const mostDropped = Math.max(...ref.terms.filter((t) => !kept.has(t)).map(freq));
    expect(least).toBeGreaterThanOrEqual(mostDropped);
    expect(() => embeddedSourceFromIndex(ref.index, s, quick, { maxTerms: 0 })).toThrow(/at least one term/);
  });
});
