import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { countTerms, Vocabulary } from '../../../src/core/counting/termCounts.js';
import { tokenize } from '../../../src/core/text/tokenize.js';
import { WordCounter } from '../../../src/node/parallel/wordCounter.js';
import { loadCollection, REPO_ROOT } from '../../helpers/shared.js';

// The reference is the plain pipeline itself: countTerms(tokenize(text)) (brute force, no cache).
function reference(text: string): Map<string, number> {
  const vocab = new Vocabulary();
  const t = countTerms(tokenize(text), vocab, true);
  return new Map(Array.from(t.termIds, (id, i) => [vocab.termOf(id), t.counts[i]]));
}

function viaCounter(counter: WordCounter, terms: string[], text: string): { bag: Map<string, number>; length: number } {
  const c = counter.count(text);
  terms.push(...counter.takeNewTerms());
  for (let i = 1; i < c.ids.length; i++) expect(c.ids[i]).toBeGreaterThan(c.ids[i - 1]);
  return { bag: new Map(Array.from(c.ids, (id, i) => [terms[id], c.counts[i]])), length: c.length };
}

const ODD_TEXTS = [
  'getUserName HTTPServer parse_json_value kebab-case x86_64 $scope __init__ 0xDEADBEEF deadbeef12',
  'Café naïve résumé — “quoted” ﬁle ①②③ Ｆｕｌｌｗｉｄｔｈ ΑΒΓ δέλτα 東京 ゲーム',
  'e\u0301tude combining marks: a\u0300 o\u0308 and emoji 😀 in text_with_snake',
  'astral letters 𝐀𝐁𝐂 𠀀𠀁 and 𝟙𝟚 digits, lone \ud800 surrogate, 東京タワー 한국어 Ⅻ ǅungla İstanbul ΣΊΣΥΦΟΣ',
  '東京'.repeat(25), // a caseless run over 40 units: no term
  'numbers 12345 1234 3.14159 v2 2fa a1b2c3d4e5 Version42Beta',
  '',
  '   ',
  'a b c',
  'The the THE of and',
];

describe('WordCounter', () => {
  it('counts exactly what tokenize + countTerms count, on odd text (reference: the uncached pipeline)', () => {
    const counter = new WordCounter({});
    const terms: string[] = [];
    for (const text of [...ODD_TEXTS, ...ODD_TEXTS]) {
      const got = viaCounter(counter, terms, text);
      const want = reference(text);
      expect(got.bag).toEqual(want);
      expect(got.length).toBe(tokenize(text).length);
    }
  });

  it('counts ASCII bytes exactly as the same text (reference: the uncached pipeline)', () => {
    const counter = new WordCounter({});
    const terms: string[] = [];
    for (const text of ['getUserName HTTPServer x86_64 0xDEADBEEF running runs', 'the parse_json_value getUserName', '']) {
      const c = counter.countAscii(Buffer.from(text, 'ascii'));
      terms.push(...counter.takeNewTerms());
      expect(new Map(Array.from(c.ids, (id, i) => [terms[id], c.counts[i]]))).toEqual(reference(text));
      expect(c.length).toBe(tokenize(text).length);
    }
  });

  const cran = loadCollection('cran');
  it('counts every ASCII character as the uncached pipeline does, and a run of its lines alike (reference: tokenize + countTerms)', () => {
    // Each of the 128 ASCII units beside letters, digits and the word characters '_' and '$'.
    const all = Array.from({ length: 128 }, (_, c) => String.fromCharCode(c));
    const lines = [all.join(''), all.map((c) => `ab${c}cd`).join(' '), all.map((c) => `${c}Xy_z$9`).join(''), 'end$ of_file x'];
    const text = lines.join('\n');
    for (const recordWords of [false, true]) {
      const counter = new WordCounter({});
      counter.recordWords = recordWords;
      const terms: string[] = [];
      const c = counter.countAscii(Buffer.from(text, 'latin1'));
      terms.push(...counter.takeNewTerms());
      expect(new Map(Array.from(c.ids, (id, i) => [terms[id], c.counts[i]]))).toEqual(reference(text));
      expect(c.length).toBe(tokenize(text).length);
      // Lines 1–2 as a section: the same as counting those lines alone.
      counter.packAscii(Buffer.from(text, 'latin1'));
      const from = lines[0].length + 1;
      const to = from + lines[1].length + 1 + lines[2].length;
      const p = counter.packSection(from, to);
      terms.push(...counter.takeNewTerms());
      const s = counter.drainSectionPack();
      const bag = new Map<string, number>();
      for (let i = p.at; i < p.at + p.terms; i++) bag.set(terms[s.ids[i]], s.counts[i]);
      const part = `${lines[1]}\n${lines[2]}`;
      expect(bag).toEqual(reference(part));
      expect(p.length).toBe(tokenize(part).length);
    }
  });

  it('keeps section counts of 255 and more exactly beside the one-byte counts (reference: tokenize + countTerms)', () => {
    // Counts on both sides of the one-byte limit, in two sections of one text.
    const lines = [`${'alpha '.repeat(254)}beta`, `${'gamma '.repeat(255)}${'delta '.repeat(70000)}alpha`];
    const text = lines.join('\n');
    const counter = new WordCounter({});
    counter.recordWords = true;
    counter.packAscii(Buffer.from(text, 'latin1'));
    const first = counter.packSection(0, lines[0].length + 1);
    const second = counter.packSection(lines[0].length + 1, text.length);
    const terms = counter.takeNewTerms();
    const s = counter.drainSectionPack();
    const bag = (p: { at: number; terms: number }): Map<string, number> => {
      const m = new Map<string, number>();
      for (let i = p.at; i < p.at + p.terms; i++) m.set(terms[s.ids[i]], s.counts[i]);
      return m;
    };
    expect(bag(first)).toEqual(reference(lines[0]));
    expect(bag(second)).toEqual(reference(lines[1]));
  });

  it('keeps file counts of 255 and more exactly through count, takePack and drainPack (reference: tokenize + countTerms)', () => {
    const texts = [`${'alpha '.repeat(254)}beta`, `${'gamma '.repeat(255)}${'delta '.repeat(70000)}alpha`, 'alpha beta'];
    const counter = new WordCounter({});
    const terms: string[] = [];
    for (const t of texts) expect(viaCounter(counter, terms, t).bag).toEqual(reference(t));
    for (const take of [() => counter.takePack(), () => counter.drainPack()]) {
      const packed = texts.map((t) => counter.packAscii(Buffer.from(t, 'latin1')));
      terms.push(...counter.takeNewTerms());
      const { ids, counts } = take();
      packed.forEach((p, k) => {
        const bag = new Map<string, number>();
        for (let i = p.at; i < p.at + p.terms; i++) bag.set(terms[ids[i]], counts[i]);
        expect(bag).toEqual(reference(texts[k]));
      });
    }
  });

  it('agrees with tokenize + countTerms on 400 CRAN abstracts', () => {
    const counter = new WordCounter({});
    const terms: string[] = [];
    for (const d of cran.docs.slice(0, 400)) expect(viaCounter(counter, terms, d.text).bag).toEqual(reference(d.text));
  });

  it('honours tokenize options (no stemming, no compounds)', () => {
    const opts = { stem: false, keepCompounds: false };
    const counter = new WordCounter(opts);
    const terms: string[] = [];
    const text = 'Running runners ran quickly; getUserName and parse_json_value';
    const vocab = new Vocabulary();
    const t = countTerms(tokenize(text, opts), vocab, true);
    const want = new Map(Array.from(t.termIds, (id, i) => [vocab.termOf(id), t.counts[i]]));
    expect(viaCounter(counter, terms, text).bag).toEqual(want);
    expect(want.has('running')).toBe(true);
  });

  // Real non-ASCII text through one counter: the GNOME help pages in Japanese, Simplified Chinese,
  // Russian, German and French (test/fixtures/gnome-help, Debian gnome-user-docs 43.0-2,
  // CC-BY-SA-3.0), Mallard XML unchanged.
  it('agrees with tokenize + countTerms on real pages in six languages (GNOME help, Debian gnome-user-docs)', () => {
    const root = join(REPO_ROOT, 'test', 'fixtures', 'gnome-help');
    const files = (readdirSync(root, { recursive: true }) as string[]).filter((f) => f.endsWith('.page')).sort();
    const counter = new WordCounter({});
    const terms: string[] = [];
    const scripts = new Set<string>();
    for (const f of files) {
      const text = readFileSync(join(root, f), 'utf8');
      expect(viaCounter(counter, terms, text).bag, f).toEqual(reference(text));
      scripts.add(f.split(/[\\/]/)[0]);
    }
    expect(files.length).toBeGreaterThanOrEqual(30);
    expect([...scripts].sort()).toEqual(['C', 'de', 'fr', 'ja', 'ru', 'zh_CN']);
  });
});
