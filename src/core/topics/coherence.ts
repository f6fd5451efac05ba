/**
 * Topic coherence by normalised pointwise mutual information (NPMI; Bouma 2009, "Normalized
 * (pointwise) mutual information in collocation extraction", GSCL), averaged over every pair of a
 * topic's top terms: the C_NPMI measure of Röder, Both & Hinneburg 2015 ("Exploring the space of
 * topic coherence measures", WSDM), with its one-one segmentation and arithmetic mean.
 *   NPMI(a, b) = ln((P(a,b) + ε) / (P(a)·P(b))) / −ln(P(a,b) + ε),  ε = 10⁻¹² (Röder et al.)
 * Probabilities are estimated over whole documents (boolean document, P_bd in Röder et al.; their
 * C_NPMI uses a 10-word sliding window instead, which needs the word order this index does not
 * keep): P(a) = files containing a / all files. A pair that never co-occurs scores −1, a term in
 * no file makes the pair score 0 (it says nothing).
 * 1 = the terms always occur together, 0 = independent, −1 = never together.
 */
import type { CsrMatrix } from '../matrix/sparse.js';

export const NPMI_EPSILON = 1e-12;

/**
 * Mean NPMI of each term set (columns of a file × term matrix; any non-zero entry counts as the
 * term occurring in the file). A set with fewer than two terms scores NaN.
 */
export function npmiCoherence(a: CsrMatrix, termSets: readonly (readonly number[])[]): number[] {
  const wanted = new Map<number, number[]>();
  for (const set of termSets) for (const c of set) wanted.set(c, []);
  for (let r = 0; r < a.rows; r++) {
    for (let p = a.indptr[r]; p < a.indptr[r + 1]; p++) {
      if (a.values[p] === 0) continue;
      wanted.get(a.indices[p])?.push(r);
    }
  }
  const n = a.rows;
  return termSets.map((set) => {
    const terms = [...new Set(set)];
    if (terms.length < 2) return NaN;
    let total = 0;
    let pairs = 0;
    for (let i = 0; i < terms.length; i++) {
      for (let j = i + 1; j < terms.length; j++) {
        total += npmiPair(wanted.get(terms[i])!, wanted.get(terms[j])!, n);
        pairs++;
      }
    }
    return total / pairs;
  });
}

/** NPMI of two sorted row lists over n documents. */
export function npmiPair(x: readonly number[], y: readonly number[], n: number): number {
  if (x.length === 0 || y.length === 0 || n === 0) return 0;
  let both = 0;
  for (let i = 0, j = 0; i < x.length && j < y.length;) {
    if (x[i] === y[j]) {
      both++;
      i++;
      j++;
    } else if (x[i] < y[j]) i++;
    else j++;
  }
  const pxy = both / n + NPMI_EPSILON;
  const px = x.length / n;
  const py = y.length / n;
  if (both === 0) return -1;
  const denom = -Math.log(pxy);
  return denom > 0 ? Math.log(pxy / (px * py)) / denom : 1;
}
