/**
 * Binary form of an LsiIndex (our own format, version INDEX_FORMAT_VERSION):
 *   8 bytes magic "UNDTNIDX" · u32 LE header length · u32 LE header checksum · UTF-8 JSON header
 *   · zero padding to 8 · payload of typed-array sections, each starting on an 8-byte boundary.
 * The header holds the format version, the settings, scalar model facts, the section table
 * (name, element type, byte offset, element count), the payload's length and its checksum. The
 * header checksum covers every byte before the payload (magic, length, header, padding) except
 * its own four, and the payload checksum (inside the header) covers the payload, so every byte of
 * the file is checked. Decoding checks the magic, both checksums, the exact file length, then
 * every header field and the payload's structure (indexFileCheck.ts), and throws
 * CorruptIndexError on any mismatch, so a damaged, truncated, padded or older file is rebuilt,
 * never trusted. Holes left by removed documents are compacted on encoding.
 * Reopening does one pass over the payload for the checksum and one for the structural checks:
 * the vocabulary is saved as UTF-8 bytes with term offsets (ids in byte order, looked up by
 * binary search; see termCounts.ts) and every aligned section becomes a view of the given bytes,
 * so the decoded index shares their memory: hand decodeIndex a buffer nobody else writes to.
 * The section vectors come last in the payload, so a reader can keep them in the file:
 * decodeIndexWithRows takes the bytes before them, checked by the caller while it streamed the
 * rest, and gives each file's sections their rows in a SectionRowReader (../../sections/sectionRows.ts).
 * The section lists' codes come after the vectors, so such a reader leaves them in the file too and
 * hands decodeIndexWithRows a way to read them (ByteSpill, as the lists' spill reads its codes).
 */
import type { FileSections } from '../../sections/types.js';
import { CorruptIndexError } from '../../errors.js';
import { Checksum32, checksum32 } from './checksum.js';
import type { ConceptModel } from '../model/conceptModel.js';
import {
  align8,
  checkHeader,
  checkPayload,
  checkSectionSizes,
  type ArrayKind,
  type CheckedHeader,
  type PayloadParts,
  type SectionEntry,
} from './indexFileCheck.js';
import { LsiIndex, type DocSlot } from '../lsiIndex.js';
import type { ConceptRows } from '../search/conceptRows.js';
import { Vocabulary, type DocTerms } from '../../counting/termCounts.js';
import { LANGUAGES } from '../../text/languages.js';
import { withLanguage } from '../../text/detectLanguage.js';
import { StoredFileSections, type SectionRowReader } from '../../sections/sectionRows.js';
import { bytesSpill } from '../../sections/savedLists.js';
import { isWellFormedUtf8 } from '../../text/utf8Check.js';
import type { ByteSpill, OpenSpill } from '../../sections/types.js';

/**
 * 4: each file's sections (line ranges, titles, concept vectors) follow the file vectors.
 * 5: the section lists too (trained centroids, each section's list, the 8-bit codes in slot
 * order: ../../sections/savedLists.ts), so a reopen does not train them again; format 4 still opens
 * (its lists are trained at the first ranking that needs them, as before).
 * 6: format 5's layout, and the header holds a second checksum, headChecksum, of the payload before
 * the section vectors (the part a reopen reads into memory), so a reader can trust that part as
 * soon as it is read and check the rest (the rows and the codes, most of a large tree's file)
 * afterwards, before any of it is used (src/node/persistCheck.ts). Formats 4 and 5 still open
 * (their whole payload is checked before the index is used, as before).
 */
export const INDEX_FORMAT_VERSION = 6;
const MAGIC = 'UNDTNIDX';
/** Bytes before the JSON header: magic, header length, header checksum. */
export const INDEX_PREAMBLE_BYTES = 16;
/** A header longer than this is damage (a real one is a few KiB). */
export const MAX_INDEX_HEADER_BYTES = 1 << 20;

type Typed = Uint8Array | Int32Array | Float32Array | Float64Array;
type Header = CheckedHeader;

const CTORS = { u8: Uint8Array, i32: Int32Array, f32: Float32Array, f64: Float64Array } as const;
const kindOf = (a: Typed): ArrayKind =>
  a instanceof Uint8Array ? 'u8' : a instanceof Int32Array ? 'i32' : a instanceof Float32Array ? 'f32' : 'f64';
const encoder = new TextEncoder();
const decoder = new TextDecoder('utf-8', { fatal: true });

/** A payload section: its table entry's name, kind and length, and its bytes in order. */
interface SectionSource {
  readonly name: string;
  readonly kind: ArrayKind;
  readonly length: number;
  /** The section's bytes, as views of the index's own arrays where they exist (no copy). */
  readonly pieces: () => Iterable<Uint8Array>;
}

const bytesOf = (a: Typed): Uint8Array => new Uint8Array(a.buffer, a.byteOffset, a.byteLength);

const copied = (name: string, arr: Typed): SectionSource => ({
  name,
  kind: kindOf(arr),
  length: arr.length,
  pieces: () => [bytesOf(arr)],
});

/** A section gathered from many arrays (one per file), each given as it is. */
const gathered = (name: string, kind: ArrayKind, length: number, parts: () => Iterable<Typed>): SectionSource => ({
  name,
  kind,
  length,
  pieces: function* () {
    for (const p of parts()) yield bytesOf(p);
  },
});

/** The checksum of the bytes before the payload, its own four bytes (12…16) left out. */
function headerChecksum(prefix: Uint8Array): number {
  // A copy of its own (a Node Buffer's slice() is a view: filling it would change the caller's bytes).
  const copy = new Uint8Array(prefix);
  copy.fill(0, 12, 16);
  return checksum32(copy);
}

/**
 * An index file laid out but not yet written: a writer streams pieces() (the payload, padding
 * included, start…end of file) while computing their checksum, then writes head(checksum) (the
 * first `start` bytes) in front. The pieces view the index's own arrays, so the file is never
 * held whole in memory; the index must not change until the last piece is written.
 */
export interface IndexFilePlan {
  /** Byte offset of the payload: the length of head(). */
  readonly start: number;
  readonly payloadBytes: number;
  pieces(): Iterable<Uint8Array>;
  /** Payload bytes before the section vectors: the part headChecksum covers (format 6). */
  readonly headBytes: number;
  /** Magic, header (with these payload checksums), header checksum and padding. */
  head(payloadChecksum: number, headChecksum: number): Uint8Array;
}

const ZEROS = new Uint8Array(8);

/**
 * Where files' raw counts are while they are kept out of memory (a build's scratch file: the
 * node side's parkedCounts.ts), so that a save can stream them instead of having them read back
 * whole first. For a DocTerms it does not hold, each method gives undefined and the file's own
 * arrays are written. ids() and counts() are asked for file after file in slot order, all ids
 * first, then all counts; what they return is read only until the next call (it may be a view of
 * one reused buffer).
 */
export interface TermListSource {
  /** The number of (id, count) entries of d while its own arrays are empty, else undefined. */
  length(d: DocTerms): number | undefined;
  ids(d: DocTerms): Int32Array | undefined;
  counts(d: DocTerms): Float32Array | undefined;
}

/** What planIndexFile may be given beside the index. */
export interface PlanOptions {
  /** The files' counts held elsewhere (the file is the same bytes as with them in memory). */
  readonly termLists?: TermListSource;
  /** Where the section lists' codes may wait while the file is written (SectionStore.savedLists). */
  readonly openSpill?: OpenSpill;
}

/** Lays out the file of an index (see IndexFilePlan; encodeIndex writes it into one buffer). */
export function planIndexFile(index: LsiIndex, createdAt: Date = new Date(), options: PlanOptions = {}): IndexFilePlan {
  const live = index
    .slots()
    .map((s, i) => [s, i] as const)
    .filter((p): p is readonly [DocSlot, number] => p[0] !== null);
  const k = index.k;
  const n = live.length;
  const all = index.vectors();
  const termIndptr = new Int32Array(n + 1);
  const source = options.termLists;
  live.forEach(([s], j) => (termIndptr[j + 1] = termIndptr[j] + (source?.length(s.terms) ?? s.terms.termIds.length)));
  const nnz = termIndptr[n];
  const m = index.model;
  const vocab = index.vocab.toBytes();
  const sections: SectionSource[] = [
    copied('vocab', vocab.bytes),
    copied('vocabStarts', vocab.starts),
    copied('paths', encoder.encode(live.map(([s]) => s.meta.path).join('\0'))),
    copied(
      'docSize',
      Float64Array.from(live, ([s]) => s.meta.size),
    ),
    copied(
      'docMtime',
      Float64Array.from(live, ([s]) => s.meta.mtimeMs),
    ),
    copied(
      'docLength',
      Float64Array.from(live, ([s]) => s.terms.length),
    ),
    copied(
      'docFolded',
      Uint8Array.from(live, ([s]) => (s.folded ? 1 : 0)),
    ),
    copied(
      'docResidual',
      Float64Array.from(live, ([s]) => s.residual),
    ),
    copied(
      'docLanguage',
      Uint8Array.from(live, ([s]) => LANGUAGES.indexOf(s.meta.language ?? 'en')),
    ),
    copied('termIndptr', termIndptr),
    // Generators: a source's lists are valid only until the next is asked for.
    gathered('termIds', 'i32', nnz, function* () {
      for (const [s] of live) yield source?.ids(s.terms) ?? s.terms.termIds;
    }),
    gathered('termCounts', 'f32', nnz, function* () {
      for (const [s] of live) yield source?.counts(s.terms) ?? s.terms.counts;
    }),
    copied('keptIds', m.keptIds),
    copied('weights', m.weights),
    copied('termVectors', m.termVectors),
    copied('singularValues', m.singularValues),
    copied('axisScale', m.axisScale),
    gathered('vectors', 'f32', n * k, () => live.map(([, i]) => all.subarray(i * k, (i + 1) * k))),
    ...sectionSources(index, live, k, options.openSpill),
  ];
  const table: SectionEntry[] = [];
  let offset = 0;
  for (const { name, kind, length } of sections) {
    table.push({ name, kind, offset, length });
    offset = align8(offset + length * CTORS[kind].BYTES_PER_ELEMENT);
  }
  const { keptIds: _a, columnOf, weights: _b, termVectors: _c, singularValues: _d, axisScale: _e, ...scalars } = m;
  const header: Header = {
    formatVersion: INDEX_FORMAT_VERSION,
    createdAt: createdAt.toISOString(),
    settings: index.settings,
    docs: n,
    vocabSorted: vocab.sorted,
    model: { ...scalars, columnOfLength: columnOf.length },
    counters: { ...index.counters() },
    sections: table,
    payloadBytes: offset,
    checksum: 0xffffffff, // the widest value: room for the real one, padded with spaces
    headChecksum: 0xffffffff,
  };
  const reserved = encoder.encode(JSON.stringify(header)).length;
  const start = align8(INDEX_PREAMBLE_BYTES + reserved);
  return {
    start,
    payloadBytes: offset,
    headBytes: headBytesOf(header),
    pieces: function* () {
      let at = 0;
      for (const [i, sec] of sections.entries()) {
        for (const p of sec.pieces()) {
          yield p;
          at += p.length;
        }
        const end = i + 1 < table.length ? table[i + 1].offset : offset;
        if (at !== table[i].offset + table[i].length * CTORS[sec.kind].BYTES_PER_ELEMENT || end - at >= 8)
          throw new Error(`index section ${sec.name} has the wrong length (a bug)`);
        if (end > at) yield ZEROS.subarray(0, end - at);
        at = end;
      }
    },
    head: (payloadChecksum, headChecksum) => {
      const out = new Uint8Array(start);
      sealHeader(out, { ...header, checksum: payloadChecksum, headChecksum }, reserved);
      return out;
    },
  };
}

/** Encodes an index into one buffer (a writer that can stream uses planIndexFile instead). */
export function encodeIndex(index: LsiIndex, createdAt: Date = new Date(), options: PlanOptions = {}): Uint8Array {
  const plan = planIndexFile(index, createdAt, options);
  const out = new Uint8Array(plan.start + plan.payloadBytes);
  let at = plan.start;
  for (const p of plan.pieces()) {
    out.set(p, at);
    at += p.length;
  }
  const payload = out.subarray(plan.start);
  out.set(plan.head(checksum32(payload), checksum32(payload.subarray(0, plan.headBytes))), 0);
  return out;
}

/**
 * Payload bytes before the section vectors (format 6's headChecksum covers them): where the
 * vectors' section starts in the payload.
 */
export function headBytesOf(header: Pick<CheckedHeader, 'sections'>): number {
  return header.sections.find((s) => s.name === 'sectionVectors')?.offset ?? 0;
}

/** The four section-table entries of the files' sections, in the order of `live`. */
function sectionSources(index: LsiIndex, live: readonly (readonly [DocSlot, number])[], k: number, openSpill?: OpenSpill): SectionSource[] {
  const indptr = new Int32Array(live.length + 1);
  const files = live.map(([s]) => index.sections.get(s.meta.path));
  files.forEach((f, j) => (indptr[j + 1] = indptr[j] + (f?.starts.length ?? 0)));
  const total = indptr[live.length];
  // The titles as saved: no '\0' inside, none empty.
  const savedTitle = (t: string): string => t.replace(/\0/g, ' ') || '…';
  // Their UTF-8 bytes, '\0'-separated, are made in pieces as the writer goes (joined whole, the
  // whole tree's 1.33 M titles were one string and one buffer at the save's start); the length
  // first, from the titles themselves.
  let titleBytes = 0;
  for (const f of files) if (f) for (const t of f.titles) titleBytes += utf8Length(savedTitle(t)) + 1;
  titleBytes = Math.max(0, titleBytes - 1);
  const lines = (f: NonNullable<(typeof files)[number]>): Int32Array => {
    const [starts, ends] = [f.starts, f.ends]; // once: a reopened file's are made on each access
    const out = new Int32Array(2 * starts.length);
    for (let i = 0; i < starts.length; i++) {
      out[2 * i] = starts[i];
      out[2 * i + 1] = ends[i];
    }
    return out;
  };
  const saved = index.sections.savedLists(
    live.map(([s]) => s.meta.path),
    openSpill,
  );
  if (saved && saved.count !== total) throw new Error('the saved section lists miss sections (a bug)');
  const listed = saved?.count ?? 0;
  return [
    copied('sectionIndptr', indptr),
    // Generators, not lists: a reopened index's files make their arrays afresh on each access
    // (their vectors are read from the saved file), so a list would hold every one at once (the
    // whole tree's 1.5 GB of section rows when the editor saved a reopened index).
    gathered('sectionLines', 'i32', 2 * total, function* () {
      for (const f of files) if (f) yield lines(f);
    }),
    {
      name: 'sectionTitles',
      kind: 'u8',
      length: titleBytes,
      pieces: function* () {
        let batch: string[] = [];
        let chars = 0;
        let first = true;
        const encoded = (): Uint8Array => {
          const bytes = encoder.encode((first ? '' : '\0') + batch.join('\0'));
          [first, batch, chars] = [false, [], 0];
          return bytes;
        };
        for (const f of files)
          if (f)
            for (const t of f.titles) {
              const title = savedTitle(t);
              batch.push(title);
              chars += title.length;
              if (chars >= TITLE_PIECE_CHARS) yield encoded();
            }
        if (batch.length > 0) yield encoded();
      },
    },
    copied('listCentroids', saved?.centroids ?? new Float32Array(0)),
    copied('listGroups', saved?.groups ?? new Float32Array(0)),
    copied('listGroupStarts', saved?.groupStarts ?? new Int32Array(0)),
    copied('sectionList', saved?.listOf ?? new Int32Array(0)),
    gathered('sectionVectors', 'f32', total * k, () => sectionRowBlocks(files, indptr, k)),
    { name: 'sectionCodes', kind: 'u8', length: listed * k, pieces: () => saved?.codes() ?? [] },
    { name: 'sectionCodeParams', kind: 'f64', length: 3 * listed, pieces: () => saved?.params() ?? [] },
  ];
}

/** UTF-16 code units of titles encoded at a time by the save (a small piece; not tuned). */
const TITLE_PIECE_CHARS = 1 << 16;

/** Bytes TextEncoder makes of s (a lone surrogate becomes U+FFFD, 3 bytes, as it encodes it). */
export function utf8Length(s: string): number {
  let n = 0;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c < 0x80) n += 1;
    else if (c < 0x800) n += 2;
    else if (c >= 0xd800 && c <= 0xdbff && i + 1 < s.length && (s.charCodeAt(i + 1) & 0xfc00) === 0xdc00) {
      n += 4;
      i++;
    } else n += 3;
  }
  return n;
}

/**
 * Bytes of stored rows read at once by the save (files whose rows follow one another in the same
 * source, such as a build's scratch file, go in one read; common practice, not tuned).
 */
export const SAVE_ROW_BLOCK_BYTES = 4 * 1024 * 1024;

/**
 * The files' section rows in order: vectors held in memory as they are; stored rows (a reopened
 * index's file, a large build's scratch file) read in blocks of up to SAVE_ROW_BLOCK_BYTES over
 * consecutive files whose rows are consecutive in one source, instead of an array per file. A
 * block is valid until the next one is asked for (the writer copies or writes it at once).
 */
function* sectionRowBlocks(files: readonly (FileSections | undefined)[], indptr: Int32Array, k: number): Generator<Float32Array> {
  const most = Math.max(1, Math.floor(SAVE_ROW_BLOCK_BYTES / (4 * k)));
  let block: Float32Array | undefined;
  for (let i = 0; i < files.length;) {
    const f = files[i];
    const stored = f?.stored;
    const n = indptr[i + 1] - indptr[i];
    if (!f || n === 0) {
      i++;
      continue;
    }
    if (!stored || n > most) {
      yield f.vectors;
      i++;
      continue;
    }
    // The run of files from this one whose rows follow on in the same source, up to a block.
    let rows = n;
    let j = i + 1;
    for (; j < files.length; j++) {
      const g = files[j];
      const m = indptr[j + 1] - indptr[j];
      if (m === 0) continue;
      if (!g?.stored || g.stored.reader !== stored.reader || g.stored.first !== stored.first + rows || rows + m > most) break;
      rows += m;
    }
    if (!block) block = new Float32Array(most * k);
    stored.reader.read(stored.first, rows, block, 0);
    yield block.subarray(0, rows * k);
    i = j;
  }
}

/** Writes magic, header (padded with spaces to `reserved` bytes) and the header checksum into out. */
function sealHeader(out: Uint8Array, header: Header, reserved: number): void {
  const headerBytes = encoder.encode(JSON.stringify(header));
  out.set(encoder.encode(MAGIC), 0);
  const view = new DataView(out.buffer, out.byteOffset, out.byteLength);
  view.setUint32(8, reserved, true);
  out.set(headerBytes, INDEX_PREAMBLE_BYTES);
  out.fill(0x20, INDEX_PREAMBLE_BYTES + headerBytes.length, INDEX_PREAMBLE_BYTES + reserved);
  out.fill(0, INDEX_PREAMBLE_BYTES + reserved, align8(INDEX_PREAMBLE_BYTES + reserved));
  view.setUint32(12, headerChecksum(out.subarray(0, align8(INDEX_PREAMBLE_BYTES + reserved))), true);
}

/**
 * A file from a header object and a payload, both checksums computed: what a writer that gets
 * the content wrong but the sealing right would produce (tests use it to check that the
 * structural checks, not only the checksums, reject bad content).
 */
export function sealIndexFile(header: Header, payload: Uint8Array): Uint8Array {
  const h = { ...header, checksum: checksum32(payload) };
  if (h.formatVersion >= 6) h.headChecksum = checksum32(payload.subarray(0, Math.min(payload.length, headBytesOf(h))));
  else delete h.headChecksum;
  const reserved = encoder.encode(JSON.stringify(h)).length;
  const start = align8(INDEX_PREAMBLE_BYTES + reserved);
  const out = new Uint8Array(start + payload.length);
  out.set(payload, start);
  sealHeader(out, h, reserved);
  return out;
}

/** The payload of a file whose header has been read (a view). */
export function payloadOf(bytes: Uint8Array): Uint8Array {
  const len = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength).getUint32(8, true);
  return bytes.subarray(align8(INDEX_PREAMBLE_BYTES + len));
}

/**
 * How many bytes of a file the header needs (the preamble says), or throws CorruptIndexError when
 * the first INDEX_PREAMBLE_BYTES bytes are not those of an index file.
 */
export function headerExtent(preamble: Uint8Array): number {
  if (preamble.length < INDEX_PREAMBLE_BYTES || String.fromCharCode(...preamble.subarray(0, 8)) !== MAGIC) {
    throw new CorruptIndexError('not an Undertone index file (bad magic bytes)');
  }
  const len = new DataView(preamble.buffer, preamble.byteOffset, preamble.byteLength).getUint32(8, true);
  if (len < 2 || len > MAX_INDEX_HEADER_BYTES) throw new CorruptIndexError(`index header length ${len} is out of range (damaged file)`);
  return align8(INDEX_PREAMBLE_BYTES + len);
}

/**
 * Reads and checks only the header (cheap): it needs the first headerExtent() bytes, not the
 * payload. Throws CorruptIndexError unless the header's checksum matches and every field is of
 * its known type and range; the total file length it implies is headerExtent + payloadBytes.
 */
export function readIndexHeader(bytes: Uint8Array): Header {
  const start = headerExtent(bytes);
  if (start > bytes.length) throw new CorruptIndexError('index file is truncated inside its header');
  const prefix = bytes.subarray(0, start);
  const stored = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength).getUint32(12, true);
  if (headerChecksum(prefix) !== stored) {
    // Format 2 and before had no header checksum: their JSON started at byte 12.
    if (String.fromCharCode(...bytes.subarray(12, 16)) === '{"fo') throw new CorruptIndexError('index file is of an older format');
    throw new CorruptIndexError('index header fails its checksum (damaged file)');
  }
  const len = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength).getUint32(8, true);
  let parsed: unknown;
  try {
    parsed = JSON.parse(decoder.decode(bytes.subarray(INDEX_PREAMBLE_BYTES, INDEX_PREAMBLE_BYTES + len)));
  } catch {
    throw new CorruptIndexError('index header is not valid JSON');
  }
  const header = checkHeader(parsed, INDEX_FORMAT_VERSION);
  checkSectionSizes(header);
  return header;
}

export function decodeIndex(bytes: Uint8Array): LsiIndex {
  const header = readIndexHeader(bytes);
  const start = headerExtent(bytes);
  if (bytes.length !== start + header.payloadBytes)
    throw new CorruptIndexError(`index file is ${bytes.length} bytes, expected ${start + header.payloadBytes} (truncated or padded)`);
  const payload = bytes.subarray(start);
  // One pass: the part before the section vectors (its own checksum from format 6 on), then the rest.
  const sum = new Checksum32().update(payload.subarray(0, headBytesOf(header)));
  if (header.headChecksum !== undefined && sum.digest() !== header.headChecksum)
    throw new CorruptIndexError('index payload fails its checksum (damaged file)');
  if (sum.update(payload.subarray(headBytesOf(header))).digest() !== header.checksum)
    throw new CorruptIndexError('index payload fails its checksum (damaged file)');
  return decodeChecked(header, payload, undefined);
}

/**
 * Where the saved section lists' codes and their params lie in the file (byte offsets and lengths),
 * or null when the file has none (format 4, or too few sections for lists).
 */
export function sectionCodesOf(
  header: CheckedHeader,
  fileStart: number,
): { readonly codesAt: number; readonly codesBytes: number; readonly paramsAt: number; readonly paramsBytes: number } | null {
  const codes = header.sections.find((s) => s.name === 'sectionCodes');
  const params = header.sections.find((s) => s.name === 'sectionCodeParams');
  if (!codes || !params || codes.length === 0) return null;
  return {
    codesAt: fileStart + codes.offset,
    codesBytes: codes.length,
    paramsAt: fileStart + params.offset,
    paramsBytes: 8 * params.length,
  };
}

/** The section vectors' entry of a checked header: where their rows start in the file, and how many. */
export function sectionRowsOf(
  header: CheckedHeader,
  fileStart: number,
): { readonly at: number; readonly rows: number; readonly k: number } {
  const e = header.sections.find((s) => s.name === 'sectionVectors')!;
  const k = header.model.k;
  return { at: fileStart + e.offset, rows: k > 0 ? e.length / k : 0, k };
}

/**
 * Decodes a file whose section vectors stay where they are: `head` is the file up to their first
 * row (sectionRowsOf), `rows` reads them. The caller has checked what decodeIndex checks over the
 * whole file while reading it (header, length, payload checksum, and the rows' unit length with
 * checkSectionRows); this checks the rest of the payload's structure.
 * @throws CorruptIndexError
 */
export function decodeIndexWithRows(
  head: Uint8Array,
  rows: SectionRowReader,
  codes?: { readonly codes: ByteSpill; readonly params: ByteSpill },
  vectors?: ConceptRows,
  terms?: FillGate,
  termVectors?: FillGate,
): LsiIndex {
  const header = readIndexHeader(head);
  const start = headerExtent(head);
  const { at, rows: count, k } = sectionRowsOf(header, start);
  if (head.length !== at) throw new CorruptIndexError(`index head is ${head.length} bytes, expected ${at} (a reader bug)`);
  if (rows.rows !== count || rows.k !== k)
    throw new CorruptIndexError(`the section rows reader holds ${rows.rows} rows, expected ${count}`);
  if (!codes !== !sectionCodesOf(header, start)) throw new CorruptIndexError('the saved section codes were not given (a reader bug)');
  if (vectors && (vectors.k !== k || vectors.capacity * k * 4 < vectorsOf(header, start).bytes))
    throw new CorruptIndexError(
      `the files' vector rows hold ${vectors.capacity} rows of ${vectors.k}, expected ${header.docs} of ${k} (a reader bug)`,
    );
  return decodeChecked(header, head.subarray(start), rows, codes, vectors, terms, termVectors);
}

/**
 * A part of the head that a reader streamed through its checksum and its checks without keeping
 * it, and fills into its place after the load (persist.ts): the files' term lists (TermListCheck)
 * and the model's term vectors (checkTermVectorsBlock). ensure() returns once the part is there
 * (finishing the fill itself when it has not ended) and throws when it cannot be read. The index's
 * slots call it before giving out a file's terms, and the model before giving out its term
 * vectors (modelFilledLater), so nothing reads them unfilled.
 */
export interface FillGate {
  ensure(): void;
}

/** Where the term lists (termIds, then termCounts, adjacent) lie in the file, and how many entries they hold. */
export function termListsOf(
  header: CheckedHeader,
  fileStart: number,
): { readonly at: number; readonly idsBytes: number; readonly bytes: number; readonly total: number } {
  const ids = header.sections.find((s) => s.name === 'termIds')!;
  const counts = header.sections.find((s) => s.name === 'termCounts')!;
  return { at: fileStart + ids.offset, idsBytes: 4 * ids.length, bytes: counts.offset + 4 * counts.length - ids.offset, total: ids.length };
}

/** Where the model's term vectors lie in the file (byte offset and length). */
export function termVectorsOf(header: CheckedHeader, fileStart: number): { readonly at: number; readonly bytes: number } {
  const e = header.sections.find((s) => s.name === 'termVectors')!;
  return { at: fileStart + e.offset, bytes: 4 * e.length };
}

/**
 * The model with its term vectors behind `gate`: the first read of model.termVectors fills them
 * (gate.ensure(), which throws when they cannot be read), then makes the field a plain one again,
 * so later reads cost nothing and a spread or a copy of the model reads them filled.
 */
function modelFilledLater(model: ConceptModel, gate: FillGate): ConceptModel {
  const termVectors = model.termVectors;
  return Object.defineProperty(model, 'termVectors', {
    enumerable: true,
    configurable: true,
    get(this: ConceptModel): Float32Array {
      gate.ensure();
      Object.defineProperty(this, 'termVectors', { value: termVectors, enumerable: true, configurable: true, writable: false });
      return termVectors;
    },
  });
}

/** Where termIndptr lies in the file, and how many terms the vocabulary holds (from its offsets' length). */
export function termIndptrOf(
  header: CheckedHeader,
  fileStart: number,
): { readonly at: number; readonly length: number; readonly vocabSize: number } {
  const ip = header.sections.find((s) => s.name === 'termIndptr')!;
  const starts = header.sections.find((s) => s.name === 'vocabStarts')!;
  return { at: fileStart + ip.offset, length: ip.length, vocabSize: starts.length - 1 };
}

/** The term lists of all files of a reopened index, with the gate that says when they are filled. */
interface SavedTermLists {
  readonly ids: Int32Array;
  readonly counts: Float32Array;
  readonly indptr: Int32Array;
  readonly length: Float64Array;
  readonly gate: FillGate;
}

/**
 * A reopened file's slot whose term lists are bytes filled in after the load (FillGate): its
 * terms wait for them, and their views are made on the first access (then kept), so the load makes
 * no per-file arrays for them. The other fields are plain, as in any DocSlot.
 */
class FilledLaterSlot implements DocSlot {
  private _terms: DocSlot['terms'] | undefined;

  constructor(
    public meta: DocSlot['meta'],
    public folded: boolean,
    public residual: number,
    private readonly lists: SavedTermLists,
    private readonly j: number,
  ) {}

  get terms(): DocSlot['terms'] {
    if (this._terms) return this._terms;
    const { ids, counts, indptr, length, gate } = this.lists;
    gate.ensure();
    const [a, b] = [indptr[this.j], indptr[this.j + 1]];
    return (this._terms = { termIds: ids.subarray(a, b), counts: counts.subarray(a, b), length: length[this.j] });
  }
}

/**
 * Where the files' concept vectors lie in the file (byte offset and length): a reader may read
 * them straight into the ranking rows (ConceptRows.rowBytes, docs × k) and hand those to
 * decodeIndexWithRows, leaving their place in the head unread (no copy of them is ever made).
 */
export function vectorsOf(header: CheckedHeader, fileStart: number): { readonly at: number; readonly bytes: number } {
  const e = header.sections.find((s) => s.name === 'vectors')!;
  return { at: fileStart + e.offset, bytes: 4 * e.length };
}

/** decodeIndex after the checksum: every section a view of payload, or the section rows in `rows`. */
function decodeChecked(
  header: CheckedHeader,
  payload: Uint8Array,
  rows: SectionRowReader | undefined,
  codes?: { readonly codes: ByteSpill; readonly params: ByteSpill },
  conceptRows?: ConceptRows,
  terms?: FillGate,
  termVectorsGate?: FillGate,
): LsiIndex {
  // The section table was checked against SECTION_LAYOUT (names, kinds, contiguous offsets) and
  // payloadBytes against its end, so every section lies inside the payload.
  const get = <K extends ArrayKind>(name: string, kind: K): InstanceType<(typeof CTORS)[K]> => {
    const e = header.sections.find((s) => s.name === name);
    const Ctor = CTORS[kind];
    if (!e) return new Ctor(0) as InstanceType<(typeof CTORS)[K]>; // a section an older format has not
    const bytesLen = e.length * Ctor.BYTES_PER_ELEMENT;
    const at = payload.byteOffset + e.offset;
    // A view when aligned (the usual case: the file buffer starts on 8 bytes), else a copy.
    if (at % Ctor.BYTES_PER_ELEMENT === 0) return new Ctor(payload.buffer as ArrayBuffer, at, e.length) as InstanceType<(typeof CTORS)[K]>;
    return new Ctor(payload.slice(e.offset, e.offset + bytesLen).buffer) as InstanceType<(typeof CTORS)[K]>;
  };
  const n = header.docs;
  const k = header.model.k;
  const splitText = (u8: Uint8Array): string[] => {
    try {
      return u8.length === 0 ? [] : decoder.decode(u8).split('\0');
    } catch {
      throw new CorruptIndexError('index file paths are not valid UTF-8');
    }
  };
  const vocabBytes = get('vocab', 'u8');
  // Checked without decoding (a term is decoded only when asked for, which would not say it is damaged).
  if (!isWellFormedUtf8(vocabBytes)) throw new CorruptIndexError('index vocabulary is not valid UTF-8');
  const vocab = Vocabulary.fromBytes({ bytes: vocabBytes, starts: get('vocabStarts', 'i32'), sorted: header.vocabSorted });
  if (!vocab) throw new CorruptIndexError('index vocabulary does not match its term offsets');
  const paths = n === 0 ? [] : splitText(get('paths', 'u8'));
  if (paths.length !== n) throw new CorruptIndexError('index sections disagree in size: paths are not docs long');
  const parts = {
    vocabSize: vocab.size,
    paths,
    size: get('docSize', 'f64'),
    mtime: get('docMtime', 'f64'),
    length: get('docLength', 'f64'),
    folded: get('docFolded', 'u8'),
    residual: get('docResidual', 'f64'),
    language: get('docLanguage', 'u8'),
    indptr: get('termIndptr', 'i32'),
    ids: get('termIds', 'i32'),
    counts: get('termCounts', 'f32'),
    termsChecked: terms !== undefined,
    keptIds: get('keptIds', 'i32'),
    columnOfLength: header.model.columnOfLength,
    weights: get('weights', 'f64'),
    termVectors: get('termVectors', 'f32'),
    termVectorsChecked: termVectorsGate !== undefined,
    singularValues: get('singularValues', 'f64'),
    axisScale: get('axisScale', 'f64'),
    vectors: conceptRows ? conceptRows.rows.subarray(0, n * k) : get('vectors', 'f32'),
    k,
    sectionIndptr: get('sectionIndptr', 'i32'),
    sectionLines: get('sectionLines', 'i32'),
    sectionTitles: rows ? titleStarts(get('sectionTitles', 'u8')) : splitText(get('sectionTitles', 'u8')),
    sectionVectors: rows ? undefined : get('sectionVectors', 'f32'),
    lists: {
      centroids: get('listCentroids', 'f32'),
      groups: get('listGroups', 'f32'),
      groupStarts: get('listGroupStarts', 'i32'),
      listOf: get('sectionList', 'i32'),
      params: rows ? undefined : get('sectionCodeParams', 'f64'),
    },
  };
  checkPayload(parts);
  const { size, mtime, length, folded, residual, indptr, ids, counts, keptIds, weights, termVectors, singularValues, axisScale, vectors } =
    parts;
  const columnOf = new Int32Array(header.model.columnOfLength).fill(-1);
  keptIds.forEach((id, c) => (columnOf[id] = c));
  const { columnOfLength: _len, ...scalars } = header.model;
  const plain: ConceptModel = { ...scalars, keptIds, columnOf, weights, termVectors, singularValues, axisScale };
  const model = termVectorsGate ? modelFilledLater(plain, termVectorsGate) : plain;
  const lists: SavedTermLists | undefined = terms && { ids, counts, indptr, length, gate: terms };
  const slots: DocSlot[] = paths.map((path, j) => {
    const meta = withLanguage<DocSlot['meta']>({ path, size: size[j], mtimeMs: mtime[j] }, LANGUAGES[parts.language[j]]);
    if (lists) return new FilledLaterSlot(meta, folded[j] === 1, residual[j], lists, j);
    const docTerms = {
      termIds: ids.subarray(indptr[j], indptr[j + 1]),
      counts: counts.subarray(indptr[j], indptr[j + 1]),
      length: length[j],
    };
    return { meta, terms: docTerms, folded: folded[j] === 1, residual: residual[j] };
  });
  const index = LsiIndex.assemble(header.settings, vocab, model, slots, conceptRows ?? vectors);
  index.restoreCounters(header.counters);
  const titles = parts.sectionTitles;
  if (titles instanceof Int32Array) {
    const table = { lines: parts.sectionLines, titleBytes: get('sectionTitles', 'u8'), titleStarts: titles, rows: rows! };
    parts.paths.forEach((path, j) => {
      const [a, b] = [parts.sectionIndptr[j], parts.sectionIndptr[j + 1]];
      if (b > a) index.sections.set(path, new StoredFileSections(table, a, b - a));
    });
  } else restoreSections(index, parts, titles);
  const l = parts.lists;
  if (l.listOf.length > 0) {
    const listing = codes
      ? { listOf: l.listOf, codes: codes.codes, params: codes.params, inFile: true }
      : { listOf: l.listOf, codes: bytesSpill(get('sectionCodes', 'u8')), params: bytesSpill(byteView(l.params!)), inFile: false };
    try {
      index.sections.restoreLists(l.centroids, l.groups, l.groupStarts, listing);
    } catch (err) {
      throw new CorruptIndexError(`index payload: ${(err as Error).message}`);
    }
  }
  return index;
}

const byteView = (a: Float64Array): Uint8Array => new Uint8Array(a.buffer, a.byteOffset, a.byteLength);

/**
 * Where each saved title starts in the titles' bytes (titles joined by NUL, which UTF-8 uses for
 * nothing else), with one offset past the end; the bytes are checked to be UTF-8 here.
 * @throws CorruptIndexError
 */
function titleStarts(bytes: Uint8Array): Int32Array {
  // Checked without decoding (a string of the whole table would only be thrown away).
  if (!isWellFormedUtf8(bytes)) throw new CorruptIndexError('index file section titles are not valid UTF-8');
  if (bytes.length === 0) return new Int32Array(1);
  let count = 1;
  for (let i = 0; i < bytes.length; i++) if (bytes[i] === 0) count++;
  const out = new Int32Array(count + 1);
  for (let i = 0, t = 1; i < bytes.length; i++) if (bytes[i] === 0) out[t++] = i + 1;
  out[count] = bytes.length + 1;
  return out;
}

/** Gives each file its saved sections (views of the payload). */
function restoreSections(index: LsiIndex, p: PayloadParts, titles: readonly string[]): void {
  const { sectionIndptr: ip, sectionLines: lines, sectionVectors: vectors, k } = p;
  p.paths.forEach((path, j) => {
    const a = ip[j];
    const b = ip[j + 1];
    if (b === a) return;
    const starts = new Int32Array(b - a);
    const ends = new Int32Array(b - a);
    for (let i = a; i < b; i++) [starts[i - a], ends[i - a]] = [lines[2 * i], lines[2 * i + 1]];
    index.sections.set(path, { starts, ends, titles: titles.slice(a, b), vectors: vectors!.subarray(a * k, b * k) });
  });
}
