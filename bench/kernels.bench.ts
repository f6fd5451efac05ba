/**
 * `npm run bench:kernels`: the WebAssembly SIMD kernels of this tree against those of an earlier
 * revision (default: the last one with the hand-encoded bytecode kernels), side by side.
 *
 * scripts/bench-kernels.mjs takes the other revision's kernel files out of git, bundles them and
 * runs this file. Each round is a child process (a fresh engine) that instantiates both sides on
 * the same memory and inputs and calls them alternately (old, new, new, old, …: the order flips
 * every call and every round) so that the load of this shared machine falls on both alike. It
 * times:
 *  - the randomized SVD (k = 100, src/core/svd/randomizedSvd.ts on a WasmExecutor) of the
 *    document-term matrix of the four public test collections in test/fixtures/corpora (CISI,
 *    CRAN, CACM, ADI: 6146 documents, stemmed words, log(1 + count) weights);
 *  - each kernel alone: spmm and spmm_f32 (that matrix times a 110-column block), cross (AᵀA of
 *    a 20000 × 110 block), times (that block times an upper-triangular 110 × 110 factor),
 *    dots (100000 f32 rows of 100) and code_dots (400000 rows of 100 8-bit codes),
 * after one warm-up call of each side (the engine's optimising tier), `--reps` calls of each side,
 * with a hash of every output so that the two sides are checked to give the same bits. The parent
 * prints, per measurement and side, the median of all calls of all `--rounds` rounds and their
 * spread (min–max).
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
  /** Milliseconds of every timed call, per measurement and side. */
  ms: Record<string, Record<Side, number[]>>;
  /** Hash of the last output, per measurement and side. */
  hash: Record<string, Record<Side, string>>;
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
      for (const [id, n] of [...counts].sort((a, b) => a[0] - b[0])) {
        indices.push(id);
        values.push(Math.log1p(n));
      }
      indptr.push(indices.length);
    }
  }
  return {
    rows: indptr.length - 1,
    cols: vocab.size,
    indptr: Int32Array.from(indptr),
    indices: Int32Array.from(indices),
    values: Float64Array.from(values),
  };
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

async function child(firstSide: Side, reps: number): Promise<ChildResult> {
  const sides: Record<Side, Modules> = { old: await modules('old'), new: await modules('new') };
  const m = fixtureMatrix();
  const ms: ChildResult['ms'] = {};
  const hash: ChildResult['hash'] = {};
  /** Times run(side) for both sides, alternately; the first call of each side warms up. */
  const time = (name: string, run: (side: Side) => ArrayBufferView): void => {
    ms[name] = { old: [], new: [] };
    hash[name] = { old: '', new: '' };
    for (let r = 0; r <= reps; r++) {
      const order: Side[] = (r % 2 === 0) === (firstSide === 'old') ? ['old', 'new'] : ['new', 'old'];
      for (const side of order) {
        const t0 = performance.now();
        const out = run(side);
        if (r > 0) ms[name][side].push(performance.now() - t0);
        hash[name][side] = hashOf(out);
      }
    }
  };

  // The whole SVD as the index build runs it (one thread), a fresh arena each time.
  time('svd k=100', (side) => {
    const r = randomizedSvd(m, { k: K, executor: new WasmExecutor(sides[side].kernels, new WasmArena()) });
    const all = new Float64Array(r.s.length + r.u.length);
    all.set(r.s);
    all.set(r.u, r.s.length);
    return all;
  });

  // The kernels alone, both sides on one arena (inputs in place, so no copies are timed).
  const arena = new WasmArena();
  const kernels = { old: instantiateKernels(sides.old.kernels, arena.memory), new: instantiateKernels(sides.new.kernels, arena.memory) };
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
  time(
    'spmm',
    (s) => (kernels[s].spmm(indptr.byteOffset, indices.byteOffset, values.byteOffset, x.byteOffset, L, y.byteOffset, 0, m.rows, 1), y),
  );
  time(
    'spmm_f32',
    (s) => (
      kernels[s].spmm_f32(indptr.byteOffset, indices.byteOffset, values32.byteOffset, x.byteOffset, L, y.byteOffset, 0, m.rows, 1),
      y
    ),
  );
  const rows = 20000;
  const a = fill(arena.float64(rows * L));
  const g = arena.float64(L * L);
  time('cross', (s) => (kernels[s].cross(a.byteOffset, a.byteOffset, L, 0, rows, g.byteOffset, 1), g));
  const w = fill(arena.float64(L * L));
  for (let i = 0; i < L; i++) for (let j = 0; j < i; j++) w[i * L + j] = 0;
  const out = arena.float64(rows * L);
  time('times', (s) => (kernels[s].times(a.byteOffset, L, w.byteOffset, L, 1, out.byteOffset, 0, rows), out));

  // Search-time kernels, on a memory of their own as conceptRows.ts / conceptCodes.ts use them.
  const n = 100000,
    codesN = 400000;
  const memory = new WebAssembly.Memory({
    initial: Math.ceil((n * K * 4 + codesN * K + codesN * 8 + 4096) / 65536),
    maximum: 4096,
    shared: true,
  });
  type Search = { dots(...a: number[]): void; code_dots(...a: number[]): void };
  const inst = (mod: WebAssembly.Module): Search => new WebAssembly.Instance(mod, { env: { memory } }).exports as unknown as Search;
  const dots = { old: inst(sides.old.dots), new: inst(sides.new.dots) };
  const codeDots = { old: inst(sides.old.codeDots), new: inst(sides.new.codeDots) };
  const q = fill(new Float64Array(memory.buffer, 0, K));
  const q32 = new Float32Array(memory.buffer, 1024, K);
  q32.set(q);
  const scores = new Float64Array(memory.buffer, 2048, codesN);
  const rowsF32 = fill(new Float32Array(memory.buffer, 2048 + codesN * 8, n * K));
  const codes = new Int8Array(memory.buffer, 2048 + codesN * 8 + n * K * 4, codesN * K);
  for (let i = 0; i < codes.length; i++) codes[i] = (rnd.nextUint32() % 255) - 127;
  time('dots', (s) => (dots[s].dots(rowsF32.byteOffset, q.byteOffset, K, 0, n, scores.byteOffset), scores.subarray(0, n)));
  time('code_dots', (s) => (codeDots[s].code_dots(codes.byteOffset, q32.byteOffset, K, 0, codesN, scores.byteOffset), scores));
  return { ms, hash };
}

function parent(): void {
  const rounds = Number(flag('rounds', '5'));
  const reps = flag('reps', '6');
  console.log(
    `WebAssembly kernels, old (${flag('legacy-rev', '?')}) vs new (this tree): ${rounds} rounds (processes) × ${reps} calls of each side, alternating`,
  );
  console.log(`${loadavg()[0].toFixed(2)} load average (1 min) at the start; node ${process.version}`);
  const results: ChildResult[] = [];
  for (let r = 0; r < rounds; r++) {
    const first: Side = r % 2 === 0 ? 'old' : 'new';
    const run = spawnSync(process.execPath, [process.argv[1], '--child', first, '--reps', reps, '--legacy', flag('legacy', '')], {
      encoding: 'utf8',
      maxBuffer: 1 << 26,
    });
    if (run.status !== 0) throw new Error(`round ${r + 1} failed:\n${run.stderr}`);
    results.push(JSON.parse(run.stdout.trim().split('\n').pop()!) as ChildResult);
    process.stderr.write(`round ${r + 1}/${rounds} done\n`);
  }
  const fmt = (v: number): string => (v >= 100 ? v.toFixed(0) : v.toFixed(1));
  const cell = (xs: number[]): string => `${fmt(median(xs))} (${fmt(Math.min(...xs))}–${fmt(Math.max(...xs))})`;
  console.log('');
  console.log('| measurement | old: median ms (min–max) | new: median ms (min–max) | new / old (medians) | same bits |');
  console.log('|---|---|---|---|---|');
  let allSame = true;
  for (const name of Object.keys(results[0].ms)) {
    const o = results.flatMap((c) => c.ms[name].old);
    const nw = results.flatMap((c) => c.ms[name].new);
    const hashes = new Set(results.flatMap((c) => [c.hash[name].old, c.hash[name].new]));
    allSame &&= hashes.size === 1;
    console.log(`| ${name} | ${cell(o)} | ${cell(nw)} | ${(median(nw) / median(o)).toFixed(2)} | ${hashes.size === 1 ? 'yes' : 'NO'} |`);
  }
  console.log(`\n${loadavg()[0].toFixed(2)} load average (1 min) at the end`);
  if (!allSame) {
    console.error('The two sides gave different bits.');
    process.exitCode = 1;
  }
}

if (process.argv.includes('--child')) {
  void child(flag('child', 'old') as Side, Number(flag('reps', '6'))).then((r) => console.log(JSON.stringify(r)));
} else {
  parent();
}
