/**
 * Look-alike files: exact copies, near-copies and paraphrases (shingles and MinHash after Broder 1997;
 * LSH banding after Leskovec, Rajaraman & Ullman, Mining of Massive Datasets, ch. 3).
 *
 * 1. Exact copies: files grouped by content hash of the normalised text (contentHash.ts). Blank
 *    files are only counted. One representative per distinct text goes on, so a thousand
 *    identical files cost one file's work below and never crowd an LSH bucket.
 * 2. Near-copies: token w-shingles (shingles.ts) → K MinHash values (minhash.ts, Broder 1997) →
 *    LSH banding, b bands × r rows (banding.ts) → every candidate verified by exact Jaccard on the
 *    shingle sets → union-find groups of pairs with J ≥ threshold. Texts with fewer than w tokens
 *    are counted in stats.skippedShort and skipped. No all-pairs step: work is O(n·K) plus the
 *    candidates, which banding keeps near-linear (giant buckets are capped, see banding.ts).
 * 3. Paraphrases (only with concept vectors): pairs with cosine ≥ paraphraseThreshold whose exact
 *    Jaccard is below threshold and that are not already in one near-copy group (paraphrase.ts).
 * Shared line counts come from the texts (sharedLines.ts). Same input and seed → same report.
 */
import { InvalidInputError } from '../errors.js';
import { bandCandidates } from './banding.js';
import { contentHash, isBlankText } from './contentHash.js';
import { createMinHasher } from './minhash.js';
import { resolveLookalikeOptions, type LookalikeOptions } from './options.js';
import { findHighCosinePairs } from './paraphrase.js';
import { lineCounts, nonBlankLineCount, sharedLineCount } from './sharedLines.js';
import { jaccardSorted, shingleSet } from './shingles.js';
import type { ExactGroup, LookalikeFile, LookalikeGroup, LookalikeInput, LookalikePair, LookalikeReport } from './types.js';
import { UnionFind } from './unionFind.js';

export function findLookalikes(input: LookalikeInput, options: Partial<LookalikeOptions> = {}): LookalikeReport {
  const o = resolveLookalikeOptions(options);
  const files = checkInput(input);
  const n = files.length;

  // 1. Exact copies.
  const byHash = new Map<string, number[]>();
  let emptyFiles = 0;
  for (let i = 0; i < n; i++) {
    if (isBlankText(files[i].text)) {
      emptyFiles++;
      continue;
    }
    const h = contentHash(files[i].text);
    const list = byHash.get(h);
    if (list) list.push(i);
    else byHash.set(h, [i]);
  }
  const lines = new Map<number, Map<string, number>>();
  const linesOf = (i: number): Map<string, number> => {
    let c = lines.get(i);
    if (!c) {
      c = lineCounts(files[i].text);
      lines.set(i, c);
    }
    return c;
  };
  const reps: number[] = [];
  const copiesOf = new Map<number, number[]>();
  const exactGroups: ExactGroup[] = [];
  for (const [hash, members] of byHash) {
    reps.push(members[0]);
    if (members.length < 2) continue;
    copiesOf.set(members[0], members);
    const sharedLines = nonBlankLineCount(lineCounts(files[members[0]].text));
    exactGroups.push({ files: members.map((i) => files[i].id), similarity: 1, sharedLines, contentHash: hash });
  }
  exactGroups.sort((x, y) => y.files.length - x.files.length);

  // 2. Shingles and MinHash signatures of the representatives.
  const shingled: number[] = [];
  const sets: Uint32Array[] = [];
  let skippedShort = 0;
  for (const r of reps) {
    const s = shingleSet(files[r].text, o.shingleSize);
    if (s.hashes.length === 0) {
      skippedShort++;
      continue;
    }
    shingled.push(r);
    sets.push(s.hashes);
  }
  const m = shingled.length;
  const k = o.numHashes;
  const hasher = createMinHasher(k, o.seed);
  const signatures = new Uint32Array(m * k);
  for (let t = 0; t < m; t++) hasher.signature(sets[t], signatures, t * k);

  // 3. LSH candidates, exact Jaccard check, union-find.
  const cand = bandCandidates(signatures, m, k, { bands: o.bands, rows: k / o.bands, maxBucketSize: o.maxBucketSize });
  const near = new UnionFind(m);
  const edges: Edge[] = [];
  for (let c = 0; c < cand.count; c++) {
    const a = cand.left[c];
    const b = cand.right[c];
    const j = jaccardSorted(sets[a], sets[b]);
    if (j >= o.threshold) {
      edges.push({ a, b, similarity: j, jaccard: j });
      near.union(a, b);
    }
  }
  const pairOf = (e: Edge): LookalikePair => {
    const fa = shingled[e.a];
    const fb = shingled[e.b];
    const sharedLines = sharedLineCount(linesOf(fa), linesOf(fb));
    return { a: files[fa].id, b: files[fb].id, similarity: e.similarity, jaccard: e.jaccard, sharedLines };
  };
  const groupsOf = (uf: UnionFind, list: Edge[]): LookalikeGroup[] => {
    const edgesByRoot = new Map<number, Edge[]>();
    for (const e of list) {
      const root = uf.find(e.a);
      const bucket = edgesByRoot.get(root);
      if (bucket) bucket.push(e);
      else edgesByRoot.set(root, [e]);
    }
    return uf.components().map((component) => {
      const members = component.flatMap((t) => copiesOf.get(shingled[t]) ?? [shingled[t]]).sort((x, y) => x - y);
      const pairs = (edgesByRoot.get(uf.find(component[0])) ?? []).sort((x, y) => x.a - y.a || x.b - y.b);
      return { files: members.map((i) => files[i].id), pairs: pairs.map(pairOf) };
    });
  };
  const nearGroups = bySize(groupsOf(near, edges));

  // 4. Paraphrases among the shingled representatives.
  let paraphraseGroups: LookalikeGroup[] = [];
  let paraphraseMode: 'none' | 'all-pairs' | 'simhash' = 'none';
  let paraphraseCandidates = 0;
  if (input.concepts) {
    const { vectors, dims } = input.concepts;
    const found = findHighCosinePairs(vectors, dims, shingled, {
      threshold: o.paraphraseThreshold,
      allPairsLimit: o.paraphraseAllPairsLimit,
      simhashBands: o.simhashBands,
      simhashBitsPerBand: o.simhashBitsPerBand,
      maxBucketSize: o.maxBucketSize,
      seed: o.seed ^ 0x5bd1e995,
    });
    paraphraseMode = found.mode;
    paraphraseCandidates = found.candidates;
    const localOf = new Map<number, number>(shingled.map((f, t) => [f, t]));
    const para = new UnionFind(m);
    const paraEdges: Edge[] = [];
    for (let p = 0; p < found.left.length; p++) {
      const a = localOf.get(found.left[p]) as number;
      const b = localOf.get(found.right[p]) as number;
      if (near.find(a) === near.find(b)) continue;
      const j = jaccardSorted(sets[a], sets[b]);
      if (j >= o.threshold) continue;
      paraEdges.push({ a, b, similarity: found.cosine[p], jaccard: j });
      para.union(a, b);
    }
    paraphraseGroups = bySize(groupsOf(para, paraEdges));
  }

  return {
    exactGroups,
    nearGroups,
    paraphraseGroups,
    stats: {
      files: n,
      emptyFiles,
      distinctTexts: reps.length,
      shingled: m,
      skippedShort,
      candidates: cand.count,
      verified: edges.length,
      cappedBuckets: cand.cappedBuckets,
      paraphraseMode,
      paraphraseCandidates,
    },
  };
}

interface Edge {
  readonly a: number;
  readonly b: number;
  readonly similarity: number;
  readonly jaccard: number;
}

/** Largest group first; stable, so ties keep first-file order. */
function bySize(groups: LookalikeGroup[]): LookalikeGroup[] {
  return groups.sort((x, y) => y.files.length - x.files.length);
}

function checkInput(input: LookalikeInput): readonly LookalikeFile[] {
  if (!input || !Array.isArray(input.files)) throw new InvalidInputError('look-alike search needs { files: [{ id, text }, …] }');
  const ids = new Set<string>();
  input.files.forEach((f, i) => {
    if (!f || typeof f.id !== 'string' || typeof f.text !== 'string') {
      throw new InvalidInputError(`file ${i} must be { id: string, text: string }`);
    }
    if (ids.has(f.id)) throw new InvalidInputError(`file id "${f.id}" appears more than once`);
    ids.add(f.id);
  });
  if (input.concepts) {
    const { vectors, dims } = input.concepts;
    if (!Number.isInteger(dims) || dims < 1) throw new InvalidInputError(`concept vectors need dims ≥ 1, got ${dims}`);
    if (!(vectors instanceof Float32Array) || vectors.length !== input.files.length * dims) {
      throw new InvalidInputError(
        `concept vectors must be a Float32Array of ${input.files.length}×${dims} numbers (one row per file), got ${vectors?.length}`,
      );
    }
  }
  return input.files;
}
