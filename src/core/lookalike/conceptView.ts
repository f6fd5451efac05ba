/**
 * A coarse concept view of the look-alike finder's term space: how close two files are by their
 * broad topic alone.
 *
 * The finder's L2-normalised TF-IDF rows (termSpace.ts) are reduced to their leading k singular
 * directions (latent semantic analysis, Deerwester et al. 1990, "Indexing by latent semantic
 * analysis"; truncated SVD by randomized subspace iteration, svd/randomizedSvd.ts); each file's
 * concept vector is its row of U·Σ and two files compare by the cosine of those vectors. With a
 * small k the directions are the folder's main areas, so two pages of one area (one template,
 * one family of devices) sit near 1 there, while a pair whose closeness lies in words specific
 * to the two (the same options, the same identifiers told twice) is closer in the full term space
 * than its area explains: retold.ts uses the full cosine minus this one as evidence.
 * Default k = 50 (retoldConceptK in options.ts: chosen with the rule's other constants, leaving
 * one source of test/fixtures/lookalike-retellings out; the other fold chose 100). The clause that
 * uses this view is off by default (options.ts' retoldConceptMinDiff says why); the view is then
 * never built.
 */
import { randomizedSvd } from '../svd/randomizedSvd.js';
import { DEFAULT_SEED } from '../random.js';
import type { TermSpace } from './termSpace.js';

export interface ConceptView {
  /** Concept dimensions actually used (k clamped to the matrix's rank bound). */
  readonly k: number;
  /** Cosine of files a and b in the concept space (0 when either has no concept weight). */
  readonly cosine: (a: number, b: number) => number;
}

/** The k-dimensional concept vectors of a term space's rows (seeded: same space, same view). */
export function conceptView(space: TermSpace, k: number, seed: number = DEFAULT_SEED): ConceptView {
  const n = space.n;
  const cols = space.df.length;
  const rank = Math.min(n, cols, Math.max(1, Math.floor(k)));
  if (n === 0 || cols === 0 || space.terms.length === 0) return { k: 0, cosine: () => 0 };
  const svd = randomizedSvd({ rows: n, cols, indptr: space.rowStart, indices: space.terms, values: space.weights }, { k: rank, seed });
  const kk = svd.k;
  const vec = new Float64Array(n * kk);
  const norm = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let j = 0; j < kk; j++) {
      const x = svd.u[i * kk + j] * svd.s[j];
      vec[i * kk + j] = x;
      s += x * x;
    }
    norm[i] = Math.sqrt(s);
  }
  return {
    k: kk,
    cosine(a, b) {
      if (norm[a] === 0 || norm[b] === 0) return 0;
      let d = 0;
      for (let j = 0; j < kk; j++) d += vec[a * kk + j] * vec[b * kk + j];
      return d / (norm[a] * norm[b]);
    },
  };
}
