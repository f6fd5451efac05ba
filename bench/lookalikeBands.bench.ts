/**
 * Where the partial-copy band should start, and whether its candidates are found. No assertions.
 * Run: npm run bench:lookalike-bands
 *
 * Folders: test/fixtures/lookalike-retellings (Debian 12 manual pages and Texinfo chapters, its
 * README), test/fixtures/cmake-doc (CMake reference), test/fixtures/django-doc (Django manual)
 * and the demo workspace. For each:
 * - the finder (findLookalikes) at its defaults and with the partial band starting at each of
 *   0.3, 0.25 and 0.2 (the "same content, other words" band ends at 0.2): pairs per band, and
 *   every pair the lower start adds (Jaccard, shared words, words of each file; for the Debian
 *   fixture whether the key lists it as a natural retelling);
 * - the other way to close the gap, "same content, other words" up to J 0.3: the pairs it adds;
 * - candidate recall: every pair of distinct texts (exact copies stand for one) with exact
 *   shingle Jaccard in [0.2, 0.8), found by comparing all pairs (no MinHash, no LSH), against
 *   the partial pairs the finder reports at start 0.2. Candidates come from MinHash LSH at
 *   b = 16, r = 8, which catches J = 0.3 with probability 1 − (1 − 0.3^8)^16 ≈ 0.001 (Leskovec,
 *   Rajaraman & Ullman, Mining of Massive Datasets, ch. 3.4), and each file's 10 nearest
 *   neighbours in the full term space; the all-pairs count says how many partial pairs that
 *   union misses; and MinHash LSH alone at 16 × 8, 32 × 4 and 64 × 2 over the same 128 values:
 *   candidates made and all-pairs truth caught.
 */
import { contentHash, isBlankText } from '../src/core/lookalike/contentHash.js';
import { findLookalikes } from '../src/core/lookalike/findLookalikes.js';
import { boilerplateLines, withoutBoilerplate } from '../src/core/lookalike/retold.js';
import { jaccardSorted, shingleSet } from '../src/core/lookalike/shingles.js';
import { bandCandidates } from '../src/core/lookalike/banding.js';
import { createMinHasher } from '../src/core/lookalike/minhash.js';
import { DEFAULT_LOOKALIKE_OPTIONS as D } from '../src/core/lookalike/options.js';
import type { LookalikePair } from '../src/core/lookalike/types.js';
import { demoFiles, jsonlFiles, pairKey, retellingsCorpus, type MaterialFile } from './lookalikeMaterial.js';

const STARTS = [0.3, 0.25, 0.2];
const LIST = Number(process.argv[2] ?? 60);

/** The files with text, one per distinct text (the finder's own first step): ids, texts and 5-word shingle sets. */
function distinctTexts(files: readonly MaterialFile[], size: number): { ids: string[]; texts: string[]; sets: Uint32Array[] } {
  const seen = new Set<string>();
  const ids: string[] = [];
  const texts: string[] = [];
  const sets: Uint32Array[] = [];
  for (const f of files) {
    if (isBlankText(f.text)) continue;
    const h = contentHash(f.text);
    if (seen.has(h)) continue;
    seen.add(h);
    const s = shingleSet(f.text, size);
    if (s.hashes.length === 0) continue;
    ids.push(f.id);
    texts.push(f.text);
    sets.push(s.hashes);
  }
  return { ids, texts, sets };
}

/** Every pair of distinct texts with lo ≤ J < hi: its Jaccard and the Jaccard of the two texts without template lines (lines in ≥ 3 files, as the finder's term space drops them). */
function allPairs(files: readonly MaterialFile[], lo: number, hi: number): Map<string, [number, number]> {
  const { ids, texts, sets } = distinctTexts(files, 5);
  const template = boilerplateLines(texts, 3);
  const own = texts.map((t) => shingleSet(withoutBoilerplate(t, template), 5).hashes);
  const out = new Map<string, [number, number]>();
  for (let a = 0; a < ids.length; a++) {
    for (let b = a + 1; b < ids.length; b++) {
      const x = sets[a].length;
      const y = sets[b].length;
      if (Math.min(x, y) < lo * Math.max(x, y)) continue; // J ≤ min/max
      const j = jaccardSorted(sets[a], sets[b]);
      if (j >= lo && j < hi) out.set(pairKey(ids[a], ids[b]), [j, own[a].length && own[b].length ? jaccardSorted(own[a], own[b]) : 0]);
    }
  }
  return out;
}

/** LSH alone at other band shapes over the same 128 MinHash values: candidates made and truth pairs caught. */
function lshAlone(files: readonly MaterialFile[], truth: ReadonlyMap<string, [number, number]>): void {
  const { ids, sets } = distinctTexts(files, D.shingleSize);
  const k = D.numHashes;
  const sig = new Uint32Array(ids.length * k);
  const hasher = createMinHasher(k, D.seed);
  sets.forEach((set, t) => hasher.signature(set, sig, t * k));
  for (const bands of [16, 32, 64]) {
    const c = bandCandidates(sig, ids.length, k, { bands, rows: k / bands, maxBucketSize: D.maxBucketSize });
    const got = new Set<string>();
    for (let i = 0; i < c.count; i++) got.add(pairKey(ids[c.left[i]], ids[c.right[i]]));
    const part = (keep: (j: number, o: number) => boolean): string => {
      const all = [...truth].filter(([, [j, o]]) => keep(j, o));
      return `${all.filter(([x]) => got.has(x)).length}/${all.length}`;
    };
    console.log(
      `    LSH alone, ${bands} bands × ${k / bands} rows: ${c.count} candidates (${c.cappedBuckets} capped buckets); ` +
        `J 0.2–0.3 ${part((j) => j < 0.3)}, J 0.3–0.8 ${part((j) => j >= 0.3)}, beyond template lines ${part((_, o) => o >= 0.2)}`,
    );
  }
}

function show(p: LookalikePair, key: ReadonlySet<string>): string {
  const tag = key.has(pairKey(p.a, p.b)) ? ' [retelling in the key]' : '';
  return `    J ${p.jaccard.toFixed(3)}  ${p.sharedWords}/${p.words[0]}+${p.words[1]} words  ${p.a} ~ ${p.b}${tag}`;
}

function folder(name: string, files: readonly MaterialFile[], key: ReadonlySet<string> = new Set()): void {
  const t0 = Date.now();
  const reports = STARTS.map((s) => findLookalikes({ files }, { partialThreshold: s }));
  console.log(`\n${name}: ${files.length} files (${((Date.now() - t0) / 1000).toFixed(1)} s for ${STARTS.length} runs)`);
  for (let i = 0; i < STARTS.length; i++) {
    const r = reports[i];
    console.log(
      `  partial from ${STARTS[i]}: exact groups ${r.exactGroups.length}, near ${r.nearPairs.length}, partial ${r.partialPairs.length}, same content ${r.retoldPairs.length}`,
    );
  }
  const base = new Set(reports[0].partialPairs.map((p) => pairKey(p.a, p.b)));
  const added = reports[STARTS.length - 1].partialPairs.filter((p) => !base.has(pairKey(p.a, p.b)));
  const retoldSame =
    JSON.stringify(reports[0].retoldPairs.map((p) => pairKey(p.a, p.b))) ===
    JSON.stringify(reports[STARTS.length - 1].retoldPairs.map((p) => pairKey(p.a, p.b)));
  console.log(`  same-content pairs unchanged by the start: ${retoldSame}`);
  console.log(
    `  added at 0.2 (J in [0.2, 0.3)): ${added.length}, of them in the key: ${added.filter((p) => key.has(pairKey(p.a, p.b))).length}`,
  );
  for (const p of added.slice(0, LIST)) console.log(show(p, key));
  if (added.length > LIST) console.log(`    … ${added.length - LIST} more`);
  console.log(`  of them with fewer than 50 shared words: ${added.filter((p) => p.sharedWords < 50).length}`);
  // The other way to close the gap: "other words" up to 0.3 (partial copies from 0.3 as before).
  const wide = findLookalikes({ files }, { partialThreshold: 0.3, retoldMaxJaccard: 0.3 });
  const before = new Set(reports[0].retoldPairs.map((p) => pairKey(p.a, p.b)));
  const gained = wide.retoldPairs.filter((p) => !before.has(pairKey(p.a, p.b)));
  const lost = reports[0].retoldPairs.filter((p) => !wide.retoldPairs.some((q) => pairKey(q.a, q.b) === pairKey(p.a, p.b)));
  console.log(
    `  "other words" up to 0.3 instead: same content ${wide.retoldPairs.length} (${gained.length} new, ${gained.filter((p) => key.has(pairKey(p.a, p.b))).length} in the key; ${lost.length} lost)`,
  );
  for (const p of gained) console.log(show(p, key));
  const truth = allPairs(files, 0.2, 0.8);
  const reported = new Set(reports[STARTS.length - 1].partialPairs.map((p) => pairKey(p.a, p.b)));
  const row = (label: string, keep: (j: number, own: number) => boolean): void => {
    const all = [...truth].filter(([, [j, o]]) => keep(j, o));
    const found = all.filter(([k]) => reported.has(k)).length;
    console.log(`    ${label}: ${found}/${all.length}`);
  };
  console.log('  candidate recall at start 0.2 against all-pairs exact Jaccard (pairs found / pairs there):');
  row('J in [0.2, 0.3)', (j) => j < 0.3);
  row('J in [0.3, 0.8)', (j) => j >= 0.3);
  row('J in [0.2, 0.3), without template lines J ≥ 0.2', (j, o) => j < 0.3 && o >= 0.2);
  row('J in [0.2, 0.3), without template lines J < 0.2', (j, o) => j < 0.3 && o < 0.2);
  row('J in [0.3, 0.8), without template lines J ≥ 0.2', (j, o) => j >= 0.3 && o >= 0.2);
  row('J in [0.3, 0.8), without template lines J < 0.2', (j, o) => j >= 0.3 && o < 0.2);
  const keyed = [...truth].filter(([k]) => key.has(k));
  console.log(`  retellings of the key at J in [0.2, 0.8): ${keyed.length}, reported ${keyed.filter(([k]) => reported.has(k)).length}`);
  lshAlone(files, truth);
  const miss = [...truth].filter(([k, [, o]]) => !reported.has(k) && o >= 0.2);
  console.log(`  missed with J ≥ 0.2 without template lines: ${miss.length}`);
  for (const [k, [j, o]] of miss.sort((x, y) => y[1][0] - x[1][0]).slice(0, 40))
    console.log(`    J ${j.toFixed(3)} (${o.toFixed(3)} without template lines)  ${k.replace('|', ' ~ ')}`);
}

const c = retellingsCorpus();
folder('lookalike-retellings', c.files, new Set(c.retellings.map(([a, b]) => pairKey(a, b))));
folder('cmake-doc', jsonlFiles('test/fixtures/cmake-doc/docs.jsonl.gz'));
folder('django-doc', jsonlFiles('test/fixtures/django-doc/docs.jsonl.gz'));
folder('demo', demoFiles());
