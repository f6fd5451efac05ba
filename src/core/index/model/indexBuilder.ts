/**
 * Collects documents (text or already-counted terms) and builds an LsiIndex. Documents are
 * sorted by path and the vocabulary is renumbered in term order before the build, so the same
 * files give the same index whether they were read now or reused from a saved index.
 */
import { InvalidInputError } from '../../errors.js';
import { tokenizeIn } from '../../text/tokenizeLanguage.js';
import { fileLanguage, withLanguage } from '../../text/detectLanguage.js';
import { adoptSharedModel } from './adoptModel.js';
import { buildConceptModelAndVectors, type BuildProgress } from './conceptModel.js';
import { LsiIndex, type DocMeta, type DocSlot } from '../lsiIndex.js';
import { resolveSettings, type IndexSettings } from './settings.js';
import { countTerms, Vocabulary, type DocTerms } from '../../counting/termCounts.js';

export class IndexBuilder {
  readonly settings: IndexSettings;
  private readonly _vocab: Vocabulary;
  private readonly _docs = new Map<string, { meta: DocMeta; terms: DocTerms }>();

  /** Pass the vocabulary the given DocTerms refer to when reusing counts from an index. */
  constructor(settings: Partial<IndexSettings> = {}, vocab: Vocabulary = new Vocabulary()) {
    this.settings = resolveSettings(settings);
    this._vocab = vocab;
  }

  get size(): number {
    return this._docs.size;
  }

  /** Tokenizes and counts one document (replacing an earlier one with the same path). */
  addText(meta: DocMeta, text: string): DocTerms {
    const language = fileLanguage(meta.path, text, this.settings.tokenize.languages);
    const terms = countTerms(tokenizeIn(text, this.settings.tokenize, language), this._vocab, true);
    this._docs.set(meta.path, { meta: withLanguage(meta, language), terms });
    return terms;
  }

  /** Adds a document whose terms were counted against this builder's vocabulary. */
  addCounted(meta: DocMeta, terms: DocTerms): void {
    this._docs.set(meta.path, { meta, terms });
  }

  remove(path: string): boolean {
    return this._docs.delete(path);
  }

  build(progress: BuildProgress = {}): LsiIndex {
    const paths = [...this._docs.keys()].sort(comparePaths);
    // Renumber the vocabulary: only terms still used, in code-unit order of the term strings.
    const used = new Uint8Array(this._vocab.size);
    for (const p of paths) for (const id of this._docs.get(p)!.terms.termIds) used[id] = 1;
    const oldIds: number[] = [];
    for (let id = 0; id < used.length; id++) if (used[id]) oldIds.push(id);
    // A vocabulary already in that order (every term used, terms ascending; the parallel reader
    // of src/node builds one, a reopened index has one) is kept as it is: renumbering would change
    // nothing. Its strings are then never needed (decoding millions of saved terms takes seconds).
    const canonical = oldIds.length === this._vocab.size && inCodeUnitOrder(this._vocab);
    const terms = canonical ? [] : this._vocab.terms;
    if (!canonical) oldIds.sort((a, b) => (terms[a] < terms[b] ? -1 : terms[a] > terms[b] ? 1 : 0));
    const newId = new Int32Array(canonical ? 0 : this._vocab.size).fill(-1);
    if (!canonical) oldIds.forEach((old, i) => (newId[old] = i));
    const vocab = canonical ? this._vocab : new Vocabulary(oldIds.map((id) => terms[id]));
    const slots: DocSlot[] = paths.map((path) => {
      const { meta, terms: t } = this._docs.get(path)!;
      return { meta, terms: canonical ? t : remap(t, newId), folded: false, residual: 0 };
    });
    if (slots.length === 0) throw new InvalidInputError('There are no files to index.');
    if (progress.sharedModel) {
      const a = adoptSharedModel(progress.sharedModel, vocab, slots, this.settings, progress);
      return LsiIndex.assemble(this.settings, a.vocab, a.model, a.slots, a.vectors);
    }
    const { model, vectors } = buildConceptModelAndVectors(
      slots.map((s) => s.terms),
      vocab.size,
      this.settings,
      progress,
    );
    return LsiIndex.assemble(this.settings, vocab, model, slots, vectors);
  }
}

/**
 * Whether the terms ascend strictly in code-unit order. For a reopened vocabulary, from its bytes
 * when every id is in ascending byte order and no term has a character above U+FFFF (4-byte UTF-8,
 * lead byte ≥ 0xF0): UTF-8 byte order is code-point order, which is code-unit order for such
 * strings. Otherwise from the strings.
 */
function inCodeUnitOrder(vocab: Vocabulary): boolean {
  if (vocab.byteOrdered > 0) {
    const { bytes, sorted } = vocab.toBytes();
    if (sorted === vocab.size && !hasFourByteSequence(bytes)) return true;
  }
  const terms = vocab.terms;
  for (let i = 1; i < terms.length; i++) if (!(terms[i - 1] < terms[i])) return false;
  return true;
}

/** Whether any byte is ≥ 0xF0, four bytes at a time (words without a high bit are skipped). */
function hasFourByteSequence(bytes: Uint8Array): boolean {
  const head = Math.min(bytes.length, (4 - (bytes.byteOffset % 4)) % 4);
  const words = new Uint32Array(bytes.buffer, bytes.byteOffset + head, (bytes.length - head) >>> 2);
  for (let i = 0; i < head; i++) if (bytes[i] >= 0xf0) return true;
  for (let w = 0; w < words.length; w++) {
    if ((words[w] & 0x80808080) === 0) continue;
    for (let i = head + 4 * w; i < head + 4 * w + 4; i++) if (bytes[i] >= 0xf0) return true;
  }
  for (let i = head + 4 * words.length; i < bytes.length; i++) if (bytes[i] >= 0xf0) return true;
  return false;
}

/** Position bits of a remap sort key (ids below 2^31, positions below 2^21: a key fits 2^52). */
const REMAP_SHIFT = 2 ** 21;

function remap(t: DocTerms, newId: Int32Array): DocTerms {
  // Typed arrays only (no per-entry objects): new ids, then a sort of (id, position) keys.
  const n = t.termIds.length;
  const termIds = new Int32Array(n);
  let sorted = true;
  for (let i = 0; i < n; i++) {
    termIds[i] = newId[t.termIds[i]];
    if (i > 0 && termIds[i] < termIds[i - 1]) sorted = false;
  }
  if (sorted) return { termIds, counts: Float32Array.from(t.counts), length: t.length };
  if (n >= REMAP_SHIFT) {
    const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => termIds[a] - termIds[b]);
    return { termIds: Int32Array.from(order, (i) => termIds[i]), counts: Float32Array.from(order, (i) => t.counts[i]), length: t.length };
  }
  const keys = new Float64Array(n);
  for (let i = 0; i < n; i++) keys[i] = termIds[i] * REMAP_SHIFT + i;
  keys.sort();
  const counts = new Float32Array(n);
  for (let j = 0; j < n; j++) {
    const id = Math.floor(keys[j] / REMAP_SHIFT);
    termIds[j] = id;
    counts[j] = t.counts[keys[j] - id * REMAP_SHIFT];
  }
  return {
    termIds,
    counts,
    length: t.length,
  };
}

/** Path order used everywhere: plain code-unit comparison (locale-independent). */
export function comparePaths(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}
