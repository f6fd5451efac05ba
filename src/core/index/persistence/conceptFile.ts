/**
 * The portable concept model: one file an organisation builds once (for example with the cluster
 * job in cluster/) and every editor folds its own files into. Our own binary layout, version
 * CONCEPT_FILE_VERSION, little-endian throughout:
 *
 *   offset 0   8 bytes  magic "UTCNCPT1"
 *          8   u32      format version
 *         12   u32      header length H (bytes of UTF-8 JSON)
 *         16   H bytes  header (JSON, below), then zero bytes up to a multiple of 8
 *          P   payload: the sections the header lists, each at P + offset (offsets are multiples
 *              of 8; zero bytes between sections)
 *        end-4 u32      CRC-32 (zlib's) of every byte before it
 *
 * Header fields: format ("undertone-concept-model"), createdAt, producer, weighting
 * ('log-entropy' | 'tfidf'), tokenize (the tokenizer options the counts used), prune (the pruning
 * options), powerIterations, oversampling, seed, k, terms (vocabulary size m), files (how many
 * files have a row in fileVectors; 0 when the model carries none), documents (n, files the model
 * was built from), nonZeros, frobeniusSquared, sections: [{ name, kind: 'u8'|'f32'|'f64', offset,
 * length (elements) }].
 * Sections: terms (u8: the m terms in UTF-8, '\0' after each, strictly ascending in code-unit
 * order), weights (f64 × m: the weighting's global factor of each term), singularValues (f64 × k,
 * descending), termVectors (f32 × m·k: U, row-major), and optionally files (u8: paths, '\0' after
 * each) and fileVectors (f32 × files·k, row-major: each covered file's unit concept vector, the
 * row of VΣ scaled to length 1, as the index holds its files' vectors with conceptScaling 1).
 * Decoding refuses, with CorruptModelError, any file whose CRC, magic, version, header, section
 * bounds or contents (finite numbers, term order, lengths) do not check out: a file damaged in any
 * byte is never used.
 */
import { UndertoneError } from '../../errors.js';
import type { TokenizeOptions } from '../../text/tokenize.js';
import type { PruneOptions } from '../../weighting/prune.js';
import { WEIGHTING_SCHEMES, type WeightingScheme } from '../../weighting/termWeighting.js';
import { crc32 } from './crc32.js';

export const CONCEPT_FILE_VERSION = 1;
export const CONCEPT_FILE_MAGIC = 'UTCNCPT1';
export const CONCEPT_FILE_FORMAT = 'undertone-concept-model';

export class CorruptModelError extends UndertoneError {}

export interface PortableModel {
  readonly createdAt: string;
  readonly producer: string;
  readonly weighting: WeightingScheme;
  readonly tokenize: TokenizeOptions;
  readonly prune: PruneOptions;
  readonly powerIterations: number;
  readonly oversampling: number;
  readonly seed: number;
  readonly k: number;
  readonly documents: number;
  readonly nonZeros: number;
  readonly frobeniusSquared: number;
  /** m terms, strictly ascending in code-unit order. */
  readonly terms: readonly string[];
  /** Global weight per term. */
  readonly weights: Float64Array;
  /** k values, descending. */
  readonly singularValues: Float64Array;
  /** U: m × k, row-major. */
  readonly termVectors: Float32Array;
  /** Files with a row in fileVectors (empty when the model carries none). */
  readonly files: readonly string[];
  /** Unit rows of VΣ: files × k, row-major. */
  readonly fileVectors: Float32Array;
  /** CRC-32 of the file: its identity (a different file means a different model). */
  readonly checksum: number;
}

type Kind = 'u8' | 'f32' | 'f64';
interface Section {
  name: string;
  kind: Kind;
  offset: number;
  length: number;
}
const SIZE: Record<Kind, number> = { u8: 1, f32: 4, f64: 8 };
const align8 = (n: number): number => (n + 7) & ~7;
const encoder = new TextEncoder();
const decoder = new TextDecoder('utf-8', { fatal: true });

function joinTerms(items: readonly string[]): Uint8Array {
  return encoder.encode(items.map((t) => `${t}\0`).join(''));
}

/** Encodes a model (checksum ignored: the file's CRC is computed here). */
export function encodeConceptFile(model: Omit<PortableModel, 'checksum'>): Uint8Array {
  const parts: { name: string; kind: Kind; bytes: Uint8Array; length: number }[] = [];
  const add = (name: string, arr: Uint8Array | Float32Array | Float64Array): void => {
    const kind: Kind = arr instanceof Uint8Array ? 'u8' : arr instanceof Float32Array ? 'f32' : 'f64';
    parts.push({ name, kind, bytes: new Uint8Array(arr.buffer, arr.byteOffset, arr.byteLength), length: arr.length });
  };
  add('terms', joinTerms(model.terms));
  add('weights', model.weights);
  add('singularValues', model.singularValues);
  add('termVectors', model.termVectors);
  if (model.files.length > 0) {
    add('files', joinTerms(model.files));
    add('fileVectors', model.fileVectors);
  }
  const sections: Section[] = [];
  let offset = 0;
  for (const p of parts) {
    sections.push({ name: p.name, kind: p.kind, offset, length: p.length });
    offset = align8(offset + p.bytes.length);
  }
  const header = {
    format: CONCEPT_FILE_FORMAT,
    createdAt: model.createdAt,
    producer: model.producer,
    weighting: model.weighting,
    tokenize: model.tokenize,
    prune: model.prune,
    powerIterations: model.powerIterations,
    oversampling: model.oversampling,
    seed: model.seed,
    k: model.k,
    terms: model.terms.length,
    files: model.files.length,
    documents: model.documents,
    nonZeros: model.nonZeros,
    frobeniusSquared: model.frobeniusSquared,
    sections,
  };
  const headerBytes = encoder.encode(JSON.stringify(header));
  const payloadAt = align8(16 + headerBytes.length);
  const out = new Uint8Array(payloadAt + offset + 4);
  out.set(encoder.encode(CONCEPT_FILE_MAGIC), 0);
  const view = new DataView(out.buffer);
  view.setUint32(8, CONCEPT_FILE_VERSION, true);
  view.setUint32(12, headerBytes.length, true);
  out.set(headerBytes, 16);
  parts.forEach((p, i) => out.set(p.bytes, payloadAt + sections[i].offset));
  view.setUint32(out.length - 4, crc32(out.subarray(0, out.length - 4)), true);
  return out;
}

/** Decodes and checks a concept model file; throws CorruptModelError on any damage. */
export function decodeConceptFile(bytes: Uint8Array): PortableModel {
  const bad = (why: string): never => {
    throw new CorruptModelError(`not a usable concept model file: ${why}`);
  };
  if (bytes.length < 24) bad('too short');
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const stored = view.getUint32(bytes.length - 4, true);
  const actual = crc32(bytes.subarray(0, bytes.length - 4));
  if (stored !== actual) bad('checksum mismatch (the file is damaged or truncated)');
  if (decoder.decode(bytes.subarray(0, 8)) !== CONCEPT_FILE_MAGIC) bad('wrong magic bytes');
  const version = view.getUint32(8, true);
  if (version !== CONCEPT_FILE_VERSION) bad(`format version ${version}, this build reads ${CONCEPT_FILE_VERSION}`);
  const headerLength = view.getUint32(12, true);
  if (16 + headerLength > bytes.length - 4) bad('header runs past the end');
  let h: Record<string, unknown>;
  try {
    h = JSON.parse(decoder.decode(bytes.subarray(16, 16 + headerLength))) as Record<string, unknown>;
  } catch {
    return bad('header is not JSON');
  }
  const payloadAt = align8(16 + headerLength);
  for (let i = 16 + headerLength; i < payloadAt; i++) if (bytes[i] !== 0) bad('padding is not zero');
  const int = (name: string, min: number): number => {
    const v = h[name];
    if (typeof v !== 'number' || !Number.isInteger(v) || v < min) bad(`header field ${name} must be a whole number ≥ ${min}`);
    return v as number;
  };
  if (h.format !== CONCEPT_FILE_FORMAT) bad('header names another format');
  if (!WEIGHTING_SCHEMES.includes(h.weighting as WeightingScheme)) bad('unknown weighting');
  const tokenize = h.tokenize as TokenizeOptions;
  if (
    typeof tokenize !== 'object' ||
    tokenize === null ||
    typeof tokenize.stem !== 'boolean' ||
    typeof tokenize.keepCompounds !== 'boolean'
  )
    bad('tokenizer options missing');
  const prune = h.prune as PruneOptions;
  if (
    typeof prune !== 'object' ||
    prune === null ||
    typeof prune.minDocs !== 'number' ||
    typeof prune.maxDocFraction !== 'number' ||
    typeof prune.maxTerms !== 'number'
  )
    bad('pruning options missing');
  const k = int('k', 1);
  const m = int('terms', k);
  const f = int('files', 0);
  const frob = h.frobeniusSquared;
  if (typeof frob !== 'number' || !Number.isFinite(frob)) bad('frobeniusSquared must be a finite number');
  if (typeof h.createdAt !== 'string' || typeof h.producer !== 'string') bad('createdAt and producer must be text');
  const sections = h.sections as Section[];
  if (!Array.isArray(sections)) bad('no section table');
  const payloadEnd = bytes.length - 4;
  const get = (name: string, kind: Kind, length: number | undefined): Uint8Array => {
    const s = sections.find((x) => x && x.name === name);
    if (!s) return bad(`section ${name} missing`);
    if (s.kind !== kind) bad(`section ${name} has kind ${String(s.kind)}, expected ${kind}`);
    if (!Number.isInteger(s.offset) || s.offset < 0 || s.offset % 8 !== 0 || !Number.isInteger(s.length) || s.length < 0)
      bad(`section ${name} has a bad offset or length`);
    if (length !== undefined && s.length !== length) bad(`section ${name} holds ${s.length} values, expected ${length}`);
    const start = payloadAt + s.offset;
    const end = start + s.length * SIZE[kind];
    if (end > payloadEnd) bad(`section ${name} runs past the end`);
    return bytes.subarray(start, end);
  };
  const copyOf = <T extends Float32Array | Float64Array>(ctor: new (b: ArrayBuffer) => T, raw: Uint8Array): T => {
    const buf = new ArrayBuffer(raw.length);
    new Uint8Array(buf).set(raw);
    const arr = new ctor(buf);
    for (let i = 0; i < arr.length; i++) if (!Number.isFinite(arr[i])) bad('a section holds a value that is not a finite number');
    return arr;
  };
  const splitNames = (raw: Uint8Array, count: number, what: string): string[] => {
    let text: string;
    try {
      text = decoder.decode(raw);
    } catch {
      return bad(`${what} are not valid UTF-8`);
    }
    if (count === 0 ? text.length !== 0 : !text.endsWith('\0')) bad(`${what} are not '\\0'-terminated`);
    const names = count === 0 ? [] : text.slice(0, -1).split('\0');
    if (names.length !== count) bad(`${what}: ${names.length} names, the header says ${count}`);
    return names;
  };
  const terms = splitNames(get('terms', 'u8', undefined), m, 'terms');
  for (let i = 0; i < terms.length; i++) {
    if (terms[i].length === 0) bad('an empty term');
    if (i > 0 && !(terms[i - 1] < terms[i])) bad('terms are not in ascending order');
  }
  const weights = copyOf(Float64Array, get('weights', 'f64', m));
  const singularValues = copyOf(Float64Array, get('singularValues', 'f64', k));
  for (let c = 0; c < k; c++)
    if (singularValues[c] < 0 || (c > 0 && singularValues[c] > singularValues[c - 1])) bad('singular values must be ≥ 0 and descending');
  const termVectors = copyOf(Float32Array, get('termVectors', 'f32', m * k));
  const files = f > 0 ? splitNames(get('files', 'u8', undefined), f, 'file names') : [];
  const fileVectors = f > 0 ? copyOf(Float32Array, get('fileVectors', 'f32', f * k)) : new Float32Array(0);
  // Every byte between and after the sections is zero (so no byte escapes a check).
  const used = new Uint8Array(payloadEnd - payloadAt);
  for (const s of sections) {
    if (!s || typeof s.name !== 'string' || !(s.kind in SIZE)) bad('a bad section entry');
    if (!['terms', 'weights', 'singularValues', 'termVectors', 'files', 'fileVectors'].includes(s.name)) bad(`unknown section ${s.name}`);
    const start = s.offset;
    const end = s.offset + s.length * SIZE[s.kind];
    if (end > used.length) bad(`section ${s.name} runs past the end`);
    for (let i = start; i < end; i++) {
      if (used[i]) bad('sections overlap');
      used[i] = 1;
    }
  }
  for (let i = 0; i < used.length; i++) if (!used[i] && bytes[payloadAt + i] !== 0) bad('bytes outside every section are not zero');
  const documents = int('documents', 1);
  const nonZeros = int('nonZeros', 0);
  return {
    createdAt: h.createdAt as string,
    producer: h.producer as string,
    weighting: h.weighting as WeightingScheme,
    tokenize: { stem: tokenize.stem, keepCompounds: tokenize.keepCompounds },
    prune: { minDocs: prune.minDocs, maxDocFraction: prune.maxDocFraction, maxTerms: prune.maxTerms },
    powerIterations: int('powerIterations', 0),
    oversampling: int('oversampling', 0),
    seed: int('seed', 0),
    k,
    documents,
    nonZeros,
    frobeniusSquared: frob as number,
    terms,
    weights,
    singularValues,
    termVectors,
    files,
    fileVectors,
    checksum: stored,
  };
}
