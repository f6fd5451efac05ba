/**
 * The pipeline's sections stage: each indexed file is read again, cut into sections and every
 * section folded into the freshly built model (src/core/sections). Run after the build, because
 * section vectors need the model; a file that can no longer be read keeps no sections (its
 * results fall back to the whole file).
 */
import { foldContextOf, foldSections } from '../core/sections/sectionVectors.js';
import type { LsiIndex } from '../core/index/lsiIndex.js';
import { decodeUtf8 } from './scanRead.js';
import { FileReader } from './parallel/readTextSync.js';
import { SectionCounter } from './parallel/sectionCounter.js';

export interface SectionPassOptions {
  /** Throws when the run was cancelled (called between files). */
  readonly check: () => void;
  readonly onProgress?: (done: number) => void;
}

export async function foldFileSections(
  index: LsiIndex,
  files: readonly { readonly key: string; readonly absPath: string }[],
  maxFileBytes: number,
  options: SectionPassOptions,
): Promise<void> {
  const base = foldContextOf(index);
  // The build's fast counter (same counts as tokenize + countTerms, checked in its test).
  const counter = new SectionCounter(base.vocab, base.tokenize);
  const ctx = { ...base, count: (text: string) => counter.count(text) };
  const reader = new FileReader();
  for (let i = 0; i < files.length; i++) {
    const f = files[i];
    // The synchronous twin of readIndexableText (same outcomes, no trip through the event loop).
    const got = reader.read(f.absPath, maxFileBytes);
    if (got.kind === 'bytes') {
      const text = got.ascii ? got.bytes.toString('latin1') : decodeUtf8(got.bytes);
      index.sections.set(f.key, foldSections(ctx, f.key, text));
    } else index.sections.delete(f.key);
    if (i % 64 === 0) {
      await new Promise<void>((resolve) => setImmediate(resolve)); // let a cancel message in
      options.check();
      options.onProgress?.(i);
    }
  }
  options.onProgress?.(files.length);
}
