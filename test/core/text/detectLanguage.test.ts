import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import {
  candidateLanguages,
  detectLanguage,
  fileLanguage,
  fileLanguageAscii,
  isProsePath,
  queryLanguage,
} from '../../../src/core/text/detectLanguage.js';
import { LANGUAGES } from '../../../src/core/text/languages.js';
import { loadCollection, REPO_ROOT } from '../../helpers/shared.js';

// Reference: the language of Debian's translated manual pages (manpages-de/-fr/-es/-nl/-sv
// 4.18.1, test/fixtures/languages) is the package's; English: CRAN abstracts (test collection).
function pages(lang: string): string[] {
  return readFileSync(join(REPO_ROOT, 'test/fixtures/languages/known-item', `${lang}.jsonl`), 'utf8')
    .split('\n')
    .filter((l) => l.length > 0)
    .map((l) => (JSON.parse(l) as { text: string }).text);
}

describe('detectLanguage', () => {
  // Some translated pages keep untranslated English paragraphs, so English counts as no mistake;
  // fileLanguage reads a page with a clear second language in that language.
  it('names the language of translated manual pages, and seldom a third language', () => {
    for (const lang of ['de', 'fr', 'es', 'nl', 'sv']) {
      const got = pages(lang).map((t) => fileLanguage('page.txt', t, 'auto'));
      const right = got.filter((g) => g === lang).length;
      const wrong = got.filter((g) => g !== undefined && g !== lang && g !== 'en').length;
      expect(right / got.length, lang).toBeGreaterThanOrEqual(0.75);
      expect(wrong / got.length, lang).toBeLessThanOrEqual(0.05);
    }
  });

  it('reads English abstracts as English', () => {
    const docs = loadCollection('cran').docs.slice(0, 200);
    const english = docs.filter((d) => detectLanguage(d.text, LANGUAGES) === 'en').length;
    expect(english / docs.length).toBeGreaterThanOrEqual(0.95);
    const asFiles = docs.filter((d) => fileLanguage('abstract.txt', d.text, 'auto') === 'en').length;
    expect(asFiles / docs.length).toBeGreaterThanOrEqual(0.95);
  });
});

describe('detectLanguage, the sample', () => {
  // Reference: the same translated manual pages; the German stop words "und", "der", "die"
  // (stopwords-iso's German list).
  it('reads a page the same with its words on ASCII lines or beside a non-ASCII character', () => {
    for (const lang of ['de', 'fr', 'nl']) {
      for (const page of pages(lang).slice(0, 20)) {
        // A non-ASCII mark at the end of every line takes the lines off the ASCII path; no word changes.
        const marked = page
          .split('\n')
          .map((line) => `${line} \u00b6`)
          .join('\n');
        expect(fileLanguage('page.txt', marked, 'auto'), lang).toBe(fileLanguage('page.txt', page, 'auto'));
      }
    }
  });

  it('reads ASCII bytes in place as it reads their text', () => {
    // The translated pages with every non-ASCII character dropped (ASCII text, still in the
    // page's language), with "\r\n" line ends, upper case, and fences and inline code added.
    const ascii = (t: string): string => t.replace(/[^\t\n\r -~]/g, '');
    const german = 'Und der Die das IST nicht mit sich auf dem '.repeat(8);
    const texts = [
      ...['de', 'fr', 'es', 'nl', 'sv'].flatMap((lang) => pages(lang).slice(0, 12).map(ascii)),
      ...loadCollection('cran')
        .docs.slice(0, 20)
        .map((d) => ascii(d.text)),
      ...pages('fr')
        .slice(0, 6)
        .map((t) => ascii(t).replace(/\n/g, '\r\n').toUpperCase()),
      `\`\`\`\n${german}\n  \`\`\`\n${german}`,
      ` \t~~~x\n${german}\n~~~\nthe and of to in is that \`${german}\` it was for\n\`\`\``,
      `unclosed \`inline und der die\nthe \`a\` of \`\`to\` in\`is that`,
      '',
    ];
    for (const text of texts)
      for (const sampleWords of [7, 40, 600]) {
        const bytes = Buffer.from(text, 'latin1');
        expect(fileLanguageAscii('page.txt', bytes, 'auto', { sampleWords }), text.slice(0, 40)).toBe(
          fileLanguage('page.txt', text, 'auto', { sampleWords }),
        );
      }
    // Tied scores: with margin 1 the language that scored first wins, in both readings.
    for (const text of ['nicht nous', 'nous nicht', 'niet nicht', 'kernel nicht niet']) {
      const o = { minHits: 1, margin: 1 };
      expect(fileLanguageAscii('page.txt', Buffer.from(text), 'auto', o), text).toBe(fileLanguage('page.txt', text, 'auto', o));
    }
    expect(fileLanguageAscii('src/a.py', Buffer.from(german), 'auto')).toBe('en');
    expect(fileLanguageAscii('notes/a.md', Buffer.from(german), 'auto')).toBe('de');
  });

  it('stops at sampleWords, and leaves out fenced blocks and inline code', () => {
    const english = 'the and of to in is that it was for on are with as at be by this '.repeat(3);
    const german = 'und der die das ist nicht mit sich auf dem '.repeat(20);
    expect(detectLanguage(`${english}\n${german}`, LANGUAGES, { sampleWords: 40 })).toBe('en');
    expect(detectLanguage(`${english}\n${german}`, LANGUAGES)).toBe('de');
    expect(detectLanguage(`\`\`\`\n${english}\n\`\`\`\n${german}`, LANGUAGES, { sampleWords: 40 })).toBe('de');
    expect(detectLanguage(`\`${english}\` ${german}`, LANGUAGES, { sampleWords: 40 })).toBe('de');
  });
});

describe('fileLanguage', () => {
  const german = pages('de')[3];
  it('keeps code files English and detects prose files', () => {
    expect(isProsePath('notes/a.md')).toBe(true);
    expect(isProsePath('README')).toBe(true);
    expect(isProsePath('src/a.ts')).toBe(false);
    expect(fileLanguage('src/a.py', german, 'auto')).toBe('en');
    expect(fileLanguage('notes/a.md', german, 'auto')).toBe('de');
  });

  it('is English only without the setting (indexes made before languages) and follows a listed language', () => {
    expect(fileLanguage('notes/a.md', german, undefined)).toBe('en');
    expect(fileLanguage('notes/a.md', german, ['fr'])).toBe('fr');
    expect(candidateLanguages(['xx' as never])).toEqual(['en']);
  });
});

describe('queryLanguage', () => {
  it('reads a question in its own language when it has stop words, else in the fallback', () => {
    expect(queryLanguage('wie funktioniert das Budget', 'auto', 'en')).toBe('de');
    expect(queryLanguage('how does the retry budget work', 'auto', 'de')).toBe('en');
    expect(queryLanguage('retry budget', 'auto', 'de')).toBe('de');
    expect(queryLanguage('retry budget', ['en'], 'de')).toBe('en');
  });

  // Spanish NAME lines of Debian's manpages-es 4.18.1 (known-item fixture): without the index's
  // languages, some were read as Portuguese or French on their shared "de", "a", "o".
  it('reads a question only in a language the index has', () => {
    const questions = readFileSync(join(REPO_ROOT, 'test/fixtures/languages/known-item/es.jsonl'), 'utf8')
      .split('\n')
      .filter((l) => l.length > 0)
      .map((l) => (JSON.parse(l) as { question: string }).question);
    const got = questions.map((q) => queryLanguage(q, 'auto', 'es', ['es', 'en']));
    expect(got.every((l) => l === 'es' || l === 'en')).toBe(true);
    expect(got.filter((l) => l === 'es').length / got.length).toBeGreaterThanOrEqual(0.9);
    expect(queryLanguage('o de a', 'auto', 'es', ['de'])).toBe('de');
  });
});
