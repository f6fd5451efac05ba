/**
 * Random-hyperplane signatures (Charikar 2002, STOC, "Similarity estimation techniques from
 * rounding algorithms"): bit j of vector v is [g_j · v ≥ 0] for a Gaussian direction g_j, and two
 * vectors at angle θ agree on a bit with probability 1 − θ/π. Bits are packed into bands of
 * `bitsPerBand` (≤ 32) bits, one 32-bit word per band, ready for banding.ts with rows = 1: a pair
 * at cosine c becomes a candidate with probability 1 − (1 − (1 − arccos(c)/π)^bitsPerBand)^bands.
 *
 * Gaussian directions come from createRandom(seed).normal() (Box–Muller), so a seed fixes them.
 */
import { InvalidInputError } from '../errors.js';
import { createRandom } from '../random.js';

export interface SimhashParams {
  readonly bands: number;
  readonly bitsPerBand: number;
  readonly seed: number;
}

/** Per-row agreement probability of one hyperplane bit at cosine c: 1 − arccos(c)/π. */
export function hyperplaneAgreement(cosine: number): number {
  return 1 - Math.acos(Math.max(-1, Math.min(1, cosine))) / Math.PI;
}

/**
 * Band words for `items` vectors of `dims` numbers stored row-major in `vectors`; only rows listed
 * in `rowsToSign` are signed (result row t belongs to vector rowsToSign[t]). Returns
 * rowsToSign.length × bands words.
 */
export function simhashBands(vectors: Float32Array, dims: number, rowsToSign: Int32Array, params: SimhashParams): Uint32Array {
  const { bands, bitsPerBand, seed } = params;
  if (!Number.isInteger(bitsPerBand) || bitsPerBand < 1 || bitsPerBand > 32) {
    throw new InvalidInputError(`bits per band must be a whole number from 1 to 32, got ${bitsPerBand}`);
  }
  if (!Number.isInteger(bands) || bands < 1) throw new InvalidInputError(`SimHash needs at least one band, got ${bands}`);
  const planes = bands * bitsPerBand;
  const rng = createRandom(seed);
  const g = new Float64Array(planes * dims);
  for (let p = 0; p < g.length; p++) g[p] = rng.normal();
  const out = new Uint32Array(rowsToSign.length * bands);
  for (let t = 0; t < rowsToSign.length; t++) {
    const vo = rowsToSign[t] * dims;
    for (let band = 0; band < bands; band++) {
      let wordBits = 0;
      for (let bit = 0; bit < bitsPerBand; bit++) {
        const go = (band * bitsPerBand + bit) * dims;
        let dot = 0;
        for (let d = 0; d < dims; d++) dot += g[go + d] * vectors[vo + d];
        if (dot >= 0) wordBits |= 1 << bit;
      }
      out[t * bands + band] = wordBits >>> 0;
    }
  }
  return out;
}
