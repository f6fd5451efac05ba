/**
 * The build's sections: counted on the tokenizing threads while they read the files (sortedCount
 * with sections) or read again in the sections stage, then folded all at once on the build's
 * executor. The reference is the plain path of a file saved in the editor: foldSections over
 * tokenize + countTerms + projectTerms (src/core/sections/sectionVectors.ts), file by file.
 * Files (public text, written out as files):
 *   - CRAN abstracts (test/fixtures/corpora/cran), .txt: windows of lines;
 *   - numba-doc 0.56.4 pages (Debian, BSD-2-Clause; test/fixtures/numba-doc-sections), .rst:
 *     headings, some with non-ASCII text; a few written with "\r\n" and a few with "\r" line ends;
 *   - the hand-checked files of test/fixtures/sections (Go, C#, Rust, C, Python, AsciiDoc, Markdown);
 *   - German manual pages (manpages-de 4.18.1; test/fixtures/languages/known-item/de.jsonl), .md:
 *     counted in German as files, so their sections are left to the sections stage.
 * Tolerance 1e-6 per number (the brief's; the sums are the same operations in the same order, so
 * they are expected to agree to the bit).
 */
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { gunzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { countTerms } from '../../src/core/counting/termCounts.js';
import type { LsiIndex } from '../../src/core/index/lsiIndex.js';
import { resolveSettings } from '../../src/core/index/model/settings.js';
import { splitLines, splitSections } from '../../src/core/sections/splitSections.js';
import { foldContextOf, foldSections } from '../../src/core/sections/sectionVectors.js';
import { fileLanguage } from '../../src/core/text/detectLanguage.js';
import { tokenize } from '../../src/core/text/tokenize.js';
import { runIndexPipeline, type SourceFile } from '../../src/node/indexPipeline.js';
import { countFilesSorted } from '../../src/node/parallel/sortedCount.js';
import { WorkerPool } from '../../src/node/parallel/workerPool.js';
import { fixturePath, loadCollection } from '../helpers/shared.js';
import { useBundledParallelWorker } from '../helpers/parallelWorkerBundle.js';

const tmp = mkdtempSync(join(tmpdir(), 'undertone-sections-'));
const texts = new Map<string, string>();
let files: SourceFile[] = [];
let restoreWorker: () => void = () => undefined;

function add(key: string, text: string): void {
  texts.set(key, text);
}

function corpus(): void {
  for (const d of loadCollection('cran').docs.slice(0, 220)) add(`cran/${d.id}.txt`, d.text);
  const numba = gunzipSync(readFileSync(fixturePath('numba-doc-sections/docs.jsonl.gz')))
    .toString('utf8')
    .split('\n')
    .filter((l) => l.trim())
    .map((l) => JSON.parse(l) as { id: string; text: string });
  numba.forEach((d, i) => {
    // Every fifth page with "\r\n" line ends, every seventh with "\r" (old Mac), the rest as shipped.
    const text = i % 5 === 0 ? d.text.replace(/\n/g, '\r\n') : i % 7 === 0 ? d.text.replace(/\n/g, '\r') : d.text;
    add(`numba/${d.id}`, text);
  });
  const dir = fixturePath('sections');
  for (const name of readdirSync(dir)) if (name !== 'README.md') add(`code/${name}`, readFileSync(join(dir, name), 'utf8'));
  const de = readFileSync(fixturePath('languages/known-item/de.jsonl'), 'utf8')
    .split('\n')
    .filter((l) => l.trim())
    .slice(0, 12)
    .map((l) => JSON.parse(l) as { page: string; text: string });
  for (const p of de) add(`de/${p.page}.md`, `# ${p.page}\n\n${p.text}`);
}

beforeAll(async () => {
  restoreWorker = await useBundledParallelWorker(tmp);
  corpus();
  files = [...texts].map(([key, text]) => {
    const absPath = join(tmp, 'files', key);
    mkdirSync(dirname(absPath), { recursive: true });
    writeFileSync(absPath, text);
    const st = statSync(absPath);
    return { key, absPath, size: st.size, mtimeMs: st.mtimeMs };
  });
});

afterAll(() => {
  restoreWorker();
  rmSync(tmp, { recursive: true, force: true });
});

const settings = resolveSettings({ k: 40 });
const none = { binary: 0, tooLarge: 0, unreadable: 0, other: 0 };
const pipeline = (threads: false | { threads: number }, previous?: LsiIndex) =>
  runIndexPipeline({
    settings,
    scan: async () => ({ files, skipped: { ...none } }),
    maxFileBytes: 1 << 20,
    previous,
    emptyMessage: 'empty',
    threads,
  });

/** Largest difference of any section vector from the reference fold of the file's text; checks the cut too. */
function worstAgainstReference(index: LsiIndex): { worst: number; sections: number } {
  const ctx = foldContextOf(index);
  let worst = 0;
  let sections = 0;
  for (const [key, text] of texts) {
    const want = foldSections(ctx, key, text);
    const got = index.sections.get(key);
    expect(got, key).toBeDefined();
    expect(Array.from(got!.starts), key).toEqual(Array.from(want.starts));
    expect(Array.from(got!.ends), key).toEqual(Array.from(want.ends));
    expect(got!.titles, key).toEqual(want.titles);
    for (let i = 0; i < want.vectors.length; i++) worst = Math.max(worst, Math.abs(got!.vectors[i] - want.vectors[i]));
    sections += want.starts.length;
  }
  return { worst, sections };
}

describe('sections of a build', () => {
  it('the tokenizing threads count each section as tokenize + countTerms over the final vocabulary do', async () => {
    const pool = WorkerPool.start({ threads: 2 });
    expect(pool).toBeDefined(); // the bundled thread script was found
    try {
      const jobs = files.map((f) => ({ absPath: f.absPath, size: f.size, key: f.key }));
      const { vocab, outcomes } = await countFilesSorted(pool!, jobs, {
        tokenize: settings.tokenize,
        maxFileBytes: 1 << 20,
        sections: true,
      });
      let counted = 0;
      let crlf = 0;
      outcomes.forEach((got, i) => {
        const key = files[i].key;
        const text = texts.get(key)!;
        expect(got.kind).toBe('text');
        if (got.kind !== 'text') return;
        // Files counted in another language are left to the sections stage.
        expect(got.sections === undefined, key).toBe(got.language !== undefined);
        if (!got.sections) return;
        const lines = splitLines(text);
        const cut = splitSections(key, text).sections;
        expect(Array.from(got.sections.starts)).toEqual(cut.map((s) => s.start));
        expect(Array.from(got.sections.ends)).toEqual(cut.map((s) => s.end));
        expect(got.sections.titles).toEqual(cut.map((s) => s.title));
        cut.forEach((s, j) => {
          const want = countTerms(tokenize(lines.slice(s.start, s.end).join('\n'), settings.tokenize), vocab, false);
          const a = got.sections!.offsets[j];
          const b = got.sections!.offsets[j + 1];
          expect(Array.from(got.sections!.termIds.subarray(a, b)), `${key} §${j}`).toEqual(Array.from(want.termIds));
          expect(Array.from(got.sections!.counts.subarray(a, b)), `${key} §${j}`).toEqual(Array.from(want.counts));
        });
        counted++;
        if (text.includes('\r')) crlf++;
      });
      expect(counted).toBeGreaterThan(300);
      expect(crlf).toBeGreaterThan(20);
      expect(outcomes.filter((o) => o.kind === 'text' && o.language === 'de').length).toBeGreaterThan(5);
    } finally {
      await pool!.close();
    }
  });

  it('gives every file the reference section vectors, with threads (counted while read) and without (read again)', async () => {
    const threaded = await pipeline({ threads: 2 });
    const serial = await pipeline(false);
    // An incremental build over a previous index (its vocabulary reused): sections read again.
    const again = await pipeline({ threads: 2 }, serial.index);
    // Only the pages counted in another language (German) are read again after a build from scratch.
    const foreign = [...texts].filter(([key, text]) => fileLanguage(key, text, settings.tokenize.languages) !== 'en').length;
    expect(foreign).toBeGreaterThan(5);
    expect(threaded.sectionsReadAgain).toBe(foreign);
    expect(serial.sectionsReadAgain).toBe(files.length);
    for (const r of [threaded, serial, again]) {
      const { worst, sections } = worstAgainstReference(r.index);
      expect(sections).toBeGreaterThan(1000);
      expect(worst).toBeLessThanOrEqual(1e-6);
    }
  });
});
