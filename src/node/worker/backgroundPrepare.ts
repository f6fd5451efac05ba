/**
 * Background preparation of an index in the worker: LsiIndex.prepare in slices, each started by
 * `pause` (setImmediate in the worker, so waiting messages go first), then a few searches of the
 * index's own words, one per pause: the engine optimises the search loops during the first
 * searches (~50–90 ms each on a large tree), which then no request pays for. Then, given a way
 * to read files, a few rehearsed fold-ins of indexed files (LsiIndex.rehearseFold: nothing kept),
 * so the engine has optimised the fold's code before a person's first save: on the Linux tree's
 * saved index the session's first fold-in took 45–58 ms without them and 22–34 ms after 4–12
 * (docs/speed-and-memory.md).
 */
import type { LsiIndex } from '../../core/index/lsiIndex.js';

/** Searches run after preparing, to have the engine optimise the search loops (common practice). */
export const WARM_UP_SEARCHES = 3;

/** Files whose fold-in is rehearsed after the warm-up searches (our choice: 4 and 12 measured alike). */
export const WARM_UP_FOLDS = 8;

/** Largest file rehearsed (bytes; a rehearsal holds the thread about 0.5 ms per KB). */
export const WARM_UP_FOLD_MAX_BYTES = 64 * 1024;

/** Reads an indexed file's text by its index path (null when it cannot be read as text). */
export type ReadIndexedText = (path: string) => Promise<string | null>;

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
  options: { sliceMs: number; pause: () => Promise<void>; after?: Promise<void>; readText?: ReadIndexedText },
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
      if (ready && options.readText) await rehearseFolds(index, options.readText, { pause, signal: controller.signal });
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

/**
 * Rehearses the fold-in of up to `count` indexed files of at most WARM_UP_FOLD_MAX_BYTES, spread
 * over the index's paths, one per pause; returns how many were rehearsed. A file that cannot be
 * read is passed over.
 */
export async function rehearseFolds(
  index: LsiIndex,
  readText: ReadIndexedText,
  options: { count?: number; pause?: () => Promise<void>; signal?: AbortSignal } = {},
): Promise<number> {
  const { count = WARM_UP_FOLDS, pause, signal } = options;
  const paths = index.paths();
  const tries = Math.min(paths.length, 4 * count);
  let done = 0;
  for (let i = 0; i < tries && done < count; i++) {
    const path = paths[Math.floor(((i + 0.5) * paths.length) / tries)];
    const meta = index.meta(path);
    if (!meta || meta.size > WARM_UP_FOLD_MAX_BYTES) continue;
    const text = await readText(path).catch(() => null);
    if (signal?.aborted) break;
    if (text === null || !index.has(path)) continue;
    await pause?.();
    if (signal?.aborted) break;
    index.rehearseFold(meta, text);
    done++;
  }
  return done;
}
