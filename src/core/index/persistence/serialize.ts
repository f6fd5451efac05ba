/**
 * Binary form of an LsiIndex (our own format, version INDEX_FORMAT_VERSION):
 *   8 bytes magic "UNDTNIDX" · u32 LE header length · UTF-8 JSON header · zero padding to 8 ·
 *   payload of typed-array sections, each starting on an 8-byte boundary.
 * The header holds the format version, the settings, scalar model facts, the section table
 * (name, element type, byte offset, element count) and a checksum of the payload. Decoding checks
 * magic, version, bounds, section sizes and the checksum, and throws CorruptIndexError on any
 * mismatch, so a damaged, truncated or older file is rebuilt, never trusted. Holes left by removed
 * documents are compacted on encoding.
 * Reopening does O(sections) work beyond the checksum: the vocabulary is saved as UTF-8 bytes
 * with term offsets (ids in byte order, looked up by binary search; see termCounts.ts) and every
 * aligned section becomes a view of the given bytes, so the decoded index shares their memory:
 * hand decodeIndex a buffer nobody else writes to.
 */
import { CorruptIndexError } from '../../errors.js';
import { checksum32 } from './checksum.js';
import type { ConceptModel } from '../model/conceptModel.js';
import { LsiIndex, type DocSlot, type StalenessCounters } from '../lsiIndex.js';
import type { IndexSettings } from '../model/settings.js';
import { Vocabulary } from '../../counting/termCounts.js';

export const INDEX_FORMAT_VERSION = 2;
const MAGIC = 'UNDTNIDX';

type ArrayKind = 'u8' | 'i32' | 'f32' | 'f64';
type Typed = Uint8Array | Int32Array | Float32Array | Float64Array;
interface SectionEntry {
  name: string;
  kind: ArrayKind;
  offset: number;
  length: number;
}

interface Header {
  formatVersion: number;
  createdAt: string;
  settings: IndexSettings;
  docs: number;
  /** How many leading vocabulary ids are in ascending byte order (see termCounts.ts). */
  vocabSorted: number;
  model: Omit<ConceptModel, 'keptIds' | 'columnOf' | 'weights' | 'termVectors' | 'singularValues' | 'axisScale'> & { columnOfLength: number };
  counters: StalenessCounters;
  sections: SectionEntry[];
  payloadBytes: number;
  checksum: number;
}

const CTORS = { u8: Uint8Array, i32: Int32Array, f32: Float32Array, f64: Float64Array } as const;
const kindOf = (a: Typed): ArrayKind => (a instanceof Uint8Array ? 'u8' : a instanceof Int32Array ? 'i32' : a instanceof Float32Array ? 'f32' : 'f64');
const align8 = (n: number): number => (n + 7) & ~7;
const encoder = new TextEncoder();
const decoder = new TextDecoder('utf-8', { fatal: true });

/** A payload section: its table entry's name, kind and length, and how to write it in place. */
interface SectionSource {
  readonly name: string;
  readonly kind: ArrayKind;
  readonly length: number;
  /** Writes the section into out at byte offset at (8-aligned). */
  readonly write: (out: Uint8Array, at: number) => void;
}

const copied = (name: string, arr: Typed): SectionSource => ({
  name,
  kind: kindOf(arr),
  length: arr.length,
  write: (out, at) => out.set(new Uint8Array(arr.buffer, arr.byteOffset, arr.byteLength), at),
});

/** A section filled straight into the output buffer. */
const inPlace = <K extends ArrayKind>(name: string, kind: K, length: number, fill: (dst: InstanceType<(typeof CTORS)[K]>) => void): SectionSource => ({
  name,
  kind,
  length,
  write: (out, at) => fill(new CTORS[kind](out.buffer as ArrayBuffer, out.byteOffset + at, length) as InstanceType<(typeof CTORS)[K]>),
});

/** Encodes an index into one buffer, writing the large sections in place (no second copy of the payload). */
export function encodeIndex(index: LsiIndex, createdAt: Date = new Date()): Uint8Array {
  const live = index.slots().map((s, i) => [s, i] as const).filter((p): p is readonly [DocSlot, number] => p[0] !== null);
  const k = index.k;
  const n = live.length;
  const all = index.vectors();
  const termIndptr = new Int32Array(n + 1);
  live.forEach(([s], j) => (termIndptr[j + 1] = termIndptr[j] + s.terms.termIds.length));
  const nnz = termIndptr[n];
  const m = index.model;
  const vocab = index.vocab.toBytes();
  const sections: SectionSource[] = [
    copied('vocab', vocab.bytes),
    copied('vocabStarts', vocab.starts),
    copied('paths', encoder.encode(live.map(([s]) => s.meta.path).join('\0'))),
    copied('docSize', Float64Array.from(live, ([s]) => s.meta.size)),
    copied('docMtime', Float64Array.from(live, ([s]) => s.meta.mtimeMs)),
    copied('docLength', Float64Array.from(live, ([s]) => s.terms.length)),
    copied('docFolded', Uint8Array.from(live, ([s]) => (s.folded ? 1 : 0))),
    copied('docResidual', Float64Array.from(live, ([s]) => s.residual)),
    copied('termIndptr', termIndptr),
    inPlace('termIds', 'i32', nnz, (dst) => live.forEach(([s], j) => dst.set(s.terms.termIds, termIndptr[j]))),
    inPlace('termCounts', 'f32', nnz, (dst) => live.forEach(([s], j) => dst.set(s.terms.counts, termIndptr[j]))),
    copied('keptIds', m.keptIds),
    copied('weights', m.weights),
    copied('termVectors', m.termVectors),
    copied('singularValues', m.singularValues),
    copied('axisScale', m.axisScale),
    inPlace('vectors', 'f32', n * k, (dst) => live.forEach(([, i], j) => dst.set(all.subarray(i * k, (i + 1) * k), j * k))),
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
    counters: index.counters(),
    sections: table,
    payloadBytes: offset,
    checksum: 0xffffffff, // the widest value: room for the real one, padded with spaces
  };
  const reserved = encoder.encode(JSON.stringify(header)).length;
  const start = align8(12 + reserved);
  const out = new Uint8Array(start + offset);
  sections.forEach((sec, i) => sec.write(out, start + table[i].offset));
  header.checksum = checksum32(out.subarray(start));
  const headerBytes = encoder.encode(JSON.stringify(header));
  out.set(encoder.encode(MAGIC), 0);
  new DataView(out.buffer).setUint32(8, reserved, true);
  out.set(headerBytes, 12);
  out.fill(0x20, 12 + headerBytes.length, 12 + reserved);
  return out;
}

/** Reads only the header (cheap): format version, settings, document count, creation time. */
export function readIndexHeader(bytes: Uint8Array): Header {
  if (bytes.length < 12 || decoder.decode(bytes.subarray(0, 8)) !== MAGIC) throw new CorruptIndexError('not an Undertone index file (bad magic bytes)');
  const len = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength).getUint32(8, true);
  if (12 + len > bytes.length) throw new CorruptIndexError('index file is truncated inside its header');
  let header: Header;
  try {
    header = JSON.parse(decoder.decode(bytes.subarray(12, 12 + len))) as Header;
  } catch {
    throw new CorruptIndexError('index header is not valid JSON');
  }
  if (header.formatVersion !== INDEX_FORMAT_VERSION) {
    throw new CorruptIndexError(`index format ${header.formatVersion} is not the current format ${INDEX_FORMAT_VERSION}`);
  }
  return header;
}

export function decodeIndex(bytes: Uint8Array): LsiIndex {
  const header = readIndexHeader(bytes);
  const len = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength).getUint32(8, true);
  const start = align8(12 + len);
  if (bytes.length !== start + header.payloadBytes) throw new CorruptIndexError(`index file is ${bytes.length} bytes, expected ${start + header.payloadBytes} (truncated or padded)`);
  const payload = bytes.subarray(start);
  if (checksum32(payload) !== header.checksum) throw new CorruptIndexError('index payload fails its checksum (damaged file)');
  const get = <K extends ArrayKind>(name: string, kind: K): InstanceType<(typeof CTORS)[K]> => {
    const e = header.sections.find((s) => s.name === name);
    if (!e || e.kind !== kind) throw new CorruptIndexError(`index section "${name}" is missing`);
    const Ctor = CTORS[kind];
    const bytesLen = e.length * Ctor.BYTES_PER_ELEMENT;
    if (e.offset % 8 !== 0 || e.offset + bytesLen > payload.length) throw new CorruptIndexError(`index section "${name}" lies outside the file`);
    const at = payload.byteOffset + e.offset;
    // A view when aligned (the usual case: the file buffer starts on 8 bytes), else a copy.
    if (at % Ctor.BYTES_PER_ELEMENT === 0) return new Ctor(payload.buffer as ArrayBuffer, at, e.length) as InstanceType<(typeof CTORS)[K]>;
    return new Ctor(payload.slice(e.offset, e.offset + bytesLen).buffer) as InstanceType<(typeof CTORS)[K]>;
  };
  const n = header.docs;
  const k = header.model.k;
  const splitText = (u8: Uint8Array): string[] => (u8.length === 0 ? [] : decoder.decode(u8).split('\0'));
  const vocab = Vocabulary.fromBytes({ bytes: get('vocab', 'u8'), starts: get('vocabStarts', 'i32'), sorted: header.vocabSorted });
  if (!vocab) throw new CorruptIndexError('index vocabulary does not match its term offsets');
  const paths = n === 0 ? [] : splitText(get('paths', 'u8'));
  const size = get('docSize', 'f64');
  const mtime = get('docMtime', 'f64');
  const length = get('docLength', 'f64');
  const folded = get('docFolded', 'u8');
  const residual = get('docResidual', 'f64');
  const indptr = get('termIndptr', 'i32');
  const ids = get('termIds', 'i32');
  const counts = get('termCounts', 'f32');
  const keptIds = get('keptIds', 'i32');
  const weights = get('weights', 'f64');
  const termVectors = get('termVectors', 'f32');
  const singularValues = get('singularValues', 'f64');
  const axisScale = get('axisScale', 'f64');
  const vectors = get('vectors', 'f32');
  const consistent =
    paths.length === n && size.length === n && indptr.length === n + 1 && indptr[n] === ids.length && ids.length === counts.length &&
    weights.length === keptIds.length && termVectors.length === keptIds.length * k && singularValues.length === k &&
    axisScale.length === k && vectors.length === n * k && header.model.columnOfLength <= vocab.size;
  if (!consistent) throw new CorruptIndexError('index sections disagree in size');
  const columnOf = new Int32Array(header.model.columnOfLength).fill(-1);
  keptIds.forEach((id, c) => {
    if (id < 0 || id >= columnOf.length) throw new CorruptIndexError('index term table refers to an unknown term');
    columnOf[id] = c;
  });
  const { columnOfLength: _len, ...scalars } = header.model;
  const model: ConceptModel = { ...scalars, keptIds, columnOf, weights, termVectors, singularValues, axisScale };
  const slots: DocSlot[] = paths.map((path, j) => ({
    meta: { path, size: size[j], mtimeMs: mtime[j] },
    terms: { termIds: ids.subarray(indptr[j], indptr[j + 1]), counts: counts.subarray(indptr[j], indptr[j + 1]), length: length[j] },
    folded: folded[j] === 1,
    residual: residual[j],
  }));
  const index = LsiIndex.assemble(header.settings, vocab, model, slots, vectors);
  index.restoreCounters(header.counters);
  return index;
}
