/**
 * Resource limits of the editor's index worker. A worker thread's young generation (the
 * semi-spaces of V8's scavenger, Ungar 1984) can be capped when it starts; Node's default lets it
 * grow to tens of MB, which stay resident while the editor is open. 6 MB is the young generation
 * that the command line's 2 MB semi-spaces give (scripts/build.mjs); measured in docs/speed-and-memory.md
 * (`npm run bench:worker-memory`).
 */
import type { ResourceLimits, WorkerOptions } from 'node:worker_threads';

export const INDEX_WORKER_LIMITS: Readonly<ResourceLimits> = Object.freeze({ maxYoungGenerationSizeMb: 6 });

/** How the extension starts its index worker (benches that measure the editor start it the same way). */
export function indexWorkerOptions(): WorkerOptions {
  return { name: 'undertone-index', resourceLimits: { ...INDEX_WORKER_LIMITS } };
}
