/**
 * A full garbage collection on this thread, for the few points where the build lets go of a large
 * block that only a collection frees: a WebAssembly memory the threads shared (its pages stay
 * resident until this thread's last reference to it is collected, and a synchronous build gives
 * the collector no idle time). Uses `gc` when node runs with --expose-gc, else turns that flag on
 * once (v8.setFlagsFromString) and takes `gc` from a fresh context (node's documented way to reach
 * it at run time). Returns false when no collector could be reached.
 */
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';

/** V8's gc(): a full collection, or a young-generation one with { type: 'minor' }. */
type Collect = (options?: { type: 'minor' | 'major' }) => void;

let collect: Collect | null | undefined;

export function collectGarbage(): boolean {
  if (collect === undefined) {
    const own = (globalThis as { gc?: Collect }).gc;
    if (typeof own === 'function') collect = own;
    else {
      try {
        setFlagsFromString('--expose-gc');
        const fn: unknown = runInNewContext('gc');
        collect = typeof fn === 'function' ? (fn as Collect) : null;
      } catch {
        collect = null;
      }
    }
  }
  if (!collect) return false;
  // A full collection finds the array buffers unreachable; their memory is freed when the sweep
  // that follows has finished, which a young-generation collection after it makes sure of
  // (measured: a full collection alone sometimes left a dropped 100 MB shared memory resident;
  // a second full one took a few times as long as the young one).
  collect();
  collect({ type: 'minor' });
  return true;
}
