/**
 * Map layout benchmark: times the quick and faithful layouts on random clustered unit vectors
 * (default 50,000 files, 128 concept dimensions, 40 clusters), and exact versus NN-Descent
 * neighbours at a few sizes (time and NN-Descent recall), which sets exactMaxN.
 * Run: npx esbuild bench/mapLayout.bench.ts --bundle --platform=node --format=esm
 *        --outfile=out/bench/mapLayout.mjs && node out/bench/mapLayout.mjs [n] [dim] [layouts-only]
 */
import { createRandom } from '../src/core/random.js';
import { exactNeighbours } from '../src/core/map/exactNeighbours.js';
import { nnDescent } from '../src/core/map/nnDescent.js';
import { quickLayout } from '../src/core/map/quickLayout.js';
import { landmarkIsomap, maxMinLandmarks } from '../src/core/map/landmarkIsomap.js';
import { buildGeodesicGraph } from '../src/core/map/geodesicGraph.js';
import { placeQueryFaithful } from '../src/core/map/placeQuery.js';
import { rowVectors } from '../src/core/map/rowVectors.js';

export function clusteredUnitVectors(n: number, dim: number, clusters: number, spread: number, seed: number): Float32Array {
  const rng = createRandom(seed);
  const centres = new Float64Array(clusters * dim);
  for (let i = 0; i < centres.length; i++) centres[i] = Math.abs(rng.normal());
  const out = new Float32Array(n * dim);
  for (let i = 0; i < n; i++) {
    const c = Math.floor(rng.next() * clusters);
    let s = 0;
    for (let d = 0; d < dim; d++) {
      const v = centres[c * dim + d] + spread * rng.normal();
      out[i * dim + d] = v;
      s += v * v;
    }
    const inv = 1 / Math.sqrt(s);
    for (let d = 0; d < dim; d++) out[i * dim + d] *= inv;
  }
  return out;
}

/** Wall time and this process's CPU time (user + system): on a shared machine CPU time is the steadier figure. */
function time<T>(label: string, f: () => T): T {
  const t0 = performance.now();
  const c0 = process.cpuUsage();
  const r = f();
  const cpu = process.cpuUsage(c0);
  console.log(
    `${label.padEnd(48)} wall ${((performance.now() - t0) / 1000).toFixed(2)} s  cpu ${((cpu.user + cpu.system) / 1e6).toFixed(2)} s`,
  );
  return r;
}

export function runMapLayoutBench(n = 50_000, dim = 128, full = true): void {
  console.log(`map layout bench: n=${n}, dim=${dim}, 40 clusters`);
  for (const size of full ? [2000, 4000, 8000] : []) {
    const v = rowVectors(clusteredUnitVectors(size, dim, 40, 0.6, 7), size, dim);
    const exact = time(`exact neighbours n=${size}`, () => exactNeighbours(v, 10));
    const approx = time(`NN-Descent neighbours n=${size}`, () => nnDescent(v, 10, { seed: 1 }));
    let hit = 0;
    for (let i = 0; i < size; i++) {
      const truth = new Set(Array.from(exact.indices.subarray(i * 10, i * 10 + 10)));
      for (let s = 0; s < 10; s++) if (truth.has(approx.lists.indices[i * 10 + s])) hit++;
    }
    console.log(`  NN-Descent recall@10 ${(hit / (size * 10)).toFixed(4)}, iterations ${approx.iterations}`);
  }
  for (const size of full ? [Math.round(n / 4), Math.round(n / 2)] : []) {
    const d = clusteredUnitVectors(size, dim, 40, 0.6, 11);
    time(`faithful layout n=${size}`, () => landmarkIsomap(d, size, dim, { seed: 3 }));
  }
  const data = clusteredUnitVectors(n, dim, 40, 0.6, 11);
  time(`quick layout n=${n}`, () => quickLayout(data, n, dim));
  const graph = time(`  phase: neighbour graph + bridges n=${n}`, () => buildGeodesicGraph(rowVectors(data, n, dim), { seed: 3 }));
  console.log(
    `    neighbours ${graph.neighbourMethod}, parts ${graph.componentCount}, bridges ${graph.bridges.length}, edges ${graph.graph.targets.length / 2}`,
  );
  time(`  phase: 300 MaxMin landmarks (Dijkstra) n=${n}`, () => maxMinLandmarks(graph, 300, 3));
  const faithful = time(`faithful layout (landmark Isomap) n=${n}`, () => landmarkIsomap(data, n, dim, { seed: 3 }));
  const q = data.slice(5 * dim, 6 * dim);
  time('place one query (faithful)', () => placeQueryFaithful(faithful, q));
}

const invokedDirectly =
  typeof process !== 'undefined' && process.argv[1] !== undefined && /mapLayout(\.bench)?\.m?[jt]s$/.test(process.argv[1]);
if (invokedDirectly)
  runMapLayoutBench(Number(process.argv[2] ?? 50_000), Number(process.argv[3] ?? 128), process.argv[4] !== 'layouts-only');
