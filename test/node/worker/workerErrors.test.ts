import { describe, expect, it } from 'vitest';
import { CancelledError, CorruptIndexError, EmptyCorpusError, NoKnownTermsError } from '../../../src/core/errors.js';
import {
  ERROR_KINDS,
  errorKind,
  errorKindOf,
  isWireError,
  MapOutdatedError,
  NoIndexError,
  toWireError,
  WorkerRequestError,
} from '../../../src/node/worker/workerErrors.js';

describe('errors across the worker boundary', () => {
  const cases: [Error, string][] = [
    [new CancelledError(), 'cancelled'],
    [new EmptyCorpusError('nothing to index'), 'empty'],
    [new NoIndexError('no index yet'), 'no-index'],
    [new NoKnownTermsError('zzqx'), 'no-known-terms'],
    [new MapOutdatedError('redrawn'), 'map-outdated'],
    [new CorruptIndexError('bad bytes'), 'failed'],
    [new TypeError('boom'), 'failed'],
  ];

  it('gives each error class its kind, and keeps kind, class name and message through the wire', () => {
    for (const [err, kind] of cases) {
      expect(errorKindOf(err)).toBe(kind);
      // Structured clone is what the thread boundary applies to the message.
      const wire = structuredClone(toWireError(err));
      expect(isWireError(wire)).toBe(true);
      const back = new WorkerRequestError(wire);
      expect({ kind: errorKind(back), name: back.name, message: back.message }).toEqual({ kind, name: err.name, message: err.message });
    }
  });

  it('turns a thrown non-error into a failed WireError with its text', () => {
    expect(toWireError('plain text')).toEqual({ kind: 'failed', name: 'Error', message: 'plain text' });
    expect(errorKind('plain text')).toBe('failed');
  });

  it('refuses wire errors with an unknown kind or a missing field', () => {
    expect(ERROR_KINDS).toContain('failed');
    expect(isWireError({ kind: 'exploded', name: 'Error', message: 'x' })).toBe(false);
    expect(isWireError({ name: 'CancelledError', message: 'x' })).toBe(false);
    expect(isWireError({ kind: 'cancelled', name: 'CancelledError' })).toBe(false);
    expect(isWireError(null)).toBe(false);
  });
});
