/**
 * The passage shown beside a word-match result (wordMatchIndex.ts): the window of the file
 * (core/text/passage.ts) holding the largest share of the query's distinct known terms, the
 * query's words marked. Read synchronously, as a word-match answer may be given while the SVD
 * holds the worker's thread (indexService.ts); a handful of files per answer.
 */
import type { DocTerms } from '../../core/counting/termCounts.js';
import { choosePassage, type Passage } from '../../core/text/passage.js';
import { FileReader } from '../parallel/readTextSync.js';
import { decodeUtf8 } from '../scanRead.js';

/** Largest file read for a passage (the worker's default maxFileBytes, 1 MiB). */
const PASSAGE_MAX_BYTES = 1 << 20;
const reader = new FileReader();

/** A file's text, read now (null when it cannot be read as text). */
export function readTextNow(fsPath: string): string | null {
  const got = reader.read(fsPath, PASSAGE_MAX_BYTES);
  return got.kind === 'bytes' ? decodeUtf8(got.bytes) : null;
}

/** The passage of `text` sharing most of the query's terms (ids of `queryTerms`' vocabulary). */
export function wordMatchLine(text: string, queryIds: ArrayLike<number>, termsOf: (text: string) => DocTerms): Passage {
  const wanted = new Set(Array.from(queryIds));
  const wordCache = new Map<string, boolean>();
  return choosePassage(text, {
    score(window) {
      if (wanted.size === 0) return 0;
      let shared = 0;
      for (const t of termsOf(window).termIds) if (wanted.has(t)) shared++;
      return shared / wanted.size;
    },
    isQueryWord(word) {
      const lower = word.toLowerCase();
      let hit = wordCache.get(lower);
      if (hit === undefined) {
        hit = termsOf(lower).termIds.some((t) => wanted.has(t));
        wordCache.set(lower, hit);
      }
      return hit;
    },
  });
}
