/**
 * Error types thrown by the core. Every public function checks its input at the door and throws
 * one of these with a message a person can act on; the core never logs.
 */

/** Base class: every error the core throws on purpose is an UndertoneError. */
export class UndertoneError extends Error {
  constructor(message: string) {
    super(message);
    this.name = new.target.name;
  }
}

/** An argument is malformed (wrong shape, out of range, not finite). */
export class InvalidInputError extends UndertoneError {}

/** Nothing indexable: no documents, or no terms survive vocabulary pruning. */
export class EmptyCorpusError extends UndertoneError {}

/** A query whose terms are all unknown to the index: ranking it would only be noise. */
export class NoKnownTermsError extends UndertoneError {
  constructor(public readonly query: string) {
    super(`None of the words in "${truncate(query, 60)}" occur in the index, so there is nothing to rank by.`);
  }
}

/** A document asked for by id or path is not in the index. */
export class NotIndexedError extends UndertoneError {
  constructor(public readonly key: string) {
    super(`"${key}" is not in the index (excluded, binary, too large, or not indexed yet).`);
  }
}

/** A saved index is damaged, truncated, of another format version, or fails its checksum. */
export class CorruptIndexError extends UndertoneError {}

/** Work stopped because the caller cancelled it. */
export class CancelledError extends UndertoneError {
  constructor() {
    super('Cancelled.');
  }
}

function truncate(s: string, n: number): string {
  return s.length <= n ? s : `${s.slice(0, n - 1)}…`;
}
