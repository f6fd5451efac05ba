import { describe, expect, it } from 'vitest';
import { buildMapPageData } from '../../../src/core/map/mapData.js';
import { isHostToPageMessage, isPageToHostMessage, MAX_QUERY_LENGTH } from '../../../src/core/map/mapMessages.js';

describe('page → host messages', () => {
  it('accepts each well-formed message', () => {
    for (const m of [
      { type: 'ready' },
      { type: 'open', index: 3, path: 'src/a.ts' },
      { type: 'query', requestId: 1, text: 'parse config' },
      { type: 'layoutChanged', layout: 'faithful' },
      { type: 'openSection', point: 2 },
    ]) {
      expect(isPageToHostMessage(m)).toBe(true);
    }
  });

  it('rejects unknown types, wrong field types and oversized queries', () => {
    for (const m of [
      null,
      'ready',
      { type: 'run', command: 'x' },
      { type: 'open', index: -1, path: 'a' },
      { type: 'open', index: 1.5, path: 'a' },
      { type: 'open', index: 1 },
      { type: 'query', requestId: 1, text: 'x'.repeat(MAX_QUERY_LENGTH + 1) },
      { type: 'layoutChanged', layout: 'spiral' },
      { type: 'openSection', point: -1 },
      { type: 'openSection', point: '2' },
    ]) {
      expect(isPageToHostMessage(m)).toBe(false);
    }
  });
});

describe('host → page messages', () => {
  const data = buildMapPageData(
    {
      count: 1,
      dimensions: 1,
      vectors: Float32Array.from([1]),
      paths: ['a.md'],
      tokenCounts: [1],
      topicIds: [-1],
      topicLabels: [],
      topTerms: [[]],
      singularValues: Float64Array.from([1]),
      k: 1,
      totalEnergy: 1,
    },
    { quick: { x: [0], y: [0] }, faithful: null },
  );

  it('accepts init, layout, query answers, selection and theme', () => {
    for (const m of [
      { type: 'init', data },
      { type: 'layout', name: 'faithful', layout: { x: [0], y: [1] } },
      {
        type: 'queryResult',
        requestId: 2,
        text: 'q',
        positions: { quick: { x: 0, y: 1 }, faithful: null },
        neighbours: [0],
        similarities: [0.5],
      },
      { type: 'queryError', requestId: 2, message: 'no known words' },
      { type: 'select', index: null },
      { type: 'theme', kind: 'high-contrast' },
      { type: 'trail', trail: null },
      { type: 'trail', trail: { path: 'a.md', points: [{ title: 'Intro', start: 0, end: 4, quick: { x: 0, y: 1 }, faithful: null }] } },
    ]) {
      expect(isHostToPageMessage(m)).toBe(true);
    }
  });

  it('rejects a trail with a bad point', () => {
    const point = { title: 'Intro', start: 0, end: 4, quick: { x: 0, y: 1 }, faithful: null };
    for (const bad of [
      { ...point, start: -1 },
      { ...point, start: 5 },
      { ...point, quick: null },
      { ...point, title: 3 },
    ]) {
      expect(isHostToPageMessage({ type: 'trail', trail: { path: 'a.md', points: [bad] } })).toBe(false);
    }
    expect(isHostToPageMessage({ type: 'trail', trail: { points: [point] } })).toBe(false);
  });

  it('rejects an init with damaged data and a query answer with mismatched lists', () => {
    expect(isHostToPageMessage({ type: 'init', data: { ...data, version: 2 } })).toBe(false);
    expect(
      isHostToPageMessage({
        type: 'queryResult',
        requestId: 2,
        text: 'q',
        positions: { quick: null, faithful: null },
        neighbours: [0, 1],
        similarities: [0.5],
      }),
    ).toBe(false);
    expect(
      isHostToPageMessage({
        type: 'queryResult',
        requestId: 2,
        text: 'q',
        positions: { quick: { x: 'a', y: 0 }, faithful: null },
        neighbours: [],
        similarities: [],
      }),
    ).toBe(false);
  });
});
