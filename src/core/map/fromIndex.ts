/**
 * The concept map's input taken from an index, shared by the command line and the editor:
 * - mapSourceFromIndex: the MapSource contract (mapData.ts) for the index's live files in path
 *   order: their unit concept vectors, token counts, topic of each file (from findTopics' report;
 *   -1 for files it left unplaced), topic labels (the topic's leading signature words), each
 *   file's top terms (largest weight local(tf)·g in the file under the frozen model, ties to the
 *   lower model column), and the spectrum (the model's singular values, k and ‖A‖²_F).
 * - embeddedSourceFromIndex: what a standalone page needs to answer queries alone
 *   (embeddedQueryData.ts). The engine folds a query as normalise(Σ_k^{α−1} U_kᵀ q̂) with
 *   q̂ = local(tf)·g (conceptModel.ts projectTerms), so the term vectors handed over are the rows
 *   of U_k scaled by the model's axisScale; the query's own normalisation is a positive factor the
 *   contract allows. The vocabulary is capped to the maxTerms most frequent model terms (summed
 *   counts over the live files, ties to the lower column) since it costs about k bytes per term.
 *   Local weighting: log-entropy uses log(1 + tf), which the page has; tf-idf's 1 + ln tf has no
 *   page rule, so log(1 + tf) stands in (same value ratios within 8% up to tf = 4; queries rarely
 *   repeat a word).
 * Defaults (our choice, common practice for a readable tooltip): 8 terms per file, 3 words per
 * topic label, 20 000 terms for the page's search.
 */
import { InvalidInputError } from '../errors.js';
import type { DocSlot, LsiIndex } from '../index/lsiIndex.js';
import type { Topic, TopicsReport } from '../topics/topics.js';
import { weightDocument } from '../weighting/termWeighting.js';
import type { EmbeddedQuerySource } from './embeddedQueryData.js';
import type { MapSource } from './mapData.js';
import type { QuickProjection } from './quickProjection.js';

export interface MapFromIndexOptions {
  /** Top terms kept per file. @default 8 */
  readonly termsPerFile: number;
  /** Signature words in a topic's label. @default 3 */
  readonly labelWords: number;
  /** Readable word for an index term (a stem), e.g. SurfaceForms.wordFor; identity when absent. */
  readonly wordFor?: (term: string) => string;
}

export const DEFAULT_MAP_FROM_INDEX_OPTIONS: MapFromIndexOptions = { termsPerFile: 8, labelWords: 3 };

/** The index's live documents in slot (= path) order. */
export function liveSlots(index: LsiIndex): DocSlot[] {
  return index.slots().filter((s): s is DocSlot => s !== null);
}

export function mapSourceFromIndex(index: LsiIndex, topics: TopicsReport | null, options: Partial<MapFromIndexOptions> = {}): MapSource {
  const opts = { ...DEFAULT_MAP_FROM_INDEX_OPTIONS, ...options };
  if (!Number.isInteger(opts.termsPerFile) || opts.termsPerFile < 0)
    throw new InvalidInputError(`terms per file must be a whole number, got ${opts.termsPerFile}`);
  const word = opts.wordFor ?? ((t: string) => t);
  const k = index.k;
  const all = index.vectors();
  const slots = index.slots();
  const paths: string[] = [];
  const tokenCounts = new Int32Array(index.size);
  const vectors = new Float32Array(index.size * k);
  const topTerms: string[][] = [];
  let row = 0;
  for (let s = 0; s < slots.length; s++) {
    const slot = slots[s];
    if (!slot) continue;
    paths.push(slot.meta.path);
    tokenCounts[row] = slot.terms.length;
    vectors.set(all.subarray(s * k, (s + 1) * k), row * k);
    topTerms.push(fileTopTerms(index, slot, opts.termsPerFile).map(word));
    row++;
  }
  const { topicIds, topicLabels } = topicsOf(paths, topics, (t) => topicLabel(t, opts.labelWords, word));
  return {
    count: paths.length,
    dimensions: k,
    vectors,
    paths,
    tokenCounts,
    topicIds,
    topicLabels,
    topTerms,
    singularValues: Float64Array.from(index.model.singularValues),
    k,
    totalEnergy: index.model.frobeniusSquared,
  };
}

/** The terms of one file with the largest weight local(tf)·g under the frozen model. */
export function fileTopTerms(index: LsiIndex, slot: DocSlot, count: number): string[] {
  const { model, vocab } = index;
  const w = weightDocument(slot.terms, model.columnOf, model.weights, model.scheme);
  const order = Array.from(w.columns.keys()).sort((a, b) => w.values[b] - w.values[a] || w.columns[a] - w.columns[b]);
  return order.slice(0, count).map((i) => vocab.termOf(model.keptIds[w.columns[i]]));
}

/** A topic's name on the map: its leading distinctive words (never a number). */
export function topicLabel(topic: Topic, words: number, wordFor: (term: string) => string = (t) => t): string {
  const shown = topic.terms.slice(0, words).map((x) => wordFor(x.term));
  return shown.length > 0 ? shown.join(', ') : 'no distinctive words';
}

function topicsOf(
  paths: readonly string[],
  report: TopicsReport | null,
  label: (t: Topic) => string,
): { topicIds: Int32Array; topicLabels: string[] } {
  const topicIds = new Int32Array(paths.length).fill(-1);
  if (!report) return { topicIds, topicLabels: [] };
  const rowOf = new Map(paths.map((p, i) => [p, i]));
  const topicLabels: string[] = [];
  report.topics.forEach((t, i) => {
    topicLabels.push(label(t));
    for (const p of t.members) {
      const r = rowOf.get(p);
      if (r === undefined) throw new InvalidInputError(`topic ${t.id} lists "${p}", which is not in the index`);
      topicIds[r] = i;
    }
  });
  return { topicIds, topicLabels };
}

export interface EmbeddedVocabularyOptions {
  /** Most frequent model terms the page's search knows. @default 20000 */
  readonly maxTerms: number;
}

export const DEFAULT_EMBEDDED_VOCABULARY_OPTIONS: EmbeddedVocabularyOptions = { maxTerms: 20_000 };

/** The embedded query source for a MapSource built from the same index (its vectors). */
export function embeddedSourceFromIndex(
  index: LsiIndex,
  source: Pick<MapSource, 'count' | 'vectors'>,
  quick: QuickProjection,
  options: Partial<EmbeddedVocabularyOptions> = {},
): EmbeddedQuerySource & { readonly modelTerms: number } {
  const { maxTerms } = { ...DEFAULT_EMBEDDED_VOCABULARY_OPTIONS, ...options };
  if (!Number.isInteger(maxTerms) || maxTerms < 1)
    throw new InvalidInputError(`the page vocabulary needs at least one term, got ${maxTerms}`);
  const { model, vocab } = index;
  const k = model.k;
  const columns = frequentColumns(index, maxTerms);
  const termVectors = new Float32Array(columns.length * k);
  const globalWeights = new Float64Array(columns.length);
  columns.forEach((col, i) => {
    for (let c = 0; c < k; c++) termVectors[i * k + c] = model.termVectors[col * k + c] * model.axisScale[c];
    globalWeights[i] = model.weights[col];
  });
  return {
    count: source.count,
    dimensions: k,
    fileVectors: source.vectors,
    terms: Array.from(columns, (col) => vocab.termOf(model.keptIds[col])),
    termVectors,
    globalWeights,
    localWeighting: 'log1p',
    quick,
    modelTerms: model.keptIds.length,
  };
}

/** Model columns by summed counts over the live files, most frequent first, at most max. */
export function frequentColumns(index: LsiIndex, max: number): Int32Array {
  const { columnOf, keptIds } = index.model;
  const m = keptIds.length;
  const freq = new Float64Array(m);
  for (const slot of liveSlots(index)) {
    const { termIds, counts } = slot.terms;
    for (let i = 0; i < termIds.length; i++) {
      const id = termIds[i];
      const col = id < columnOf.length ? columnOf[id] : -1;
      if (col >= 0) freq[col] += counts[i];
    }
  }
  const order = Int32Array.from({ length: m }, (_, c) => c).sort((a, b) => freq[b] - freq[a] || a - b);
  return order.slice(0, Math.min(max, m));
}
