/**
 * `npm run bench:kernels`: the WebAssembly SIMD kernels of this tree against those of an earlier
 * revision (default: the last one with the hand-encoded bytecode kernels), side by side.
 *
 * scripts/bench-kernels.mjs takes the other revision's kernel files out of git, bundles them and
 * runs this file. Every measurement runs in its own child process (a fresh engine, as a user's
 * command meets it), the two sides alternating (old, new, then new, old, …) so that the load of
 * this shared machine falls on both alike. Each child times, on the same inputs:
 *  - the randomized SVD (k = 100, src/core/svd/randomizedSvd.ts on a WasmExecutor) of the
 *    document-term matrix of the four public test collections in test/fixtures/corpora (CISI,
 *    CRAN, CACM, ADI: 6146 documents, stemmed words, log(1 + count) weights);
 *  - each kernel alone: spmm and spmm_f32 (that matrix times a 110-column block), cross (AᵀA of
 *    a 20000 × 110 block), times (that block times an upper-triangular 110 × 110 factor),
 *    dots (100000 f32 rows of 100) and code_dots (400000 rows of 100 8-bit codes),
 * reporting the median of `--reps` calls, and a hash of every output so that the two sides are
 * checked to give the same bits. The parent prints, per measurement, the median over `--rounds`
 * children of each side and the spread (min–max).
 */
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { instantiateKernels, WasmArena } from '../src/core/matrix/wasm/wasmArena.js';
import { WasmExecutor } from '../src/core/matrix/wasm/wasmExecutor.js';
import { kernelModule } from '../src/core/matrix/wasm/kernelModule.js';
import type { CsrMatrix } from '../src/core/matrix/sparse.js';
import { createRandom } from '../src/core/random.js';
import { randomizedSvd } from '../src/core/svd/randomizedSvd.js';
import { tokenize } from '../src/core/text/tokenize.js';

type Side = 'old' | 'new';
/** The modules of one side: the SVD kernels (spmm, spmm_f32, cross, times), dots, code_dots. */
interface Modules {
  kernels: WebAssembly.Module;
  dots: WebAssembly.Module;
  codeDots: WebAssembly.Module;
}
interface ChildResult {
  ms: Record<string, number>;
  hash: Record<string, string>;
}

const REPO = resolve(process.argv[1], '..', '..', '..');
const COLLECTIONS = ['cisi', 'cran', 'cacm', 'adi'];
const L = 110;
const K = 100;

function flag(name: string, fallback: string): string {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? process.argv[i + 1] : fallback;
}

async function modules(side: Side): Promise<Modules> {
  if (side === 'new') {
    const m = kernelModule();
    if (!m) throw new Error('this runtime lacks WebAssembly SIMD or shared memory');
    return { kernels: m, dots: m, codeDots: m };
  }
  const legacy = (await import(pathToFileURL(flag('legacy', '')).href)) as {
    kernelModuleBytes(): Uint8Array<ArrayBuffer>;
    dotModuleBytes(): Uint8Array<ArrayBuffer>;
    codeDotModuleBytes(): Uint8Array<ArrayBuffer>;
  };
  return {
    kernels: new WebAssembly.Module(legacy.kernelModuleBytes()),
    dots: new WebAssembly.Module(legacy.dotModuleBytes()),
    codeDots: new WebAssembly.Module(legacy.codeDotModuleBytes()),
  };
}

/** Documents × stemmed words of the four collections, log(1 + count) weights, f64 values. */
function fixtureMatrix(): CsrMatrix {
  const vocab = new Map<string, number>();
  const indptr = [0];
  const indices: number[] = [];
  const values: number[] = [];
  for (const name of COLLECTIONS) {
    const lines = readFileSync(join(REPO, 'test', 'fixtures', 'corpora', name, 'docs.jsonl'), 'utf8').split('\n');
    for (const line of lines) {
      if (line.trim() === '') continue;
      const counts = new Map<number, number>();
      for (const t of tokenize((JSON.parse(line) as { text: string }).text)) {
        let id = vocab.get(t);
        if (id === undefined) vocab.set(t, (id = vocab.size));
        counts.set(id, (counts.get(id) ?? 0) + 1);
      }
      for (const [id, n] of [...counts].sort((a, b) => a[0] - b[0])) (indices.push(id), values.push(Math.log1p(n)));
      indptr.push(indices.length);
    }
  }
  return { rows: indptr.length - 1, cols: vocab.size, indptr: Int32Array.from(indptr), indices: Int32Array.from(indices), values: Float64Array.from(values) };
}

/** FNV-1a over the bytes of an array: equal hashes for equal bits (as a check, not a proof). */
function hashOf(a: ArrayBufferView): string {
  const b = new Uint8Array(a.buffer, a.byteOffset, a.byteLength);
  let h = 0x811c9dc5;
  for (let i = 0; i < b.length; i++) h = Math.imul(h ^ b[i], 0x01000193);
  return (h >>> 0).toString(16).padStart(8, '0');
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[s.length >> 1] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
}

async function child(side: Side, reps: number): Promise<ChildResult> {
  const mods = await modules(side);
  const m = fixtureMatrix();
  const ms: Record<string, number> = {};
  const hash: Record<string, string> = {};
  const time = (name: string, run: () => ArrayBufferView): void => {
    const t: number[] = [];
    let out: ArrayBufferView | undefined;
    for (let r = 0; r <= reps; r++) {
      const t0 = performance.now();
      out = run();
      if (r > 0) t.push(performance.now() - t0); // the first call warms up
    }
    ms[name] = median(t);
    hash[name] = hashOf(out!);
  };

  // The whole SVD as the index build runs it (one thread).
  time('svd k=100', () => {
    const ex = new WasmExecutor(mods.kernels, new WasmArena());
    const r = randomizedSvd(m, { k: K, executor: ex });
    const all = new Float64Array(r.s.length + r.u.length);
    all.set(r.s);
    all.set(r.u, r.s.length);
    return all;
  });

  // The kernels alone, on one arena (inputs in place, so no copies are timed).
  const arena = new WasmArena();
  const kernels = instantiateKernels(mods.kernels, arena.memory);
  const rnd = createRandom(11);
  const fill = <T extends Float64Array | Float32Array>(a: T): T => {
    for (let i = 0; i < a.length; i++) a[i] = rnd.normal();
    return a;
  };
  const indptr = arena.int32(m.indptr.length);
  indptr.set(m.indptr);
  const indices = arena.int32(m.indices.length);
  indices.set(m.indices);
  const values = arena.float64(m.values.length);
  values.set(m.values);
  const values32 = arena.float32(m.values.length);
  values32.set(m.values);
  const x = fill(arena.float64(m.cols * L));
  const y = arena.float64(m.rows * L);
  time('spmm', () => (kernels.spmm(indptr.byteOffset, indices.byteOffset, values.byteOffset, x.byteOffset, L, y.byteOffset, 0, m.rows, 1), y));
  time('spmm_f32', () => (kernels.spmm_f32(indptr.byteOffset, indices.byteOffset, values32.byteOffset, x.byteOffset, L, y.byteOffset, 0, m.rows, 1), y));
  const rows = 20000;
  const a = fill(arena.float64(rows * L));
  const g = arena.float64(L * L);
  time('cross', () => (kernels.cross(a.byteOffset, a.byteOffset, L, 0, rows, g.byteOffset, 1), g));
  const w = fill(arena.float64(L * L));
  for (let i = 0; i < L; i++) for (let j = 0; j < i; j++) w[i * L + j] = 0;
  const out = arena.float64(rows * L);
  time('times', () => (kernels.times(a.byteOffset, L, w.byteOffset, L, 1, out.byteOffset, 0, rows), out));

  // Search-time kernels, each on its own memory as conceptRows.ts / conceptCodes.ts use them.
  const n = 100000, codesN = 400000;
  const memory = new WebAssembly.Memory({ initial: Math.ceil((n * K * 4 + codesN * K + codesN * 8 + 4096) / 65536), maximum: 4096, shared: true });
  const dots = new WebAssembly.Instance(mods.dots, { env: { memory } }).exports as unknown as { dots(...a: number[]): void };
  const codeDots = new WebAssembly.Instance(mods.codeDots, { env: { memory } }).exports as unknown as { code_dots(...a: number[]): void };
  const q = fill(new Float64Array(memory.buffer, 0, K));
  const q32 = new Float32Array(memory.buffer, 1024, K);
  q32.set(q);
  const scores = new Float64Array(memory.buffer, 2048, codesN);
  const rowsF32 = fill(new Float32Array(memory.buffer, 2048 + codesN * 8, n * K));
  const codes = new Int8Array(memory.buffer, 2048 + codesN * 8 + n * K * 4, codesN * K);
  for (let i = 0; i < codes.length; i++) codes[i] = (rnd.nextUint32() % 255) - 127;
  time('dots', () => (dots.dots(rowsF32.byteOffset, q.byteOffset, K, 0, n, scores.byteOffset), scores.subarray(0, n)));
  time('code_dots', () => (codeDots.code_dots(codes.byteOffset, q32.byteOffset, K, 0, codesN, scores.byteOffset), scores));
  return { ms, hash };
}

function parent(): void {
  const rounds = Number(flag('rounds', '7'));
  const reps = flag('reps', '5');
  console.log(`WebAssembly kernels, old (${flag('legacy-rev', '?')}) vs new (this tree): ${rounds} rounds, each side in its own process per round, alternating`);
  console.log(`${loadavg()[0].toFixed(2)} load average (1 min) at the start; node ${process.version}`);
  const results: Record<Side, ChildResult[]> = { old: [], new: [] };
  for (let r = 0; r < rounds; r++) {
    const order: Side[] = r % 2 === 0 ? ['old', 'new'] : ['new', 'old'];
    for (const side of order) {
      const run = spawnSync(process.execPath, [process.argv[1], '--child', side, '--reps', reps, '--legacy', flag('legacy', '')], { encoding: 'utf8', maxBuffer: 1 << 26 });
      if (run.status !== 0) throw new Error(`the ${side} child failed:\n${run.stderr}`);
      results[side].push(JSON.parse(run.stdout.trim().split('\n').pop()!) as ChildResult);
    }
    process.stderr.write(`round ${r + 1}/${rounds} done\n`);
  }
  const names = Object.keys(results.old[0].ms);
  const fmt = (v: number): string => (v >= 100 ? v.toFixed(0) : v.toFixed(1));
  const spread = (xs: number[]): string => `${fmt(Math.min(...xs))}–${fmt(Math.max(...xs))}`;
  console.log('');
  console.log('| measurement | old median ms (min–max) | new median ms (min–max) | new / old | same bits |');
  console.log('|---|---|---|---|---|');
  let allSame = true;
  for (const name of names) {
    const o = results.old.map((c) => c.ms[name]);
    const nw = results.new.map((c) => c.ms[name]);
    const hashes = new Set([...results.old, ...results.new].map((c) => c.hash[name]));
    allSame &&= hashes.size === 1;
    console.log(`| ${name} | ${fmt(median(o))} (${spread(o)}) | ${fmt(median(nw))} (${spread(nw)}) | ${(median(nw) / median(o)).toFixed(2)} | ${hashes.size === 1 ? 'yes' : 'NO'} |`);
  }
  console.log(`\n${loadavg()[0].toFixed(2)} load average (1 min) at the end`);
  if (!allSame) {
    console.error('The two sides gave different bits.');
    process.exitCode = 1;
  }
}

if (process.argv.includes('--child')) {
  const side = flag('child', 'new') as Side;
  void child(side, Number(flag('reps', '5'))).then((r) => console.log(JSON.stringify(r)));
} else {
  parent();
}
