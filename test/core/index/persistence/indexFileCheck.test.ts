import { describe, expect, it } from 'vitest';
import { CorruptIndexError } from '../../../../src/core/errors.js';
import { TermListCheck } from '../../../../src/core/index/persistence/indexFileCheck.js';
import { countTerms, Vocabulary } from '../../../../src/core/counting/termCounts.js';
import { tokenize } from '../../../../src/core/text/tokenize.js';
import { loadCollection } from '../../../helpers/shared.js';

// Real term lists: the first 40 documents of the ADI collection (test/fixtures/corpora/adi), counted
// as the index counts them; the reference verdict is the check of the whole sections at once.
const adi = loadCollection('adi');

function lists(): { indptr: Int32Array; ids: Int32Array; counts: Float32Array; vocabSize: number } {
  const vocab = new Vocabulary();
  const docs = adi.docs.slice(0, 40).map((d) => countTerms(tokenize(d.text), vocab, true));
  const indptr = new Int32Array(docs.length + 1);
  docs.forEach((d, j) => (indptr[j + 1] = indptr[j] + d.termIds.length));
  const ids = new Int32Array(indptr[docs.length]);
  const counts = new Float32Array(indptr[docs.length]);
  docs.forEach((d, j) => (ids.set(d.termIds, indptr[j]), counts.set(d.counts, indptr[j])));
  return { indptr, ids, counts, vocabSize: vocab.size };
}

/** The check's verdict in blocks of `block` entries (0: whole), as a message or 'ok'. */
function verdict(l: ReturnType<typeof lists>, block: number): string {
  try {
    const check = new TermListCheck(l.indptr, l.ids.length, l.vocabSize);
    const step = block || l.ids.length || 1;
    for (let a = 0; a < l.ids.length; a += step) check.ids(l.ids.subarray(a, a + step));
    for (let a = 0; a < l.counts.length; a += step) check.counts(l.counts.subarray(a, a + step));
    check.finish();
    return 'ok';
  } catch (err) {
    if (!(err instanceof CorruptIndexError)) throw err;
    return err.message;
  }
}

describe('TermListCheck', () => {
  it('gives the verdict of the whole sections whatever the blocks, on good and damaged lists', () => {
    const good = lists();
    expect(good.ids.length).toBeGreaterThan(1000);
    const damaged: [string, (l: ReturnType<typeof lists>) => void, RegExp][] = [
      ['none', () => undefined, /^ok$/],
      ['repeated id', (l) => (l.ids[l.indptr[7] + 1] = l.ids[l.indptr[7]]), /out of order/],
      ['id past the vocabulary', (l) => (l.ids[l.indptr[20] + 3] = l.vocabSize), /outside the vocabulary/],
      ['negative id', (l) => (l.ids[0] = -1), /outside the vocabulary/],
      ['zero count', (l) => (l.counts[500] = 0), /termCounts holds a value out of range/],
      ['infinite count', (l) => (l.counts[l.counts.length - 1] = Infinity), /termCounts/],
      ['indptr backwards', (l) => (l.indptr[5] = l.indptr[6] + 1), /termIndptr goes backwards/],
      ['indptr short', (l) => (l.indptr[l.indptr.length - 1] -= 1), /termIndptr does not span/],
    ];
    for (const [what, edit, reason] of damaged) {
      const l = lists();
      edit(l);
      const whole = verdict(l, 0);
      expect(whole, what).toMatch(reason);
      for (const block of [1, 3, 64, 1000]) expect(verdict(l, block), `${what} in blocks of ${block}`).toBe(whole);
    }
  });

  it('refuses lists given only in part', () => {
    const l = lists();
    const check = new TermListCheck(l.indptr, l.ids.length, l.vocabSize);
    check.ids(l.ids);
    check.counts(l.counts.subarray(0, 10));
    expect(() => check.finish()).toThrow(CorruptIndexError);
    expect(() => check.counts(l.counts)).toThrow(/run past/);
  });
});
