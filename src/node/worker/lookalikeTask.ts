/**
 * Overlaps of the indexed files for the editor (core/lookalike/findLookalikes.ts): every indexed
 * file is read again (shingles and terms need the text) and the report is turned into wire groups
 * with file references. Paths that resolve to one real file (symbolic links) are the same file,
 * not copies: only the first is kept and the others counted. Exact groups are shown as the first
 * file paired with each other one; near, partial and retold pairs are one group each, strongest
 * first, at most MAX_PAIRS_PER_BAND per band (the rest counted, so the view can say so).
 */
import { realpath } from 'node:fs/promises';
import type { LsiIndex } from '../../core/index/lsiIndex.js';
import { DEFAULT_LOOKALIKE_OPTIONS, findLookalikes, type LookalikePair } from '../../core/lookalike/index.js';
import { withIndexCounts } from '../overlapCounts.js';
import { readIndexableText } from '../scan.js';
import type { LookalikeGroupWire, LookalikeKind, LookalikePairWire, LookalikesResult } from './insightProtocol.js';
import type { RootMap } from './rootMap.js';

/** Pairs per exact group sent to the editor (common practice: more than a person reads in a tree). */
export const MAX_PAIRS_PER_GROUP = 200;
/** Near, partial and retold pairs sent per band; the view shows them a page at a time. */
export const MAX_PAIRS_PER_BAND = 500;

export interface LookalikeTaskOptions {
  readonly threshold: number;
  readonly maxFileBytes: number;
}

export async function computeLookalikes(index: LsiIndex, roots: RootMap, o: LookalikeTaskOptions): Promise<LookalikesResult> {
  const t0 = performance.now();
  const paths = index.paths();
  const files: { id: string; text: string }[] = [];
  const real = new Set<string>();
  let sameFile = 0;
  let unreadable = 0;
  for (const p of paths) {
    const fsPath = roots.refOf(p).fsPath;
    const target = await realpath(fsPath).catch(() => fsPath);
    if (real.has(target)) {
      sameFile++;
      continue;
    }
    real.add(target);
    const got = await readIndexableText(fsPath, o.maxFileBytes).catch(() => null);
    if (got?.kind !== 'text') unreadable++;
    // The index may have changed while files were read: keep the files it still holds.
    else if (index.has(p)) files.push({ id: p, text: got.text });
  }
  const report = findLookalikes(withIndexCounts(index, files), { threshold: o.threshold, seed: index.settings.seed });
  const ref = (key: string) => roots.refOf(key);
  const wirePair = (p: LookalikePair): LookalikePairWire => ({
    a: ref(p.a),
    b: ref(p.b),
    similarity: p.similarity,
    jaccard: p.jaccard,
    sharedLines: p.sharedLines,
    lines: p.lines,
    sharedWords: p.sharedWords,
    words: p.words,
    ...(p.gap === undefined ? {} : { gap: p.gap }),
    ...(p.sharedNames === undefined ? {} : { sharedNames: p.sharedNames }),
  });
  const groups: LookalikeGroupWire[] = report.exactGroups.map((g) => {
    const pairs = g.files.slice(1).map((b) => ({
      a: ref(g.files[0]),
      b: ref(b),
      similarity: 1,
      jaccard: 1,
      sharedLines: g.sharedLines,
      lines: [g.sharedLines, g.sharedLines] as const,
      sharedWords: g.words,
      words: [g.words, g.words] as const,
    }));
    return {
      kind: 'exact',
      files: g.files.map(ref),
      pairs: pairs.slice(0, MAX_PAIRS_PER_GROUP),
      morePairs: Math.max(0, pairs.length - MAX_PAIRS_PER_GROUP),
    };
  });
  const morePairs: Record<LookalikeKind, number> = { exact: 0, near: 0, partial: 0, retold: 0 };
  const band = (kind: LookalikeKind, pairs: readonly LookalikePair[]): void => {
    morePairs[kind] = Math.max(0, pairs.length - MAX_PAIRS_PER_BAND);
    for (const p of pairs.slice(0, MAX_PAIRS_PER_BAND))
      groups.push({ kind, files: [ref(p.a), ref(p.b)], pairs: [wirePair(p)], morePairs: 0 });
  };
  band('near', report.nearPairs);
  band('partial', report.partialPairs);
  band('retold', report.retoldPairs);
  return {
    groups,
    morePairs,
    sameFile,
    files: report.stats.files,
    emptyFiles: report.stats.emptyFiles,
    skippedShort: report.stats.skippedShort,
    unreadable,
    threshold: o.threshold,
    partialThreshold: DEFAULT_LOOKALIKE_OPTIONS.partialThreshold,
    ms: performance.now() - t0,
  };
}
