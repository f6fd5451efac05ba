/**
 * Look-alikes of the indexed files for the editor (core/lookalike/findLookalikes.ts): every
 * indexed file is read again (shingles need the text), its concept vector comes from the index,
 * and the report is turned into wire groups with file references. Exact groups are shown as the
 * first file paired with each other one (every pair of identical files is alike, and n − 1 pairs
 * say it); any group keeps at most MAX_PAIRS_PER_GROUP pairs, the rest counted.
 */
import type { LsiIndex } from '../../core/index/lsiIndex.js';
import { findLookalikes, type LookalikeGroup, type LookalikePair } from '../../core/lookalike/index.js';
import { readIndexableText } from '../scan.js';
import type { LookalikeGroupWire, LookalikeKind, LookalikePairWire, LookalikesResult } from './insightProtocol.js';
import type { RootMap } from './rootMap.js';

/** Pairs per group sent to the editor (common practice: more than a person reads in a tree). */
export const MAX_PAIRS_PER_GROUP = 200;

export interface LookalikeTaskOptions {
  readonly threshold: number;
  readonly paraphraseThreshold: number;
  readonly maxFileBytes: number;
}

export async function computeLookalikes(index: LsiIndex, roots: RootMap, o: LookalikeTaskOptions): Promise<LookalikesResult> {
  const t0 = performance.now();
  const paths = index.paths();
  const texts: (string | null)[] = [];
  for (const p of paths) {
    const got = await readIndexableText(roots.refOf(p).fsPath, o.maxFileBytes).catch(() => null);
    texts.push(got?.kind === 'text' ? got.text : null);
  }
  // The index may have changed while files were read: keep the files it still holds.
  const k = index.k;
  const files: { id: string; text: string }[] = [];
  const kept: string[] = [];
  let unreadable = 0;
  paths.forEach((p, i) => {
    const text = texts[i];
    if (text === null) unreadable++;
    else if (index.has(p)) {
      files.push({ id: p, text });
      kept.push(p);
    }
  });
  const vectors = new Float32Array(files.length * k);
  kept.forEach((p, i) => vectors.set(index.vectorOf(p), i * k));
  const report = findLookalikes(
    { files, concepts: { vectors, dims: k } },
    { threshold: o.threshold, paraphraseThreshold: o.paraphraseThreshold, seed: index.settings.seed },
  );
  const ref = (key: string) => roots.refOf(key);
  const wirePair = (p: LookalikePair): LookalikePairWire => ({ a: ref(p.a), b: ref(p.b), similarity: p.similarity, jaccard: p.jaccard, sharedLines: p.sharedLines });
  const capped = (kind: LookalikeKind, files: readonly string[], pairs: LookalikePairWire[]): LookalikeGroupWire => ({
    kind,
    files: files.map(ref),
    pairs: pairs.slice(0, MAX_PAIRS_PER_GROUP),
    morePairs: Math.max(0, pairs.length - MAX_PAIRS_PER_GROUP),
  });
  const fromGroup = (kind: LookalikeKind) => (g: LookalikeGroup) => capped(kind, g.files, g.pairs.map(wirePair));
  const groups: LookalikeGroupWire[] = [
    ...report.exactGroups.map((g) =>
      capped('exact', g.files, g.files.slice(1).map((b) => ({ a: ref(g.files[0]), b: ref(b), similarity: 1, jaccard: 1, sharedLines: g.sharedLines }))),
    ),
    ...report.nearGroups.map(fromGroup('near')),
    ...report.paraphraseGroups.map(fromGroup('paraphrase')),
  ];
  return {
    groups,
    files: report.stats.files,
    emptyFiles: report.stats.emptyFiles,
    skippedShort: report.stats.skippedShort,
    unreadable,
    threshold: o.threshold,
    paraphraseThreshold: o.paraphraseThreshold,
    ms: performance.now() - t0,
  };
}
