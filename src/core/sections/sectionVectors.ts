/**
 * Section vectors: each section of a file folded into the index's concept space with the frozen
 * model, exactly as a query or an edited file is (Berry, Dumais & O'Brien 1995, "Using linear
 * algebra for intelligent information retrieval", SIAM Review 37(4): d̂ = Σ_k^{α-1} U_kᵀ w(d),
 * normalised). The sections share the files' model, so a section's cosine with a query or with
 * another section is on the same scale as a file's, and the file vectors stay as they are.
 * Counting uses the vocabulary without growing it: a word the model does not know cannot move a
 * concept vector, so a section folded on save equals the one a build would fold from the same text.
 * A build folds all sections at once (foldCountedSections): the weighted section rows, a chunk at
 * a time, times U_k as one sequential sparse product on the build's executor (its threads), the
 * same arithmetic as projectTerms row by row (projectMatrixRows does the same for file vectors).
 */
import { CancelledError } from '../errors.js';
import { countTerms, type DocTerms, type Vocabulary } from '../counting/termCounts.js';
import { blockedTermProduct, PROJECTION_BLOCK_BYTES, projectTerms, type ConceptModel } from '../index/model/conceptModel.js';
import { serialExecutor, type MatrixExecutor } from '../matrix/executor.js';
import { unitRowsInto } from '../matrix/kernels.js';
import { copyCsr, type CsrMatrix } from '../matrix/sparse.js';
import { createWasmExecutor } from '../matrix/wasm/wasmExecutor.js';
import { weightRowInto } from '../weighting/termWeighting.js';
import { tokenize, type TokenizeOptions } from '../text/tokenize.js';
import { splitLines, splitSections } from './splitSections.js';
import { sectionsWithRows, SpillRows } from './sectionRows.js';
import type { FileSections, OpenSpill, Section, SectionOptions } from './types.js';

export type { FileSections } from './types.js';

export interface FoldContext {
  readonly model: ConceptModel;
  readonly vocab: Vocabulary;
  readonly tokenize: Partial<TokenizeOptions>;
  /**
   * Counts a section's text over the vocabulary without growing it; must equal
   * countTerms(tokenize(text, tokenize), vocab, false) (a faster twin, e.g. the build's thread counter).
   */
  readonly count?: (text: string) => DocTerms;
}

/** Splits a file into sections and folds each into the concept space. */
export function foldSections(ctx: FoldContext, path: string, text: string, options: Partial<SectionOptions> = {}): FileSections {
  return foldSectionList(ctx, splitSections(path, text, options).sections, text);
}

/** Folds given sections of a text (line ranges of it) into the concept space. */
export function foldSectionList(ctx: FoldContext, sections: readonly Section[], text: string): FileSections {
  const lines = splitLines(text);
  const k = ctx.model.k;
  const vectors = new Float32Array(sections.length * k);
  const count = ctx.count ?? ((t: string) => countTerms(tokenize(t, ctx.tokenize), ctx.vocab, false));
  sections.forEach((s, i) => {
    const terms = count(lines.slice(s.start, s.end).join('\n'));
    vectors.set(projectTerms(ctx.model, terms).vector, i * k);
  });
  return {
    starts: Int32Array.from(sections, (s) => s.start),
    ends: Int32Array.from(sections, (s) => s.end),
    titles: sections.map((s) => s.title),
    vectors,
  };
}

/**
 * The sections of one file with their term counts, ready to fold: section i's terms are
 * termIds / counts [offsets[i], offsets[i + 1]) (ids ascending, over the model's vocabulary),
 * as countTerms(tokenize(section text), vocab, false) gives them. The arrays may be shared by
 * many files (offsets are absolute).
 */
export interface CountedSections {
  readonly starts: Int32Array;
  readonly ends: Int32Array;
  readonly titles: readonly string[];
  readonly offsets: Int32Array;
  readonly termIds: Int32Array;
  readonly counts: Float32Array;
}

export interface FoldManyOptions {
  /** Runs the sparse products (the build's threads); default: WebAssembly on this thread, else plain loops. */
  readonly executor?: MatrixExecutor;
  /** Polled between chunks; CancelledError when aborted. */
  readonly signal?: { readonly aborted: boolean };
  /** Files done so far (before each chunk), and the number of files. */
  readonly onProgress?: (done: number, total: number) => void;
  /** Sections per sparse product. @default FOLD_CHUNK_SECTIONS (twice that when U_k goes in column blocks) */
  readonly chunkSections?: number;
  /** Bytes of f64 term vectors handed to the executor at once. @default PROJECTION_BLOCK_BYTES */
  readonly blockBytes?: number;
  /**
   * U_k read whole where it lies, as f32, by every chunk's product instead of gathered in f64
   * column blocks chunk by chunk: an executor with memory of its own (WebAssembly, threads) then
   * holds one f32 copy of it (terms × k × 4 bytes). @default wholeTermVectorsFor(sections, terms)
   * (the plain executor always reads the model's own array: no copy)
   */
  readonly wholeTermVectors?: boolean;
  /**
   * Where the rows go when all of them would take at least spillFromBytes (a scratch file beside
   * the index: src/node/sectionCodeFile.ts); the files' sections then read their vectors from it
   * (FileSections.stored). Without one, or when it gives null, the rows stay in memory.
   */
  readonly spill?: OpenSpill;
  /** Bytes of f32 rows from which they go to the spill. @default SPILL_ROWS_FROM_BYTES */
  readonly spillFromBytes?: number;
  /**
   * Gives file i's term ids and counts when the fold comes to it, for files whose own arrays are
   * left empty (kept elsewhere, e.g. in a scratch file, so they are never resident all at once);
   * undefined: the file's own arrays. Called at most once per file, in order; what it returns is read
   * only until the next call (it may reuse one buffer).
   */
  readonly termsOf?: (file: number) => SectionTerms | undefined;
}

/** A file's section counts given by FoldManyOptions.termsOf: entry t of the file (absolute, as offsets) is at t − first. */
export interface SectionTerms {
  readonly termIds: Int32Array;
  readonly counts: Float32Array;
  readonly first: number;
}

/**
 * The fold writes its rows to the spill from this many bytes on (1.33 M sections at k = 200 are
 * 1.06 GB: the whole tree's build held them from the fold to the save). Below it they cost little
 * and a spill would only add reads. A round number, not tuned.
 */
export const SPILL_ROWS_FROM_BYTES = 256 * 1024 * 1024;

/** Sections per sparse product in foldCountedSections (bounds its executor memory; common practice, not tuned). */
export const FOLD_CHUNK_SECTIONS = 2048;

/**
 * Whether a fold of `sections` over `terms` terms gives the executor one f32 copy of U_k
 * (FoldManyOptions.wholeTermVectors): when the sections outnumber the terms, so the rows the fold
 * makes outweigh the copy. Otherwise the per-chunk gathers of U_k's rows add up to about one copy
 * of it, and the copy would only add to the build's memory where the fold is its peak (the Linux
 * Documentation folder: 36,567 sections over 51,651 terms). With many sections each chunk gathers
 * again the rows of the terms it uses (the whole Linux tree: 1.33 M sections, some 650 chunks of
 * about 15,000 terms each, a third of the fold's time on the calling thread while the other
 * threads waited). Our rule, from that cost, not tuned.
 */
export function wholeTermVectorsFor(sections: number, terms: number): boolean {
  return sections >= terms;
}

/**
 * Folds the counted sections of many files, each section's vector the same as
 * projectTerms(model, its terms).vector: per chunk, the rows weighted as weightDocument does,
 * U_kᵀd̂ by the executor's sequential sparse product (each row adds its terms in order, as
 * projectTerms does), then the same axis scaling and normalisation. U_k goes to the executor as
 * f64 in blocks of columns of at most blockBytes, as projectMatrixRows does (each output column
 * is the same sum whatever the block, so the bits do not change): one f64 copy of all of it
 * (terms × k × 8 bytes: 83 MB on 51,651 terms at k = 200) would set the executor memory's high
 * mark, which it keeps to the end of the build. When U_k fits in one block it is copied once for
 * all chunks. With many sections (wholeTermVectorsFor) the executor gets one f32 copy of U_k
 * instead, which every chunk's product reads where it lies (the same numbers, so the same bits),
 * and no chunk gathers anything; the plain executor always reads the model's own array.
 */
export function foldCountedSections(model: ConceptModel, files: readonly CountedSections[], options: FoldManyOptions = {}): FileSections[] {
  const ex = options.executor ?? createWasmExecutor() ?? serialExecutor;
  const k = model.k;
  const total = files.reduce((n, f) => n + f.starts.length, 0);
  // With a spill the rows of each chunk (consecutive rows, in file order) go there as they are made.
  const spill = options.spill && 4 * total * k >= (options.spillFromBytes ?? SPILL_ROWS_FROM_BYTES) ? options.spill() : null;
  const vectors = spill ? [] : files.map((f) => new Float32Array(f.starts.length * k));
  const scoped = <T>(fn: () => T): T => (ex.scoped ? ex.scoped(fn) : fn());
  try {
    scoped(() => foldChunks());
  } catch (err) {
    spill?.close();
    throw err;
  }
  if (!spill) return files.map((file, i) => ({ starts: file.starts, ends: file.ends, titles: file.titles, vectors: vectors[i] }));
  const reader = new SpillRows(spill, total, k);
  let first = 0;
  return files.map((file) => {
    const out = sectionsWithRows(file, reader, first);
    first += file.starts.length;
    return out;
  });

  function foldChunks(): void {
    const { columnOf, weights, scheme, axisScale } = model;
    const terms = weights.length;
    // U_k whole (f32, read where it lies: the same numbers, so the same sums), or in f64 blocks.
    let whole: Float32Array | undefined;
    if (ex === serialExecutor) whole = model.termVectors;
    else if (options.wholeTermVectors ?? wholeTermVectorsFor(total, terms)) {
      whole = ex.float32(terms * k);
      whole.set(model.termVectors);
    }
    const width = whole
      ? k
      : Math.max(1, Math.min(k, Math.floor((options.blockBytes ?? PROJECTION_BLOCK_BYTES) / (8 * Math.max(1, terms)))));
    // The f64 blocks of U_k (unused when it is read whole).
    const tv = whole ? new Float64Array(0) : ex.float64(terms * width);
    if (!whole && width === k) tv.set(model.termVectors);
    // Which file and section each row of the chunk is.
    const chunk = Math.max(1, Math.floor(options.chunkSections ?? (width === k ? FOLD_CHUNK_SECTIONS : 2 * FOLD_CHUNK_SECTIONS)));
    const fileOf = new Int32Array(chunk);
    const sectionOf = new Int32Array(chunk);
    // U_kᵀd̂ of the chunk's rows, gathered block by block (when U_k is split).
    const acc = width === k ? undefined : new Float64Array(chunk * k);
    // When U_k is split, each chunk gathers its column blocks again, and only the rows of the
    // terms its sections use (laying U_k out once for all chunks would add a second copy, 41 MB
    // on the Documentation folder at k = 200, at the build's memory peak). The chunk's columns
    // are renumbered in order of first use: every row keeps its entries in the same order, so
    // every sum is the same. A chunk of sections uses a small share of a large vocabulary (all
    // 100,000 rows gathered for each of 325 chunks took most of the fold's CPU on the kernel tree).
    const slotOf = acc ? new Int32Array(terms).fill(-1) : undefined;
    let used = new Int32Array(acc ? 1 << 12 : 0);
    // The chunk's rows on their way to the spill, and the row the chunk starts at.
    const out = spill ? new Float32Array(chunk * k) : undefined;
    let base = 0;
    // The chunk's weighted rows (CSR), reused from chunk to chunk.
    const indptr = new Int32Array(chunk + 1);
    let indices = new Int32Array(1 << 16);
    let vals = new Float64Array(1 << 16);
    let f = 0;
    let s = 0;
    // The current file's ids and counts, and the offset their entry 0 stands for.
    let loaded = -1;
    let ids: Int32Array = new Int32Array(0);
    let cnts: Float32Array = new Float32Array(0);
    let shift = 0;
    for (;;) {
      let rows = 0;
      let p = 0;
      while (f < files.length && rows < chunk) {
        const file = files[f];
        if (s >= file.starts.length) {
          f++;
          s = 0;
          continue;
        }
        if (loaded !== f) {
          loaded = f;
          const given = options.termsOf?.(f);
          ({ termIds: ids, counts: cnts } = given ?? file);
          shift = given ? given.first : 0;
          const end = file.offsets[file.starts.length] - shift;
          if (ids.length < end || cnts.length < end) throw new Error('section counts missing (a bug)');
        }
        const a = file.offsets[s] - shift;
        const b = file.offsets[s + 1] - shift;
        if (p + b - a > indices.length) {
          const size = Math.max(2 * indices.length, p + b - a);
          const grownIndices = new Int32Array(size);
          grownIndices.set(indices.subarray(0, p));
          indices = grownIndices;
          const grownValues = new Float64Array(size);
          grownValues.set(vals.subarray(0, p));
          vals = grownValues;
        }
        // weightDocument's arithmetic (termWeighting.ts), in place.
        p = weightRowInto(ids, cnts, a, b, columnOf, weights, scheme, indices, vals, p);
        fileOf[rows] = f;
        sectionOf[rows] = s++;
        indptr[++rows] = p;
      }
      if (rows === 0) break;
      if (options.signal?.aborted) throw new CancelledError();
      options.onProgress?.(f, files.length);
      let cols = terms;
      if (slotOf) {
        cols = 0;
        for (let t = 0; t < p; t++) {
          const c = indices[t];
          let q = slotOf[c];
          if (q < 0) {
            if (cols === used.length) {
              const grown = new Int32Array(2 * used.length);
              grown.set(used);
              used = grown;
            }
            q = slotOf[c] = cols;
            used[cols++] = c;
          }
          indices[t] = q;
        }
        for (let q = 0; q < cols; q++) slotOf[used[q]] = -1;
      }
      const matrix: CsrMatrix = {
        rows,
        cols,
        indptr: indptr.subarray(0, rows + 1),
        indices: indices.subarray(0, p),
        values: vals.subarray(0, p),
      };
      // The chunk's column blocks: as wide as tv holds for the terms it uses.
      const w = acc ? Math.max(1, Math.min(k, Math.floor(tv.length / Math.max(1, cols)))) : k;
      scoped(() => {
        const m = ex === serialExecutor ? matrix : copyCsr(matrix, ex, 'f64');
        const part = ex.float64(rows * w);
        if (acc) blockedTermProduct(ex, m, model.termVectors, k, w, tv, part, acc, used);
        else ex.spmm(m, whole ?? tv, k, part, true);
        // Axis scaling and normalisation (unitRowsInto's arithmetic, projectTerms' order): the
        // whole chunk at once into the spill's block, or each row straight into its file's rows.
        const sums = acc ?? part;
        if (out) ex.unitRows(sums, rows, k, axisScale, out.subarray(0, rows * k));
        else
          for (let r = 0; r < rows; r++) {
            const at = sectionOf[r] * k;
            unitRowsInto(sums.subarray(r * k, (r + 1) * k), axisScale, k, vectors[fileOf[r]].subarray(at, at + k), 0, 1);
          }
      });
      if (spill && out) spill.write(new Uint8Array(out.buffer, 0, 4 * rows * k), 4 * base * k);
      base += rows;
    }
  }
}

/** The fold context of an index (anything with its model, vocabulary and tokenizer settings). */
export function foldContextOf(index: {
  readonly model: ConceptModel;
  readonly vocab: Vocabulary;
  readonly settings: { readonly tokenize: Partial<TokenizeOptions> };
}): FoldContext {
  return { model: index.model, vocab: index.vocab, tokenize: index.settings.tokenize };
}
