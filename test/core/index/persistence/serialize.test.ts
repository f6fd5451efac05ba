import { describe, expect, it } from 'vitest';
import { CorruptIndexError } from '../../../../src/core/errors.js';
import { IndexBuilder } from '../../../../src/core/index/model/indexBuilder.js';
import { checksum32 } from '../../../../src/core/index/persistence/checksum.js';
import type { LsiIndex } from '../../../../src/core/index/lsiIndex.js';
import { decodeIndex, encodeIndex, INDEX_FORMAT_VERSION, readIndexHeader } from '../../../../src/core/index/persistence/serialize.js';
import { tokenize } from '../../../../src/core/text/tokenize.js';
import { loadCollection } from '../../../helpers/shared.js';

// Real text: the ADI collection (test/fixtures/corpora/adi, 82 abstracts).
const adi = loadCollection('adi');

/** Every answer a caller can get, for comparing a reopened index with the saved one (bit for bit). */
function answers(index: LsiIndex) {
  const search = adi.queries.map((q) => {
    try {
      return index.search(q.text, { top: 15 });
    } catch (err) {
      return (err as Error).name;
    }
  });
  const nearby = index.paths().map((p) => index.nearby(p, { top: 5 }));
  const terms = index.vocab.terms.map((t, id) => [index.vocab.idOf(t), index.vocab.termOf(id)]);
  return { search, nearby, terms, size: index.vocab.size, staleness: index.staleness() };
}

/** Rewrites a saved file's payload (and header), recomputing the checksum as a buggy writer would. */
function rewrite(bytes: Uint8Array, edit: (header: ReturnType<typeof readIndexHeader>, payload: Uint8Array) => void): Uint8Array {
  const header = readIndexHeader(bytes);
  const len = new DataView(bytes.buffer, bytes.byteOffset).getUint32(8, true);
  const payload = bytes.slice((12 + len + 7) & ~7);
  edit(header, payload);
  header.checksum = checksum32(payload);
  const h = new TextEncoder().encode(JSON.stringify(header));
  const start = (12 + h.length + 7) & ~7;
  const out = new Uint8Array(start + payload.length);
  out.set(bytes.subarray(0, 8));
  new DataView(out.buffer).setUint32(8, h.length, true);
  out.set(h, 12);
  out.set(payload, start);
  return out;
}

function buildAdi() {
  const b = new IndexBuilder();
  for (const d of adi.docs) b.addText({ path: `adi/${d.id}.txt`, size: d.text.length, mtimeMs: 1000 + Number(d.id) }, d.text);
  return b.build();
}

describe('serialize', () => {
  it('round-trips an index: same paths, vectors, and search results', () => {
    const index = buildAdi();
    index.foldIn({ path: 'extra/new.md', size: 10, mtimeMs: 5 }, 'automatic indexing of library catalogues and documents');
    index.remove('adi/3.txt');
    const copy = decodeIndex(encodeIndex(index));
    expect(copy.paths()).toEqual(index.paths());
    expect(Array.from(copy.vectorOf('extra/new.md'))).toEqual(Array.from(index.vectorOf('extra/new.md')));
    expect(copy.search('information retrieval systems')).toEqual(index.search('information retrieval systems'));
    expect(copy.staleness()).toEqual(index.staleness());
    expect(copy.meta('adi/5.txt')).toEqual(index.meta('adi/5.txt'));
  });

  it('reopens to bit-identical search and nearby results and the same term ids and strings', () => {
    const index = buildAdi();
    const bytes = encodeIndex(index);
    // A fresh build numbers terms in sorted order, so every id is found by binary search.
    expect(readIndexHeader(bytes).vocabSorted).toBe(index.vocab.size);
    const copy = decodeIndex(bytes);
    expect(answers(copy)).toEqual(answers(index));
    // And the same after folding a changed file with new words into both.
    const text = 'computerised catalogue of microfilm holdings, with zzsecondterm and qqnewterm';
    index.foldIn({ path: 'adi/7.txt', size: text.length, mtimeMs: 9 }, text);
    copy.foldIn({ path: 'adi/7.txt', size: text.length, mtimeMs: 9 }, text);
    expect(answers(copy)).toEqual(answers(index));
  });

  it('looks up terms added by fold-in after a reopen, and keeps them across another save', () => {
    const index = buildAdi();
    const before = index.vocab.size;
    const copy = decodeIndex(encodeIndex(index));
    expect(copy.vocab.idOf('qqnewterm')).toBeUndefined();
    const text = 'qqnewterm documentation zzsecondterm qqnewterm';
    copy.foldIn({ path: 'extra/a.md', size: text.length, mtimeMs: 1 }, text);
    // New words take the next ids in order of first occurrence (brute force over the tokens).
    const fresh = [...new Set(tokenize(text, index.settings.tokenize))].filter((t) => index.vocab.idOf(t) === undefined);
    expect(fresh.length).toBe(2);
    expect(fresh.map((t) => copy.vocab.idOf(t))).toEqual([before, before + 1]);
    expect(copy.vocab.termOf(before + 1)).toBe(fresh[1]);
    expect(copy.search('qqnewterm')[0].path).toBe('extra/a.md');
    const again = decodeIndex(encodeIndex(copy));
    expect(answers(again)).toEqual(answers(copy));
    expect(again.vocab.idOf(fresh[1])).toBe(before + 1);
  });

  it('rejects term offsets that do not fit the vocabulary bytes even when the checksum matches', () => {
    const bytes = rewrite(encodeIndex(buildAdi()), (header, payload) => {
      const e = header.sections.find((x) => x.name === 'vocabStarts')!;
      const starts = new Int32Array(payload.buffer, payload.byteOffset + e.offset, e.length);
      starts[5] += 1;
    });
    expect(() => decodeIndex(bytes)).toThrow(/term offsets/);
    const unsorted = rewrite(encodeIndex(buildAdi()), (header) => (header.vocabSorted = -1));
    expect(() => decodeIndex(unsorted)).toThrow(/term offsets/);
  });

  it('rejects a file with a flipped byte in its vocabulary (checksum)', () => {
    const bytes = encodeIndex(buildAdi());
    const e = readIndexHeader(bytes).sections.find((x) => x.name === 'vocab')!;
    const len = new DataView(bytes.buffer).getUint32(8, true);
    bytes[((12 + len + 7) & ~7) + e.offset + 3] ^= 0x01;
    expect(() => decodeIndex(bytes)).toThrow(/checksum/);
  });

  it('rejects a file with a flipped payload byte (checksum)', () => {
    const bytes = encodeIndex(buildAdi());
    bytes[bytes.length - 100] ^= 0x40;
    expect(() => decodeIndex(bytes)).toThrow(CorruptIndexError);
  });

  it('rejects a truncated file', () => {
    const bytes = encodeIndex(buildAdi());
    expect(() => decodeIndex(bytes.subarray(0, bytes.length - 8))).toThrow(/truncated/);
    expect(() => decodeIndex(bytes.subarray(0, 20))).toThrow(CorruptIndexError);
  });

  it('rejects another format version and foreign bytes', () => {
    const bytes = encodeIndex(buildAdi());
    const text = new TextDecoder().decode(bytes.subarray(12, 200));
    const patched = text.replace(`"formatVersion":${INDEX_FORMAT_VERSION}`, `"formatVersion":0`);
    const older = bytes.slice();
    older.set(new TextEncoder().encode(patched), 12);
    expect(() => decodeIndex(older)).toThrow(/format 0/);
    expect(() => decodeIndex(new TextEncoder().encode('hello, this is not an index'))).toThrow(/magic/);
  });
});
