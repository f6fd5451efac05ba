/**
 * The section stage's fast counts against the reference path, on public documentation:
 * numba-doc 0.56.4 (Debian, BSD-2-Clause; test/fixtures/numba-doc-sections). The reference is
 * the plain pipeline, countTerms(tokenize(text), vocab, false), and the section vectors folded
 * with it (foldSections without a counter); the fast path must give the same ids, counts and
 * lengths, hence bit-identical vectors.
 */
import { readFileSync } from 'node:fs';
import { gunzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { countTerms } from '../../../src/core/counting/termCounts.js';
import { IndexBuilder } from '../../../src/core/index/model/indexBuilder.js';
import { splitLines, splitSections } from '../../../src/core/sections/splitSections.js';
import { foldContextOf, foldSections } from '../../../src/core/sections/sectionVectors.js';
import { tokenize } from '../../../src/core/text/tokenize.js';
import { SectionCounter } from '../../../src/node/parallel/sectionCounter.js';
import { fixturePath } from '../../helpers/shared.js';

const docs = gunzipSync(readFileSync(fixturePath('numba-doc-sections/docs.jsonl.gz')))
  .toString('utf8')
  .split('\n')
  .filter((l) => l.trim())
  .map((l) => JSON.parse(l) as { id: string; text: string });

describe('SectionCounter', () => {
  // Build on half the pages, so the other half has words the vocabulary lacks.
  const builder = new IndexBuilder({});
  docs.filter((_, i) => i % 2 === 0).forEach((d) => builder.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text));
  const index = builder.build();
  const ctx = foldContextOf(index);

  it('counts every section as tokenize + countTerms over the frozen vocabulary do', () => {
    const counter = new SectionCounter(ctx.vocab, ctx.tokenize);
    let sections = 0;
    let unknown = 0;
    for (const d of docs) {
      const lines = splitLines(d.text);
      for (const s of splitSections(d.id, d.text).sections) {
        const text = lines.slice(s.start, s.end).join('\n');
        const want = countTerms(tokenize(text, ctx.tokenize), ctx.vocab, false);
        const got = counter.count(text);
        expect(Array.from(got.termIds)).toEqual(Array.from(want.termIds));
        expect(Array.from(got.counts)).toEqual(Array.from(want.counts));
        expect(got.length).toBe(want.length);
        if (tokenize(text, ctx.tokenize).length > want.length) unknown++;
        sections++;
      }
    }
    expect(sections).toBeGreaterThan(500);
    expect(unknown).toBeGreaterThan(10); // the held-back pages do bring unknown words
  });

  it('folds the same section vectors as the reference path (bit for bit)', () => {
    const counter = new SectionCounter(ctx.vocab, ctx.tokenize);
    const fast = { ...ctx, count: (t: string) => counter.count(t) };
    for (const d of docs) {
      const want = foldSections(ctx, d.id, d.text);
      const got = foldSections(fast, d.id, d.text);
      expect(Array.from(got.starts)).toEqual(Array.from(want.starts));
      expect(Array.from(got.vectors)).toEqual(Array.from(want.vectors));
    }
  });
});
