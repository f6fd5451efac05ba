/**
 * Structural checks of a saved index (serialize.ts) made before anything in it is trusted: the
 * header's every field has its known type and range (settings included: a renamed or retyped key
 * is damage, not a default), the section table has exactly the expected sections in the expected
 * order, kinds and offsets (each offset follows from the lengths before it, so none can point
 * elsewhere), lengths agree with the counts (documents, terms, k), and the payload's values are
 * in range (term ids inside the vocabulary and ascending per document, finite numbers, unit or
 * zero concept vectors, distinct paths). Checksums catch accidental damage; these checks make a
 * file that passes its checksums but was written wrong (or forged) fail with a clear reason
 * instead of giving wrong answers or a TypeError later.
 */
import { LANGUAGES } from '../../text/languageCodes.js';
import { CorruptIndexError } from '../../errors.js';
import { WEIGHTING_SCHEMES } from '../../weighting/termWeighting.js';
import type { IndexSettings } from '../model/settings.js';

export type ArrayKind = 'u8' | 'i32' | 'f32' | 'f64';

export interface SectionEntry {
  name: string;
  kind: ArrayKind;
  offset: number;
  length: number;
}

/** The sections of a saved index of format 4, in file order, with their element kinds. */
export const SECTION_LAYOUT_4: readonly (readonly [string, ArrayKind])[] = [
  ['vocab', 'u8'],
  ['vocabStarts', 'i32'],
  ['paths', 'u8'],
  ['docSize', 'f64'],
  ['docMtime', 'f64'],
  ['docLength', 'f64'],
  ['docFolded', 'u8'],
  ['docResidual', 'f64'],
  // Each file's language: a position in LANGUAGES (src/core/text/languages.ts; 0 is English).
  ['docLanguage', 'u8'],
  ['termIndptr', 'i32'],
  ['termIds', 'i32'],
  ['termCounts', 'f32'],
  ['keptIds', 'i32'],
  ['weights', 'f64'],
  ['termVectors', 'f32'],
  ['singularValues', 'f64'],
  ['axisScale', 'f64'],
  ['vectors', 'f32'],
  // Format 4: each file's sections (src/core/sections): per-file offsets, [start, end) lines,
  // '\0'-separated titles, and k f32 numbers per section.
  ['sectionIndptr', 'i32'],
  ['sectionLines', 'i32'],
  ['sectionTitles', 'u8'],
  ['sectionVectors', 'f32'],
];

/**
 * Format 5: format 4 with the section lists (src/core/sections/savedLists.ts) — the trained
 * centroids, group centres and group starts and each section's list before the section vectors,
 * the 8-bit codes (k bytes a section) and their scale, error and norm (f64) in slot order after
 * them, so that a reader can leave both the vectors and the codes in the file. All six are empty
 * when the index has too few sections for lists.
 */
export const SECTION_LAYOUT: readonly (readonly [string, ArrayKind])[] = [
  ...SECTION_LAYOUT_4.slice(0, -1),
  ['listCentroids', 'f32'],
  ['listGroups', 'f32'],
  ['listGroupStarts', 'i32'],
  ['sectionList', 'i32'],
  ['sectionVectors', 'f32'],
  ['sectionCodes', 'u8'],
  ['sectionCodeParams', 'f64'],
];

/** The layout of each format version still read (format 4 opens without saved lists). */
export const LAYOUTS: Readonly<Record<number, readonly (readonly [string, ArrayKind])[]>> = {
  4: SECTION_LAYOUT_4,
  5: SECTION_LAYOUT,
  // Format 6: the same layout; the header adds headChecksum (serialize.ts).
  6: SECTION_LAYOUT,
};

export const BYTES_PER: Record<ArrayKind, number> = { u8: 1, i32: 4, f32: 4, f64: 8 };
export const align8 = (n: number): number => Math.ceil(n / 8) * 8;

/** Largest element count a section may claim (keeps offset arithmetic exact in doubles). */
const MAX_ELEMENTS = 2 ** 40;

const fail = (what: string): never => {
  throw new CorruptIndexError(`index header: ${what}`);
};

type Obj = Record<string, unknown>;

function object(v: unknown, what: string, keys: readonly string[]): Obj {
  if (typeof v !== 'object' || v === null || Array.isArray(v)) return fail(`${what} is not an object`);
  const o = v as Obj;
  const have = Object.keys(o).sort();
  const want = [...keys].sort();
  if (have.length !== want.length || have.some((k, i) => k !== want[i])) {
    const missing = want.filter((k) => !(k in o));
    const extra = have.filter((k) => !want.includes(k));
    fail(
      `${what} has ${missing.length ? `no ${missing.map((k) => `"${k}"`).join(', ')}` : ''}${missing.length && extra.length ? ' and ' : ''}${extra.length ? `unknown ${extra.map((k) => `"${k}"`).join(', ')}` : ''}`,
    );
  }
  return o;
}

function int(v: unknown, what: string, min: number, max = Number.MAX_SAFE_INTEGER): number {
  if (typeof v !== 'number' || !Number.isInteger(v) || v < min || v > max) fail(`${what} is not a whole number in ${min}…${max}`);
  return v as number;
}

function num(v: unknown, what: string, min: number, max: number): number {
  if (typeof v !== 'number' || !Number.isFinite(v) || v < min || v > max) fail(`${what} is not a number in ${min}…${max}`);
  return v as number;
}

function bool(v: unknown, what: string): boolean {
  if (typeof v !== 'boolean') fail(`${what} is not true or false`);
  return v as boolean;
}

/** Settings as saved: exactly the known keys, each of its type and range. */
export function checkSettings(v: unknown): IndexSettings {
  const keys = ['weighting', 'k', 'seed', 'powerIterations', 'prune', 'tokenize', 'conceptScaling', 'lexicalBlend'];
  // A shared concept model (import-model) is the one optional key.
  const hasShared = typeof v === 'object' && v !== null && 'sharedModel' in v;
  const s = object(v, 'settings', hasShared ? [...keys, 'sharedModel'] : keys);
  if (hasShared) {
    const m = object(s.sharedModel, 'settings.sharedModel', ['path', 'key']);
    if (typeof m.path !== 'string' || m.path.length === 0) fail('settings.sharedModel.path is not a path');
    if (typeof m.key !== 'string' || m.key.length === 0) fail('settings.sharedModel.key is not a model key');
  }
  if (!WEIGHTING_SCHEMES.includes(s.weighting as never)) fail('settings.weighting is not a known weighting');
  if (s.k !== 'auto') int(s.k, 'settings.k', 1, 1_000_000);
  int(s.seed, 'settings.seed', -(2 ** 53), 2 ** 53);
  int(s.powerIterations, 'settings.powerIterations', 0, 1000);
  const p = object(s.prune, 'settings.prune', ['minDocs', 'maxDocFraction', 'maxTerms']);
  int(p.minDocs, 'settings.prune.minDocs', 1);
  num(p.maxDocFraction, 'settings.prune.maxDocFraction', Number.MIN_VALUE, 1);
  int(p.maxTerms, 'settings.prune.maxTerms', 1);
  const hasLanguages = typeof s.tokenize === 'object' && s.tokenize !== null && 'languages' in s.tokenize;
  const t = object(s.tokenize, 'settings.tokenize', hasLanguages ? ['stem', 'keepCompounds', 'languages'] : ['stem', 'keepCompounds']);
  bool(t.stem, 'settings.tokenize.stem');
  bool(t.keepCompounds, 'settings.tokenize.keepCompounds');
  const l = t.languages;
  if (hasLanguages && l !== 'auto' && !(Array.isArray(l) && l.length > 0 && l.every((x) => LANGUAGES.includes(x as never))))
    fail('settings.tokenize.languages is neither "auto" nor a list of known languages');
  num(s.conceptScaling, 'settings.conceptScaling', -10, 10);
  num(s.lexicalBlend, 'settings.lexicalBlend', 0, 1);
  return s as unknown as IndexSettings;
}

export interface CheckedHeader {
  formatVersion: number;
  createdAt: string;
  settings: IndexSettings;
  docs: number;
  vocabSorted: number;
  model: {
    scheme: IndexSettings['weighting'];
    k: number;
    kChoice: { k: number; requested: number; clamped: boolean };
    frobeniusSquared: number;
    residualMean: number;
    nonZeros: number;
    pruneRelaxed: boolean;
    columnOfLength: number;
  };
  counters: { removedSinceBuild: number; foldedTokens: number; foldedUnknownTokens: number };
  sections: SectionEntry[];
  payloadBytes: number;
  checksum: number;
  /** Format 6 on: the checksum of the payload before the section vectors. */
  headChecksum?: number;
}

/**
 * Checks every field of a parsed header (types, ranges, the section table and its offsets): of
 * format `formatVersion`, or of an older one LAYOUTS still reads.
 */
export function checkHeader(v: unknown, formatVersion: number): CheckedHeader {
  const version = typeof v === 'object' && v !== null ? (v as Obj).formatVersion : undefined;
  const h = object(v, 'the header', [
    ...(typeof version === 'number' && version >= 6 ? ['headChecksum'] : []),
    'formatVersion',
    'createdAt',
    'settings',
    'docs',
    'vocabSorted',
    'model',
    'counters',
    'sections',
    'payloadBytes',
    'checksum',
  ]);
  const layout = typeof h.formatVersion === 'number' && h.formatVersion <= formatVersion ? LAYOUTS[h.formatVersion] : undefined;
  if (!layout) throw new CorruptIndexError(`index format ${String(h.formatVersion)} is not the current format ${formatVersion}`);
  if (typeof h.createdAt !== 'string' || Number.isNaN(Date.parse(h.createdAt))) fail('createdAt is not a date');
  const settings = checkSettings(h.settings);
  int(h.docs, 'docs', 0, 2 ** 31 - 2);
  int(h.vocabSorted, 'vocabSorted', 0, 2 ** 31 - 2);
  const m = object(h.model, 'model', [
    'scheme',
    'k',
    'kChoice',
    'frobeniusSquared',
    'residualMean',
    'nonZeros',
    'pruneRelaxed',
    'columnOfLength',
  ]);
  if (m.scheme !== settings.weighting) fail('model.scheme differs from settings.weighting');
  const k = int(m.k, 'model.k', 1, 1_000_000);
  const kc = object(m.kChoice, 'model.kChoice', ['k', 'requested', 'clamped']);
  if (kc.k !== k) fail('model.kChoice.k differs from model.k');
  int(kc.requested, 'model.kChoice.requested', 1);
  bool(kc.clamped, 'model.kChoice.clamped');
  num(m.frobeniusSquared, 'model.frobeniusSquared', 0, Number.MAX_VALUE);
  num(m.residualMean, 'model.residualMean', -1e-6, 1 + 1e-6);
  int(m.nonZeros, 'model.nonZeros', 0);
  bool(m.pruneRelaxed, 'model.pruneRelaxed');
  int(m.columnOfLength, 'model.columnOfLength', 0, 2 ** 31 - 2);
  const c = object(h.counters, 'counters', ['removedSinceBuild', 'foldedTokens', 'foldedUnknownTokens']);
  int(c.removedSinceBuild, 'counters.removedSinceBuild', 0);
  num(c.foldedTokens, 'counters.foldedTokens', 0, Number.MAX_VALUE);
  num(c.foldedUnknownTokens, 'counters.foldedUnknownTokens', 0, Number.MAX_VALUE);
  if (!Array.isArray(h.sections) || h.sections.length !== layout.length)
    fail(`the section table does not list the ${layout.length} sections`);
  let offset = 0;
  (h.sections as unknown[]).forEach((raw, i) => {
    const [name, kind] = layout[i];
    const e = object(raw, `section ${i + 1}`, ['name', 'kind', 'offset', 'length']);
    if (e.name !== name || e.kind !== kind) fail(`section ${i + 1} is not "${name}" of ${kind}`);
    if (e.offset !== offset) fail(`section "${name}" does not start where the one before it ends`);
    const length = int(e.length, `the length of section "${name}"`, 0, MAX_ELEMENTS);
    offset = align8(offset + length * BYTES_PER[kind]);
  });
  if (h.payloadBytes !== offset) fail('payloadBytes differs from the sum of the sections');
  int(h.checksum, 'checksum', 0, 0xffffffff);
  if (h.headChecksum !== undefined) int(h.headChecksum, 'headChecksum', 0, 0xffffffff);
  return h as unknown as CheckedHeader;
}

/** The length relations between sections (before any section is read). */
export function checkSectionSizes(header: CheckedHeader): void {
  const len = Object.fromEntries(header.sections.map((s) => [s.name, s.length])) as Record<string, number>;
  const n = header.docs;
  const k = header.model.k;
  const m = len.keptIds;
  const terms = len.vocabStarts - 1;
  const rules: [boolean, string][] = [
    [terms >= 0, 'vocabStarts is empty'],
    [header.vocabSorted <= terms, 'vocabSorted exceeds the vocabulary'],
    [header.model.columnOfLength <= terms, 'model.columnOfLength exceeds the vocabulary'],
    [(n === 0) === (len.paths === 0), 'paths disagree with docs'],
    [
      ['docSize', 'docMtime', 'docLength', 'docFolded', 'docResidual', 'docLanguage'].every((s) => len[s] === n),
      'a per-document section is not docs long',
    ],
    [len.termIndptr === n + 1, 'termIndptr is not docs + 1 long'],
    [len.termIds === len.termCounts, 'termIds and termCounts differ in length'],
    [len.weights === m, 'weights are not one per model term'],
    [len.termVectors === m * k, 'termVectors are not k per model term'],
    [len.singularValues === k && len.axisScale === k, 'singularValues or axisScale are not k long'],
    [len.vectors === n * k, 'vectors are not k per document'],
    [m <= header.model.columnOfLength, 'more model terms than model.columnOfLength'],
    [len.sectionIndptr === n + 1, 'sectionIndptr is not docs + 1 long'],
    [len.sectionLines % 2 === 0 && len.sectionVectors === (len.sectionLines / 2) * k, 'sectionVectors are not k per section'],
  ];
  if (header.formatVersion >= 5) {
    const s = len.sectionList;
    const g = len.listGroupStarts - 1;
    rules.push(
      [s === 0 || s === len.sectionLines / 2, 'sectionList is neither empty nor one per section'],
      [len.sectionCodes === s * k && len.sectionCodeParams === 3 * s, 'sectionCodes are not k bytes and 3 numbers per listed section'],
      [
        s === 0
          ? len.listCentroids + len.listGroups + len.listGroupStarts === 0
          : g >= 1 && len.listCentroids >= k && len.listCentroids % k === 0,
        'the section lists have no centroids or no groups',
      ],
      [len.listGroups === Math.max(0, g) * k, 'listGroups are not k per group'],
    );
  }
  for (const [ok, what] of rules) if (!ok) throw new CorruptIndexError(`index sections disagree in size: ${what}`);
}

/**
 * ‖v[o, o + k)‖² in f64, in four running sums (every fourth number each, then added pairwise):
 * the additions no longer wait on one another, about half the time of one running sum over the
 * 1.5 GB of section rows a load checks. Only the unit-length checks below use it (their bounds,
 * 1 ± 1e-3, are far wider than any difference the order of the sum makes).
 */
function normSquared(v: Float32Array, o: number, k: number): number {
  let s0 = 0,
    s1 = 0,
    s2 = 0,
    s3 = 0;
  const end = o + k;
  let c = o;
  for (const e4 = o + (k & ~3); c < e4; c += 4) {
    const a = v[c],
      b = v[c + 1],
      d = v[c + 2],
      e = v[c + 3];
    s0 += a * a;
    s1 += b * b;
    s2 += d * d;
    s3 += e * e;
  }
  for (; c < end; c++) s0 += v[c] * v[c];
  return s0 + s1 + (s2 + s3);
}

/** Payload values: ranges, orders and finiteness. */
export interface PayloadParts {
  readonly vocabSize: number;
  readonly paths: readonly string[];
  readonly size: Float64Array;
  readonly mtime: Float64Array;
  readonly length: Float64Array;
  readonly folded: Uint8Array;
  readonly residual: Float64Array;
  readonly language: Uint8Array;
  readonly indptr: Int32Array;
  readonly ids: Int32Array;
  readonly counts: Float32Array;
  /**
   * True when ids and counts were checked while a reader streamed them (TermListCheck), so their
   * bytes are not read here (a reopen fills them in after the load: persist.ts).
   */
  readonly termsChecked?: boolean;
  readonly keptIds: Int32Array;
  readonly columnOfLength: number;
  readonly weights: Float64Array;
  readonly termVectors: Float32Array;
  /**
   * True when termVectors were checked while a reader streamed them (checkTermVectorsBlock), so
   * their bytes are not read here (a reopen fills them in after the load: persist.ts).
   */
  readonly termVectorsChecked?: boolean;
  readonly singularValues: Float64Array;
  readonly axisScale: Float64Array;
  readonly vectors: Float32Array;
  readonly k: number;
  readonly sectionIndptr: Int32Array;
  readonly sectionLines: Int32Array;
  /** The titles, or where each starts in their bytes (one offset more than titles). */
  readonly sectionTitles: readonly string[] | Int32Array;
  /** Absent when the rows stay in the file: checked while they were streamed (checkSectionRows). */
  readonly sectionVectors?: Float32Array;
  /** The saved section lists (format 5; empty when none): see SECTION_LAYOUT. */
  readonly lists?: {
    readonly centroids: Float32Array;
    readonly groups: Float32Array;
    readonly groupStarts: Int32Array;
    readonly listOf: Int32Array;
    /** Absent when the codes stay in the file: checked while they were streamed (checkCodeParams). */
    readonly params?: Float64Array;
  };
}

const bad = (what: string): never => {
  throw new CorruptIndexError(`index payload: ${what}`);
};

/** Every value finite and at least min. */
function allFinite(a: Float64Array, what: string, min = -Infinity): void {
  for (let i = 0; i < a.length; i++) if (!(a[i] >= min && a[i] < Infinity && a[i] > -Infinity)) bad(`${what} holds a value out of range`);
}

/** IEEE 754 binary32 bits of the exponent field: all ones is an infinity or a NaN. */
const F32_EXPONENT = 0x7f800000;

/**
 * Every f32 value finite (or, with `positive`, finite and above zero), read as bit patterns
 * (IEEE 754 binary32: exponent all ones is ±Infinity or NaN; above zero is a clear sign bit and
 * bits from 1, the least subnormal, up to 0x7f7fffff, the greatest finite): integer tests on a
 * 32-bit view instead of float reads and compares (the saved term counts and term vectors are
 * 200 MB on the Linux tree).
 */
function allFiniteF32(a: Float32Array, what: string, positive = false): void {
  const bits = new Uint32Array(a.buffer, a.byteOffset, a.length);
  if (positive) {
    for (let i = 0; i < bits.length; i++) if ((bits[i] - 1) >>> 0 >= F32_EXPONENT - 1) bad(`${what} holds a value out of range`);
  } else {
    for (let i = 0; i < bits.length; i++) if ((bits[i] & F32_EXPONENT) === F32_EXPONENT) bad(`${what} holds a value out of range`);
  }
}

/**
 * The check of the model's term vectors (all finite), on one block of them as a reader streams
 * them (persist.ts); checkPayload does the same over the whole section when not told it was done.
 * @throws CorruptIndexError
 */
export function checkTermVectorsBlock(block: Float32Array): void {
  allFiniteF32(block, 'termVectors');
}

export function checkPayload(p: PayloadParts): void {
  const n = p.paths.length;
  const seen = new Set<string>();
  for (const path of p.paths) {
    if (path.length === 0 || seen.has(path)) bad('a file path is empty or listed twice');
    seen.add(path);
  }
  allFinite(p.size, 'docSize', 0);
  allFinite(p.mtime, 'docMtime');
  allFinite(p.length, 'docLength', 0);
  for (let j = 0; j < n; j++) if (p.folded[j] > 1) bad('docFolded holds a value other than 0 or 1');
  allFinite(p.residual, 'docResidual', -1e-3);
  for (let j = 0; j < n; j++) if (p.residual[j] > 1 + 1e-3) bad('docResidual holds a value above 1');
  for (let j = 0; j < n; j++) if (p.language[j] >= LANGUAGES.length) bad('docLanguage holds an unknown language');
  if (p.termsChecked) checkTermIndptr(p.indptr, p.ids.length);
  else {
    const check = new TermListCheck(p.indptr, p.ids.length, p.vocabSize);
    check.ids(p.ids);
    check.counts(p.counts);
    check.finish();
  }
  let prev = -1;
  for (let c = 0; c < p.keptIds.length; c++) {
    const id = p.keptIds[c];
    if (!(id > prev && id < p.columnOfLength)) bad('keptIds are out of order or outside the vocabulary');
    prev = id;
  }
  allFinite(p.weights, 'weights');
  if (!p.termVectorsChecked) allFiniteF32(p.termVectors, 'termVectors');
  allFinite(p.singularValues, 'singularValues', 0);
  allFinite(p.axisScale, 'axisScale');
  const k = p.k;
  const v = p.vectors;
  for (let j = 0; j < n; j++) {
    const s = normSquared(v, j * k, k);
    // Unit vectors, or zero for a file without model terms (float32 rounding allows a little).
    if (!(s <= 1 + 1e-3) || (s > 1e-6 && s < 1 - 1e-3)) bad(`the concept vector of "${p.paths[j]}" is not of unit length`);
  }
  checkSections(p);
}

/** termIndptr starts at 0, never goes backwards and ends at the term lists' length (`total`). */
function checkTermIndptr(indptr: Int32Array, total: number): void {
  const n = indptr.length - 1;
  if (n < 0 || indptr[0] !== 0 || indptr[n] !== total) bad('termIndptr does not span the term lists');
  for (let j = 0; j < n; j++) if (!(indptr[j + 1] >= indptr[j])) bad('termIndptr goes backwards or past the term lists');
}

/**
 * The checks of the files' term lists (termIds, then termCounts): each file's ids ascending and
 * inside the vocabulary, each count finite and above zero. Made on the whole sections, or on
 * consecutive blocks of each (all of termIds, then all of termCounts) as a reader streams them
 * without keeping them (persist.ts); finish() then checks that both were given whole.
 */
export class TermListCheck {
  private doc = 0;
  private prev = -1;
  private idsAt = 0;
  private countsAt = 0;

  /** @throws CorruptIndexError when indptr does not span `total` entries in order. */
  constructor(
    private readonly indptr: Int32Array,
    private readonly total: number,
    private readonly vocabSize: number,
  ) {
    checkTermIndptr(indptr, total);
  }

  /** The next block of termIds. */
  ids(block: Int32Array): void {
    if (this.idsAt + block.length > this.total) bad('termIds run past termIndptr');
    const ip = this.indptr;
    const vocab = this.vocabSize;
    let doc = this.doc;
    let prev = this.prev;
    let end = ip[doc + 1];
    let at = this.idsAt;
    for (let i = 0; i < block.length; i++, at++) {
      while (at >= end) {
        doc++;
        end = ip[doc + 1];
        prev = -1;
      }
      const id = block[i];
      if (!(id > prev && id < vocab)) bad('a document lists a term id out of order or outside the vocabulary');
      prev = id;
    }
    this.doc = doc;
    this.prev = prev;
    this.idsAt = at;
  }

  /** The next block of termCounts (after every block of termIds). */
  counts(block: Float32Array): void {
    if (this.countsAt + block.length > this.total) bad('termCounts run past termIndptr');
    allFiniteF32(block, 'termCounts', true);
    this.countsAt += block.length;
  }

  /** @throws CorruptIndexError unless both sections were given whole. */
  finish(): void {
    if (this.idsAt !== this.total || this.countsAt !== this.total) bad('the term lists were not checked whole (a reader bug)');
  }
}

function checkSections(p: PayloadParts): void {
  const n = p.paths.length;
  const count = p.sectionLines.length / 2;
  const ip = p.sectionIndptr;
  if (ip[0] !== 0 || ip[n] !== count) bad('sectionIndptr does not span the sections');
  for (let j = 0; j < n; j++) if (!(ip[j + 1] >= ip[j])) bad('sectionIndptr goes backwards');
  const titles = p.sectionTitles instanceof Int32Array ? p.sectionTitles.length - 1 : p.sectionTitles.length;
  if (titles !== count) bad('there are not as many section titles as sections');
  for (let i = 0; i < count; i++) {
    const start = p.sectionLines[2 * i];
    const end = p.sectionLines[2 * i + 1];
    if (!(start >= 0 && end > start)) bad('a section ends before it starts');
  }
  if (p.sectionVectors) checkSectionRows(p.sectionVectors, count, p.k);
  const l = p.lists;
  if (!l || l.listOf.length === 0) return;
  allFiniteF32(l.centroids, 'listCentroids');
  allFiniteF32(l.groups, 'listGroups');
  const lists = l.centroids.length / p.k;
  const g = l.groupStarts.length - 1;
  if (l.groupStarts[0] !== 0 || l.groupStarts[g] !== lists) bad('listGroupStarts do not span the lists');
  for (let c = 0; c < g; c++) if (!(l.groupStarts[c + 1] >= l.groupStarts[c])) bad('listGroupStarts go backwards');
  for (let i = 0; i < l.listOf.length; i++)
    if (!(l.listOf[i] >= 0 && l.listOf[i] < lists)) bad('sectionList holds a list that does not exist');
  if (l.params) checkCodeParams(l.params);
}

/**
 * The saved codes' scales, errors and norms (three f64 a row) are finite and not negative. Run on
 * the whole section, or on consecutive blocks of it as they are read.
 * @throws CorruptIndexError
 */
export function checkCodeParams(p: Float64Array): void {
  for (let i = 0; i < p.length; i++) if (!(p[i] >= 0 && p[i] < Infinity)) bad('sectionCodeParams hold a value out of range');
}

/**
 * The first `rows` section vectors of v (k numbers each) are of unit length, or zero for a section
 * without a model term (float32 rounding allows a little). Run on the whole section, or on
 * consecutive blocks of whole rows of it as they are read.
 * @throws CorruptIndexError
 */
export function checkSectionRows(v: Float32Array, rows: number, k: number): void {
  for (let i = 0; i < rows; i++) {
    const ss = normSquared(v, i * k, k);
    if (!(ss <= 1 + 1e-3) || (ss > 1e-6 && ss < 1 - 1e-3)) bad('a section vector is not of unit length');
  }
}
