/**
 * A full garbage collection of this thread's heap, for the index worker once a build's transient
 * memory (the SVD's working blocks and shared memory, the readers' buffers, the counts' copies)
 * is garbage: an idle worker allocates little, so the engine may otherwise keep a hundred MB and
 * more of it resident for hours (measured: bench/workerMemory.bench.ts). The engine exposes its
 * collector only behind a flag; setting the flag at run time and taking `gc` from a new context
 * is common practice (test runners report heap use this way; from memory, not from a source).
 * Returns a no-op where the engine refuses.
 */
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';

export function garbageCollector(): () => void {
  try {
    setFlagsFromString('--expose-gc');
    const gc: unknown = runInNewContext('gc');
    if (typeof gc === 'function') return () => (gc as () => void)();
  } catch {
    // An engine without the flag: nothing to call.
  }
  return () => undefined;
}
