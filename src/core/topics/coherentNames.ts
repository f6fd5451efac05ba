/**
 * Name terms chosen as a set that occurs together: from a topic's most distinctive terms (the
 * pool, best first; topicNames.ts), the most distinctive is kept, then each next term is the pool
 * term with the largest mean normalised pointwise mutual information (NPMI; Bouma 2009, GSCL)
 * with the terms already chosen, over the workspace's files (a file contains a term or not, as
 * coherence.ts counts). Word sets whose words co-occur are the ones people judge coherent
 * (Newman, Lau, Grieser & Baldwin 2010, "Automatic evaluation of topic coherence", NAACL; Röder,
 * Both & Hinneburg 2015 for NPMI as the measure); the pool keeps every chosen term among the
 * topic's distinctive ones. Ties go to the more distinctive term. The result keeps the pool's
 * order (most distinctive first).
 * The joint count is discounted by one file (absolute discounting, Ney, Essen & Kneser 1994,
 * "On structuring probabilistic dependences in stochastic language modelling", Computer Speech
 * and Language 8; cited from memory): two rare terms that share a single file would otherwise
 * score the top NPMI, and a pair seen together once says little about other files. Measured on
 * the CMake and Django manuals, names chosen on one half of the files and scored on the other
 * (test/core/topics/topicQuality.test.ts): held-out NPMI rose in 6 of 8 cases (both halves, the
 * first two levels; e.g. Django's second level 0.179 → 0.233 and 0.123 → 0.195, CMake's 0.346 →
 * 0.366 and 0.312 → 0.343) and fell by at most 0.013 in the other two.
 * Default pool: twice the terms wanted (our choice, compared with three times on the CMake and
 * Django manuals, each checked with the other held out: test/core/topics/topicQuality.test.ts).
 */
import type { CsrMatrix } from '../matrix/sparse.js';
import { transposeCsr } from '../matrix/sparse.js';
import { NPMI_EPSILON } from './coherence.js';

export const DEFAULT_NAME_POOL_FACTOR = 2;

/** Which files hold each term (the matrix's columns as lists of rows), with a reusable marker. */
export class TermFiles {
  private readonly _byTerm: CsrMatrix;
  private readonly _mark: Uint8Array;
  readonly files: number;

  constructor(a: CsrMatrix) {
    this._byTerm = transposeCsr(a);
    this._mark = new Uint8Array(a.rows);
    this.files = a.rows;
  }

  /** Mean NPMI of each candidate with the chosen terms, greedily: see the header. */
  choose(pool: readonly number[], count: number): number[] {
    if (pool.length <= count) return [...pool];
    const { indptr, indices } = this._byTerm;
    const n = this.files;
    const mark = this._mark;
    const total = new Float64Array(pool.length);
    const taken = new Uint8Array(pool.length);
    let chosen = 0;
    let next = 0;
    while (true) {
      taken[next] = 1;
      chosen++;
      if (chosen >= count) break;
      const t = pool[next];
      for (let p = indptr[t]; p < indptr[t + 1]; p++) mark[indices[p]] = 1;
      const pt = (indptr[t + 1] - indptr[t]) / n;
      let best = -1;
      for (let q = 0; q < pool.length; q++) {
        if (taken[q]) continue;
        const c = pool[q];
        let both = 0;
        for (let p = indptr[c]; p < indptr[c + 1]; p++) both += mark[indices[p]];
        total[q] += npmi(Math.max(0, both - 1) / n, pt, (indptr[c + 1] - indptr[c]) / n);
        if (best < 0 || total[q] > total[best] + 1e-12) best = q;
      }
      for (let p = indptr[t]; p < indptr[t + 1]; p++) mark[indices[p]] = 0;
      next = best;
    }
    return pool.filter((_, q) => taken[q] === 1);
  }
}

/** NPMI from joint and single probabilities (coherence.ts's definition: −1 when never together). */
function npmi(pxy: number, px: number, py: number): number {
  if (px === 0 || py === 0) return 0;
  if (pxy === 0) return -1;
  const p = pxy + NPMI_EPSILON;
  const denom = -Math.log(p);
  return denom > 0 ? Math.log(p / (px * py)) / denom : 1;
}
