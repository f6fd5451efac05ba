/**
 * Timing of the look-alike finder on synthetic files (no assertions; speed figures only).
 * Run: npx esbuild bench/lookalike.bench.ts --bundle --platform=node --outfile=/tmp/lookalike-bench.js
 *      && node /tmp/lookalike-bench.js [files=10000] [tokensPerFile=300] [dims=200]
 * Corpus: Zipf-distributed words from a 20 000-word invented vocabulary, 10 words per line; 10 %
 * near-copies (a few words and lines changed), 5 % exact copies, 1 % blank files. Concept vectors:
 * random unit vectors (paraphrase search then runs its SimHash path above 2000 files).
 */
import { createRandom } from '../src/core/random.js';
import { contentHash } from '../src/core/lookalike/contentHash.js';
import { createMinHasher } from '../src/core/lookalike/minhash.js';
import { findLookalikes } from '../src/core/lookalike/findLookalikes.js';
import { shingleSet } from '../src/core/lookalike/shingles.js';
import type { LookalikeFile } from '../src/core/lookalike/types.js';

const n = Number(process.argv[2] ?? 10000);
const tokensPerFile = Number(process.argv[3] ?? 300);
const dims = Number(process.argv[4] ?? 200);
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
const vectors = new Float32Array(n * dims);
for (let i = 0; i < n; i++) {
  let s = 0;
  for (let d = 0; d < dims; d++) s += (vectors[i * dims + d] = rng.normal()) ** 2;
  for (let d = 0; d < dims; d++) vectors[i * dims + d] /= Math.sqrt(s);
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
console.log(`lookalike bench: ${n} files × ~${tokensPerFile} tokens, concept dims ${dims}`);
const sets = time('shingling (all files)', () => files.map((f) => shingleSet(f.text, 5)));
const hasher = createMinHasher(128, 1);
time('MinHash K=128 (all non-empty files)', () => sets.forEach((s) => s.hashes.length > 0 && hasher.signature(s.hashes)));
time('content hashes (all files)', () => files.forEach((f) => contentHash(f.text)));
const plain = time('findLookalikes (no concept vectors)', () => findLookalikes({ files }));
const full = time('findLookalikes (with concept vectors)', () => findLookalikes({ files, concepts: { vectors, dims } }));
console.log('stats (no vectors):', JSON.stringify(plain.stats));
console.log('stats (vectors):   ', JSON.stringify(full.stats));
console.log(`exact groups ${plain.exactGroups.length}, near groups ${plain.nearGroups.length}`);
const same = Array.from({ length: 3000 }, (_, i) => ({ id: `same/${i}.md`, text: files[20].text || freshText() }));
time('findLookalikes (3000 identical files)', () => findLookalikes({ files: same }));
const body = freshText();
const templated = Array.from({ length: 3000 }, (_, i) => ({ id: `tpl/${i}.md`, text: `${body}\nitem ${i}` }));
const tpl = time('findLookalikes (3000 templated near-copies)', () => findLookalikes({ files: templated }));
console.log('stats (templated):', JSON.stringify(tpl.stats));
