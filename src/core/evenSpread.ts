/**
 * Evenly spread picks: which of n items to visit when only `budget` may be (reading a sample of
 * files for word spellings, in the worker and the command line alike).
 */

/** All of 0…n−1 when n ≤ budget, else budget indices spread evenly (first and last included). */
export function evenSpread(n: number, budget: number): number[] {
  if (n <= budget) return Array.from({ length: n }, (_, i) => i);
  if (budget <= 0) return [];
  if (budget === 1) return [0];
  return Array.from({ length: budget }, (_, i) => Math.round((i * (n - 1)) / (budget - 1)));
}
