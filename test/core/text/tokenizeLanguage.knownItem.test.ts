import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { IndexBuilder } from '../../../src/core/index/model/indexBuilder.js';
import type { TokenizeOptions } from '../../../src/core/text/tokenize.js';
import { REPO_ROOT } from '../../helpers/shared.js';

// Known-item retrieval on Debian's translated manual pages (manpages-de/-fr/-es/-nl/-sv 4.18.1,
// test/fixtures/languages/README.md): each page's NAME description is the question, the rest of
// the page the document; the score is the mean reciprocal rank of the page over all its
// questions, through the index's own search. Three tokenizers in the same run: each file in its
// detected language (the default), English rules for every file (the tokenizer before languages),
// and no stemming at all (the baseline the issue names).
const FIXTURE = join(REPO_ROOT, 'test/fixtures/languages/known-item');
const LANGS = ['de', 'fr', 'es', 'nl', 'sv'];

interface Page {
  readonly page: string;
  readonly question: string;
  readonly text: string;
}

function load(lang: string): Page[] {
  return readFileSync(join(FIXTURE, `${lang}.jsonl`), 'utf8')
    .split('\n')
    .filter((l) => l.length > 0)
    .map((l) => JSON.parse(l) as Page);
}

interface Run {
  /** Reciprocal rank of each page for its question (0 when not in the top 10). */
  readonly rr: number[];
  readonly mrr: number;
  readonly languages: Map<string, number>;
}

function run(pages: readonly Page[], tokenize: Partial<TokenizeOptions>): Run {
  const b = new IndexBuilder({ tokenize: tokenize as TokenizeOptions, seed: 1 });
  for (const p of pages) b.addText({ path: `${p.page}.txt`, size: p.text.length, mtimeMs: 0 }, p.text);
  const index = b.build();
  const languages = new Map<string, number>();
  for (const path of index.paths()) {
    const l = index.meta(path)?.language ?? 'en';
    languages.set(l, (languages.get(l) ?? 0) + 1);
  }
  const rr = pages.map((p) => {
    let hits: readonly { path: string }[] = [];
    try {
      hits = index.search(p.question, { top: 10 });
    } catch {
      // NoKnownTermsError: the question's words are all unknown (rank: none).
    }
    const rank = hits.findIndex((h) => h.path === `${p.page}.txt`);
    return rank >= 0 ? 1 / (rank + 1) : 0;
  });
  return { rr, mrr: rr.reduce((a, b) => a + b, 0) / rr.length, languages };
}

/** Mean and standard error of the per-question differences a − b (paired). */
function paired(a: Run, b: Run): { mean: number; se: number } {
  const d = a.rr.map((x, i) => x - b.rr[i]);
  const mean = d.reduce((s, x) => s + x, 0) / d.length;
  const sd = Math.sqrt(d.reduce((s, x) => s + (x - mean) ** 2, 0) / (d.length - 1));
  return { mean, se: sd / Math.sqrt(d.length) };
}

describe('tokenizeIn on translated manual pages (known-item search)', () => {
  const results = LANGS.map((lang) => {
    const pages = load(lang);
    return {
      lang,
      detected: run(pages, { stem: true, keepCompounds: true, languages: 'auto' }),
      english: run(pages, { stem: true, keepCompounds: true, languages: ['en'] }),
      unstemmed: run(pages, { stem: false, keepCompounds: true, languages: ['en'] }),
    };
  });
  const fmt = (p: { mean: number; se: number }): string => `${p.mean >= 0 ? '+' : ''}${p.mean.toFixed(3)}±${p.se.toFixed(3)}`;
  console.log(
    results
      .map(
        (r) =>
          `${r.lang} (${r.detected.rr.length} pages, read as ${[...r.detected.languages].map(([l, n]) => `${l} ${n}`).join(', ')}): ` +
          `detected ${r.detected.mrr.toFixed(3)} english ${r.english.mrr.toFixed(3)} unstemmed ${r.unstemmed.mrr.toFixed(3)}; ` +
          `detected−english ${fmt(paired(r.detected, r.english))} detected−unstemmed ${fmt(paired(r.detected, r.unstemmed))}`,
      )
      .join('\n'),
  );

  // Some translated pages are partly or wholly untranslated English (Spanish most: 15 of 160).
  it('detects the language of at least 85% of the pages (the rest are read as English)', () => {
    for (const r of results) {
      const all = [...r.detected.languages.values()].reduce((a, b) => a + b, 0);
      expect((r.detected.languages.get(r.lang) ?? 0) / all, r.lang).toBeGreaterThanOrEqual(0.85);
    }
  });

  // Measured (report of issue 16): Dutch and Swedish +0.02 to +0.04 over English rules and over
  // no stemming, German, French and Spanish level to -0.02; every difference is within 1.2
  // standard errors of the paired differences (0.013-0.039), so this material shows no real
  // gain: its questions are the pages' own NAME lines and mostly reuse the pages' words. The
  // checks: no language loses more than 0.04 to either reference, and Dutch and Swedish stay
  // above no stemming.
  it('finds pages by their description at least about as well in the detected language, per language', () => {
    for (const r of results) {
      expect(r.detected.mrr, r.lang).toBeGreaterThan(r.english.mrr - 0.04);
      expect(r.detected.mrr, r.lang).toBeGreaterThan(r.unstemmed.mrr - 0.04);
    }
    for (const r of results.filter((x) => x.lang === 'nl' || x.lang === 'sv'))
      expect(r.detected.mrr, r.lang).toBeGreaterThan(r.unstemmed.mrr + 0.01);
  });
});
