/**
 * Near-copy recall and precision on real text with planted look-alikes.
 *
 * Corpus: CISI abstracts (test/fixtures/corpora/cisi, 1460 docs; provenance in its README) plus seeded
 * mutated copies (word swaps, deleted/inserted sentences, reordered paragraphs) and exact copies.
 * Truth: exact Jaccard of token 5-gram sets over ALL pairs, by brute force written in the test
 * (corpusFixtures.ts, string shingles, no code shared with the finder).
 * Targets: precision 1.0 (every reported pair is verified by exact Jaccard, so none may fall below
 * the threshold) and recall ≥ 0.95 (LSH at b=16, r=8 catches a pair at J=0.8 with probability
 * 0.95 and at J≥0.85 with ≥0.99: MMDS ch. 3 formula 1 − (1 − s^r)^b).
 */
import { describe, expect, it } from 'vitest';
import { findLookalikes } from '../../../src/core/lookalike/findLookalikes.js';
import type { LookalikeReport } from '../../../src/core/lookalike/types.js';
import { bruteForcePairs, buildMutatedCorpus, loadCorpusDocs, type TextDoc } from './corpusFixtures.js';

/** Unordered pairs of file indices the report claims are alike (exact groups and near pairs, copies expanded). */
function reportedPairs(report: LookalikeReport, docs: readonly TextDoc[]): Set<string> {
  const index = new Map(docs.map((d, i) => [d.id, i]));
  const copies = new Map<string, readonly string[]>();
  const out = new Set<string>();
  const add = (a: string, b: string): void => {
    const i = index.get(a) as number;
    const j = index.get(b) as number;
    if (i !== j) out.add(i < j ? `${i} ${j}` : `${j} ${i}`);
  };
  for (const g of report.exactGroups) {
    for (const f of g.files) copies.set(f, g.files);
    for (let p = 0; p < g.files.length; p++) for (let q = p + 1; q < g.files.length; q++) add(g.files[p], g.files[q]);
  }
  for (const pair of report.nearPairs) {
    for (const a of copies.get(pair.a) ?? [pair.a]) for (const b of copies.get(pair.b) ?? [pair.b]) add(a, b);
  }
  return out;
}

const base = loadCorpusDocs('cisi');

describe('findLookalikes on CISI with planted near-copies', () => {
  it('matches brute-force all-pairs Jaccard ≥ 0.8 with precision 1 and recall ≥ 0.95', () => {
    const docs = buildMutatedCorpus(base, 1000, 40, 11);
    const truth = bruteForcePairs(
      docs.map((d) => d.text),
      5,
      0.8,
    );
    const report = findLookalikes({ files: docs });
    // Exact groups only hold texts that have ≥ 5 tokens here or none; drop pairs the truth cannot judge (no shingles).
    const claimed = [...reportedPairs(report, docs)].filter((k) => {
      const [i, j] = k.split(' ').map(Number);
      return (
        (docs[i].text.match(/[\p{L}\p{M}\p{N}_]+/gu)?.length ?? 0) >= 5 && (docs[j].text.match(/[\p{L}\p{M}\p{N}_]+/gu)?.length ?? 0) >= 5
      );
    });
    const truePositives = claimed.filter((k) => truth.has(k)).length;
    const precision = truePositives / claimed.length;
    const recall = truePositives / truth.size;
    const inBand = [...truth.values()].filter((j) => j < 0.9).length;
    console.log(
      `lookalike CISI: ${docs.length} docs, truth ${truth.size} pairs (${inBand} with J in [0.8, 0.9)), ` +
        `claimed ${claimed.length}, precision ${precision.toFixed(4)}, recall ${recall.toFixed(4)}, candidates ${report.stats.candidates}`,
    );
    expect(truth.size).toBeGreaterThan(300); // the planted copies must give a meaningful test
    expect(inBand).toBeGreaterThan(100); // and include pairs near the threshold, where LSH can miss
    expect(precision).toBe(1);
    expect(recall).toBeGreaterThanOrEqual(0.95);
    // Near-linear candidate work: far fewer candidates than the n²/2 ≈ 3·10⁶ pairs.
    expect(report.stats.candidates).toBeLessThan(20 * docs.length);
  });
});
