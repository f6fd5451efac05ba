/**
 * The trail of a file's sections on the map, on rxjs 7.8.2's sources (npm, Apache-2.0;
 * test/fixtures/rxjs-src): the index's file vectors laid out as the editor's map lays them out
 * (computeMapLayouts), the sections folded by core/sections. References: the existing query
 * placement (projectQuick, placeQueryFaithful) applied to each section's vector on its own, and
 * the geometry of the map (a file's sections sit nearer their own file's dot than the map's files
 * do on average: a property of the placement, not a value fitted here).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { InvalidInputError } from '../../../src/core/errors.js';
import type { LsiIndex } from '../../../src/core/index/lsiIndex.js';
import { computeMapLayouts, type MapLayouts } from '../../../src/core/map/mapLayouts.js';
import { placeQueryFaithful } from '../../../src/core/map/placeQuery.js';
import { projectQuick } from '../../../src/core/map/quickProjection.js';
import { placeSectionTrail } from '../../../src/core/map/sectionTrail.js';
import { foldContextOf, foldSections } from '../../../src/core/sections/sectionVectors.js';
import { buildFixtureIndex, loadRankingFixture } from '../../helpers/rankingChecks.js';

describe('a file’s sections as a trail on the map (rxjs sources)', () => {
  let index: LsiIndex;
  let layouts: MapLayouts;
  let paths: string[];
  beforeAll(() => {
    const fx = loadRankingFixture('rxjs-src');
    index = buildFixtureIndex(fx);
    const ctx = foldContextOf(index);
    for (const d of fx.docs) index.sections.set(d.id, foldSections(ctx, d.id, d.text));
    paths = index.paths();
    const vectors = new Float32Array(paths.length * index.k);
    paths.forEach((p, i) => vectors.set(index.vectorOf(p), i * index.k));
    layouts = computeMapLayouts(vectors, paths.length, index.k, { faithful: { seed: index.settings.seed } });
  });

  it('places every section as the map places a query, in reading order', () => {
    let checked = 0;
    for (const path of paths.slice(0, 25)) {
      const f = index.sections.get(path)!;
      const trail = placeSectionTrail(layouts, f, index.k);
      let at = 0;
      for (let i = 0; i < f.starts.length; i++) {
        const v = f.vectors.subarray(i * index.k, (i + 1) * index.k);
        if (!v.some((x) => x !== 0)) continue; // no known word: no place
        const p = trail[at++];
        expect([p.title, p.start, p.end]).toEqual([f.titles[i], f.starts[i], f.ends[i]]);
        const q = projectQuick(layouts.quick, v);
        expect(p.quick.x).toBeCloseTo(q.x, 9);
        expect(p.quick.y).toBeCloseTo(q.y, 9);
        const g = placeQueryFaithful(layouts.faithful!, v)!;
        expect(p.faithful!.x).toBeCloseTo(g.x, 9);
        expect(p.faithful!.y).toBeCloseTo(g.y, 9);
        checked++;
      }
      expect(at).toBe(trail.length);
      for (let i = 1; i < trail.length; i++) expect(trail[i].start).toBeGreaterThan(trail[i - 1].start);
    }
    expect(checked).toBeGreaterThan(100);
  });

  it('puts a file’s sections nearer its own dot than the map’s files are on average', () => {
    const { x, y } = layouts.faithful!;
    const n = paths.length;
    let nearer = 0;
    let files = 0;
    for (let j = 0; j < n; j += 7) {
      const trail = placeSectionTrail(layouts, index.sections.get(paths[j])!, index.k);
      if (trail.length < 2) continue;
      const own = trail.reduce((s, p) => s + Math.hypot(p.faithful!.x - x[j], p.faithful!.y - y[j]), 0) / trail.length;
      let all = 0;
      for (let i = 0; i < n; i++) all += Math.hypot(x[i] - x[j], y[i] - y[j]);
      if (own < all / n) nearer++;
      files++;
    }
    expect(files).toBeGreaterThan(10);
    expect(nearer / files).toBeGreaterThan(0.8);
  });

  it('leaves out sections without a known word and refuses arrays that disagree', () => {
    const k = index.k;
    const f = index.sections.get(paths[0])!;
    const vectors = new Float32Array(2 * k);
    vectors.set(f.vectors.subarray(0, k), k); // the first section is all zeros
    const trail = placeSectionTrail(layouts, { starts: [0, 5], ends: [5, 9], titles: ['empty', 'kept'], vectors }, k);
    expect(trail.map((p) => p.title)).toEqual(['kept']);
    expect(() => placeSectionTrail(layouts, { starts: [0], ends: [5], titles: ['a'], vectors: new Float32Array(k + 1) }, k)).toThrow(
      InvalidInputError,
    );
  });
});
