/**
 * All eigenvalues and eigenvectors of a dense symmetric n × n matrix: Householder reduction to
 * tridiagonal form, then the implicit QL algorithm with Wilkinson's shift (Bowdler, Martin, Reinsch
 * & Wilkinson 1968, "The QR and QL algorithms for symmetric matrices", Numer. Math. 11; Martin,
 * Reinsch & Wilkinson 1968, "Householder's tridiagonalization of a symmetric matrix", Numer. Math.
 * 11; EISPACK's tred2/tql2 as the public-domain JAMA library gives them). The operations, and
 * their order, are those of ml-matrix's EigenvalueDecomposition for a symmetric matrix, so the
 * results are bit for bit the same; only the storage differs: one flat Float64Array with each
 * eigenvector as a row (the inner loops of both steps then read consecutive memory), where
 * ml-matrix reads and writes through Matrix.get and Matrix.set on an array of rows. O(n³) time
 * (about 4n³/3 for the reduction, about 3n³ for the rotations), n² + 2n numbers of memory.
 * No options: the convergence test is JAMA's (|e| ≤ ε·max(|d| + |e|)).
 */
import { InvalidInputError } from '../errors.js';

export interface SymmetricEigen {
  readonly n: number;
  /** The n eigenvalues, ascending. */
  readonly values: Float64Array;
  /** Row-major n × n: row i is the unit eigenvector of values[i]. */
  readonly vectors: Float64Array;
}

/**
 * Eigen-decomposition of the symmetric matrix a (row-major n × n; read as ml-matrix reads it with
 * assumeSymmetric, so a slightly asymmetric input gives ml-matrix's answer too). a is not changed.
 */
export function symmetricEigen(a: ArrayLike<number>, n: number): SymmetricEigen {
  if (!Number.isInteger(n) || n < 1) throw new InvalidInputError(`symmetricEigen: n must be a positive integer (got ${n})`);
  if (a.length < n * n) throw new InvalidInputError(`symmetricEigen: ${n} × ${n} needs ${n * n} entries (got ${a.length})`);
  // w[r·n + c] is ml-matrix's transposed working matrix: w(j, i) holds the logical V(i, j).
  const w = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) w[j * n + i] = a[i * n + j];
  const d = new Float64Array(n);
  const e = new Float64Array(n);
  tridiagonalize(n, e, d, w);
  diagonalize(n, e, d, w);
  return { n, values: d, vectors: w };
}

/** Householder reduction of w to tridiagonal form (d, e), accumulating the transformations in w. */
function tridiagonalize(n: number, e: Float64Array, d: Float64Array, w: Float64Array): void {
  let f: number, g: number, h: number, hh: number, scale: number;
  for (let j = 0; j < n; j++) d[j] = w[j * n + n - 1];
  for (let i = n - 1; i > 0; i--) {
    scale = 0;
    h = 0;
    for (let k = 0; k < i; k++) scale = scale + Math.abs(d[k]);
    if (scale === 0) {
      e[i] = d[i - 1];
      for (let j = 0; j < i; j++) {
        d[j] = w[j * n + i - 1];
        w[j * n + i] = 0;
        w[i * n + j] = 0;
      }
    } else {
      for (let k = 0; k < i; k++) {
        d[k] /= scale;
        h += d[k] * d[k];
      }
      f = d[i - 1];
      g = Math.sqrt(h);
      if (f > 0) g = -g;
      e[i] = scale * g;
      h = h - f * g;
      d[i - 1] = f - g;
      for (let j = 0; j < i; j++) e[j] = 0;
      for (let j = 0; j < i; j++) {
        const row = j * n;
        f = d[j];
        w[i * n + j] = f;
        g = e[j] + w[row + j] * f;
        for (let k = j + 1; k <= i - 1; k++) {
          g += w[row + k] * d[k];
          e[k] += w[row + k] * f;
        }
        e[j] = g;
      }
      f = 0;
      for (let j = 0; j < i; j++) {
        e[j] /= h;
        f += e[j] * d[j];
      }
      hh = f / (h + h);
      for (let j = 0; j < i; j++) e[j] -= hh * d[j];
      for (let j = 0; j < i; j++) {
        const row = j * n;
        f = d[j];
        g = e[j];
        for (let k = j; k <= i - 1; k++) w[row + k] = w[row + k] - (f * e[k] + g * d[k]);
        d[j] = w[row + i - 1];
        w[row + i] = 0;
      }
    }
    d[i] = h;
  }
  for (let i = 0; i < n - 1; i++) {
    const next = (i + 1) * n;
    w[i * n + n - 1] = w[i * n + i];
    w[i * n + i] = 1;
    h = d[i + 1];
    if (h !== 0) {
      for (let k = 0; k <= i; k++) d[k] = w[next + k] / h;
      for (let j = 0; j <= i; j++) {
        const row = j * n;
        g = 0;
        for (let k = 0; k <= i; k++) g += w[next + k] * w[row + k];
        for (let k = 0; k <= i; k++) w[row + k] = w[row + k] - g * d[k];
      }
    }
    for (let k = 0; k <= i; k++) w[next + k] = 0;
  }
  for (let j = 0; j < n; j++) {
    d[j] = w[j * n + n - 1];
    w[j * n + n - 1] = 0;
  }
  w[(n - 1) * n + n - 1] = 1;
  e[0] = 0;
}

/** Implicit QL iterations on the tridiagonal (d, e), rotating the rows of w; then sorts ascending. */
function diagonalize(n: number, e: Float64Array, d: Float64Array, w: Float64Array): void {
  let g: number, h: number, p: number, r: number, dl1: number, c: number, c2: number, c3: number, el1: number, s: number, s2: number;
  for (let i = 1; i < n; i++) e[i - 1] = e[i];
  e[n - 1] = 0;
  let f = 0;
  let tst1 = 0;
  const eps = Number.EPSILON;
  for (let l = 0; l < n; l++) {
    tst1 = Math.max(tst1, Math.abs(d[l]) + Math.abs(e[l]));
    let m = l;
    while (m < n) {
      if (Math.abs(e[m]) <= eps * tst1) break;
      m++;
    }
    if (m > l) {
      do {
        g = d[l];
        p = (d[l + 1] - g) / (2 * e[l]);
        r = hypotenuse(p, 1);
        if (p < 0) r = -r;
        d[l] = e[l] / (p + r);
        d[l + 1] = e[l] * (p + r);
        dl1 = d[l + 1];
        h = g - d[l];
        for (let i = l + 2; i < n; i++) d[i] -= h;
        f = f + h;
        p = d[m];
        c = 1;
        c2 = c;
        c3 = c;
        el1 = e[l + 1];
        s = 0;
        s2 = 0;
        for (let i = m - 1; i >= l; i--) {
          c3 = c2;
          c2 = c;
          s2 = s;
          g = c * e[i];
          h = c * p;
          r = hypotenuse(p, e[i]);
          e[i + 1] = s * r;
          s = e[i] / r;
          c = p / r;
          p = c * d[i] - s * g;
          d[i + 1] = h + s * (c * g + s * d[i]);
          const lo = i * n;
          const hi = lo + n;
          for (let k = 0; k < n; k++) {
            h = w[hi + k];
            w[hi + k] = s * w[lo + k] + c * h;
            w[lo + k] = c * w[lo + k] - s * h;
          }
        }
        p = (-s * s2 * c3 * el1 * e[l]) / dl1;
        e[l] = s * p;
        d[l] = c * p;
      } while (Math.abs(e[l]) > eps * tst1);
    }
    d[l] = d[l] + f;
    e[l] = 0;
  }
  for (let i = 0; i < n - 1; i++) {
    let k = i;
    p = d[i];
    for (let j = i + 1; j < n; j++) {
      if (d[j] < p) {
        k = j;
        p = d[j];
      }
    }
    if (k !== i) {
      d[k] = d[i];
      d[i] = p;
      const a = i * n;
      const b = k * n;
      for (let j = 0; j < n; j++) {
        p = w[a + j];
        w[a + j] = w[b + j];
        w[b + j] = p;
      }
    }
  }
}

/** √(a² + b²) without overflow, as JAMA (and ml-matrix) compute it. */
function hypotenuse(a: number, b: number): number {
  let r: number;
  if (Math.abs(a) > Math.abs(b)) {
    r = b / a;
    return Math.abs(a) * Math.sqrt(1 + r * r);
  }
  if (b !== 0) {
    r = a / b;
    return Math.abs(b) * Math.sqrt(1 + r * r);
  }
  return 0;
}
