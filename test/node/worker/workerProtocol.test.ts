import { describe, expect, it } from 'vitest';
import { CancelledError } from '../../../src/core/errors.js';
import {
  isHostMessage,
  isWorkerMessage,
  overallPercent,
  REQUEST_TYPES,
  toWireError,
  type BuildStage,
  type RequestMap,
} from '../../../src/node/worker/workerProtocol.js';

describe('protocol message checks', () => {
  it('accepts every request type the map declares, and only those', () => {
    // The list and the type map must agree: a request type missing from REQUEST_TYPES would be dropped by the worker.
    const declared: Record<keyof RequestMap, true> = {
      configure: true,
      load: true,
      checkSaved: true,
      refresh: true,
      build: true,
      update: true,
      search: true,
      nearby: true,
      searchSections: true,
      nearbySections: true,
      translations: true,
      save: true,
      deleteIndex: true,
      lookalikes: true,
      topics: true,
      mapData: true,
      mapQuery: true,
      mapTrail: true,
      suggestLinks: true,
    };
    expect([...REQUEST_TYPES].sort()).toEqual(Object.keys(declared).sort());
    for (const type of REQUEST_TYPES) expect(isHostMessage({ kind: 'request', id: 1, type, params: {} })).toBe(true);
    expect(isHostMessage({ kind: 'request', id: 1, type: 'format-disk', params: {} })).toBe(false);
  });

  it('rejects host messages without a usable id or params', () => {
    expect(isHostMessage({ kind: 'cancel', id: 3 })).toBe(true);
    expect(isHostMessage({ kind: 'cancel', id: -1 })).toBe(false);
    expect(isHostMessage({ kind: 'cancel', id: 1.5 })).toBe(false);
    expect(isHostMessage({ kind: 'request', id: 2, type: 'save' })).toBe(false);
    expect(isHostMessage(null)).toBe(false);
    expect(isHostMessage('save')).toBe(false);
  });

  it('checks worker messages by kind', () => {
    expect(isWorkerMessage({ kind: 'result', id: 1, result: null })).toBe(true);
    expect(isWorkerMessage({ kind: 'result', id: 1 })).toBe(false);
    expect(isWorkerMessage({ kind: 'error', id: 1, error: { kind: 'failed', name: 'E', message: 'm' } })).toBe(true);
    expect(isWorkerMessage({ kind: 'error', id: 1, error: { name: 'E', message: 'm' } })).toBe(false);
    expect(isWorkerMessage({ kind: 'error', id: 1, error: 'boom' })).toBe(false);
    expect(isWorkerMessage({ kind: 'progress', id: 1, progress: { stage: 'read', done: 1, total: 2 } })).toBe(true);
    expect(isWorkerMessage({ kind: 'progress', id: 1, progress: { stage: 'read', done: '1', total: 2 } })).toBe(false);
    expect(isWorkerMessage({ kind: 'hello', id: 1 })).toBe(false);
  });

  it('gives an error its kind and keeps its class name, so the host can tell a cancel from a failure', () => {
    expect(toWireError(new CancelledError())).toEqual({ kind: 'cancelled', name: 'CancelledError', message: 'Cancelled.' });
    expect(toWireError('plain')).toEqual({ kind: 'failed', name: 'Error', message: 'plain' });
  });
});

describe('overallPercent', () => {
  const stages: BuildStage[] = ['scan', 'read', 'matrix', 'svd', 'save'];

  it('runs from 0 to 100 without going back across a whole build', () => {
    const seen: number[] = [];
    for (const stage of stages) for (let done = 0; done <= 4; done++) seen.push(overallPercent({ stage, done, total: 4 }));
    expect(seen[0]).toBe(0);
    expect(seen.at(-1)).toBe(100);
    for (let i = 1; i < seen.length; i++) expect(seen[i]).toBeGreaterThanOrEqual(seen[i - 1]);
  });

  it('clamps odd counts instead of leaving its stage', () => {
    expect(overallPercent({ stage: 'read', done: 9, total: 4 })).toBe(60);
    expect(overallPercent({ stage: 'read', done: 1, total: 0 })).toBe(10);
  });
});
