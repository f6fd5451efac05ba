/**
 * `npm run bench:eigen`: the dense symmetric eigen-decomposition (src/core/matrix/symmetricEigen.ts)
 * against ml-matrix's EigenvalueDecomposition with assumeSymmetric, on seeded random symmetric
 * matrices of the sizes the build meets (the SVD's Rayleigh–Ritz basis l = k + k/2: 300 at k = 200,
 * 434 at the kernel tree's automatic k; 800 for a large map). Calls alternate (ml-matrix, ours,
 * ours, ml-matrix, …) so the load of a shared machine falls on both; one warm-up call of each side
 * first. Prints the median and range of `--reps` calls per side (default 5), and checks that both
 * give the same bits. Options: --sizes 300,434,800, --reps N.
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { symmetricEigen } from '../src/core/matrix/symmetricEigen.js';
import { createRandom } from '../src/core/random.js';

const arg = (name: string, fallback: string): string => {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? process.argv[i + 1] : fallback;
};
const sizes = arg('sizes', '300,434,800').split(',').map(Number);
const reps = Number(arg('reps', '5'));

const median = (xs: number[]): number => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};
const show = (xs: number[]): string => `${median(xs).toFixed(0)} ms (${Math.min(...xs).toFixed(0)}–${Math.max(...xs).toFixed(0)})`;

for (const n of sizes) {
  // A + Aᵀ of a seeded Gaussian A: symmetric, with a spread-out spectrum like a Gram matrix's.
  const rnd = createRandom(n);
  const g = Float64Array.from({ length: n * n }, () => rnd.normal());
  const a = Float64Array.from({ length: n * n }, (_, at) => g[at] + g[(at % n) * n + Math.floor(at / n)]);
  const rows = Array.from({ length: n }, (_, i) => Array.from(a.subarray(i * n, i * n + n)));
  const theirs = (): EigenvalueDecomposition => new EigenvalueDecomposition(new Matrix(rows), { assumeSymmetric: true });
  const ours = (): ReturnType<typeof symmetricEigen> => symmetricEigen(a, n);
  const ref = theirs();
  const got = ours();
  let differing = 0;
  for (let j = 0; j < n; j++) {
    if (ref.realEigenvalues[j] !== got.values[j]) differing++;
    for (let i = 0; i < n; i++) if (ref.eigenvectorMatrix.get(i, j) !== got.vectors[j * n + i]) differing++;
  }
  const times: [number[], number[]] = [[], []];
  for (let r = 0; r < reps; r++) {
    const order = r % 2 === 0 ? [0, 1] : [1, 0];
    for (const side of order) {
      const t = performance.now();
      if (side === 0) theirs();
      else ours();
      times[side].push(performance.now() - t);
    }
  }
  console.log(
    `n = ${n}: ml-matrix ${show(times[0])}, symmetricEigen ${show(times[1])}, ` +
      `${(median(times[0]) / median(times[1])).toFixed(2)}× faster; numbers differing: ${differing}`,
  );
}
