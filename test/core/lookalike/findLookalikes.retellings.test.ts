/**
 * Overlap bands on real documentation nobody here wrote: test/fixtures/lookalike-retellings
 * (built by scripts/fixtures/lookalike-retellings/build.py from Debian 12 packages; sources and
 * versions in its README).
 *
 * - Natural retellings, 125 pairs: a command's manual page (generated from its --help text) and
 *   the "invocation" chapter of the project's Texinfo manual, written separately.
 *   Source "coreutils" (98 pairs, coreutils 9.1-1) and source "gnu-other" (27 pairs: gettext
 *   0.21-12, diffutils 3.8-4, findutils 4.9.0-4, grep 3.8-5, sed 4.9-1).
 * - 1,421 same-area distractors: man pages of util-linux, procps, gawk, manpages, manpages-dev and
 *   the other chapters of those info manuals.
 * - 90 planted copies of distractors (20 exact, 70 edited); their band is decided here by the
 *   Jaccard of string 5-gram shingles (corpusFixtures.ts, no code shared with the finder).
 *
 * Per band, with the issue's targets where they are met and measured floors where they are not:
 * - exact copies: all 20 planted found (target: all);
 * - near-copies: recall ≥ 0.95 of the planted pairs with reference J ≥ 0.8, 0 reported below it
 *   (target; measured 32/32, 0 false);
 * - partial copies: recall ≥ 0.9 of the planted pairs with 0.2 ≤ J < 0.8, 0 reported outside
 *   (measured 38/38, 0 of 535 outside; 35/35 from 0.3); every retelling of the key whose
 *   reference J is 0.2 or more is listed as a partial or near-copy, so none falls between the
 *   bands (measured: 7, envsubst, gettext's msg* tools and egrep, J 0.21–0.35);
 * - same content, other words: at most 3 pairs not in the key (target; measured 1,
 *   pthread_yield.3 ~ sched_yield.2, itself a natural retelling outside the key) and ahead of plain
 *   TF-IDF cosine at the same number of false pairs; recall floors 0.27 overall, 26/98 coreutils,
 *   6/27 gnu-other (measured 2026-12-03 with names deciding when both files hold rare names:
 *   37/125 = 0.30, 29/98, 8/27; with the opt-in clause c, margin + name share ≥ 1 when BM25
 *   agrees, 45/125; with the opt-in clause d, closer in words than the broad topic explains,
 *   55/125 (checked below); the earlier rule 34/125, margin alone 20/125). The issue's recall
 *   target (≥ 55 %) is NOT met on this set: see the fixture README;
 * - the folder without the retellings' Texinfo side: at most 1 pair per 1,000 files (target;
 *   measured 1 in 1,660, the same pthread_yield pair).
 * The rule's constants (options.ts) were chosen leaving one source out (bench/lookalikeNameClause.bench.ts,
 * scripts/fixtures/lookalike-retellings/conceptClause.py).
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gunzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { countTerms, Vocabulary } from '../../../src/core/counting/termCounts.js';
import { findLookalikes } from '../../../src/core/lookalike/findLookalikes.js';
import { buildTermSpace, termNeighbours } from '../../../src/core/lookalike/termSpace.js';
import type { LookalikeReport } from '../../../src/core/lookalike/types.js';
import { tokenize } from '../../../src/core/text/tokenize.js';
import { REPO_ROOT } from '../../helpers/shared.js';
import { referenceShingles } from './corpusFixtures.js';

interface Corpus {
  files: { id: string; source: string; text: string }[];
  retellings: [string, string, 'coreutils' | 'gnu-other'][];
  planted: Record<'exact' | 'near' | 'partial', [string, string][]>;
}

const path = join(REPO_ROOT, 'test', 'fixtures', 'lookalike-retellings', 'corpus.json.gz');
const corpus: Corpus | null = existsSync(path) ? JSON.parse(gunzipSync(readFileSync(path)).toString('utf8')) : null;

const key = (a: string, b: string): string => (a < b ? `${a}|${b}` : `${b}|${a}`);

const shingleCache = new Map<string, Set<string>>();
function shinglesOf(text: string): Set<string> {
  let s = shingleCache.get(text);
  if (!s) shingleCache.set(text, (s = referenceShingles(text, 5)));
  return s;
}

function referenceJaccard(a: string, b: string): number {
  const sa = shinglesOf(a);
  const sb = shinglesOf(b);
  let common = 0;
  for (const x of sa) if (sb.has(x)) common++;
  return common / (sa.size + sb.size - common);
}

/** Keys of a pair with each side replaced by each of its exact copies (the report names one representative). */
function expanded(r: LookalikeReport, a: string, b: string): string[] {
  const copies = new Map<string, readonly string[]>();
  for (const g of r.exactGroups) for (const f of g.files) copies.set(f, g.files);
  return (copies.get(a) ?? [a]).flatMap((x) => (copies.get(b) ?? [b]).map((y) => key(x, y)));
}

/** Pairs of a report's exact groups (every two members). */
function exactPairs(r: LookalikeReport): Set<string> {
  const out = new Set<string>();
  for (const g of r.exactGroups)
    for (let i = 0; i < g.files.length; i++) for (let j = i + 1; j < g.files.length; j++) out.add(key(g.files[i], g.files[j]));
  return out;
}

describe('overlap bands on Debian manual pages and Texinfo manuals', () => {
  it.skipIf(!corpus)('finds planted copies in the right band and retellings ahead of plain TF-IDF cosine', { timeout: 900_000 }, () => {
    const c = corpus!;
    const text = new Map(c.files.map((f) => [f.id, f.text]));
    const report = findLookalikes({ files: c.files });

    // Exact copies: every planted one.
    const exact = exactPairs(report);
    const exactFound = c.planted.exact.filter(([a, b]) => exact.has(key(a, b))).length;

    // Near and partial copies: truth by the reference Jaccard of each planted pair.
    const plantedEdited = [...c.planted.near, ...c.planted.partial].map(([a, b]) => ({
      k: key(a, b),
      j: referenceJaccard(text.get(a)!, text.get(b)!),
    }));
    const nearTruth = plantedEdited.filter((p) => p.j >= 0.8);
    const partialTruth = plantedEdited.filter((p) => p.j >= 0.2 && p.j < 0.8);
    const nearKeys = new Set(report.nearPairs.flatMap((p) => expanded(report, p.a, p.b)));
    const partialKeys = new Set(report.partialPairs.flatMap((p) => expanded(report, p.a, p.b)));
    const nearRecall = nearTruth.filter((p) => nearKeys.has(p.k)).length / nearTruth.length;
    const partialRecall = partialTruth.filter((p) => partialKeys.has(p.k)).length / partialTruth.length;
    // Precision of the two bands: every reported pair's reference Jaccard is in its band.
    const falseNear = report.nearPairs.filter((p) => referenceJaccard(text.get(p.a)!, text.get(p.b)!) < 0.8).length;
    const falsePartial = report.partialPairs.filter((p) => {
      const j = referenceJaccard(text.get(p.a)!, text.get(p.b)!);
      return j < 0.2 || j >= 0.8;
    }).length;

    // Same content, other words.
    const truth = new Map(c.retellings.map(([a, b, s]) => [key(a, b), s]));
    // Retellings sharing much text (J ≥ 0.2, where partial copies start) are listed as copies.
    const copyKeys = new Set([...nearKeys, ...partialKeys, ...exact]);
    const sharing = c.retellings
      .map(([a, b]) => key(a, b))
      .filter((k) => {
        const [a, b] = k.split('|');
        return referenceJaccard(text.get(a)!, text.get(b)!) >= 0.2;
      });
    const sharingListed = sharing.filter((k) => copyKeys.has(k)).length;
    const retold = report.retoldPairs.map((p) => ({ k: expanded(report, p.a, p.b).find((x) => truth.has(x)) ?? key(p.a, p.b), p }));
    const hits = retold.filter((r) => truth.has(r.k));
    const falseRetold = retold.length - hits.length;
    const bySource = (s: string) => `${hits.filter((r) => truth.get(r.k) === s).length}/${c.retellings.filter((r) => r[2] === s).length}`;
    const recall = hits.length / truth.size;

    // Baseline in the same run: plain TF-IDF cosine (no boilerplate removal, no margin), pairs with
    // Jaccard < 0.3, ranked by cosine; recall when the same number of false pairs has been passed.
    const ids = c.files.map((f) => f.id);
    const space = buildTermSpace(c.files.map((f) => f.text));
    const nb = termNeighbours(space, { k: 10, candidates: 50, maxDf: Math.max(100, Math.floor(0.05 * ids.length)) });
    const seen = new Map<string, number>();
    for (let i = 0; i < ids.length; i++) {
      for (let r = 0; r < 10; r++) {
        const d = nb.index[i * 10 + r];
        if (d >= 0) seen.set(key(ids[i], ids[d]), nb.cosine[i * 10 + r]);
      }
    }
    const ranked = [...seen.entries()].sort((x, y) => y[1] - x[1] || (x[0] < y[0] ? -1 : 1));
    const baselineFalse: string[] = [];
    const baselineAt = (allowed: number): number => {
      let tp = 0;
      let fp = 0;
      for (const [k, cos] of ranked) {
        const [a, b] = k.split('|');
        if (exact.has(k)) continue;
        if (referenceJaccard(text.get(a)!, text.get(b)!) >= 0.3) continue;
        if (truth.has(k)) tp++;
        else {
          if (allowed === 3 && baselineFalse.length < 5) baselineFalse.push(`${a} ~ ${b} (cosine ${cos.toFixed(2)})`);
          if (++fp > allowed) break;
        }
      }
      return tp;
    };
    const baseSame = baselineAt(falseRetold);
    const base3 = baselineAt(3);
    const base5 = baselineAt(5);

    console.log(
      [
        `overlaps on ${c.files.length} Debian documentation files:`,
        `  exact copies: ${exactFound}/${c.planted.exact.length} planted found`,
        `  near-copies: recall ${nearRecall.toFixed(3)} of ${nearTruth.length} planted with J ≥ 0.8; ${report.nearPairs.length} reported, ${falseNear} below J 0.8`,
        `  partial copies: recall ${partialRecall.toFixed(3)} of ${partialTruth.length} planted with 0.2 ≤ J < 0.8; ${report.partialPairs.length} reported, ${falsePartial} outside the band`,
        `  retellings with J ≥ 0.2 listed as copies: ${sharingListed}/${sharing.length}`,
        `  same content, other words: ${retold.length} reported, ${hits.length} retellings (coreutils ${bySource('coreutils')}, gnu-other ${bySource('gnu-other')}), recall ${recall.toFixed(3)}, ${falseRetold} not in the key`,
        `  baseline TF-IDF cosine, J < 0.3: ${baseSame} retellings before its ${falseRetold + 1}th false pair; ${base3} with ≤ 3 false, ${base5} with ≤ 5 false`,
        ...baselineFalse.map((x) => `    baseline's first false pairs: ${x}`),
        ...retold
          .filter((r) => !truth.has(r.k))
          .map(
            (r) =>
              `    not in the key: ${r.p.a} ~ ${r.p.b} (cosine ${r.p.cosine!.toFixed(2)}, margin ${r.p.gap!.toFixed(2)}, J ${r.p.jaccard.toFixed(2)})`,
          ),
      ].join('\n'),
    );

    expect(exactFound).toBe(c.planted.exact.length);
    expect(nearTruth.length).toBeGreaterThan(20);
    expect(nearRecall).toBeGreaterThanOrEqual(0.95);
    expect(falseNear).toBe(0);
    expect(partialTruth.length).toBeGreaterThan(20);
    expect(partialRecall).toBeGreaterThanOrEqual(0.9);
    expect(falsePartial).toBe(0);
    expect(sharing.length).toBeGreaterThan(0);
    expect(sharingListed).toBe(sharing.length);
    // Target: at most 3 pairs not in the key (measured 2026-12-03: 1 of 38 reported).
    expect(falseRetold).toBeLessThanOrEqual(3);
    expect(hits.length / Math.max(1, retold.length)).toBeGreaterThanOrEqual(0.85);
    // Floors below the measured recall (37/125; coreutils 29/98, gnu-other 8/27); the target of 0.55 is not met.
    expect(recall).toBeGreaterThanOrEqual(0.27);
    expect(hits.filter((r) => truth.get(r.k) === 'coreutils').length).toBeGreaterThanOrEqual(26);
    expect(hits.filter((r) => truth.get(r.k) === 'gnu-other').length).toBeGreaterThanOrEqual(6);
    // Ahead of the baseline at the same number of false pairs (baseline measured: 4 with ≤ 3 false).
    expect(hits.length).toBeGreaterThan(baseSame);
  });

  it.skipIf(!corpus)('with the opt-in clause d finds more retellings at the same false pairs', { timeout: 900_000 }, () => {
    // Clause d (retold.ts; off by default, options.ts says why) at its chosen level −0.15.
    // Measured 2026-12-03: 55/125 (coreutils 45/98, gnu-other 10/27), 1 pair not in the key (the
    // same pthread_yield one); floors below that.
    const c = corpus!;
    const report = findLookalikes({ files: c.files }, { retoldConceptMinDiff: -0.15 });
    const truth = new Map(c.retellings.map(([a, b, s]) => [key(a, b), s]));
    const found = report.retoldPairs.map((p) => expanded(report, p.a, p.b).find((x) => truth.has(x)));
    const hits = found.filter((k) => k !== undefined);
    const byClause = report.retoldPairs.filter((p) => p.clause === 'beyond-topic').length;
    console.log(
      `opt-in clause d: ${report.retoldPairs.length} reported, ${hits.length} retellings (${byClause} by clause d), ${found.length - hits.length} not in the key`,
    );
    expect(found.length - hits.length).toBeLessThanOrEqual(3);
    expect(hits.length).toBeGreaterThanOrEqual(50);
    expect(hits.filter((k) => truth.get(k!) === 'gnu-other').length).toBeGreaterThanOrEqual(9);
    expect(byClause).toBeGreaterThan(0);
  });

  it.skipIf(!corpus)('reports few "same content" pairs in a real folder without planted retellings', { timeout: 900_000 }, () => {
    const c = corpus!;
    // The same folder with the info side of every retelling removed: what is left has no planted
    // retelling (natural ones among the distractors may remain and count as false here).
    const infoSide = new Set(c.retellings.map((r) => r[1]));
    const files = c.files.filter((f) => !infoSide.has(f.id));
    const r = findLookalikes({ files });
    const perThousand = (1000 * r.retoldPairs.length) / files.length;
    console.log(
      `overlaps without retellings: ${files.length} files, ${r.retoldPairs.length} "same content" pairs (${perThousand.toFixed(2)} per 1,000 files)\n` +
        r.retoldPairs.map((p) => `    ${p.a} ~ ${p.b} (cosine ${p.cosine!.toFixed(2)}, margin ${p.gap!.toFixed(2)})`).join('\n'),
    );
    // The target: at most 1 per 1,000 files (measured 2026-12-03: 1 pair in 1,660 files).
    expect(perThousand).toBeLessThanOrEqual(1);
  });

  const cmakePath = join(REPO_ROOT, 'test', 'fixtures', 'cmake-doc', 'docs.jsonl.gz');
  it.skipIf(!existsSync(cmakePath))(
    'reports at most 1 "same content" pair per 1,000 pages of the CMake reference manual',
    { timeout: 900_000 },
    () => {
      // test/fixtures/cmake-doc (CMake 3.25 reference manual, Debian cmake-doc; see its README): no
      // planted retelling; many pages of one template (Find modules, a property and the variable that
      // sets its default). A control for the rule, not held out: its constants were chosen with it
      // (bench/lookalikeNameClause.bench.ts, scripts/fixtures/lookalike-retellings/conceptClause.py).
      // Measured 2026-12-03: 1 pair in 1,906 pages (module/FindMPEG ~ module/FindMPEG2, two modules
      // of one template), also with the opt-in clause d; the earlier rule gave 10.
      const files = gunzipSync(readFileSync(cmakePath))
        .toString('utf8')
        .split('\n')
        .filter((l) => l.length > 0)
        .map((l) => JSON.parse(l) as { id: string; text: string });
      const r = findLookalikes({ files });
      console.log(
        `overlaps on the CMake reference: ${files.length} pages, ${r.retoldPairs.length} "same content" pairs\n` +
          r.retoldPairs
            .map((p) => `    ${p.a} ~ ${p.b} (cosine ${p.cosine!.toFixed(2)}, margin ${p.gap!.toFixed(2)}, by ${p.clause})`)
            .join('\n'),
      );
      expect(files.length).toBeGreaterThan(1000);
      expect((1000 * r.retoldPairs.length) / files.length).toBeLessThanOrEqual(1);
    },
  );

  const djangoPath = join(REPO_ROOT, 'test', 'fixtures', 'django-doc', 'docs.jsonl.gz');
  it.skipIf(!existsSync(djangoPath))('reports no "same content" pair in the Django manual', { timeout: 300_000 }, () => {
    // test/fixtures/django-doc (Django 3.2 manual, Debian python-django-doc; see its README): 258
    // pages, no planted retelling; a control used when choosing clause d, not held out. The
    // issue's 1 per 1,000 files allows none here. Measured 2026-12-03: 0 pairs.
    const files = gunzipSync(readFileSync(djangoPath))
      .toString('utf8')
      .split('\n')
      .filter((l) => l.length > 0)
      .map((l) => JSON.parse(l) as { id: string; text: string });
    const r = findLookalikes({ files });
    console.log(`overlaps on the Django manual: ${files.length} pages, ${r.retoldPairs.length} "same content" pairs`);
    expect(files.length).toBeGreaterThan(200);
    expect(r.retoldPairs.map((p) => `${p.a} ~ ${p.b}`)).toEqual([]);
  });

  const erlangPath = join(REPO_ROOT, 'test', 'fixtures', 'topic-trees', 'erlang.jsonl.gz');
  it.skipIf(!existsSync(erlangPath))('reports no "same content" pair in the Erlang/OTP manual', { timeout: 300_000 }, () => {
    // test/fixtures/topic-trees/erlang.jsonl.gz (Erlang/OTP 25 manual, Debian erlang-doc; see that
    // folder's README): 978 pages, no planted retelling, many module reference pages of one
    // template per application. It chose no constant of the rule (a held-out distractor folder,
    // added 2026-12-03 after the rule was chosen); the 1 per 1,000 files allows none here.
    // Measured 2026-12-03: 0 pairs (the opt-in clause d lists 1, two wx grid-cell editor classes;
    // clause c 1, two port tutorials: npm run bench:lookalike-distractors).
    const files = gunzipSync(readFileSync(erlangPath))
      .toString('utf8')
      .split('\n')
      .filter((l) => l.length > 0)
      .map((l) => JSON.parse(l) as { path: string; text: string })
      .map((f) => ({ id: f.path, text: f.text }));
    const r = findLookalikes({ files });
    console.log(`overlaps on the Erlang/OTP manual: ${files.length} pages, ${r.retoldPairs.length} "same content" pairs`);
    expect(files.length).toBeGreaterThan(900);
    expect(r.retoldPairs.map((p) => `${p.a} ~ ${p.b}`)).toEqual([]);
  });

  it.skipIf(!corpus)('gives the same report from stored term counts as from the texts', { timeout: 300_000 }, () => {
    // What the CLI and the editor pass: an index's raw counts (here counted with the index tokenizer
    // into one vocabulary) and that counter applied to single lines.
    const c = corpus!;
    const files = c.files.filter((f) => f.id.startsWith('coreutils/') || f.id.startsWith('procps/'));
    const vocab = new Vocabulary();
    const termCounts = files.map((f) => countTerms(tokenize(f.text), vocab, true));
    const countLine = (line: string) => countTerms(tokenize(line), vocab, false);
    const fromTexts = findLookalikes({ files });
    const fromCounts = findLookalikes({ files, termCounts, countLine });
    expect(fromTexts.retoldPairs.length).toBeGreaterThan(10);
    const strip = (r: LookalikeReport) => ({
      near: r.nearPairs.map((p) => key(p.a, p.b)),
      partial: r.partialPairs.map((p) => key(p.a, p.b)),
      retold: r.retoldPairs.map((p) => [key(p.a, p.b), p.cosine!.toFixed(5)]),
    });
    expect(strip(fromCounts)).toEqual(strip(fromTexts));
  });
});
