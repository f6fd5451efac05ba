/**
 * Retrieval quality on public test collections (test/fixtures/corpora; provenance in their READMEs:
 * the classic SMART collections as distributed by the University of Glasgow IR group).
 * Floors: the best of the general-purpose reference pipelines measured on the same files
 * (scikit-learn LSI with log-entropy at k=100 or 300, and a checked BM25; no stemming), as quoted in
 * the issues that asked for this check: CISI 0.227 and CRAN 0.324 (LSI log-entropy k=300), CACM
 * 0.302 (BM25), ADI 0.409 (LSI log-entropy).
 * One default configuration for all four collections; every document ranked; judged queries only.
 */
import { describe, expect, it } from 'vitest';
import { evaluateRuns } from '../../../src/core/eval/retrievalMetrics.js';
import { IndexBuilder } from '../../../src/core/index/model/indexBuilder.js';
import { loadCollection } from '../../helpers/shared.js';

const FLOORS: Record<string, number> = { cisi: 0.227, cran: 0.324, cacm: 0.302, adi: 0.409 };

describe('retrieval quality with the default settings', () => {
  for (const [name, floor] of Object.entries(FLOORS)) {
    const col = loadCollection(name);
    it(`${name.toUpperCase()} mean average precision ≥ ${floor}`, () => {
      const builder = new IndexBuilder();
      for (const d of col!.docs) builder.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
      const index = builder.build();
      const runs = new Map<string, string[]>();
      for (const q of col!.queries) {
        if (!col!.qrels.has(q.id)) continue;
        runs.set(q.id, index.search(q.text, { top: index.size }).map((h) => h.path));
      }
      const summary = evaluateRuns(runs, col!.qrels);
      console.log(`${name.toUpperCase()}: MAP ${summary.map.toFixed(4)} P@10 ${summary.precisionAt10.toFixed(4)} nDCG@10 ${summary.ndcgAt10.toFixed(4)} over ${summary.queries} queries (k=${index.k})`);
      expect(summary.map).toBeGreaterThanOrEqual(floor);
    });
  }
});
