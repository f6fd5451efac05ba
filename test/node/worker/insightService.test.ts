/**
 * The worker's insight requests on the demo workspace (invented data; its answer key is
 * demo/expectations.json, written with the workspace): look-alikes against the planted copies,
 * topics as a partition of the files with readable words, the concept map's data and query
 * placement against a brute-force cosine ranking, and the "why" of search and nearby results
 * against the scores the ranking itself reports (the shares must add up to them).
 */
import { cpSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { appendFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { pageDataProblems } from '../../../src/core/map/mapData.js';
import { stemWord } from '../../../src/core/text/tokenize.js';
import { IndexService } from '../../../src/node/worker/indexService.js';
import type { FileRef } from '../../../src/node/worker/workerProtocol.js';
import type { TopicWire } from '../../../src/node/worker/insightProtocol.js';
import type { HandlerContext } from '../../../src/node/worker/server.js';
import { REPO_ROOT } from '../../helpers/shared.js';
import { workerConfig } from './fixtures/workerConfig.js';

interface Expectations {
  topics: { name: string; files: string[] }[];
  exactCopies: string[][];
  nearCopies: string[][];
}
const expectations = JSON.parse(readFileSync(join(REPO_ROOT, 'demo', 'expectations.json'), 'utf8')) as Expectations;

const tmp = mkdtempSync(join(tmpdir(), 'undertone-insights-'));
const folder = join(tmp, 'ferry');
const service = new IndexService({ saveDelayMs: 60_000 });
const h = service.handlers();
const ctx: HandlerContext = { signal: new AbortController().signal, isCancelled: () => false, progress: () => undefined };
const config = workerConfig({
  roots: [{ name: 'ferry', fsPath: folder, exclude: [] }],
  indexFile: join(tmp, 'storage', 'index.undertone'),
});

beforeAll(async () => {
  cpSync(join(REPO_ROOT, 'demo', 'workspace'), folder, { recursive: true });
  await h.configure({ config }, ctx);
  await h.build({}, ctx);
});

afterAll(() => rmSync(tmp, { recursive: true, force: true }));

const keys = (refs: readonly FileRef[]) => refs.map((r) => r.key);

describe('topic tree after a build', () => {
  it('is not computed in the background (it waits for the Topics view or the map), then computed once and shared by later requests', async () => {
    expect(await service.preparing).not.toBe(false);
    expect(service.topicsStarted()).toBe(false);
    const first = h.topics({}, ctx);
    expect(service.topicsStarted()).toBe(true);
    expect(await h.topics({}, ctx)).toBe(await first);
  });
});

describe('look-alikes request', () => {
  it('finds every planted exact copy as an exact pair, and every file of each planted near-copy group paired with another (demo answer key)', async () => {
    const r = await h.lookalikes({ threshold: 0.8 }, ctx);
    const pairsOf = (kind: string) =>
      r.groups.filter((g) => g.kind === kind).flatMap((g) => g.pairs.map((p) => [p.a.key, p.b.key].sort().join(' + ')));
    for (const [a, b] of expectations.exactCopies) expect(pairsOf('exact')).toContain([a, b].sort().join(' + '));
    // Pairs, never chained groups: each planted file has a near or partial partner inside its group.
    const copyPairs = r.groups.filter((g) => g.kind === 'near' || g.kind === 'partial').map((g) => keys(g.files));
    for (const planted of expectations.nearCopies) {
      for (const f of planted)
        expect(copyPairs.some(([a, b]) => (a === f && planted.includes(b)) || (b === f && planted.includes(a)))).toBe(true);
    }
    for (const g of r.groups) {
      for (const p of g.pairs) {
        expect(existsSync(p.a.fsPath) && existsSync(p.b.fsPath)).toBe(true);
        if (g.kind === 'near') expect(p.jaccard).toBeGreaterThanOrEqual(0.8);
        if (g.kind === 'partial') expect(p.jaccard).toBeGreaterThanOrEqual(0.2);
        if (g.kind === 'retold') expect(p.jaccard).toBeLessThan(0.15);
      }
    }
    expect(r.unreadable).toBe(0);
  });

  it('answers from its cache until the index changes, then computes again', async () => {
    const params = { threshold: 0.8 };
    const first = await h.lookalikes(params, ctx);
    expect(await h.lookalikes(params, ctx)).toBe(first);
    expect(await h.lookalikes({ ...params, threshold: 0.9 }, ctx)).not.toBe(first);
    const [a, b] = expectations.exactCopies[0];
    await appendFile(join(folder, b), '\n// a local change that makes the copy differ\n');
    await h.update({ changes: [{ kind: 'changed', fsPath: join(folder, b) }] }, ctx);
    const after = await h.lookalikes(params, ctx);
    expect(after).not.toBe(first);
    const exact = after.groups.filter((g) => g.kind === 'exact').flatMap((g) => g.pairs.map((p) => [p.a.key, p.b.key].sort().join(' + ')));
    expect(exact).not.toContain([a, b].sort().join(' + '));
  });
});

describe('topics request', () => {
  it('puts every indexed file in exactly one topic, among the loose files or among the unplaced', async () => {
    const r = await h.topics({}, ctx);
    expect(r.topics.length).toBeGreaterThan(1);
    const leaves = (ts: readonly TopicWire[]): TopicWire[] => ts.flatMap((t) => (t.children.length > 0 ? leaves(t.children) : [t]));
    const listed = [...leaves(r.topics).flatMap((t) => keys(t.files)), ...keys(r.loose), ...keys(r.unplaced)];
    expect(leaves(r.topics).every((t) => t.moreFiles === 0)).toBe(true);
    expect(new Set(listed).size).toBe(listed.length);
    expect([...listed].sort()).toEqual(service.index!.paths().sort());
    for (const t of leaves(r.topics)) expect(t.files.length).toBe(t.size);
    expect(r.looseCount).toBe(r.loose.length);
  });

  it('says which topics hold the files of a folder, and refuses a folder outside the workspace', async () => {
    const r = await h.topics({ folder: join(folder, 'notes') }, ctx);
    const inNotes = service.index!.paths().filter((p) => p.startsWith('notes/')).length;
    expect(r.folder).toMatchObject({ folder: 'notes', files: inNotes });
    const firstLevel = r.topics.reduce((s, t) => s + (r.folder!.counts[t.path] ?? 0), 0);
    expect(firstLevel + r.folder!.outside).toBe(inNotes);
    await expect(h.topics({ folder: '/nowhere/at/all' }, ctx)).rejects.toThrow(/not inside a folder of this workspace/);
  });

  it('names terms by words that occur in the files and stem back to the term', async () => {
    const r = await h.topics({}, ctx);
    const terms = r.topics.flatMap((t) => t.terms);
    // A readable word is a surface form of the term: Porter-stemming it gives the term back.
    const readable = terms.filter((x) => x.word !== x.term && stemWord(x.word) === x.term).length;
    const unchanged = terms.filter((x) => x.word === x.term).length;
    expect(readable + unchanged).toBe(terms.length);
    expect(readable).toBeGreaterThan(0);
  });

  it('gathers most files of each planted topic in one topic (demo answer key)', async () => {
    const r = await h.topics({}, ctx);
    const members = (t: TopicWire): string[] => (t.children.length > 0 ? t.children.flatMap(members) : keys(t.files));
    const topicOf = new Map(r.topics.flatMap((t) => members(t).map((k) => [k, t.id] as const)));
    let gathered = 0;
    for (const planted of expectations.topics) {
      const counts = new Map<number, number>();
      for (const f of planted.files) if (topicOf.has(f)) counts.set(topicOf.get(f)!, (counts.get(topicOf.get(f)!) ?? 0) + 1);
      if (Math.max(0, ...counts.values()) >= planted.files.length / 2) gathered++;
    }
    expect(gathered).toBeGreaterThanOrEqual(expectations.topics.length - 1);
  });
});

describe('concept map requests', () => {
  it('sends page data for every indexed file, with absolute paths, and reuses its layouts', async () => {
    const first = await h.mapData({}, ctx);
    expect(pageDataProblems(first.data)).toEqual([]);
    expect([...first.data.files.paths].sort()).toEqual(service.index!.paths().sort());
    first.data.files.paths.forEach((p, i) => expect(first.fsPaths[i]).toBe(join(folder, ...p.split('/'))));
    expect(first.data.layouts.faithful).not.toBeNull();
    const again = await h.mapData({}, ctx);
    expect(again.cached).toBe(true);
    expect(again.token).toBe(first.token);
  });

  it('rings the files the search ranks first for the query, so the map agrees with search', async () => {
    const { token, data } = await h.mapData({}, ctx);
    const text = 'refund for a cancelled sailing';
    const r = await h.mapQuery({ token, text }, ctx);
    // Reference: the index's own search (a separate code path from the map's placement).
    const direct = service.index!.search(text, { top: r.neighbours.length });
    expect(r.neighbours.map((i) => data.files.paths[i])).toEqual(direct.map((d) => d.path));
    r.similarities.forEach((s, i) => expect(s).toBeCloseTo(direct[i].score, 9));
    for (const p of [r.positions.quick, r.positions.faithful]) expect(Number.isFinite(p!.x) && Number.isFinite(p!.y)).toBe(true);
  });

  it('refuses words the index has never seen, and a map that was replaced', async () => {
    const { token } = await h.mapData({}, ctx);
    await expect(h.mapQuery({ token, text: 'zzqx vvqk' }, ctx)).rejects.toMatchObject({ name: 'NoKnownTermsError' });
    await expect(h.mapQuery({ token: token + 1000, text: 'refund' }, ctx)).rejects.toMatchObject({ name: 'MapOutdatedError' });
  });

  it('places the sections of a file as a trail, each where the map places its text as a query', async () => {
    const { token } = await h.mapData({}, ctx);
    const file = join(folder, 'notes', 'ticketing', 'refund-policy.md');
    const trail = (await h.mapTrail({ token, fsPath: file }, ctx))!;
    expect(trail.path).toBe('notes/ticketing/refund-policy.md');
    const sections = service.index!.sections.get(trail.path)!;
    expect(trail.points.map((p) => p.title)).toEqual(sections.titles);
    // Reference: the map's query placement of the section's own text (it folds the text again).
    const lines = readFileSync(file, 'utf8').split('\n');
    for (const p of trail.points.slice(0, 4)) {
      const q = await h.mapQuery({ token, text: lines.slice(p.start, p.end).join('\n') }, ctx);
      expect(p.quick.x).toBeCloseTo(q.positions.quick!.x, 4);
      expect(p.faithful!.y).toBeCloseTo(q.positions.faithful!.y, 4);
    }
    expect(await h.mapTrail({ token, fsPath: join(tmp, 'elsewhere.md') }, ctx)).toBeNull();
    await expect(h.mapTrail({ token: token + 1000, fsPath: file }, ctx)).rejects.toMatchObject({ name: 'MapOutdatedError' });
  });
});

describe('why section results match', () => {
  it('gives each section found by a search terms whose shares add up to its score', async () => {
    const hits = await h.searchSections({ query: 'what happens to tickets when a crossing is called off', top: 5 }, ctx);
    expect(hits.length).toBe(5);
    for (const hit of hits) expect(hit.why!.terms.reduce((s, t) => s + t.share, 0) + hit.why!.rest).toBeCloseTo(hit.score, 4);
  });

  it('gives each section near the cursor terms and concepts that add up to its cosine', async () => {
    const near = (await h.nearbySections({ fsPath: join(folder, 'notes', 'ticketing', 'refund-policy.md'), line: 12, top: 5 }, ctx))!;
    expect(near.hits.length).toBe(5);
    for (const hit of near.hits) {
      const why = hit.why!;
      expect(why.terms.reduce((s, t) => s + t.share, 0) + why.rest).toBeCloseTo(hit.score, 4);
      expect(why.concepts!.reduce((s, c) => s + c.share, 0) + why.conceptRest!).toBeCloseTo(hit.score, 4);
    }
  });
});

describe('why search and nearby results match', () => {
  it('gives each search result terms whose shares add up to its score', async () => {
    const query = 'what happens to tickets when a crossing is called off';
    const hits = await h.search({ query, top: 5 }, ctx);
    expect(hits.length).toBe(5);
    for (const hit of hits) {
      const why = hit.why!;
      expect(why.terms.length).toBeGreaterThan(0);
      expect(why.terms.length).toBeLessThanOrEqual(5);
      const sum = why.terms.reduce((s, t) => s + t.share, 0) + why.rest;
      expect(sum).toBeCloseTo(hit.score, 4);
      // Search explanations are over the query's own terms, shown as the query wrote them.
      for (const t of why.terms) expect(query).toContain(t.word);
    }
  });

  it('gives each nearby file terms whose shares add up to its cosine', async () => {
    const file = join(folder, 'notes', 'ticketing', 'refund-policy.md');
    const hits = await h.nearby({ fsPath: file, top: 5 }, ctx);
    expect(hits!.length).toBe(5);
    for (const hit of hits!) {
      const sum = hit.why!.terms.reduce((s, t) => s + t.share, 0) + hit.why!.rest;
      expect(sum).toBeCloseTo(hit.score, 4);
    }
  });
});

describe('a workspace of one file', () => {
  it('has no look-alikes, one topic holding the file, and a map with one dot that queries land on', async () => {
    const one = join(tmp, 'one');
    mkdirSync(one);
    writeFileSync(join(one, 'crossing.md'), 'Tide tables and ferry timetables for the island crossing.\n');
    const single = new IndexService({ saveDelayMs: 60_000 });
    const s = single.handlers();
    await s.configure(
      { config: { ...config, roots: [{ name: 'one', fsPath: one, exclude: [] }], indexFile: join(tmp, 'one.undertone') } },
      ctx,
    );
    await s.build({}, ctx);
    expect((await s.lookalikes({ threshold: 0.8 }, ctx)).groups).toEqual([]);
    const topics = await s.topics({}, ctx);
    expect(topics.topics.map((t) => keys(t.files))).toEqual([['crossing.md']]);
    const map = await s.mapData({}, ctx);
    expect(map.data.files.paths).toEqual(['crossing.md']);
    const placed = await s.mapQuery({ token: map.token, text: 'ferry timetable' }, ctx);
    expect(placed.neighbours).toEqual([0]);
    expect(placed.similarities[0]).toBeCloseTo(1, 5);
  });
});
