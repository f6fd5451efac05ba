import { describe, expect, it } from 'vitest';
import { buildMapPageData, checkMapSource, pageDataProblems, type MapSource } from '../../../src/core/map/mapData.js';
import { InvalidInputError } from '../../../src/core/errors.js';

function source(overrides: Partial<MapSource> = {}): MapSource {
  return {
    count: 3,
    dimensions: 2,
    vectors: Float32Array.from([1, 0, 0, 1, Math.SQRT1_2, Math.SQRT1_2]),
    paths: ['a.md', 'src/b.ts', 'c.md'],
    tokenCounts: [10, 200, 3000],
    topicIds: [0, 1, -1],
    topicLabels: ['alpha', 'beta'],
    topTerms: [['x', 'y', 'z'], ['y'], []],
    singularValues: Float64Array.from([2, 1, 0.5]),
    k: 2,
    totalEnergy: 6,
    ...overrides,
  };
}

describe('map page data', () => {
  it('copies what the page draws and rounds coordinates', () => {
    const layout = { x: [0.123456789, 1, -1], y: [0, 0.5, 2 / 3] };
    const d = buildMapPageData(source(), { quick: layout, faithful: null }, null, { digits: 3, termsPerFile: 2 });
    expect(d.layouts.quick.x).toEqual([0.123, 1, -1]);
    expect(d.layouts.quick.y[2]).toBe(0.667);
    expect(d.files.topTerms[0]).toEqual(['x', 'y']);
    expect(d.spectrum).toEqual({ singularValues: [2, 1, 0.5], k: 2, totalEnergy: 6 });
    expect(pageDataProblems(JSON.parse(JSON.stringify(d)))).toEqual([]);
  });

  it('names each inconsistency in the index’s input', () => {
    expect(() => checkMapSource(source({ paths: ['a.md'] }))).toThrow(/paths has 1 entries for 3 files/);
    expect(() => checkMapSource(source({ topicIds: [0, 5, -1] }))).toThrow(/topic 5/);
    expect(() => checkMapSource(source({ k: 9 }))).toThrow(InvalidInputError);
    expect(() => buildMapPageData(source(), { quick: { x: [0], y: [0] }, faithful: null })).toThrow(/1 points for 3 files/);
  });

  it('finds damaged page data', () => {
    expect(pageDataProblems(null)).toEqual(['map data is not an object']);
    const d = buildMapPageData(source(), { quick: { x: [0, 1, 2], y: [0, 1, 2] }, faithful: null });
    const broken = { ...d, files: { ...d.files, tokenCounts: [1] } };
    expect(pageDataProblems(broken)).toEqual(['files.tokenCounts does not have 3 entries']);
  });
});
