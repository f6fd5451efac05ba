/**
 * Word-match answers during a first build, driven through the worker's IndexService as the index
 * worker drives it: the build's progress and its polls inside the synchronous SVD (server.ts'
 * pump, here called by the test), over a folder made of the CISI collection
 * (test/fixtures/corpora/cisi: 1460 information-science abstracts and 112 queries; provenance in
 * test/fixtures/corpora/README.md). A search answered between the counting stage and the end of
 * the SVD must rank by BM25 alone and say so; its ranking is checked against BM25 computed here
 * from the finished index's stored counts with the formula of Robertson & Zaragoza 2009 ("The
 * Probabilistic Relevance Framework: BM25 and Beyond", eq. 3.15 with k1 = 1.2, b = 0.75, their
 * common-practice values, and the non-negative idf ln(1 + (N − df + 0.5)/(df + 0.5)) Lucene uses).
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { countTerms } from '../../../src/core/counting/termCounts.js';
import type { LsiIndex } from '../../../src/core/index/lsiIndex.js';
import { tokenize } from '../../../src/core/text/tokenize.js';
import { IndexService } from '../../../src/node/worker/indexService.js';
import type { HandlerContext } from '../../../src/node/worker/server.js';
import type { Progress, SearchMatch } from '../../../src/node/worker/workerProtocol.js';
import { loadCollection } from '../../helpers/shared.js';
import { workerConfig } from './fixtures/workerConfig.js';

const cisi = loadCollection('cisi');
const tmp = mkdtempSync(join(tmpdir(), 'undertone-wordmatch-'));
const folder = join(tmp, 'ws');
const config = workerConfig({
  roots: [{ name: 'ws', fsPath: folder, exclude: [] }],
  indexFile: join(tmp, 'index.undertone'),
  settings: { k: 40 },
  honourGitignore: false,
});
/** Queries of the collection (its first five), asked while the concept model is built. */
const QUERIES = cisi.queries.slice(0, 5).map((q) => q.text);
const TOP = 10;

const service = new IndexService({ saveDelayMs: 60_000 });
const progress: Progress[] = [];
/** What a search answered on the spot during the build saw, per query. */
const early = new Map<string, { answer: readonly SearchMatch[]; stage: string; indexInUse: boolean }>();

beforeAll(async () => {
  mkdirSync(folder, { recursive: true });
  for (const d of cisi.docs) writeFileSync(join(folder, `${d.id}.txt`), d.text);
  const h = service.handlers();
  const now = service.immediateHandlers();
  const ctx: HandlerContext = {
    signal: new AbortController().signal,
    isCancelled: () => false,
    progress: (p) => progress.push(p),
    // The server calls this at the build's polls (server.ts): answer each query once, on the spot.
    pump: () => {
      for (const query of QUERIES) {
        if (early.has(query)) continue;
        const answer = now.search!({ query, top: TOP, like: [], unlike: [] });
        if (answer === undefined) return;
        const stage = progress.at(-1)?.stage ?? 'none';
        early.set(query, { answer, stage, indexInUse: service.index !== undefined });
      }
    },
  };
  await h.configure({ config }, ctx);
  await h.build({}, ctx);
}, 120_000);

afterAll(() => rmSync(tmp, { recursive: true, force: true }));

/** BM25 of every file for a query, from the index's stored counts (see the header for the source). */
function referenceBm25(index: LsiIndex, query: string): Map<string, number> {
  const k1 = 1.2;
  const b = 0.75;
  const q = countTerms(tokenize(query, index.settings.tokenize), index.vocab, false);
  const paths = index.paths();
  const docs = paths.map((p) => index.termsOf(p));
  const n = docs.length;
  const avgdl = docs.reduce((s, d) => s + d.length, 0) / n;
  const scores = new Map<string, number>();
  for (let qi = 0; qi < q.termIds.length; qi++) {
    const t = q.termIds[qi];
    const tf = docs.map((d) => {
      const at = Array.from(d.termIds).indexOf(t);
      return at < 0 ? 0 : d.counts[at];
    });
    const df = tf.filter((x) => x > 0).length;
    const idf = Math.log(1 + (n - df + 0.5) / (df + 0.5));
    tf.forEach((f, j) => {
      if (f === 0) return;
      const w = (q.counts[qi] * idf * f * (k1 + 1)) / (f + k1 * (1 - b + (b * docs[j].length) / avgdl));
      scores.set(paths[j], (scores.get(paths[j]) ?? 0) + w);
    });
  }
  return scores;
}

describe('word-match answers during a first build', () => {
  it('answers searches between the counting stage and the end of the SVD, marked as word match only', () => {
    expect(early.size).toBe(QUERIES.length);
    for (const e of early.values()) {
      expect(['matrix', 'svd']).toContain(e.stage);
      expect(e.indexInUse).toBe(false);
      expect(e.answer.length).toBe(TOP);
      expect(e.answer.every((m) => m.wordMatchOnly === true)).toBe(true);
      expect(e.answer[0].score).toBe(1);
    }
    // Progress after counting says how many files word match covers; before it, nothing.
    const firstMarked = progress.findIndex((p) => p.wordMatch !== undefined);
    expect(firstMarked).toBeGreaterThan(0);
    expect(progress.slice(0, firstMarked).every((p) => p.stage === 'scan' || p.stage === 'read')).toBe(true);
    expect(progress[firstMarked].wordMatch).toBe(cisi.docs.length);
  });

  it('ranks by BM25 as computed independently from the same counts (Robertson & Zaragoza 2009)', () => {
    const index = service.index!;
    for (const [query, e] of early) {
      const ref = referenceBm25(index, query);
      const ranked = [...ref].sort((a, b) => b[1] - a[1] || (a[0] < b[0] ? -1 : 1));
      const best = ranked[0][1];
      // Same files in the same order (ties broken alike: by path), same scores relative to the best.
      expect(e.answer.map((m) => m.key)).toEqual(ranked.slice(0, TOP).map(([p]) => p));
      e.answer.forEach((m, i) => expect(m.score).toBeCloseTo(ranked[i][1] / best, 9));
    }
  });

  it('switches to the full ranking once the build is done, and keeps nothing of the word-match answers', async () => {
    expect(service.wordMatch).toBeUndefined();
    const after = await service.search(QUERIES[0], TOP);
    expect(after.some((m) => m.wordMatchOnly)).toBe(false);
    expect(service.immediateHandlers().search!({ query: QUERIES[0], top: TOP, like: [], unlike: [] })).toBeUndefined();
  });
});
