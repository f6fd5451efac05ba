/**
 * Automatic number of concept dimensions.
 *
 * For n ≥ 1000 files: k = 100 + 100·log10(n/1000), clamped to [100, 300] — 100 at 1k files, 200 at
 * 10k, 300 at 100k, following Deerwester et al. 1990 ("ca. 100"), Berry, Dumais & O'Brien 1995
 * (200–300) and Bradford 2008, CIKM, "An empirical study of required dimensionality for
 * large-scale latent semantic indexing applications" (≈300 at 10⁵ documents; from memory).
 * Below 1000 files a rank near n would reproduce plain term matching, so k shrinks with the
 * collection: k = max(2, round(n / 10 + 2·√n)) (our own rule, common practice of keeping k well
 * below n on small collections), capped at 100.
 * Any k is finally clamped to what the matrix allows: min(files, terms).
 */

export interface ChosenK {
  readonly k: number;
  /** The k asked for (auto or the user's number) before clamping. */
  readonly requested: number;
  /** True when the request exceeded what the matrix allows. */
  readonly clamped: boolean;
}

export function autoK(files: number): number {
  if (files >= 1000) return Math.round(Math.min(300, Math.max(100, 100 + 100 * Math.log10(files / 1000))));
  return Math.min(100, Math.max(2, Math.round(files / 10 + 2 * Math.sqrt(files))));
}

export function chooseK(requested: number | 'auto', files: number, terms: number): ChosenK {
  const want = requested === 'auto' ? autoK(files) : Math.max(1, Math.floor(requested));
  const limit = Math.max(1, Math.min(files, terms));
  return { k: Math.min(want, limit), requested: want, clamped: want > limit };
}
