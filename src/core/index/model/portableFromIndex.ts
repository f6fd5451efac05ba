/**
 * The portable concept model of a locally built index (conceptFile.ts): its pruned vocabulary,
 * global weights, U and Σ, and optionally its files' unit concept vectors. Lets one machine's
 * model be shared like a cluster-built one.
 */
import type { LsiIndex } from '../lsiIndex.js';
import type { PortableModel } from '../persistence/conceptFile.js';

export function portableFromIndex(
  index: LsiIndex,
  options: { withFiles?: boolean; createdAt?: string } = {},
): Omit<PortableModel, 'checksum'> {
  const m = index.model;
  const terms = Array.from(m.keptIds, (id) => index.vocab.termOf(id));
  const slots = index.slots().filter((s) => s !== null);
  const files = options.withFiles ? slots.map((s) => s.meta.path) : [];
  const fileVectors = new Float32Array(files.length * m.k);
  if (options.withFiles) slots.forEach((s, i) => fileVectors.set(index.vectorOf(s.meta.path), i * m.k));
  return {
    createdAt: options.createdAt ?? new Date().toISOString(),
    producer: 'undertone (local index)',
    weighting: m.scheme,
    tokenize: index.settings.tokenize,
    prune: index.settings.prune,
    powerIterations: index.settings.powerIterations,
    oversampling: 0,
    seed: index.settings.seed,
    k: m.k,
    documents: slots.length,
    nonZeros: m.nonZeros,
    frobeniusSquared: m.frobeniusSquared,
    terms,
    weights: m.weights,
    singularValues: m.singularValues,
    termVectors: m.termVectors,
    files,
    fileVectors,
  };
}
