/**
 * Timing of the overlap finder (no assertions; speed and count figures only).
 * Run: npm run bench:lookalike -- [files=10000] [tokensPerFile=300]
 *      npm run bench:lookalike -- --folder DIR   (a real folder: time and pairs per band)
 * Synthetic corpus: Zipf-distributed words from a 20 000-word invented vocabulary, 10 words per
 * line; 10 % near-copies (a few words and lines changed), 5 % exact copies, 1 % blank files.
 * Real folder: every file under DIR (hidden folders skipped) read as UTF-8 text; without
 * --folder, .cache/bench/linux-source-6.1/Documentation is used when bench-setup.sh unpacked it.
 */
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { createRandom } from '../src/core/random.js';
import { contentHash } from '../src/core/lookalike/contentHash.js';
import { createMinHasher } from '../src/core/lookalike/minhash.js';
import { findLookalikes } from '../src/core/lookalike/findLookalikes.js';
import { shingleSet } from '../src/core/lookalike/shingles.js';
import type { LookalikeFile } from '../src/core/lookalike/types.js';

const folderArg = process.argv.indexOf('--folder');
const kernelDocs = join('.cache', 'bench', 'linux-source-6.1', 'Documentation');
const folder = folderArg > 0 ? process.argv[folderArg + 1] : existsSync(kernelDocs) ? kernelDocs : undefined;
const numeric = process.argv.slice(2).filter((a, i, all) => a !== '--folder' && all[i - 1] !== '--folder');
const n = Number(numeric[0] ?? 10000);
const tokensPerFile = Number(numeric[1] ?? 300);
const rng = createRandom(7);

const vocabulary = Array.from({ length: 20000 }, (_, i) => `w${i.toString(36)}x${(i * 7919) % 97}`);
const cumulative = new Float64Array(vocabulary.length);
let acc = 0;
for (let i = 0; i < vocabulary.length; i++) cumulative[i] = acc += 1 / (i + 1);
const zipfWord = (): string => {
  const u = rng.next() * acc;
  let lo = 0;
  let hi = cumulative.length - 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (cumulative[mid] < u) lo = mid + 1;
    else hi = mid;
  }
  return vocabulary[lo];
};
const freshText = (): string => {
  const lines: string[] = [];
  for (let t = 0; t < tokensPerFile; t += 10) lines.push(Array.from({ length: 10 }, zipfWord).join(' '));
  return lines.join('\n');
};
const mutate = (text: string): string => {
  const lines = text.split('\n');
  for (let e = 0; e < 3; e++) {
    const l = Math.floor(rng.next() * lines.length);
    const words = lines[l].split(' ');
    words[Math.floor(rng.next() * words.length)] = zipfWord();
    lines[l] = words.join(' ');
  }
  lines.splice(Math.floor(rng.next() * lines.length), 1);
  return lines.join('\n');
};

const files: LookalikeFile[] = [];
for (let i = 0; i < n; i++) {
  const u = rng.next();
  let text: string;
  if (i > 10 && u < 0.1) text = mutate(files[Math.floor(rng.next() * i)].text);
  else if (i > 10 && u < 0.15) text = files[Math.floor(rng.next() * i)].text;
  else if (u < 0.16) text = '';
  else text = freshText();
  files.push({ id: `src/file${i}.ts`, text });
}

// Wall time and this process's CPU time (the second is steadier on a shared machine).
const time = <T>(label: string, f: () => T): T => {
  const t0 = performance.now();
  const c0 = process.cpuUsage();
  const r = f();
  const cpu = process.cpuUsage(c0);
  const wall = (performance.now() - t0).toFixed(0).padStart(7);
  console.log(`${label.padEnd(40)} ${wall} ms wall ${((cpu.user + cpu.system) / 1000).toFixed(0).padStart(7)} ms cpu`);
  return r;
};
if (folder) {
  realFolder(folder);
  if (folderArg > 0) process.exit(0); // a folder was asked for: the synthetic runs are not
}
console.log(`lookalike bench: ${n} files × ~${tokensPerFile} tokens`);
const sets = time('shingling (all files)', () => files.map((f) => shingleSet(f.text, 5)));
const hasher = createMinHasher(128, 1);
time('MinHash K=128 (all non-empty files)', () => sets.forEach((s) => s.hashes.length > 0 && hasher.signature(s.hashes)));
time('content hashes (all files)', () => files.forEach((f) => contentHash(f.text)));
const plain = time('findLookalikes', () => findLookalikes({ files }));
console.log('stats:', JSON.stringify(plain.stats));
console.log(
  `exact groups ${plain.exactGroups.length}, near ${plain.nearPairs.length}, partial ${plain.partialPairs.length}, retold ${plain.retoldPairs.length}`,
);
const same = Array.from({ length: 3000 }, (_, i) => ({ id: `same/${i}.md`, text: files[20].text || freshText() }));
time('findLookalikes (3000 identical files)', () => findLookalikes({ files: same }));
const body = freshText();
const templated = Array.from({ length: 3000 }, (_, i) => ({ id: `tpl/${i}.md`, text: `${body}\nitem ${i}` }));
const tpl = time('findLookalikes (3000 templated near-copies)', () => findLookalikes({ files: templated }));
console.log('stats (templated):', JSON.stringify(tpl.stats));

/** Time and pairs per band on a real folder, and the strongest "same content, other words" pairs. */
function realFolder(dir: string): void {
  const walk = (d: string): string[] =>
    readdirSync(d).flatMap((name) => {
      if (name.startsWith('.')) return [];
      const p = join(d, name);
      return statSync(p).isDirectory() ? walk(p) : [p];
    });
  const texts = walk(dir)
    .map((p) => ({ id: relative(dir, p), text: readFileSync(p, 'utf8') }))
    .filter((f) => !f.text.includes('\u0000'));
  const runs: number[] = [];
  let report = findLookalikes({ files: texts });
  for (let r = 0; r < 3; r++) {
    const t0 = performance.now();
    report = findLookalikes({ files: texts });
    runs.push(performance.now() - t0);
  }
  runs.sort((a, b) => a - b);
  const rss = (process.memoryUsage().rss / 2 ** 20).toFixed(0);
  console.log(
    `overlaps of ${dir}: ${texts.length} files, ${(runs[1] / 1000).toFixed(1)} s median of 3 (${(runs[0] / 1000).toFixed(1)}–${(runs[2] / 1000).toFixed(1)} s), RSS ${rss} MB; ` +
      `exact groups ${report.exactGroups.length}, near ${report.nearPairs.length}, partial ${report.partialPairs.length}, same content in other words ${report.retoldPairs.length}`,
  );
  for (const p of report.retoldPairs.slice(0, 15)) {
    console.log(`  ${p.cosine!.toFixed(2)} margin ${p.gap!.toFixed(2)} J ${p.jaccard.toFixed(2)}  ${p.a}  ~  ${p.b}`);
  }
}
