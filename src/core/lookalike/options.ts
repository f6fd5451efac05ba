/**
 * Options of the look-alike finder, with their defaults and where each default comes from.
 */
import { InvalidInputError } from '../errors.js';
import { DEFAULT_SEED } from '../random.js';

export interface LookalikeOptions {
  /** Tokens per shingle. @default 5 (token 5-grams, as in the Stack's and C4's deduplication, Kocetkov et al. 2022, Lee et al. 2022) */
  readonly shingleSize: number;
  /** MinHash functions K. @default 128 (common practice: the Stack and CodeParrot use 256, datasketch 128) */
  readonly numHashes: number;
  /** LSH bands b; rows r = numHashes / bands. @default 16 (r = 8: P(candidate) 0.95 at J = 0.8, 0.99 at 0.85, from 1 − (1 − s^r)^b, Leskovec, Rajaraman & Ullman, Mining of Massive Datasets, ch. 3) */
  readonly bands: number;
  /** Exact Jaccard at or above which two files are near-copies. @default 0.8 (the threshold of Lee et al. 2022, "Deduplicating training data makes language models better") */
  readonly threshold: number;
  /** Largest LSH bucket paired all-against-all; bigger ones use sorted neighbourhood (banding.ts). @default 100 (common practice, our choice) */
  readonly maxBucketSize: number;
  /** Exact Jaccard from which two files are partial copies (below `threshold`). @default 0.2 (where the "same content, other words" band ends, retoldMaxJaccard, so every pair sharing that much text is shown in some band. It was 0.3, which left pairs at 0.2–0.3 in no band. Measured with bench/lookalikeBands.bench.ts (2026-12-03): starting at 0.2 adds 249 pairs on test/fixtures/lookalike-retellings (among them 6 of its natural retellings: gettext's msg* pages and chapters, egrep; the rest gettext and diffutils pages sharing option blocks or sample inputs, character-set tables, planted copies, and template pages such as coreutils' short manual pages with the GNU footer, 228 of the 249 sharing under 0.2 once lines found in 3 or more files are set aside, against 217 of 286 from 0.3), 459 on test/fixtures/cmake-doc (1,149 from 0.3), 2 on test/fixtures/django-doc, 0 in the demo; the same-content pairs do not change) */
  readonly partialThreshold: number;
  /** "Same content, other words" only: a term-space neighbour sharing at least this (MinHash-estimated) Jaccard with a file, or with a nearer kept neighbour, is a copy and skipped (retold.ts step 2). @default 0.3 (the partial-copy start the retold rule's constants were chosen with; kept apart from partialThreshold so moving the band does not move the rule) */
  readonly retoldCopyJaccard: number;
  /** Neighbours kept per file in the full term space (termSpace.ts). @default 10 (common practice) */
  readonly neighbours: number;
  /** Lines found in this many files or more are boilerplate, left out of the term space (retold.ts). @default 3 (our choice: a line in two files may be a copy, in three a template) */
  readonly boilerplateFiles: number;
  /** Least full-space cosine of a "same content, other words" pair. @default 0.5 (our choice; any value from 0.3 to 0.55 gave the same pairs on test/fixtures/lookalike-retellings once the margin is 0.35) */
  readonly retoldMinCosine: number;
  /** Least margin of that cosine over each file's next neighbour (clause a; with retoldNamesDecide, only when a file holds no rare name). @default 0.35 (our choice; chosen leaving one source of test/fixtures/lookalike-retellings out, coreutils vs the other GNU manuals: first both folds chose 0.35; with names deciding, 0.35 and 0.4: see its README and bench/lookalikeNameClause.bench.ts) */
  readonly retoldMinGap: number;
  /** "Other words": the pair's Jaccard must be below this; the partial-copy band starts here (partialThreshold). @default 0.2 (our choice; chosen with retoldMinGap, as above. Raising it to 0.3 adds 10 pairs on test/fixtures/lookalike-retellings, 5 retellings and 5 false, one of them a planted edited copy: bench/lookalikeBands.bench.ts) */
  readonly retoldMaxJaccard: number;
  /** Clause b of the rule (retold.ts, rareNames.ts): least margin over each file's next neighbour when the pair shares its rare names; 0 asks only that the two be mutual nearest neighbours. 1 turns the clause off. @default 0 (our choice; chosen with retoldNamesDecide and the other clause-b constants over a grid on test/fixtures/lookalike-retellings and the CMake reference test/fixtures/cmake-doc: bench/lookalikeNameClause.bench.ts, the fixture's README) */
  readonly retoldNameMinGap: number;
  /** Clause b: least number of rare names both files hold. @default 3 (as retoldNameMinGap) */
  readonly retoldMinSharedNames: number;
  /** Clause b: least share of the two files' rare-name weight held in common. @default 0.85 (as retoldNameMinGap) */
  readonly retoldMinNameShare: number;
  /** Clause b: least word count (shingle tokens) of the shorter file, so a stub pointing to another page does not pass. @default 200 (as retoldNameMinGap) */
  readonly retoldNameMinWords: number;
  /** When both files hold rare names, only clause b (the names) can pass the pair; clause a (the margin) is for pairs where a file names nothing rare. Two pages of one template stand clear of a folder as a pair yet each names its own things. @default true (as retoldNameMinGap: on the CMake reference it leaves 1 pair of 10, loses no retelling) */
  readonly retoldNamesDecide: boolean;
  /** Both clauses: least word count (shingle tokens) of the shorter file; a stub page of a few dozen words does not tell the same content as another. @default 50 (our choice, on dev material only: it loses none of test/fixtures/lookalike-retellings' 34 found retellings and drops 19 of the 29 pairs the rule reports on the CMake reference test/fixtures/cmake-doc, all of them stub pages; measured with bench/lookalikeNameClause.bench.ts) */
  readonly retoldMinWords: number;
  /** Clause c of the rule (retold.ts): least margin + rare-name share of a pair whose files both hold rare names, when a second weighting (BM25, bm25View.ts) agrees that the two are each other's nearest. Infinity turns the clause off. @default Infinity (off; our choice. At 1 it finds 45 instead of 37 of test/fixtures/lookalike-retellings' 125 retellings with no new false pair on the dev sets, but 1 is where false pairs start (0.95 gives 2, 0.9 gives 4), chosen on the other GNU manuals alone the clause gains nothing held out, and on the held-out kernel Documentation folder it adds 5 false pairs to 27 right ones (about 2.8 false per 1,000 files instead of 2.2) with a wrong pair first: bench/lookalikeViews.bench.ts, the retellings fixture's README) */
  readonly retoldMinEvidence: number;
  /** Clause c for pairs sharing only 1 or 2 rare names (fewer than retoldMinSharedNames): least margin + name share. @default Infinity (off; our choice. At 1.2, the middle of 1.15–1.25 which give the same pairs, it finds 52 instead of 45 of test/fixtures/lookalike-retellings' 125 retellings with no new false pair there, on test/fixtures/cmake-doc or test/fixtures/django-doc; but left out by source it gains 1 held-out pair, and on the held-out kernel Documentation folder 2 of its 5 new pairs tell the same thing. See the fixture README) */
  readonly retoldFewNamesMinEvidence: number;
  /** Clause c: least full-space cosine. @default 0.4 (measured with retoldMinEvidence 1) */
  readonly retoldEvidenceMinCosine: number;
  /** Clause c: least word count (shingle tokens) of the shorter file. @default 150 (measured with retoldMinEvidence 1) */
  readonly retoldEvidenceMinWords: number;
  /** Clause d of the rule (retold.ts, conceptView.ts): least full-space cosine minus the pair's cosine in a coarse concept space (LSI with retoldConceptK dimensions). Infinity turns the clause off. @default Infinity (off; our choice. Its level −0.15 and the other retoldConcept* constants were chosen over a grid on test/fixtures/lookalike-retellings leaving one source out, coreutils vs the other GNU manuals (the names bench's selection: at most 3 false pairs there, at most 1 per 1,000 files without the Texinfo side, the demo's 3 planted pairs and no other, then the fewest pairs on test/fixtures/cmake-doc and test/fixtures/django-doc): both folds chose −0.15; held out 30/98 coreutils (29 without; 30–41 over the grid points tied with the choice) and 10/27 others (8 without); on the whole set 55/125 instead of 37 with no new false pair there, on CMake or Django. But on the held-out kernel Documentation folder, read once after the choice, it adds 15 pairs of which by our reading 6 tell the same thing (a device's binding or ABI entry and its driver page) and 9 do not (two parts of one SoC or chip), a wrong one ranked first: about 3.3 false pairs per 1,000 files instead of 2.2. Without the concept part (any difference) the same clause gives 5 more false pairs on the fixture and 7 on CMake: bench/lookalikeMisses.bench.ts, scripts/fixtures/lookalike-retellings/conceptClause.py, the fixture's README) */
  readonly retoldConceptMinDiff: number;
  /** Clause d: concept dimensions. @default 50 (chosen as retoldConceptMinDiff; one fold chose 100) */
  readonly retoldConceptK: number;
  /** Clause d: least full-space cosine. @default 0.45 (chosen as retoldConceptMinDiff; one fold chose 0.5) */
  readonly retoldConceptMinCosine: number;
  /** Clause d: least word count (shingle tokens) of the shorter file. @default 100 (chosen as retoldConceptMinDiff; one fold chose 200) */
  readonly retoldConceptMinWords: number;
  /** Clause d, both files holding rare names: least share of their rare-name weight in common (at least one name). @default 0.9 (chosen as retoldConceptMinDiff; both folds) */
  readonly retoldConceptMinNameShare: number;
  /** Clause d, a file naming nothing rare: least margin over each file's next neighbour. @default 0.2 (chosen as retoldConceptMinDiff; both folds) */
  readonly retoldConceptMinGap: number;
  /** A name is rare when at most this many files hold it (rareNames.ts). @default 10 (our choice, set by looking at the whole of test/fixtures/lookalike-retellings: 5, 10, 20, 30 compared; not held out) */
  readonly retoldNameMaxDf: number;
  /** Clause a (retold.ts): most files the two files' lists of nearest files (`neighbours` each, raw) may share; shared nearest neighbours, Jarvis & Patrick 1973. Infinity = no limit. @default Infinity (off; our choice. Measured at 6, halfway between the most a margin-clause retelling of test/fixtures/lookalike-retellings shares (5, `tty`) and the fewest of the one false margin-clause pair on test/fixtures/cmake-doc (7, FindMPEG ~ FindMPEG2), so chosen on 6 pairs: on the held-out kernel Documentation folder (read once after the choice) it drops 5 of the 45 pairs, all 5 false by our reading (two drivers, two codecs, two partition bindings, an MFD binding and its regulator part, two litmus tests): about 1.7 false pairs per 1,000 files instead of 2.2; but with the held-out third source of retellings added to the fixture (third.json.gz) `tty` shares 7 and is lost, and the false m4 `index` ~ `substr` pair shares 5 and stays. It removes pairs only and finds no new retelling: bench/lookalikeDistractors.bench.ts, the retellings fixture's README) */
  readonly retoldMarginMaxSharedNeighbours: number;
  /** Leave out a "same content" pair whose files both name devices by rare `vendor,model` strings (device-tree compatible strings, `ti,tmp108`) and share none (retold.ts). @default true (our choice, drawn from reading the Linux kernel Documentation folder's pairs, so not a clean held-out check: there it drops 10 of 45 pairs (7 before vendor properties and binding-file references were set apart from device names), by our reading all two bindings of different devices or parts of one chip, and keeps every binding listed with its driver's page; every folder of bench/lookalikeDistractors.bench.ts, the retellings fixture and its third source included, gives the same pairs with it as without under the default rule) */
  readonly retoldDevicesApartVeto: boolean;
  /** Leave out a "same content" pair of companion files: a source file and its header or interface of the same name (`rt5663.c` ~ `rt5663.h`, `.ml` ~ `.mli`, `.js` ~ `.d.ts`), or a test and the file it tests (`foo.test.ts` ~ `foo.ts`, `tests/test_foo.py` ~ `foo.py`); companions.ts. @default true (our choice, from the languages' conventions: such files are two halves of one unit; measured on code folders nobody here wrote, docs/overlaps.md: 20 of 30 pairs in five folders of linux-source-6.1, python3-sklearn and python3-scipy were companions, every one of them removed and nothing else; no documentation folder of bench/lookalikeDistractors.bench.ts holds any) */
  readonly retoldCompanionVeto: boolean;
  /** Seed for the MinHash family. @default DEFAULT_SEED (random.ts) */
  readonly seed: number;
}

export const DEFAULT_LOOKALIKE_OPTIONS: LookalikeOptions = Object.freeze({
  shingleSize: 5,
  numHashes: 128,
  bands: 16,
  threshold: 0.8,
  maxBucketSize: 100,
  partialThreshold: 0.2,
  retoldCopyJaccard: 0.3,
  neighbours: 10,
  boilerplateFiles: 3,
  retoldMinCosine: 0.5,
  retoldMinGap: 0.35,
  retoldMaxJaccard: 0.2,
  retoldNameMinGap: 0,
  retoldMinSharedNames: 3,
  retoldMinNameShare: 0.85,
  retoldNameMinWords: 200,
  retoldNamesDecide: true,
  retoldMinWords: 50,
  retoldMinEvidence: Infinity,
  retoldFewNamesMinEvidence: Infinity,
  retoldEvidenceMinCosine: 0.4,
  retoldEvidenceMinWords: 150,
  retoldConceptMinDiff: Infinity,
  retoldConceptK: 50,
  retoldConceptMinCosine: 0.45,
  retoldConceptMinWords: 100,
  retoldConceptMinNameShare: 0.9,
  retoldConceptMinGap: 0.2,
  retoldNameMaxDf: 10,
  retoldMarginMaxSharedNeighbours: Infinity,
  retoldDevicesApartVeto: true,
  retoldCompanionVeto: true,
  seed: DEFAULT_SEED,
});

/** Defaults merged with the caller's choices, each checked. */
export function resolveLookalikeOptions(options: Partial<LookalikeOptions> = {}): LookalikeOptions {
  const o: LookalikeOptions = { ...DEFAULT_LOOKALIKE_OPTIONS, ...options };
  positiveInteger('shingleSize', o.shingleSize);
  positiveInteger('numHashes', o.numHashes);
  positiveInteger('bands', o.bands);
  if (o.numHashes % o.bands !== 0) {
    throw new InvalidInputError(`bands (${o.bands}) must divide numHashes (${o.numHashes}) so every band has the same rows`);
  }
  unitInterval('threshold', o.threshold);
  unitInterval('partialThreshold', o.partialThreshold);
  if (o.partialThreshold > o.threshold)
    throw new InvalidInputError(`partialThreshold (${o.partialThreshold}) must not exceed threshold (${o.threshold})`);
  unitInterval('retoldCopyJaccard', o.retoldCopyJaccard);
  unitInterval('retoldMinCosine', o.retoldMinCosine);
  if (!(o.retoldMinGap >= 0 && o.retoldMinGap <= 1)) throw new InvalidInputError(`retoldMinGap must be in [0, 1], got ${o.retoldMinGap}`);
  positiveInteger('neighbours', o.neighbours);
  unitInterval('retoldMaxJaccard', o.retoldMaxJaccard);
  if (o.retoldMaxJaccard > o.partialThreshold)
    throw new InvalidInputError(`retoldMaxJaccard (${o.retoldMaxJaccard}) must not exceed partialThreshold (${o.partialThreshold})`);
  if (!(o.retoldNameMinGap >= 0 && o.retoldNameMinGap <= 1))
    throw new InvalidInputError(`retoldNameMinGap must be in [0, 1], got ${o.retoldNameMinGap}`);
  positiveInteger('retoldMinSharedNames', o.retoldMinSharedNames);
  unitInterval('retoldMinNameShare', o.retoldMinNameShare);
  if (!(Number.isInteger(o.retoldMinWords) && o.retoldMinWords >= 0))
    throw new InvalidInputError(`retoldMinWords must be a whole number ≥ 0, got ${o.retoldMinWords}`);
  if (!(Number.isInteger(o.retoldNameMinWords) && o.retoldNameMinWords >= 0))
    throw new InvalidInputError(`retoldNameMinWords must be a whole number ≥ 0, got ${o.retoldNameMinWords}`);
  positiveInteger('retoldNameMaxDf', o.retoldNameMaxDf);
  if (!(o.retoldMinEvidence >= 0)) throw new InvalidInputError(`retoldMinEvidence must be a number ≥ 0, got ${o.retoldMinEvidence}`);
  if (!(o.retoldFewNamesMinEvidence >= 0))
    throw new InvalidInputError(`retoldFewNamesMinEvidence must be a number ≥ 0, got ${o.retoldFewNamesMinEvidence}`);
  unitInterval('retoldEvidenceMinCosine', o.retoldEvidenceMinCosine);
  if (!(Number.isInteger(o.retoldEvidenceMinWords) && o.retoldEvidenceMinWords >= 0))
    throw new InvalidInputError(`retoldEvidenceMinWords must be a whole number ≥ 0, got ${o.retoldEvidenceMinWords}`);
  if (!(o.retoldConceptMinDiff === Infinity || (o.retoldConceptMinDiff >= -1 && o.retoldConceptMinDiff <= 1)))
    throw new InvalidInputError(`retoldConceptMinDiff must be in [-1, 1] or Infinity (off), got ${o.retoldConceptMinDiff}`);
  positiveInteger('retoldConceptK', o.retoldConceptK);
  unitInterval('retoldConceptMinCosine', o.retoldConceptMinCosine);
  if (!(Number.isInteger(o.retoldConceptMinWords) && o.retoldConceptMinWords >= 0))
    throw new InvalidInputError(`retoldConceptMinWords must be a whole number ≥ 0, got ${o.retoldConceptMinWords}`);
  unitInterval('retoldConceptMinNameShare', o.retoldConceptMinNameShare);
  if (!(o.retoldConceptMinGap >= 0 && o.retoldConceptMinGap <= 1))
    throw new InvalidInputError(`retoldConceptMinGap must be in [0, 1], got ${o.retoldConceptMinGap}`);
  if (!(
    o.retoldMarginMaxSharedNeighbours === Infinity ||
    (Number.isInteger(o.retoldMarginMaxSharedNeighbours) && o.retoldMarginMaxSharedNeighbours >= 0)
  ))
    throw new InvalidInputError(
      `retoldMarginMaxSharedNeighbours must be a whole number ≥ 0 or Infinity (off), got ${o.retoldMarginMaxSharedNeighbours}`,
    );
  if (typeof o.retoldNamesDecide !== 'boolean')
    throw new InvalidInputError(`retoldNamesDecide must be true or false, got ${String(o.retoldNamesDecide)}`);
  if (typeof o.retoldDevicesApartVeto !== 'boolean')
    throw new InvalidInputError(`retoldDevicesApartVeto must be true or false, got ${String(o.retoldDevicesApartVeto)}`);
  if (typeof o.retoldCompanionVeto !== 'boolean')
    throw new InvalidInputError(`retoldCompanionVeto must be true or false, got ${String(o.retoldCompanionVeto)}`);
  positiveInteger('boilerplateFiles', o.boilerplateFiles);
  if (o.boilerplateFiles < 2) throw new InvalidInputError(`boilerplateFiles must be at least 2, got ${o.boilerplateFiles}`);
  positiveInteger('maxBucketSize', o.maxBucketSize);
  if (o.maxBucketSize < 2) throw new InvalidInputError(`maxBucketSize must be at least 2, got ${o.maxBucketSize}`);
  if (!Number.isInteger(o.seed)) throw new InvalidInputError(`seed must be a whole number, got ${o.seed}`);
  return o;
}

function positiveInteger(name: string, v: number): void {
  if (!Number.isInteger(v) || v < 1) throw new InvalidInputError(`${name} must be a whole number ≥ 1, got ${v}`);
}

function unitInterval(name: string, v: number): void {
  if (!(v > 0 && v <= 1)) throw new InvalidInputError(`${name} must be in (0, 1], got ${v}`);
}
