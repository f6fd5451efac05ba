import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { countTerms, Vocabulary } from '../../../src/core/counting/termCounts.js';
import { fileLanguage } from '../../../src/core/text/detectLanguage.js';
import { tokenizeIn } from '../../../src/core/text/tokenizeLanguage.js';
import { DEFAULT_TOKENIZE_OPTIONS } from '../../../src/core/text/tokenize.js';
import { WordCounter } from '../../../src/node/parallel/wordCounter.js';
import { loadCollection, REPO_ROOT } from '../../helpers/shared.js';

// Reference: the plain pipeline, countTerms(tokenizeIn(text, options, fileLanguage(path, text))),
// on Debian's translated manual pages (test/fixtures/languages) interleaved with English CRAN
// abstracts, so one counter's caches see both.
const PAGES = ['de', 'fr', 'es', 'nl', 'sv'].flatMap((lang) =>
  readFileSync(join(REPO_ROOT, 'test/fixtures/languages/known-item', `${lang}.jsonl`), 'utf8')
    .split('\n')
    .filter((l) => l.length > 0)
    .slice(0, 12)
    .map((l) => (JSON.parse(l) as { text: string }).text),
);

function reference(path: string, text: string): Map<string, number> {
  const vocab = new Vocabulary();
  const language = fileLanguage(path, text, DEFAULT_TOKENIZE_OPTIONS.languages);
  const t = countTerms(tokenizeIn(text, DEFAULT_TOKENIZE_OPTIONS, language), vocab, true);
  return new Map(Array.from(t.termIds, (id, i) => [vocab.termOf(id), t.counts[i]]));
}

describe('WordCounter with languages', () => {
  it('counts prose files in their detected language, and code files by the English rules, as the plain pipeline does', () => {
    const english = loadCollection('cran')
      .docs.slice(0, 60)
      .map((d) => d.text);
    const counter = new WordCounter(DEFAULT_TOKENIZE_OPTIONS);
    const terms: string[] = [];
    let foreign = 0;
    PAGES.forEach((text, i) => {
      for (const [path, t] of [
        [`notes/page${i}.md`, text],
        [`src/page${i}.ts`, text],
        [`doc${i}.txt`, english[i % english.length]],
      ] as const) {
        const packed = counter.packText(t, path);
        if (packed.language !== undefined) foreign++;
        const { ids, counts } = counter.takePack();
        terms.push(...counter.takeNewTerms());
        const bag = new Map(Array.from(ids, (id, j) => [terms[id], counts[j]]));
        expect(bag, path).toEqual(reference(path, t));
        expect(packed.length).toBe([...bag.values()].reduce((a, b) => a + b, 0));
      }
    });
    expect(foreign).toBeGreaterThan(PAGES.length / 2);
  });

  it('counts an ASCII prose file the same from its bytes as from its text', () => {
    const text =
      'Die Funktion retryBudget begrenzt die Wiederholungen, und wenn das Budget aufgebraucht ist, dann schlagen weitere Aufrufe fehl. Sie ist nicht schnell.';
    const a = new WordCounter(DEFAULT_TOKENIZE_OPTIONS);
    const b = new WordCounter(DEFAULT_TOKENIZE_OPTIONS);
    const fromText = a.packText(text, 'note.md');
    const fromBytes = b.packAscii(new TextEncoder().encode(text), 'note.md');
    expect(fromText.language).toBe('de');
    expect(fromBytes.language).toBe('de');
    expect(b.takePack()).toEqual(a.takePack());
    expect(b.takeNewTerms()).toEqual(a.takeNewTerms());
  });
});
