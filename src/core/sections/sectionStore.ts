/**
 * The sections of every indexed file with their concept vectors, kept beside the file vectors:
 * set when a file is built or folded in, dropped when it is removed. Ranks sections by cosine
 * with a unit concept vector (an exact pass over all section vectors; sections of one file lie in
 * one f32 block) and finds a file's best section for a query.
 */
import { InvalidInputError } from '../errors.js';
import type { FileSections } from './sectionVectors.js';

/** A section found by a search or a nearby question. */
export interface SectionHit {
  /** The file's key. */
  readonly path: string;
  /** Position of the section in its file's list. */
  readonly index: number;
  /** Zero-based first line and the line after the last. */
  readonly start: number;
  readonly end: number;
  readonly title: string;
  /** Cosine of the section's vector with the query's. */
  readonly score: number;
}

export class SectionStore {
  private readonly _files = new Map<string, FileSections>();
  private _count = 0;

  constructor(readonly k: number) {}

  /** Files that have sections. */
  get files(): number {
    return this._files.size;
  }

  /** Sections over all files. */
  get count(): number {
    return this._count;
  }

  get(path: string): FileSections | undefined {
    return this._files.get(path);
  }

  /** Entries in insertion order (the index file keeps its own order; see serialize.ts). */
  entries(): IterableIterator<[string, FileSections]> {
    return this._files.entries();
  }

  set(path: string, sections: FileSections): void {
    const n = sections.starts.length;
    if (sections.ends.length !== n || sections.titles.length !== n || sections.vectors.length !== n * this.k)
      throw new InvalidInputError(`the sections of "${path}" disagree in size (k = ${this.k})`);
    this.delete(path);
    this._files.set(path, sections);
    this._count += n;
  }

  delete(path: string): void {
    const old = this._files.get(path);
    if (!old) return;
    this._count -= old.starts.length;
    this._files.delete(path);
  }

  /** The section of a file holding a zero-based line (the last one that starts at or before it), or null. */
  at(path: string, line: number): { index: number; vector: Float32Array } | null {
    const f = this._files.get(path);
    if (!f || f.starts.length === 0) return null;
    let best = 0;
    for (let i = 0; i < f.starts.length; i++) if (f.starts[i] <= line && line < f.ends[i]) best = i;
    if (line >= f.ends[f.starts.length - 1]) best = f.starts.length - 1;
    return { index: best, vector: f.vectors.subarray(best * this.k, (best + 1) * this.k) };
  }

  /** A file's section with the highest cosine with q, or null when the file has none. */
  best(path: string, q: Float32Array): SectionHit | null {
    const f = this._files.get(path);
    if (!f || f.starts.length === 0) return null;
    let at = 0;
    let top = Number.NEGATIVE_INFINITY;
    for (let i = 0; i < f.starts.length; i++) {
      const s = dot(f.vectors, i * this.k, q, this.k);
      if (s > top) [top, at] = [s, i];
    }
    return this.hit(path, f, at, top);
  }

  /**
   * The `top` sections with the highest cosine with q over files that `accept` lets in, best first
   * (ties: file order, then position). At most `perFile` sections of one file. Exact: every
   * section vector is multiplied.
   */
  rank(q: Float32Array, top: number, accept: (path: string) => boolean = () => true, perFile = Number.POSITIVE_INFINITY): SectionHit[] {
    if (q.length !== this.k) throw new InvalidInputError(`query vector has ${q.length} numbers, the sections have ${this.k}`);
    const heap: { path: string; f: FileSections; i: number; score: number }[] = [];
    let floor = Number.NEGATIVE_INFINITY;
    for (const [path, f] of this._files) {
      if (!accept(path)) continue;
      let taken = 0;
      const scores: { i: number; score: number }[] = [];
      for (let i = 0; i < f.starts.length; i++) {
        const s = dot(f.vectors, i * this.k, q, this.k);
        if (s > floor || heap.length < top) scores.push({ i, score: s });
      }
      scores.sort((a, b) => b.score - a.score || a.i - b.i);
      for (const { i, score } of scores) {
        if (taken++ >= perFile) break;
        heap.push({ path, f, i, score });
      }
      if (heap.length > 4 * top + 64) {
        heap.sort((a, b) => b.score - a.score);
        heap.length = top;
        floor = heap[top - 1].score;
      }
    }
    heap.sort((a, b) => b.score - a.score);
    return heap.slice(0, top).map((h) => this.hit(h.path, h.f, h.i, h.score));
  }

  private hit(path: string, f: FileSections, i: number, score: number): SectionHit {
    return { path, index: i, start: f.starts[i], end: f.ends[i], title: f.titles[i], score };
  }
}

function dot(block: Float32Array, at: number, q: Float32Array, k: number): number {
  let s = 0;
  for (let c = 0; c < k; c++) s += block[at + c] * q[c];
  return s;
}
