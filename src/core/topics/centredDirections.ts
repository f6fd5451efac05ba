/**
 * The files' unit concept vectors with the collection's mean taken out, each row re-normalised:
 * the space the topic tree's first level is clustered in (topics.ts, centreFirstLevel).
 * Every file of a collection shares its mean direction (on the CMake, Django, Erlang/OTP and
 * Sphinx manuals the mean of the unit vectors has length 0.31–0.42), so cosines between the raw
 * vectors partly measure how typical two files are; after the mean is removed they compare what
 * sets each file apart from the collection. Clustering centred data is the setting in which
 * k-means relates to principal component analysis (Ding & He 2004, "K-means clustering via
 * principal component analysis", ICML; from memory); spherical k-means (Dhillon & Modha 2001)
 * then runs on the re-normalised rows. A file that equals the mean has no direction left and stays a
 * zero row (the tree's loose-file rule sets such a file apart anyway: it is no closer to its
 * topic than to the workspace's centre).
 * Measured (2026-12-03, seeds 0–9, scripts/fixtures/topicLeaveOneOut.ts, NMI of the first level
 * with the top-level folders against scikit-learn's KMeans on the uncentred vectors at the same
 * count): CMake 0.406 (0.395 uncentred) vs 0.402, Django 0.366 (0.372) vs 0.354, Erlang/OTP 0.484
 * (0.484) vs 0.475, Sphinx 0.421 (0.415) vs 0.381; every fold of a leave-one-collection-out
 * choice between centred and uncentred chose centred at the first level. But the second level
 * moves too (topicQuality.test.ts): Erlang/OTP 0.527 against flat k-means' 0.580 (0.539 uncentred)
 * and against scikit-learn's BisectingKMeans' 0.543 (uncentred 0.539 vs 0.541), CMake 0.424
 * (0.419), Django 0.360 (0.368); names held out: Django 0.315 (0.349), Erlang 0.446 (0.503) at the
 * first level. Chosen on both levels, the fold that leaves CMake out keeps the uncentred level, so
 * this is an option (topics.ts, centreFirstLevel), not the default. Cost: one pass over the vectors (n·dims);
 * the kernel's Documentation folder's whole tree took 3.9 s CPU against 4.4 s uncentred (medians of
 * six alternating runs, load 6–9, bench/topicTree.bench.ts).
 * No parameters: the whole mean is removed (no share of it is tuned).
 */

/** points: n × dims, row-major. Returns a new n × dims array of unit (or zero) rows. */
export function centredDirections(points: Float64Array, n: number, dims: number): Float64Array {
  const mean = new Float64Array(dims);
  for (let i = 0; i < n; i++) for (let c = 0; c < dims; c++) mean[c] += points[i * dims + c];
  for (let c = 0; c < dims; c++) mean[c] /= Math.max(1, n);
  const out = new Float64Array(n * dims);
  for (let i = 0; i < n; i++) {
    let ss = 0;
    for (let c = 0; c < dims; c++) {
      const v = points[i * dims + c] - mean[c];
      out[i * dims + c] = v;
      ss += v * v;
    }
    // Rounding leaves a file at the mean a few ulps from zero: treat it as the zero it is.
    if (!(ss > 1e-24)) out.fill(0, i * dims, (i + 1) * dims);
    else for (let c = 0, inv = 1 / Math.sqrt(ss); c < dims; c++) out[i * dims + c] *= inv;
  }
  return out;
}
