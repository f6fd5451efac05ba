/**
 * The errors that cross the worker boundary, in one table. The worker turns anything thrown into a
 * WireError whose `kind` says what the editor should do with it (errorKindOf, by class); the host
 * rebuilds it as a WorkerRequestError carrying that kind, and call sites ask errorKind(err) instead
 * of comparing class names. A new error the editor must treat apart gets a kind here.
 */
import { CancelledError, EmptyCorpusError, NoKnownTermsError, UndertoneError } from '../../core/errors.js';

/** A request needs an index (or a configuration) that does not exist yet. */
export class NoIndexError extends UndertoneError {}

/** The map a page shows was replaced (rebuilt index): the page should ask for the new one. */
export class MapOutdatedError extends UndertoneError {}

/** What the editor does differently for an error; 'failed' is everything else. */
export type ErrorKind = 'cancelled' | 'empty' | 'no-index' | 'no-known-terms' | 'map-outdated' | 'failed';

/** Error classes with a kind of their own. */
const KIND_OF_CLASS: readonly (readonly [abstract new (...args: never[]) => Error, ErrorKind])[] = [
  [CancelledError, 'cancelled'],
  [EmptyCorpusError, 'empty'],
  [NoIndexError, 'no-index'],
  [NoKnownTermsError, 'no-known-terms'],
  [MapOutdatedError, 'map-outdated'],
];

export const ERROR_KINDS: readonly ErrorKind[] = [...KIND_OF_CLASS.map(([, kind]) => kind), 'failed'];

/** An error as it crosses the boundary: its kind, the class name (for the log) and the message. */
export interface WireError {
  readonly kind: ErrorKind;
  readonly name: string;
  readonly message: string;
}

/** A request failed in the worker; `kind` tells the caller what happened, `name` is the worker-side class. */
export class WorkerRequestError extends Error {
  readonly kind: ErrorKind;
  constructor(wire: WireError) {
    super(wire.message);
    this.name = wire.name;
    this.kind = wire.kind;
  }
}

/** The kind of an error thrown on this side of the boundary (by its class). */
export function errorKindOf(err: unknown): ErrorKind {
  for (const [cls, kind] of KIND_OF_CLASS) if (err instanceof cls) return kind;
  return 'failed';
}

/** The kind of any error a request can end with: one from the worker, or one thrown here. */
export function errorKind(err: unknown): ErrorKind {
  return err instanceof WorkerRequestError ? err.kind : errorKindOf(err);
}

/** Turns anything thrown into a WireError. */
export function toWireError(err: unknown): WireError {
  if (err instanceof Error) return { kind: errorKindOf(err), name: err.name, message: err.message };
  return { kind: 'failed', name: 'Error', message: String(err) };
}

/** Checks a WireError's shape at the door. */
export function isWireError(x: unknown): x is WireError {
  if (typeof x !== 'object' || x === null) return false;
  const e = x as Record<string, unknown>;
  return ERROR_KINDS.includes(e.kind as ErrorKind) && typeof e.name === 'string' && typeof e.message === 'string';
}
