import { describe, expect, it } from 'vitest';
import { countTerms, Vocabulary, type DocTerms } from '../../../../src/core/counting/termCounts.js';
import { declaringName, NameField, pathNameText } from '../../../../src/core/index/search/nameField.js';
import { tokenize } from '../../../../src/core/text/tokenize.js';
import { loadRankingFixture } from '../../../helpers/rankingChecks.js';
import { bm25OverFields } from '../../../helpers/bm25Fields.js';

// Real paths and queries: rxjs 7.8.2's source files and doc-comment sentences (test/fixtures/rxjs-src, provenance in its README).
const rxjs = loadRankingFixture('rxjs-src');
const vocab = new Vocabulary();
const names: DocTerms[] = rxjs.docs.map((d) => countTerms(tokenize(pathNameText(d.id)), vocab, true));
const queries: DocTerms[] = rxjs.queries.slice(0, 60).map((q) => countTerms(tokenize(q.text), vocab, false));

// Reference: BM25 over the name fields alone, written out from the formula (test/helpers/bm25Fields.ts).
const reference = bm25OverFields;

function scores(field: NameField, q: DocTerms, size: number, delta = 0, exclude = -1): number[] {
  const out = new Float64Array(size);
  field.scoreInto(q, out, delta, exclude);
  return [...out];
}

describe('pathNameText', () => {
  it('keeps the folders and the file name, drops the extension, separates at slashes and dots', () => {
    // ("switch" is a stop word of code, tokenize.ts.)
    expect(pathNameText('internal/operators/switchMap.ts')).toBe('internal operators switchMap');
    expect(pathNameText('faq/admin.html')).toBe('faq admin');
    expect(pathNameText('README')).toBe('README');
    expect(pathNameText('lib/jquery.min.js')).toBe('lib jquery min');
    expect(tokenize(pathNameText('internal/operators/switchMap.ts'))).toEqual(['intern', 'oper', 'map', 'switchmap']);
  });
});

describe('NameField', () => {
  const field = new NameField();
  names.forEach((d, j) => field.set(j, d));

  it('scores BM25 over the names alone, as the published formula (and BM25L with δ)', () => {
    let matched = 0;
    for (const q of queries)
      for (const delta of [0, 0.5]) {
        const want = reference(names, q, delta);
        const got = scores(field, q, names.length, delta);
        got.forEach((v, j) => expect(v).toBeCloseTo(want[j], 10));
        if (delta === 0) matched += want.filter((v) => v > 0).length;
      }
    // The queries do meet the names (so the comparison above is not between zeros).
    expect(matched).toBeGreaterThan(30);
  });

  it('splits a slot’s score exactly into per-term parts, and leaves out the excluded slot', () => {
    for (const q of queries.slice(0, 20)) {
      const all = scores(field, q, names.length);
      const without = scores(field, q, names.length, 0, 3);
      all.forEach((v, j) => {
        const parts = Array.from(q.termIds, (t, i) => field.termScore(t, q.counts[i], j)).reduce((a, b) => a + b, 0);
        expect(parts).toBeCloseTo(v, 10);
        expect(without[j]).toBe(j === 3 ? 0 : v);
      });
    }
  });

  it('after edits (names replaced, cleared, added past the end) scores as a field made afresh', () => {
    const edited = new NameField();
    names.forEach((d, j) => edited.set(j, d));
    const now: (DocTerms | null)[] = [...names];
    for (let j = 0; j < names.length; j += 7) {
      now[j] = j % 2 ? null : names[(j * 31) % names.length];
      edited.set(j, now[j]);
    }
    now.push(names[5]);
    edited.set(names.length, names[5]);
    const fresh = new NameField();
    now.forEach((d, j) => fresh.set(j, d));
    for (const q of queries) {
      expect(scores(edited, q, now.length)).toEqual(scores(fresh, q, now.length));
      const want = reference(now, q);
      scores(edited, q, now.length).forEach((v, j) => expect(v).toBeCloseTo(want[j], 10));
    }
    expect(edited.namesOf(0)).toBe(now[0]);
    expect(edited.namesOf(7)).toBeNull();
  });
});

describe('the name field in search (searchScoresInto: code files only, by the share of the query a name covers)', () => {
  it('tells code files by their extension', () => {
    expect(declaringName('internal/operators/switchMap.ts')).toBe(true);
    expect(declaringName('src/ticketing/refundService.TS')).toBe(true);
    expect(declaringName('lib/util.py')).toBe(true);
    expect(declaringName('notes/maintenance/meeting-fleet-engineering.md')).toBe(false);
    expect(declaringName('config/maintenance-intervals.yaml')).toBe(false);
    expect(declaringName('1033')).toBe(false);
  });

  it('is BM25 over the code files’ names divided by the best, times the covered share of the query (written out), 0 for the others', () => {
    const field = new NameField();
    // Every third file taken as a page (not code): its name scores 0 and does not set the best.
    names.forEach((d, j) => field.set(j, d, j % 3 !== 0));
    const weight = (q: DocTerms) => (i: number) => q.counts[i] * (1 + (q.termIds[i] % 5));
    let covered = 0;
    for (const q of queries) {
      const ref = reference(names, q, 0).map((x, j) => (j % 3 !== 0 ? x : 0));
      const max = Math.max(...ref);
      const w = weight(q);
      const total = Array.from(q.termIds, (_, i) => w(i)).reduce((a, x) => a + x, 0);
      for (const power of [0, 1, 2]) {
        const out = new Float64Array(names.length);
        expect(field.searchScoresInto(q, w, power, out)).toBeCloseTo(max, 12);
        names.forEach((d, j) => {
          const held = Array.from(q.termIds, (t, i) => (d.termIds.includes(t) ? w(i) : 0)).reduce((a, x) => a + x, 0);
          const c = total > 0 ? held / total : 0;
          expect(out[j]).toBeCloseTo(max > 0 ? (ref[j] / max) * (power > 0 ? c ** power : 1) : 0, 12);
          if (power === 1 && out[j] > 0 && c < 1) covered++;
        });
      }
    }
    // Names covering part of a query were scaled down (the comparisons are not all whole or zero).
    expect(covered).toBeGreaterThan(20);
  });
});
