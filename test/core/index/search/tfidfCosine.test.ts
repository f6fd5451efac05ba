import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { DocTerms } from '../../../../src/core/counting/termCounts.js';
import { TfidfNorms, TfidfNormsBuilder, type HolderVisitor } from '../../../../src/core/index/search/tfidfCosine.js';
import { fixturePath } from '../../../helpers/shared.js';

// Real text: the first 12 CACM titles (test/fixtures/corpora/cacm), words = runs of a–z after
// lower-casing, the same in the reference.
const titles = readFileSync(`${fixturePath('corpora/cacm')}/docs.jsonl`, 'utf8')
  .split('\n')
  .slice(0, 12)
  .map((l) => (JSON.parse(l) as { text: string }).text);
const words = (t: string): string[] => t.toLowerCase().match(/[a-z]+/g) ?? [];
const ids = new Map<string, number>();
const idOf = (w: string): number => ids.get(w) ?? (ids.set(w, ids.size), ids.size - 1);
function termsOf(text: string): DocTerms {
  const counts = new Map<number, number>();
  for (const w of words(text)) counts.set(idOf(w), (counts.get(idOf(w)) ?? 0) + 1);
  const sorted = [...counts].sort((a, b) => a[0] - b[0]);
  return {
    termIds: Int32Array.from(sorted, ([t]) => t),
    counts: Float32Array.from(sorted, ([, c]) => c),
    length: sorted.reduce((s, [, c]) => s + c, 0),
  };
}
const docs = titles.map(termsOf);
const holders: HolderVisitor = (t, fn) =>
  docs.forEach((d, j) => {
    const i = d.termIds.indexOf(t);
    if (i >= 0) fn(j, d.counts[i]);
  });

/**
 * Reference: scikit-learn 1.2.1, TfidfVectorizer(analyzer=words, sublinear_tf=True, smooth_idf=True,
 * norm='l2') fitted on the 12 titles, cosine of each title with the transformed query (values to 6
 * places, printed by /usr/bin/python3 on this machine).
 */
const REFERENCE: [string, number[]][] = [
  ['computer programming terminology glossary', [0, 0, 0, 0.791403, 0, 0, 0.791403, 0, 0, 0.791403, 0.097589, 0]],
  ['program schemes', [0, 0, 0.531965, 0, 0, 0, 0, 0.51697, 0, 0, 0, 0]],
  ['roots of digital computers computers', [0, 0.60369, 0, 0.068353, 0, 0.322163, 0.068353, 0.054407, 0, 0.068353, 0.039815, 0]],
];

function scores(norms: TfidfNorms, query: DocTerms, slope?: number): Float64Array {
  const out = new Float64Array(docs.length);
  norms.scoreInto(query, holders, out, slope === undefined ? {} : { slope });
  return out;
}

describe('TfidfNorms', () => {
  const norms = TfidfNorms.of(docs);

  it("ranks as scikit-learn's TF-IDF cosine: every score in the same proportion to the reference", () => {
    for (const [text, ref] of REFERENCE) {
      const got = scores(norms, termsOf(text));
      const j = ref.indexOf(Math.max(...ref));
      // The query's own norm is left out, so scores equal the reference times one factor per query.
      const factor = got[j] / ref[j];
      ref.forEach((r, i) => expect(got[i]).toBeCloseTo(r * factor, 5));
    }
  });

  it('pivoted normalisation: score × ((1 − s)·mean norm + s·‖d‖) is the same raw product for every slope', () => {
    const q = termsOf(REFERENCE[2][0]);
    const raw = scores(norms, q, 1).map((x, j) => x * norms.norms[j]);
    for (const s of [0, 0.2, 0.5]) {
      const got = scores(norms, q, s);
      got.forEach((x, j) => expect(x * ((1 - s) * norms.meanNorm + s * norms.norms[j])).toBeCloseTo(raw[j], 9));
    }
    // A lower slope lifts the matching title of the largest norm against the one of the smallest.
    const [at1, at0] = [scores(norms, q, 1), scores(norms, q, 0)];
    const n = norms.norms;
    const matching = [...docs.keys()].filter((j) => at1[j] > 0);
    const long = matching.reduce((best, j) => (n[j] > n[best] ? j : best));
    const short = matching.reduce((best, j) => (n[j] < n[best] ? j : best));
    expect(n[long]).toBeGreaterThan(n[short]);
    expect(at0[long] / at0[short]).toBeGreaterThan(at1[long] / at1[short]);
  });

  it("splits a document's score into its terms' shares (termScore), for every slope", () => {
    for (const [text] of REFERENCE)
      for (const s of [1, 0.4]) {
        const q = termsOf(text);
        const got = scores(norms, q, s);
        docs.forEach((d, j) => {
          let sum = 0;
          q.termIds.forEach((t, i) => {
            const at = d.termIds.indexOf(t);
            sum += norms.termScore(t, q.counts[i], at < 0 ? 0 : d.counts[at], j, { slope: s });
          });
          expect(sum).toBeCloseTo(got[j], 12);
        });
      }
  });

  it('leaves holes out of the document count and the mean norm', () => {
    const withHole = TfidfNorms.of([...docs, null]);
    expect(withHole.documents).toBe(docs.length);
    expect(withHole.meanNorm).toBeCloseTo(norms.meanNorm, 12);
    expect(withHole.norms[docs.length]).toBe(0);
  });

  it('built in slices (one step per call) has the same bits as built at once, fractional counts included', () => {
    // Every title's counts, plus one weighted copy (counts 0.5 and 1,500: off the whole-number table).
    const many = [...docs, null, { ...docs[0], counts: docs[0].counts.map((c, i) => (i % 2 ? c * 1500 : c / 2)) }];
    const whole = TfidfNorms.of(many);
    const builder = new TfidfNormsBuilder(many);
    let steps = 1;
    let sliced = builder.step(() => false);
    for (; !sliced; steps++) sliced = builder.step(() => false);
    expect(steps).toBeGreaterThan(1);
    expect(sliced.documents).toBe(whole.documents);
    expect([...sliced.idf]).toEqual([...whole.idf]);
    expect([...sliced.norms]).toEqual([...whole.norms]);
    expect(sliced.meanNorm).toBe(whole.meanNorm);
    // Each norm is the plain formula's, Σ ((1 + ln tf)·idf)² under a square root.
    many.forEach((d, j) => {
      if (!d) return;
      let ss = 0;
      d.termIds.forEach((t, i) => (ss += ((1 + Math.log(d.counts[i])) * whole.idf[t]) ** 2));
      expect(whole.norms[j]).toBe(Math.sqrt(ss));
    });
  });
});
