/**
 * The largest (algebraic) eigenpairs of a dense symmetric matrix, as classical MDS needs them:
 * Lanczos with full reorthogonalisation (Golub & Van Loan, Matrix Computations, 4th ed., §10.1),
 * Ritz pairs from the small tridiagonal matrix (solved with symmetricEigen.ts), stopping when every wanted
 * pair's residual bound |β_j·s_ji| falls below tolerance·|λ|max. Lanczos converges at both ends of
 * the spectrum, so large negative eigenvalues (non-Euclidean geodesic matrices have them) do not
 * crowd out the positive ones. Matrices up to denseMaxN use that dense solver directly.
 * Sign convention: each eigenvector's largest-magnitude entry is positive.
 */
import { InvalidInputError } from '../errors.js';
import { symmetricEigen } from '../matrix/symmetricEigen.js';
import { createRandom, DEFAULT_SEED } from '../random.js';

export interface TopEigenOptions {
  /** Relative residual tolerance. @default 1e-10 (common practice for double precision) */
  readonly tolerance: number;
  /** Largest size solved densely. @default 64 (common practice) */
  readonly denseMaxN: number;
  readonly seed: number;
}

export const DEFAULT_TOP_EIGEN_OPTIONS: TopEigenOptions = { tolerance: 1e-10, denseMaxN: 64, seed: DEFAULT_SEED };

export interface EigenPairs {
  /** count eigenvalues, largest first. */
  readonly values: Float64Array;
  /** count×n: row i is the unit eigenvector of values[i]. */
  readonly vectors: Float64Array;
}

export function topEigenpairs(a: Float64Array, n: number, count: number, options: Partial<TopEigenOptions> = {}): EigenPairs {
  const opts = { ...DEFAULT_TOP_EIGEN_OPTIONS, ...options };
  if (a.length !== n * n) throw new InvalidInputError(`expected a ${n}×${n} matrix, got ${a.length} numbers`);
  const want = Math.min(count, n);
  const result = n <= opts.denseMaxN ? denseTop(a, n, want) : lanczosTop(a, n, want, opts);
  fixSigns(result.vectors, n, want);
  return result;
}

function denseTop(a: Float64Array, n: number, want: number): EigenPairs {
  const evd = symmetricEigen(a, n);
  const order = Array.from(evd.values, (v, i) => [v, i] as const).sort((x, y) => y[0] - x[0]);
  const values = new Float64Array(want);
  const vectors = new Float64Array(want * n);
  for (let r = 0; r < want; r++) {
    values[r] = order[r][0];
    vectors.set(evd.vectors.subarray(order[r][1] * n, order[r][1] * n + n), r * n);
  }
  return { values, vectors };
}

function lanczosTop(a: Float64Array, n: number, want: number, opts: TopEigenOptions): EigenPairs {
  const rng = createRandom(opts.seed);
  const q = new Float64Array(n * n);
  const alpha: number[] = [];
  const beta: number[] = [];
  const w = new Float64Array(n);
  const minSteps = Math.min(n, Math.max(2 * want + 10, 20));
  const randomStart = (j: number): void => {
    for (let i = 0; i < n; i++) w[i] = rng.normal();
    orthogonalise(w, q, n, j);
    orthogonalise(w, q, n, j);
    scaleInto(q, j * n, w, 1 / norm(w));
  };
  randomStart(0);
  let best: EigenPairs | null = null;
  for (let j = 0; j < n; j++) {
    const qo = j * n;
    for (let r = 0; r < n; r++) {
      let s = 0;
      const ro = r * n;
      for (let c = 0; c < n; c++) s += a[ro + c] * q[qo + c];
      w[r] = s;
    }
    let aj = 0;
    for (let i = 0; i < n; i++) aj += w[i] * q[qo + i];
    alpha.push(aj);
    orthogonalise(w, q, n, j + 1);
    orthogonalise(w, q, n, j + 1);
    const bj = norm(w);
    beta.push(bj);
    const steps = j + 1;
    const scale = Math.max(...alpha.map(Math.abs), ...beta.map(Math.abs), Number.MIN_VALUE);
    const broke = bj <= 1e-13 * scale;
    if (steps >= minSteps && (steps % 5 === 0 || broke || steps === n)) {
      const ritz = ritzPairs(alpha, beta, q, n, want);
      best = ritz.pairs;
      const top = Math.max(...Array.from(ritz.pairs.values, Math.abs), Number.MIN_VALUE);
      if (steps === n || ritz.lastComponents.every((s) => Math.abs(bj * s) <= opts.tolerance * top)) break;
    }
    if (steps === n) break;
    if (broke) {
      beta[j] = 0; // invariant subspace found: continue with a fresh orthogonal direction
      randomStart(j + 1);
    } else {
      scaleInto(q, (j + 1) * n, w, 1 / bj);
    }
  }
  return best ?? ritzPairs(alpha, beta, q, n, want).pairs;
}

function ritzPairs(alpha: number[], beta: number[], q: Float64Array, n: number, want: number) {
  const steps = alpha.length;
  const t = new Float64Array(steps * steps);
  for (let i = 0; i < steps; i++) {
    t[i * steps + i] = alpha[i];
    if (i + 1 < steps) {
      t[i * steps + i + 1] = beta[i];
      t[(i + 1) * steps + i] = beta[i];
    }
  }
  const evd = symmetricEigen(t, steps);
  const order = Array.from(evd.values, (v, i) => [v, i] as const).sort((x, y) => y[0] - x[0]);
  const take = Math.min(want, steps);
  const values = new Float64Array(want);
  const vectors = new Float64Array(want * n);
  const lastComponents: number[] = [];
  for (let r = 0; r < take; r++) {
    const col = order[r][1];
    values[r] = order[r][0];
    lastComponents.push(evd.vectors[col * steps + steps - 1]);
    for (let j = 0; j < steps; j++) {
      const s = evd.vectors[col * steps + j];
      const qo = j * n;
      for (let i = 0; i < n; i++) vectors[r * n + i] += s * q[qo + i];
    }
  }
  return { pairs: { values, vectors }, lastComponents };
}

/** w ← w − Σ_{i<rows} (w·q_i) q_i (one Gram–Schmidt pass; callers run two). */
function orthogonalise(w: Float64Array, q: Float64Array, n: number, rows: number): void {
  for (let r = 0; r < rows; r++) {
    const o = r * n;
    let d = 0;
    for (let i = 0; i < n; i++) d += w[i] * q[o + i];
    for (let i = 0; i < n; i++) w[i] -= d * q[o + i];
  }
}

function norm(w: Float64Array): number {
  let s = 0;
  for (let i = 0; i < w.length; i++) s += w[i] * w[i];
  return Math.sqrt(s);
}

function scaleInto(q: Float64Array, offset: number, w: Float64Array, f: number): void {
  for (let i = 0; i < w.length; i++) q[offset + i] = w[i] * f;
}

function fixSigns(vectors: Float64Array, n: number, count: number): void {
  for (let r = 0; r < count; r++) {
    let big = 0;
    for (let i = 0; i < n; i++) if (Math.abs(vectors[r * n + i]) > Math.abs(big)) big = vectors[r * n + i];
    if (big < 0) for (let i = 0; i < n; i++) vectors[r * n + i] = -vectors[r * n + i];
  }
}
