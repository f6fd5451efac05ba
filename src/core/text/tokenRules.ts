/**
 * The limits of the tokenizer's keep rule (tokenize.ts step 4), shared by tokenize() and its fast
 * twins for ASCII words (asciiWord.ts, and the tokenizing threads' wordCounter.ts), so the paths
 * cannot drift apart. Common practice, our choice of values.
 */

/** Tokens (and joined compounds) longer than this are dropped. */
export const MAX_TOKEN_LENGTH = 40;
/** Runs of digits longer than this are dropped (numbers, not words). */
export const MAX_DIGIT_RUN = 4;
/** Hex-looking runs ([0-9a-f] with a digit) of at least this length are dropped (hashes, ids). */
export const MIN_HEXISH_LENGTH = 8;
