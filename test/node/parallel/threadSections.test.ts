/**
 * Sections counted on a tokenizing thread from the text it has just counted (threadSections.ts)
 * against the plain pipeline: countTerms(tokenize(the section's lines joined by "\n"), vocab,
 * true) in the thread's own vocabulary, for the words noted during the count (recordWords) and
 * for a second scan of the units. Text: numba-doc 0.56.4 pages (Debian, BSD-2-Clause;
 * test/fixtures/numba-doc-sections), as shipped, with "\r\n" and with "\r" line ends, and the
 * hand-checked code files of test/fixtures/sections.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gunzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { countTerms, Vocabulary } from '../../../src/core/counting/termCounts.js';
import { splitLines, splitSections } from '../../../src/core/sections/splitSections.js';
import { tokenize } from '../../../src/core/text/tokenize.js';
import { countThreadSections } from '../../../src/node/parallel/threadSections.js';
import { WordCounter } from '../../../src/node/parallel/wordCounter.js';
import { fixturePath } from '../../helpers/shared.js';

const pages = gunzipSync(readFileSync(fixturePath('numba-doc-sections/docs.jsonl.gz')))
  .toString('utf8')
  .split('\n')
  .filter((l) => l.trim())
  .map((l) => JSON.parse(l) as { id: string; text: string });
const code = readdirSync(fixturePath('sections'))
  .filter((n) => n !== 'README.md')
  .map((n) => ({ id: n, text: readFileSync(join(fixturePath('sections'), n), 'utf8') }));
const files = [
  ...pages,
  ...pages.slice(0, 30).map((p) => ({ id: p.id, text: p.text.replace(/\n/g, '\r\n') })),
  ...pages.slice(30, 50).map((p) => ({ id: p.id, text: p.text.replace(/\n/g, '\r') })),
  ...code,
];

describe('countThreadSections', () => {
  for (const recordWords of [true, false]) {
    it(`counts each section as tokenize + countTerms of its lines do (${recordWords ? 'from the noted words' : 'scanning again'})`, () => {
      const wc = new WordCounter({});
      wc.recordWords = recordWords;
      const vocab = new Vocabulary();
      let sections = 0;
      let nonAscii = 0;
      for (const f of files) {
        // Code files have no language to detect; pages are counted as a thread counts them.
        const packed = wc.packText(f.text, f.id);
        expect(packed.language).toBeUndefined();
        const got = countThreadSections(wc, f.id, f.text);
        const { ids, counts } = wc.drainSectionPack();
        wc.drainPack();
        const local = wc.takeNewTerms();
        for (const t of local) vocab.add(t); // local ids are added in order, so they are vocabulary ids
        const lines = splitLines(f.text);
        const cut = splitSections(f.id, f.text).sections;
        expect(Array.from(got.starts)).toEqual(cut.map((s) => s.start));
        expect(got.titles).toEqual(cut.map((s) => s.title));
        expect(got.offsets[0]).toBe(0);
        cut.forEach((s, j) => {
          const want = countTerms(tokenize(lines.slice(s.start, s.end).join('\n')), vocab, false);
          const a = got.offsets[j];
          const b = got.offsets[j + 1];
          // The thread's pack holds each section's ids in the order the text first used them;
          // ordered by id, they are countTerms's.
          const run = Array.from(ids.subarray(a, b), (id, i) => [id, counts[a + i]]).sort((x, y) => x[0] - y[0]);
          expect(
            run.map((r) => r[0]),
            `${f.id} §${j}`,
          ).toEqual(Array.from(want.termIds));
          expect(
            run.map((r) => r[1]),
            `${f.id} §${j}`,
          ).toEqual(Array.from(want.counts));
          sections++;
        });
        if (/[^ -~\s]/.test(f.text)) nonAscii++;
      }
      expect(sections).toBeGreaterThan(800);
      expect(nonAscii).toBeGreaterThan(3);
    });
  }
});
