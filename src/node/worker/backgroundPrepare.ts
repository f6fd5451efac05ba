/**
 * Background preparation of an index in the worker: LsiIndex.prepare in slices, each started by
 * `pause` (setImmediate in the worker, so waiting messages go first), then a few searches of the
 * index's own words, one per pause: the engine optimises the search loops during the first
 * searches (~50–90 ms each on a large tree), which then no request pays for.
 */
import type { LsiIndex } from '../../core/index/lsiIndex.js';

/** Searches run after preparing, to have the engine optimise the search loops (common practice). */
export const WARM_UP_SEARCHES = 3;

export interface BackgroundPreparation {
  readonly controller: AbortController;
  /** True once prepared and warmed; false when aborted or failed (never rejects). */
  readonly done: Promise<boolean>;
}

/**
 * `after`: starts once it has settled (a reopened index's term lists filled in the background,
 * persist.ts termsFilled: the first slice would otherwise read them all at once, holding the thread).
 */
export function prepareInBackground(
  index: LsiIndex,
  options: { sliceMs: number; pause: () => Promise<void>; after?: Promise<void> },
): BackgroundPreparation {
  const controller = new AbortController();
  const { sliceMs, pause } = options;
  const done = (options.after ? options.after.then(pause) : pause())
    .then(() => index.prepare({ signal: controller.signal, sliceMs, pause }))
    .then(async (ready) => {
      for (let i = 0; ready && i < WARM_UP_SEARCHES && !controller.signal.aborted; i++) {
        await pause();
        warmUp(index, i);
      }
      return ready;
    })
    .catch(() => false);
  return { controller, done };
}

/** One search for a word of the concept space, spread over the kept terms; its answer is not used. */
function warmUp(index: LsiIndex, i: number): void {
  const kept = index.model.keptIds;
  if (kept.length === 0) return;
  try {
    index.search(index.vocab.termOf(kept[Math.floor(((i + 0.5) * kept.length) / WARM_UP_SEARCHES)]), { top: 10 });
  } catch {
    // A word that no longer tokenizes to a known term: nothing to warm with it.
  }
}
