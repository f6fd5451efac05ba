import { describe, expect, it } from 'vitest';
import { CorruptIndexError } from '../../../../src/core/errors.js';
import { IndexBuilder } from '../../../../src/core/index/model/indexBuilder.js';
import type { LsiIndex } from '../../../../src/core/index/lsiIndex.js';
import {
  decodeIndex,
  encodeIndex,
  payloadOf,
  readIndexHeader,
  sealIndexFile,
  utf8Length,
} from '../../../../src/core/index/persistence/serialize.js';
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

/** Rewrites a saved file's payload (and header), recomputing both checksums as a buggy writer would. */
function rewrite(bytes: Uint8Array, edit: (header: ReturnType<typeof readIndexHeader>, payload: Uint8Array) => void): Uint8Array {
  const header = readIndexHeader(bytes);
  const payload = payloadOf(bytes).slice();
  edit(header, payload);
  return sealIndexFile(header, payload);
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any -- edits of parsed JSON in any shape
type Json = any;

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
    expect(() => decodeIndex(unsorted)).toThrow(/vocabSorted/);
  });

  it('refuses a vocabulary that is not UTF-8 even when the checksums match', () => {
    // Ill-formed bytes per Table 3-7 of the Unicode Standard (well-formed UTF-8 byte sequences): FF and
    // F5 never occur, 80 cannot start a sequence, C0 is an overlong lead, E0 followed by ASCII is cut short.
    const good = encodeIndex(buildAdi());
    expect(() => decodeIndex(good)).not.toThrow();
    for (const byte of [0xff, 0xf5, 0x80, 0xc0, 0xe0]) {
      const bytes = rewrite(good, (header, payload) => {
        const e = header.sections.find((x) => x.name === 'vocab')!;
        const starts = header.sections.find((x) => x.name === 'vocabStarts')!;
        const at = new Int32Array(payload.buffer, payload.byteOffset + starts.offset, starts.length)[7];
        payload[e.offset + at] = byte;
      });
      expect(() => decodeIndex(bytes), byte.toString(16)).toThrow(CorruptIndexError);
      expect(() => decodeIndex(bytes), byte.toString(16)).toThrow(/vocabulary is not valid UTF-8/);
    }
  });

  it('rejects a file with a flipped byte in its vocabulary (checksum)', () => {
    const bytes = encodeIndex(buildAdi());
    const e = readIndexHeader(bytes).sections.find((x) => x.name === 'vocab')!;
    const len = new DataView(bytes.buffer).getUint32(8, true);
    bytes[((16 + len + 7) & ~7) + e.offset + 3] ^= 0x01;
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
    const older = rewrite(bytes, (header) => (header.formatVersion = 0));
    expect(() => decodeIndex(older)).toThrow(/format 0/);
    // A file of format 2 (no header checksum: its JSON starts at byte 12).
    const v2 = new Uint8Array(64);
    v2.set(new TextEncoder().encode('UNDTNIDX'));
    new DataView(v2.buffer).setUint32(8, 40, true);
    v2.set(new TextEncoder().encode('{"formatVersion":2,"createdAt":"x"}    '), 12);
    expect(() => decodeIndex(v2)).toThrow(/older format/);
    expect(() => decodeIndex(new TextEncoder().encode('hello, this is not an index'))).toThrow(/magic/);
  });

  it('covers every byte before the payload with the header checksum: each single-byte change is detected', () => {
    const bytes = encodeIndex(buildAdi());
    const start = payloadOf(bytes).byteOffset;
    expect(start).toBeGreaterThan(500);
    for (let at = 0; at < start; at++) {
      for (const mask of [0x01, 0x80]) {
        const copy = bytes.slice();
        copy[at] ^= mask;
        expect(() => decodeIndex(copy), `byte ${at} ^ ${mask}`).toThrow(CorruptIndexError);
      }
    }
  });

  // The damage the issue reports (an edited header giving wrong answers with exit 0), made here
  // with both checksums recomputed, so only the structural checks can catch it.
  it('rejects a header whose settings, section lengths or offsets were changed, even with valid checksums', () => {
    const bytes = encodeIndex(buildAdi());
    const cases: [string, (h: Json) => void, RegExp][] = [
      ['lexicalBlend renamed', (h) => ((h.settings.lexicalBlenc = h.settings.lexicalBlend), delete h.settings.lexicalBlend), /lexicalBl/],
      ['lexicalBlend out of range', (h) => (h.settings.lexicalBlend = 1.5), /lexicalBlend/],
      ['k as text', (h) => (h.settings.k = '50'), /settings\.k/],
      ['unknown weighting', (h) => (h.settings.weighting = 'bm25'), /weighting/],
      ['stem as a number', (h) => (h.settings.tokenize.stem = 1), /stem/],
      ['extra header key', (h) => (h.extra = 1), /unknown "extra"/],
      [
        'a section length 300 → 3',
        (h) => (h.sections.find((x: Json) => x.name === 'singularValues').length = 3),
        /does not start|disagree|payloadBytes/,
      ],
      ['vectors offset + 1', (h) => (h.sections.find((x: Json) => x.name === 'vectors').offset += 1), /does not start/],
      ['vectors offset − 8', (h) => (h.sections.find((x: Json) => x.name === 'vectors').offset -= 8), /does not start/],
      ['sections swapped', (h) => h.sections.reverse(), /section 1/],
      ['docs off by one', (h) => (h.docs += 1), /disagree/],
      ['model.k changed', (h) => (h.model.k += 1), /kChoice|disagree/],
      ['scheme differs', (h) => (h.model.scheme = 'tfidf'), /scheme/],
      ['negative counter', (h) => (h.counters.removedSinceBuild = -1), /removedSinceBuild/],
      ['payloadBytes larger', (h) => (h.payloadBytes += 8), /payloadBytes/],
    ];
    for (const [what, edit, reason] of cases) {
      const forged = rewrite(bytes, (h) => edit(h as unknown as Json));
      expect(() => decodeIndex(forged), what).toThrow(reason);
    }
  });

  // An index folded into a shared concept model (import-model) saves one more settings key.
  it('accepts the settings of an index that uses a shared concept model, and rejects a malformed one', () => {
    const bytes = encodeIndex(buildAdi());
    const shared = rewrite(
      bytes,
      (h) => ((h as unknown as Json).settings.sharedModel = { path: '/models/org.utcm', key: 'crc32:1a2b3c4d' }),
    );
    expect(readIndexHeader(shared).settings.sharedModel).toEqual({ path: '/models/org.utcm', key: 'crc32:1a2b3c4d' });
    expect(() => decodeIndex(shared)).not.toThrow();
    const noKey = rewrite(bytes, (h) => ((h as unknown as Json).settings.sharedModel = { path: '/models/org.utcm' }));
    expect(() => decodeIndex(noKey)).toThrow(/sharedModel/);
    const emptyPath = rewrite(bytes, (h) => ((h as unknown as Json).settings.sharedModel = { path: '', key: 'k' }));
    expect(() => decodeIndex(emptyPath)).toThrow(/sharedModel\.path/);
  });

  it('rejects payload values out of range even with valid checksums', () => {
    const bytes = encodeIndex(buildAdi());
    const section = (h: ReturnType<typeof readIndexHeader>, payload: Uint8Array, name: string) => {
      const e = h.sections.find((x) => x.name === name)!;
      return { e, at: payload.byteOffset + e.offset };
    };
    const cases: [string, (h: ReturnType<typeof readIndexHeader>, p: Uint8Array) => void, RegExp][] = [
      [
        'term id past the vocabulary',
        (h, p) => {
          const { at } = section(h, p, 'termIds');
          new Int32Array(p.buffer, at, 1)[0] = 1e8;
        },
        /term id/,
      ],
      [
        'term ids out of order',
        (h, p) => {
          const { at } = section(h, p, 'termIds');
          const v = new Int32Array(p.buffer, at, 2);
          [v[0], v[1]] = [v[1], v[0]];
        },
        /term id/,
      ],
      [
        'a vector scaled',
        (h, p) => {
          const { at } = section(h, p, 'vectors');
          new Float32Array(p.buffer, at, 1)[0] *= 1.17 * 4;
        },
        /unit length/,
      ],
      [
        'a NaN weight',
        (h, p) => {
          const { at } = section(h, p, 'weights');
          new Float64Array(p.buffer, at, 1)[0] = NaN;
        },
        /weights/,
      ],
      // Non-finite f32 values (IEEE 754 binary32: NaN, ±Infinity), and term counts that are not
      // above zero, wherever the load checks them by their bit patterns.
      ...(
        [
          ['termCounts', NaN],
          ['termCounts', Infinity],
          ['termCounts', 0],
          ['termCounts', -0],
          ['termCounts', -2],
          ['termVectors', NaN],
          ['termVectors', Infinity],
          ['termVectors', -Infinity],
        ] as const
      ).map(([name, value]): [string, (h: ReturnType<typeof readIndexHeader>, p: Uint8Array) => void, RegExp] => [
        `${name} holding ${Object.is(value, -0) ? '-0' : value}`,
        (h, p) => {
          const { at, e } = section(h, p, name);
          new Float32Array(p.buffer, at, e.length)[Math.floor(e.length / 2)] = value;
        },
        new RegExp(`${name} holds a value out of range`),
      ]),
      [
        'a NaN bit pattern other than the usual one in the term vectors',
        (h, p) => {
          const { at } = section(h, p, 'termVectors');
          new Uint32Array(p.buffer, at, 1)[0] = 0xffc00001;
        },
        /termVectors holds a value out of range/,
      ],
      [
        'a -Infinity modification time',
        (h, p) => {
          const { at } = section(h, p, 'docMtime');
          new Float64Array(p.buffer, at, 1)[0] = -Infinity;
        },
        /docMtime/,
      ],
      [
        'a NaN vector entry',
        (h, p) => {
          const { at } = section(h, p, 'vectors');
          new Float32Array(p.buffer, at, 1)[0] = NaN;
        },
        /unit length/,
      ],
      [
        'folded flag 7',
        (h, p) => {
          const { at } = section(h, p, 'docFolded');
          p[at - p.byteOffset] = 7;
        },
        /docFolded/,
      ],
      [
        'indptr backwards',
        (h, p) => {
          const { at } = section(h, p, 'termIndptr');
          new Int32Array(p.buffer, at, 3)[1] = 1e6;
        },
        /termIndptr/,
      ],
      [
        'duplicate path',
        (h, p) => {
          const { at, e } = section(h, p, 'paths');
          const u = new Uint8Array(p.buffer, at, e.length);
          const names = new TextDecoder().decode(u).split('\0');
          const j = names.findIndex((x, i) => i > 0 && x.length === names[0].length);
          const from = names.slice(0, j).reduce((sum, x) => sum + x.length + 1, 0);
          u.set(u.subarray(0, names[0].length), from);
        },
        /listed twice/,
      ],
    ];
    for (const [what, edit, reason] of cases) {
      const forged = rewrite(bytes, edit);
      expect(() => decodeIndex(forged), what).toThrow(CorruptIndexError);
      expect(() => decodeIndex(forged), what).toThrow(reason);
    }
    // The edits are the only damage: the same rewrite without one decodes.
    expect(decodeIndex(rewrite(bytes, () => undefined)).paths().length).toBe(adi.docs.length);
  });
});

describe('section titles in the index file', () => {
  // Titles that TextEncoder (WHATWG Encoding Standard, UTF-8 encode) treats each its own way: ASCII,
  // 2- and 3-byte characters, a surrogate pair (4 bytes), lone surrogates (U+FFFD, 3 bytes), a
  // '\0' (saved as a space) and an empty title (saved as '…').
  const odd = ['plain', 'Überblick', '目次', 'emoji 😀 end', 'lone \ud800 high', 'lone \udc00 low', 'a\0b', '', 'x'.repeat(40000)];

  it('utf8Length counts what TextEncoder makes', () => {
    const enc = new TextEncoder();
    for (const t of [...odd, '\ud83d', '😀😀', 'é\udbff']) expect(utf8Length(t), JSON.stringify(t.slice(0, 20))).toBe(enc.encode(t).length);
  });

  it('saves the titles as their UTF-8 joined by \\0, in pieces across many titles, and reads them back', () => {
    const index = buildAdi();
    const paths = index.paths().slice(0, 6);
    // Enough long titles to cross the save's pieces several times.
    paths.forEach((p, i) => {
      const titles = i % 2 === 0 ? odd : [...odd].reverse();
      index.sections.set(p, {
        starts: Int32Array.from(titles, (_, j) => j),
        ends: Int32Array.from(titles, (_, j) => j + 1),
        titles,
        vectors: new Float32Array(titles.length * index.k),
      });
    });
    const bytes = encodeIndex(index, new Date(0));
    const header = readIndexHeader(bytes);
    const e = header.sections.find((x) => x.name === 'sectionTitles')!;
    const saved = index.paths().flatMap((p) => index.sections.get(p)?.titles.map((t) => t.replace(/\0/g, ' ') || '…') ?? []);
    const want = new TextEncoder().encode(saved.join('\0'));
    expect(e.length).toBe(want.length);
    expect(Buffer.from(payloadOf(bytes).subarray(e.offset, e.offset + e.length)).equals(Buffer.from(want))).toBe(true);
    const back = decodeIndex(bytes);
    expect(back.sections.get(paths[1])!.titles).toEqual(
      new TextDecoder()
        .decode(
          new TextEncoder().encode(
            [...odd]
              .reverse()
              .map((t) => t.replace(/\0/g, ' ') || '…')
              .join('\0'),
          ),
        )
        .split('\0'),
    );
  });
});
