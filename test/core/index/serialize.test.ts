import { describe, expect, it } from 'vitest';
import { CorruptIndexError } from '../../../src/core/errors.js';
import { IndexBuilder } from '../../../src/core/index/indexBuilder.js';
import { decodeIndex, encodeIndex, INDEX_FORMAT_VERSION } from '../../../src/core/index/serialize.js';
import { loadCollection, missingMessage } from '../../helpers/shared.js';

// Real text: the ADI collection (../shared/corpora/adi, 82 abstracts).
const adi = loadCollection('adi');

function buildAdi() {
  const b = new IndexBuilder();
  for (const d of adi!.docs) b.addText({ path: `adi/${d.id}.txt`, size: d.text.length, mtimeMs: 1000 + Number(d.id) }, d.text);
  return b.build();
}

describe.skipIf(!adi)(`serialize ${adi ? '' : missingMessage('corpora/adi')}`, () => {
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
