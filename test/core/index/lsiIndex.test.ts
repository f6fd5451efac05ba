import { describe, expect, it } from 'vitest';
import { NoKnownTermsError, NotIndexedError } from '../../../src/core/errors.js';
import { IndexBuilder } from '../../../src/core/index/indexBuilder.js';
import { loadCollection, missingMessage } from '../../helpers/shared.js';

// Real text: CRAN (../shared/corpora/cran, 1400 aerodynamics abstracts).
const cran = loadCollection('cran');

describe.skipIf(!cran)(`LsiIndex ${cran ? '' : missingMessage('corpora/cran')}`, () => {
  const docs = cran ? cran.docs.slice(0, 400) : [];
  const build = (list = docs) => {
    const b = new IndexBuilder();
    for (const d of list) b.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
    return b.build();
  };

  it('gives the same index whatever the order files were added in', () => {
    const a = build();
    const b = build([...docs].reverse());
    expect(b.paths()).toEqual(a.paths());
    expect(Buffer.from(b.vectors().buffer).equals(Buffer.from(a.vectors().buffer))).toBe(true);
  });

  it('folds an unchanged document back to the vector it had at build time', () => {
    const index = build();
    const before = Array.from(index.vectorOf(docs[10].id));
    index.foldIn({ path: docs[10].id, size: 1, mtimeMs: 1 }, docs[10].text);
    const after = Array.from(index.vectorOf(docs[10].id));
    after.forEach((v, i) => expect(v).toBeCloseTo(before[i], 5));
  });

  it('ranks a document first for its own title, and lists it nearest to an exact copy', () => {
    const index = build();
    const d = docs[42];
    expect(index.search(d.text.split(' . ')[0], { top: 3 }).map((h) => h.path)).toContain(d.id);
    index.foldIn({ path: 'copy', size: 1, mtimeMs: 1 }, d.text);
    const near = index.nearby('copy', { top: 1 });
    expect(near[0].path).toBe(d.id);
    expect(near[0].score).toBeGreaterThan(0.999);
  });

  it('forgets a removed document everywhere', () => {
    const index = build();
    const id = docs[5].id;
    index.remove(id);
    expect(index.has(id)).toBe(false);
    expect(() => index.nearby(id)).toThrow(NotIndexedError);
    expect(index.search(docs[5].text, { top: 400 }).map((h) => h.path)).not.toContain(id);
  });

  it('refuses a query with no known word instead of ranking noise', () => {
    expect(() => build().search('zzqx qqqv')).toThrow(NoKnownTermsError);
  });

  it('reports staleness: changed share and new vocabulary mass', () => {
    const index = build();
    index.foldIn({ path: 'new1', size: 1, mtimeMs: 1 }, 'quuxification frobnicator quuxification boundary layer');
    const s = index.staleness();
    expect(s.changedFiles).toBe(1);
    expect(s.changedShare).toBeCloseTo(1 / 401, 6);
    expect(s.newTermMass).toBeGreaterThan(0.3);
  });
});

describe('LsiIndex on tiny inputs', () => {
  it('indexes a single file', () => {
    const b = new IndexBuilder();
    b.addText({ path: 'only.md', size: 5, mtimeMs: 0 }, 'ferry timetable for the northern harbour');
    const index = b.build();
    expect(index.size).toBe(1);
    expect(index.search('timetable')[0].path).toBe('only.md');
  });
});
