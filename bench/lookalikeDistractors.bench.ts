/**
 * "Same content, other words" (retold.ts) under a few rule versions, on the retellings fixture and
 * on distractor folders that chose none of its constants. No assertions.
 * Run: npm run bench:lookalike-distractors [-- WORD] (only the folders whose name holds WORD)
 *
 * Versions (finder options; everything else at its defaults):
 * - default: clauses a and b;
 * - clause d as chosen (retoldConceptMinDiff −0.15 with its options.ts constants);
 * - clause d for named pairs only: the same, with its branch for a file naming nothing rare off
 *   (retoldConceptMinGap = 1: a margin no pair sharing little text reaches), so clause d asks both files to hold rare names and agree on
 *   them; that branch rests on 2 of the fixture's pairs (`printenv`, `sleep`);
 * - clause c (retoldMinEvidence 1);
 * - the default with clause a limited to pairs whose two lists of 10 nearest files share at most 6
 *   files (retoldMarginMaxSharedNeighbours 6: halfway between the most a margin-clause retelling
 *   of the fixture shares, 5 (`tty`), and the fewest its one false margin-clause pair on CMake
 *   shares, 7 (FindMPEG ~ FindMPEG2); chosen before reading any other folder with it).
 * Folders: test/fixtures/lookalike-retellings (125 natural retellings in two sources; recall per
 * source, pairs outside the key); the same with the third source of third.json.gz added (23 more
 * retellings from ten other Debian packages, built after every constant was chosen:
 * scripts/fixtures/lookalike-retellings/buildThird.py); the first without the Texinfo side, the CMake reference
 * (test/fixtures/cmake-doc; it chose clause b's and d's constants, so not held out), the demo
 * (3 planted pairs) and, never used to choose a constant: the Erlang/OTP 25 manual
 * (test/fixtures/topic-trees/erlang.jsonl.gz, 978 pages: each application's module reference pages
 * are one template) and the Sphinx manual (test/fixtures/sphinx-doc, 91 pages). The full Django
 * manual (topic-trees, 533 pages) contains the 258 pages of test/fixtures/django-doc that took part
 * in the choice, so its figure is only half held out. Each pair of a distractor folder is printed
 * with its clause so that it can be read and judged.
 */
import { readFileSync } from 'node:fs';
import { gunzipSync } from 'node:zlib';
import { findLookalikes } from '../src/core/lookalike/findLookalikes.js';
import type { LookalikeOptions } from '../src/core/lookalike/options.js';
import type { LookalikePair } from '../src/core/lookalike/types.js';
import {
  demoFiles,
  demoParaphrases,
  jsonlFiles,
  pairKey,
  pathFiles,
  retellingsCorpus,
  type MaterialFile,
  type RetellingsCorpus,
} from './lookalikeMaterial.js';

const VERSIONS: [string, Partial<LookalikeOptions>][] = [
  ['default (clauses a, b)', {}],
  ['+ clause d as chosen', { retoldConceptMinDiff: -0.15 }],
  ['+ clause d, named pairs only', { retoldConceptMinDiff: -0.15, retoldConceptMinGap: 1 }],
  ['+ clause c', { retoldMinEvidence: 1 }],
  ['default, clause a with at most 6 shared neighbours', { retoldMarginMaxSharedNeighbours: 6 }],
];

const corpus = retellingsCorpus();
const infoSide = new Set(corpus.retellings.map((r) => r[1]));
const truth = new Map(corpus.retellings.map(([a, b, s]) => [pairKey(a, b), s]));
// Copies of a retelling's file (exact copies are collapsed to one of them) stand for it.
const third = JSON.parse(gunzipSync(readFileSync('test/fixtures/lookalike-retellings/third.json.gz')).toString('utf8')) as RetellingsCorpus;
const withThird = new Map([...truth, ...third.retellings.map(([a, b, s]): [string, string] => [pairKey(a, b), s])]);
const folders: [string, MaterialFile[], Map<string, string>, boolean][] = [
  ['retellings', corpus.files, truth, false],
  ['retellings + third source (held out)', [...corpus.files, ...third.files], withThird, true],
  ['without Texinfo side', corpus.files.filter((f) => !infoSide.has(f.id)), new Map(), false],
  ['cmake-doc (chose constants)', jsonlFiles('test/fixtures/cmake-doc/docs.jsonl.gz'), new Map(), false],
  ['demo', demoFiles(), new Map(demoParaphrases().map(([a, b]) => [pairKey(a, b), 'demo'])), false],
  ['erlang (held out)', pathFiles('test/fixtures/topic-trees/erlang.jsonl.gz'), new Map(), true],
  ['sphinx-doc (held out)', jsonlFiles('test/fixtures/sphinx-doc/docs.jsonl.gz'), new Map(), true],
  ['django full (half held out)', pathFiles('test/fixtures/topic-trees/django.jsonl.gz'), new Map(), true],
];

const describe = (p: LookalikePair, key: Map<string, string>): string =>
  `[${key.get(pairKey(p.a, p.b)) ?? 'outside the key'}] ${p.clause} shared neighbours ${p.sharedNeighbours ?? '-'} cos ${(p.cosine ?? 0).toFixed(2)} margin ${(p.gap ?? 0).toFixed(2)} names ${p.sharedNames ?? 0} (${(p.namesHeld ?? [0, 0]).join('/')}) J ${p.jaccard.toFixed(2)}  ${p.a} ~ ${p.b}`;

const only = process.argv[2];
for (const [name, files, key, list] of folders) {
  if (only !== undefined && !name.includes(only)) continue;
  const before = new Set<string>();
  for (const [vname, opts] of VERSIONS) {
    const r = findLookalikes({ files }, opts);
    const bySource = new Map<string, number>();
    let outside = 0;
    for (const p of r.retoldPairs) {
      const s = key.get(pairKey(p.a, p.b));
      if (s === undefined) outside++;
      else bySource.set(s, (bySource.get(s) ?? 0) + 1);
    }
    if (vname.startsWith('default') && key.size > 0) {
      const copies = new Map<string, number>();
      for (const p of [...r.nearPairs, ...r.partialPairs]) {
        const s = key.get(pairKey(p.a, p.b));
        if (s === undefined) continue;
        copies.set(`${s} ${p.band}`, (copies.get(`${s} ${p.band}`) ?? 0) + 1);
        if (s === 'third') console.log(`    ${p.band} copy J ${p.jaccard.toFixed(2)}: ${p.a} ~ ${p.b}`);
      }
      console.log(`  retellings of the key listed as copies: ${[...copies].map(([k, c]) => `${k} ${c}`).join(', ') || 'none'}`);
    }
    const found = [...bySource].map(([s, c]) => `${s} ${c}`).join(', ');
    console.log(
      `${name} (${r.stats.files} files) — ${vname}: ${r.retoldPairs.length} pairs${key.size > 0 ? `; in the key: ${found || 0}; outside it: ${outside}` : ''} (${((1000 * outside) / r.stats.files).toFixed(1)} outside the key per 1,000 files)`,
    );
    if (list) {
      const isDefault = vname.startsWith('default');
      for (const p of r.retoldPairs) {
        const k = pairKey(p.a, p.b);
        if (isDefault) before.add(k);
        if (isDefault) console.log(`    ${describe(p, key)}`);
        else if (!before.has(k)) console.log(`    new: ${describe(p, key)}`);
      }
    }
  }
}
