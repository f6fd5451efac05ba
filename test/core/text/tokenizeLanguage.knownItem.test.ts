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

function mrr(pages: readonly Page[], tokenize: Partial<TokenizeOptions>): { mrr: number; languages: Map<string, number> } {
  const b = new IndexBuilder({ tokenize: tokenize as TokenizeOptions, seed: 1 });
  for (const p of pages) b.addText({ path: `${p.page}.txt`, size: p.text.length, mtimeMs: 0 }, p.text);
  const index = b.build();
  const languages = new Map<string, number>();
  for (const path of index.paths()) {
    const l = index.meta(path)?.language ?? 'en';
    languages.set(l, (languages.get(l) ?? 0) + 1);
  }
  let sum = 0;
  for (const p of pages) {
    let hits: readonly { path: string }[] = [];
    try {
      hits = index.search(p.question, { top: 10 });
    } catch {
      // NoKnownTermsError: the question's words are all unknown (rank: none).
    }
    const rank = hits.findIndex((h) => h.path === `${p.page}.txt`);
    if (rank >= 0) sum += 1 / (rank + 1);
  }
  return { mrr: sum / pages.length, languages };
}

describe('tokenizeIn on translated manual pages (known-item search)', () => {
  const results = LANGS.map((lang) => {
    const pages = load(lang);
    return {
      lang,
      detected: mrr(pages, { stem: true, keepCompounds: true, languages: 'auto' }),
      english: mrr(pages, { stem: true, keepCompounds: true, languages: ['en'] }),
      unstemmed: mrr(pages, { stem: false, keepCompounds: true, languages: ['en'] }),
    };
  });

  it('detects the language of at least three pages in four (the rest are read as English)', () => {
    for (const r of results) {
      const all = [...r.detected.languages.values()].reduce((a, b) => a + b, 0);
      expect((r.detected.languages.get(r.lang) ?? 0) / all, r.lang).toBeGreaterThanOrEqual(0.75);
    }
  });

  // Measured (see the report of issue 16): per-language stemming does not beat English rules on
  // this task (questions reuse the page's own words); the check is that it costs little.
  it('finds pages by their description about as well with the detected language as with English rules or none (within 0.03 MRR on average)', () => {
    const mean = (f: (r: (typeof results)[number]) => number): number => results.reduce((s, r) => s + f(r), 0) / results.length;
    const detected = mean((r) => r.detected.mrr);
    const unstemmed = mean((r) => r.unstemmed.mrr);
    const english = mean((r) => r.english.mrr);
    console.log(
      results
        .map(
          (r) =>
            `${r.lang}: detected ${r.detected.mrr.toFixed(3)} english ${r.english.mrr.toFixed(3)} unstemmed ${r.unstemmed.mrr.toFixed(3)}`,
        )
        .join('\n'),
    );
    expect(detected).toBeGreaterThan(unstemmed - 0.03);
    expect(detected).toBeGreaterThan(english - 0.03);
  });
});
