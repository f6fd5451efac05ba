/**
 * The pipeline's sections stage: every indexed file cut into sections, each folded into the
 * freshly built model (src/core/sections). Run after the build, because section vectors need the
 * model. A file whose sections the tokenizing threads counted while reading it (sortedCount.ts
 * with sections; `counted`) is not read again; any other file (a reused one, one in another
 * language than English, a build without threads) is read again here and its sections counted
 * with the build's fast counter. Then all sections are folded at once (foldCountedSections: one
 * sparse product per chunk, on the build's threads when it has them). A file that can no longer
 * be read keeps no sections (its results fall back to the whole file). Given a spill, a large
 * fold writes its rows there (a scratch file beside the index) and the files read them back.
 */
import { foldContextOf, foldCountedSections, type CountedSections, type SectionTerms } from '../core/sections/sectionVectors.js';
import { splitLines, splitSections } from '../core/sections/splitSections.js';
import type { LsiIndex } from '../core/index/lsiIndex.js';
import type { MatrixExecutor } from '../core/matrix/executor.js';
import type { OpenSpill } from '../core/sections/types.js';
import { decodeUtf8 } from './scanRead.js';
import { FileReader } from './parallel/readTextSync.js';
import { SectionCounter } from './parallel/sectionCounter.js';

export interface SectionPassOptions {
  /** Throws when the run was cancelled (called between files). */
  readonly check: () => void;
  /** Polled during the fold (synchronous, like the SVD). */
  readonly signal?: { readonly aborted: boolean };
  readonly onProgress?: (done: number) => void;
  /** Sections already counted by key, over the index's vocabulary ids (the tokenizing threads'). */
  readonly counted?: ReadonlyMap<string, CountedSections>;
  /**
   * The ids and counts of a counted file whose own arrays are left empty (parked in a scratch
   * file: ParkedSections.lines), read as the fold comes to it; undefined: the file's own arrays.
   */
  readonly countedTerms?: (key: string) => SectionTerms | undefined;
  /** Runs the fold's sparse products (the build's threads). */
  readonly executor?: MatrixExecutor;
  /** Where a large fold's rows go (a scratch file beside the index; foldCountedSections, spill). */
  readonly spill?: OpenSpill;
  /** Bytes of rows from which they go to the spill. @default SPILL_ROWS_FROM_BYTES */
  readonly spillFromBytes?: number;
}

/** Gives every file of the index its sections; returns the number of files read again. */
export async function foldFileSections(
  index: LsiIndex,
  files: readonly { readonly key: string; readonly absPath: string }[],
  maxFileBytes: number,
  options: SectionPassOptions,
): Promise<number> {
  const ready: { key: string; sections: CountedSections }[] = [];
  const toRead: { key: string; absPath: string }[] = [];
  for (const f of files) {
    const c = options.counted?.get(f.key);
    if (c) ready.push({ key: f.key, sections: c });
    else toRead.push(f);
  }
  // The counted files come first in ready, the files read here after them.
  const countedFiles = ready.length;
  // Progress: files read here first, then the fold of all (counted ones count as done at once).
  const total = files.length;
  const base = foldContextOf(index);
  // The build's fast counter (same counts as tokenize + countTerms, checked in its test).
  const counter = toRead.length > 0 ? new SectionCounter(base.vocab, base.tokenize) : undefined;
  const reader = new FileReader();
  for (let i = 0; i < toRead.length; i++) {
    const f = toRead[i];
    // The synchronous twin of readIndexableText (same outcomes, no trip through the event loop).
    const got = reader.read(f.absPath, maxFileBytes);
    if (got.kind === 'bytes') {
      const text = got.ascii ? got.bytes.toString('latin1') : decodeUtf8(got.bytes);
      ready.push({ key: f.key, sections: countSections(counter!, f.key, text) });
    } else index.sections.delete(f.key);
    if (i % 64 === 0) {
      await new Promise<void>((resolve) => setImmediate(resolve)); // let a cancel message in
      options.check();
      options.onProgress?.(i);
    }
  }
  options.check();
  const countedTerms = options.countedTerms;
  const folded = foldCountedSections(
    index.model,
    ready.map((r) => r.sections),
    {
      executor: options.executor,
      signal: options.signal,
      spill: options.spill,
      spillFromBytes: options.spillFromBytes,
      termsOf: countedTerms ? (i) => (i < countedFiles ? countedTerms(ready[i].key) : undefined) : undefined,
      onProgress: (done) => options.onProgress?.(toRead.length + Math.round((done * (total - toRead.length)) / Math.max(1, ready.length))),
    },
  );
  ready.forEach((r, i) => index.sections.set(r.key, folded[i]));
  options.onProgress?.(total);
  return toRead.length;
}

/** A file's sections with their counts in one pair of arrays (as the threads give them). */
function countSections(counter: SectionCounter, key: string, text: string): CountedSections {
  const { sections } = splitSections(key, text);
  const lines = splitLines(text);
  const terms = sections.map((s) => counter.count(lines.slice(s.start, s.end).join('\n')));
  const offsets = new Int32Array(sections.length + 1);
  terms.forEach((t, i) => (offsets[i + 1] = offsets[i] + t.termIds.length));
  const termIds = new Int32Array(offsets[sections.length]);
  const counts = new Float32Array(offsets[sections.length]);
  terms.forEach((t, i) => {
    termIds.set(t.termIds, offsets[i]);
    counts.set(t.counts, offsets[i]);
  });
  return {
    starts: Int32Array.from(sections, (s) => s.start),
    ends: Int32Array.from(sections, (s) => s.end),
    titles: sections.map((s) => s.title),
    offsets,
    termIds,
    counts,
  };
}
