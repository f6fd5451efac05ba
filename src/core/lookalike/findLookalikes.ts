/**
 * Overlaps between files in four bands: exact copies, near-copies, partial copies and "same
 * content, other words" (shingles and MinHash after Broder 1997; LSH banding after Leskovec,
 * Rajaraman & Ullman, Mining of Massive Datasets, ch. 3; TF-IDF after Salton & Buckley 1988).
 *
 * 1. Exact copies: files grouped by content hash of the normalised text (contentHash.ts). Blank
 *    files are only counted. One representative per distinct text goes on, so a thousand
 *    identical files cost one file's work below and never crowd an LSH bucket.
 * 2. Near-copies: token w-shingles (shingles.ts) → K MinHash values (minhash.ts, Broder 1997) →
 *    LSH banding, b bands × r rows (banding.ts); plus each file's nearest neighbours in the full
 *    term space (termSpace.ts), which catch partial copies LSH at r = 8 would miss (at J = 0.3 a
 *    pair becomes an LSH candidate with probability 1 − (1 − 0.3^8)^16 ≈ 0.001). Every
 *    candidate is verified by exact Jaccard on the shingle sets: J ≥ threshold → near-copy,
 *    partialThreshold ≤ J < threshold → partial copy; the partial band starts where "other
 *    words" ends (0.2), so no pair with that much shared text falls between the bands. Against
 *    an exact all-pairs Jaccard (bench/lookalikeBands.bench.ts) the candidates hold every pair of
 *    test/fixtures/lookalike-retellings with J ≥ 0.2 whose shared text is more than lines found
 *    in 3 or more files (90 of 90); pairs whose shared text is such template lines are found only
 *    when they are also term-space neighbours (445 of 2,023). Texts with fewer than w tokens are
 *    counted in stats.skippedShort and skipped.
 * 3. Same content, other words: retold.ts (mutual nearest neighbours standing clear of each
 *    file's other neighbours when a file names nothing rare, else holding the same rare names
 *    (rareNames.ts) when neither is a stub, or with margin and name share together high enough
 *    when a BM25 view of the same counts agrees (bm25View.ts), or (opt-in) closer in their words
 *    than their broad topic explains (conceptView.ts) with their names agreeing; little shared
 *    text; never two companion files such as a source and its header, companions.ts).
 * Pairs only (no groups by transitive closure). Shared lines and words come from the texts
 * (sharedLines.ts). Same input and seed → same report.
 */
import { InvalidInputError } from '../errors.js';
import { bandCandidates } from './banding.js';
import { companionFiles } from './companions.js';
import { contentHash, isBlankText } from './contentHash.js';
import { bm25View } from './bm25View.js';
import { conceptView } from './conceptView.js';
import { createMinHasher, estimateJaccard } from './minhash.js';
import { resolveLookalikeOptions, type LookalikeOptions } from './options.js';
import { rareNameIndex } from './rareNames.js';
import { boilerplateLines, findRetoldPairs, lineKey, withoutBoilerplate } from './retold.js';
import { termCountsOf, termNeighbours, termSpaceFromCounts, type TermCountRow } from './termSpace.js';
import { lineCounts, nonBlankLineCount, sharedLineCount } from './sharedLines.js';
import { jaccardSorted, shingleSet, shingleTokens } from './shingles.js';
import type { ExactGroup, LookalikeFile, LookalikeInput, LookalikePair, LookalikeReport } from './types.js';

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
  const words = new Map<number, Map<string, number>>();
  const wordsOf = (i: number): Map<string, number> => {
    let c = words.get(i);
    if (!c) {
      c = new Map();
      for (const w of shingleTokens(files[i].text)) c.set(w, (c.get(w) ?? 0) + 1);
      words.set(i, c);
    }
    return c;
  };
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
    const words = shingleTokens(files[members[0]].text).length;
    exactGroups.push({ files: members.map((i) => files[i].id), similarity: 1, sharedLines, words, contentHash: hash });
  }
  // Longest text first: one-line stubs ("This file has moved") come last.
  exactGroups.sort((x, y) => y.words - x.words || y.files.length - x.files.length);

  // 2. Shingles and MinHash signatures of the representatives.
  const shingled: number[] = [];
  const sets: Uint32Array[] = [];
  const tokenCounts: number[] = [];
  let skippedShort = 0;
  for (const r of reps) {
    const s = shingleSet(files[r].text, o.shingleSize);
    if (s.hashes.length === 0) {
      skippedShort++;
      continue;
    }
    shingled.push(r);
    sets.push(s.hashes);
    tokenCounts.push(s.tokens);
  }
  const m = shingled.length;
  const k = o.numHashes;
  const hasher = createMinHasher(k, o.seed);
  const signatures = new Uint32Array(m * k);
  for (let t = 0; t < m; t++) hasher.signature(sets[t], signatures, t * k);

  // 3. Full term space of the representatives (boilerplate lines left out) and neighbours there.
  const boilerplate = boilerplateLines(
    shingled.map((f) => files[f].text),
    o.boilerplateFiles,
  );
  const rows = termRowsOf(shingled, boilerplate);
  const space = termSpaceFromCounts(rows);
  const nb = termNeighbours(space, {
    k: o.neighbours,
    candidates: Math.max(50, 5 * o.neighbours),
    maxDf: Math.max(100, Math.floor(0.05 * m)),
  });

  // 4. Candidates (LSH ∪ term-space neighbours), each verified by exact Jaccard.
  const cand = bandCandidates(signatures, m, k, { bands: o.bands, rows: k / o.bands, maxBucketSize: o.maxBucketSize });
  const seen = new Set<number>();
  const pairIds: [number, number][] = [];
  const addCandidate = (x: number, y: number): void => {
    const [a, b] = x < y ? [x, y] : [y, x];
    const key = a * m + b;
    if (a === b || seen.has(key)) return;
    seen.add(key);
    pairIds.push([a, b]);
  };
  for (let c = 0; c < cand.count; c++) addCandidate(cand.left[c], cand.right[c]);
  let neighbourCandidates = 0;
  for (let t = 0; t < m; t++) {
    for (let r = 0; r < o.neighbours; r++) {
      const d = nb.index[t * o.neighbours + r];
      if (d < 0) break;
      const before = pairIds.length;
      addCandidate(t, d);
      neighbourCandidates += pairIds.length - before;
    }
  }
  const jaccardCache = new Map<number, number>();
  const jac = (x: number, y: number): number => {
    const [a, b] = x < y ? [x, y] : [y, x];
    const key = a * m + b;
    let j = jaccardCache.get(key);
    if (j === undefined) {
      j = jaccardSorted(sets[a], sets[b]);
      jaccardCache.set(key, j);
    }
    return j;
  };
  const nearPairs: LookalikePair[] = [];
  const partialPairs: LookalikePair[] = [];
  let verified = 0;
  for (const [a, b] of pairIds) {
    const j = jac(a, b);
    if (j >= o.threshold) {
      verified++;
      nearPairs.push(pairOf('near', a, b, j));
    } else if (j >= o.partialThreshold) partialPairs.push(pairOf('partial', a, b, j));
  }
  nearPairs.sort(bySimilarity);
  partialPairs.sort(bySimilarity);

  // 5. Same content, other words (retold.ts): term-space neighbour lists with copies collapsed.
  const estimate = (x: number, y: number): number => estimateJaccard(signatures, signatures, k, x * k, y * k);
  const collapse = (list: (t: number) => { index: ArrayLike<number>; cosine: ArrayLike<number> }) => {
    const neighbours: number[][] = [];
    const cosines: number[][] = [];
    for (let t = 0; t < m; t++) {
      const { index, cosine } = list(t);
      const kept: number[] = [];
      const cos: number[] = [];
      for (let r = 0; r < index.length && kept.length < 3; r++) {
        const d = index[r];
        if (d < 0) break;
        if (estimate(t, d) >= o.retoldCopyJaccard) continue;
        if (kept.some((e) => estimate(e, d) >= o.retoldCopyJaccard)) continue;
        kept.push(d);
        cos.push(cosine[r]);
      }
      neighbours.push(kept);
      cosines.push(cos);
    }
    return { neighbours, cosines };
  };
  const K = o.neighbours;
  const termLists = collapse((t) => ({ index: nb.index.subarray(t * K, t * K + K), cosine: nb.cosine.subarray(t * K, t * K + K) }));
  // Clause c is off unless one of its two levels is finite (options.ts says why it is off by default).
  const clauseC = Number.isFinite(o.retoldMinEvidence) || Number.isFinite(o.retoldFewNamesMinEvidence);
  const clauseD = Number.isFinite(o.retoldConceptMinDiff);
  const rule = {
    minCosine: o.retoldMinCosine,
    minGap: o.retoldMinGap,
    minNameGap: o.retoldNameMinGap,
    minSharedNames: o.retoldMinSharedNames,
    minNameShare: o.retoldMinNameShare,
    minNameWords: o.retoldNameMinWords,
    minWords: o.retoldMinWords,
    namesDecide: o.retoldNamesDecide,
    minEvidence: clauseC ? o.retoldMinEvidence : undefined,
    minEvidenceFewNames: o.retoldFewNamesMinEvidence,
    minEvidenceCosine: o.retoldEvidenceMinCosine,
    minEvidenceWords: o.retoldEvidenceMinWords,
    conceptMinDiff: clauseD ? o.retoldConceptMinDiff : undefined,
    conceptMinCosine: o.retoldConceptMinCosine,
    conceptMinWords: o.retoldConceptMinWords,
    conceptMinNameShare: o.retoldConceptMinNameShare,
    conceptMinGap: o.retoldConceptMinGap,
    marginMaxSharedNeighbours: o.retoldMarginMaxSharedNeighbours,
    devicesApartVeto: o.retoldDevicesApartVeto,
    companionVeto: o.retoldCompanionVeto,
  };
  // Files in both raw neighbour lists (the two files themselves left out): clause a's limit.
  const sharedNeighbours = (x: number, y: number): number => {
    let n = 0;
    for (let r = 0; r < K; r++) {
      const d = nb.index[x * K + r];
      if (d < 0) break;
      if (d === y) continue;
      for (let q = 0; q < K; q++) {
        const e = nb.index[y * K + q];
        if (e < 0) break;
        if (e === d) {
          n++;
          break;
        }
      }
    }
    return n;
  };
  const names = rareNameIndex(
    shingled.map((f) => files[f].text),
    o.retoldNameMaxDf,
  );
  // Second view (clause c): under BM25 weights, neither file has a term-space neighbour (copies of
  // the other left out) nearer than its partner.
  const bm25 = clauseC ? bm25View(rows, space.df) : undefined;
  const bothNearest = (x: number, y: number): boolean => {
    if (!bm25) return false;
    const pair = bm25.cosine(x, y);
    for (const [from, to] of [
      [x, y],
      [y, x],
    ]) {
      for (let r = 0; r < K; r++) {
        const d = nb.index[from * K + r];
        if (d < 0) break;
        if (d === to || estimate(d, to) >= o.retoldCopyJaccard) continue;
        if (bm25.cosine(from, d) > pair) return false;
      }
    }
    return true;
  };
  let concepts: ReturnType<typeof conceptView> | undefined;
  const retold = findRetoldPairs(
    {
      ...termLists,
      jaccard: jac,
      maxJaccard: o.retoldMaxJaccard,
      names: names.pair,
      words: tokenCounts,
      secondView: clauseC ? bothNearest : undefined,
      sharedNeighbours,
      companions: (x, y) => companionFiles(files[shingled[x]].id, files[shingled[y]].id),
      // Clause d's coarse concept space (conceptView.ts), built only when a mutual pair may need it.
      conceptCosine: clauseD ? (x, y) => (concepts ??= conceptView(space, o.retoldConceptK, o.seed)).cosine(x, y) : undefined,
    },
    rule,
  );
  const retoldPairs = retold.map((p) => ({
    ...pairOf('retold', p.a, p.b, jac(p.a, p.b)),
    similarity: p.cosine,
    cosine: p.cosine,
    gap: p.gap,
    sharedNames: p.sharedNames,
    nameShare: p.nameShare,
    namesHeld: p.namesHeld,
    clause: p.clause,
    ...(p.sharedNeighbours === undefined ? {} : { sharedNeighbours: p.sharedNeighbours }),
    ...(p.beyondTopic === undefined ? {} : { conceptCosine: p.cosine - p.beyondTopic }),
  }));

  return {
    exactGroups,
    nearPairs,
    partialPairs,
    retoldPairs,
    stats: {
      files: n,
      emptyFiles,
      distinctTexts: reps.length,
      shingled: m,
      skippedShort,
      candidates: cand.count,
      verified,
      cappedBuckets: cand.cappedBuckets,
      boilerplateLines: boilerplate.size,
      neighbourCandidates,
    },
  };

  /** Raw term counts of the listed files: the given counts minus boilerplate lines, or counted from the texts. */
  function termRowsOf(list: readonly number[], boilerplate: ReadonlySet<string>): TermCountRow[] {
    const { termCounts, countLine } = input;
    if (!termCounts || !countLine) return termCountsOf(list.map((f) => withoutBoilerplate(files[f].text, boilerplate)));
    const lineCache = new Map<string, TermCountRow>();
    // Kept until the rule's second view (bm25View.ts): a file without boilerplate keeps its given row.
    return list.map((f) => {
      const row = termCounts[f];
      if (boilerplate.size === 0) return row;
      const lines = files[f].text.split(/\r\n|\r|\n/).filter((l) => boilerplate.has(lineKey(l)));
      if (lines.length === 0) return row;
      const counts = Float32Array.from(row.counts as ArrayLike<number>);
      const slot = new Map<number, number>();
      for (let p = 0; p < row.termIds.length; p++) slot.set(row.termIds[p], p);
      for (const line of lines) {
        const key = lineKey(line);
        let terms = lineCache.get(key);
        if (!terms) lineCache.set(key, (terms = countLine(line)));
        for (let q = 0; q < terms.termIds.length; q++) {
          const p = slot.get(terms.termIds[q]);
          if (p !== undefined) counts[p] -= terms.counts[q];
        }
      }
      return { termIds: row.termIds, counts };
    });
  }

  function pairOf(band: LookalikePair['band'], x: number, y: number, j: number): LookalikePair {
    const fa = shingled[x];
    const fb = shingled[y];
    const la = linesOf(fa);
    const lb = linesOf(fb);
    const wa = wordsOf(fa);
    const wb = wordsOf(fb);
    return {
      band,
      a: files[fa].id,
      b: files[fb].id,
      similarity: j,
      jaccard: j,
      sharedLines: sharedLineCount(la, lb),
      lines: [nonBlankLineCount(la), nonBlankLineCount(lb)],
      sharedWords: sharedLineCount(wa, wb),
      words: [nonBlankLineCount(wa), nonBlankLineCount(wb)],
    };
  }
}

/** Highest similarity first; ties by file ids. */
function bySimilarity(x: LookalikePair, y: LookalikePair): number {
  return y.similarity - x.similarity || (x.a < y.a ? -1 : x.a > y.a ? 1 : x.b < y.b ? -1 : x.b > y.b ? 1 : 0);
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
  if (input.termCounts && input.termCounts.length !== input.files.length) {
    throw new InvalidInputError(`termCounts has ${input.termCounts.length} rows for ${input.files.length} files`);
  }
  return input.files;
}
