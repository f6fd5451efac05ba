/**
 * `undertone topics`, and `--explain` on `ask` and `nearby`, end to end through main().
 * References: the demo workspace's answer key (demo/expectations.json: planted topics); the
 * scores the same commands print without --explain (shares must add up to them); real text
 * (CRAN abstracts, test/fixtures/corpora/cran) for odd folders.
 */
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gunzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../helpers/cliRunner.js';
import { fixturePath, loadCollection, REPO_ROOT } from '../helpers/shared.js';

let dir: string;
const run = (...args: string[]) => runCli(args, ['--cache-dir', join(dir, 'cache'), '--quiet']);
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'undertone-topics-cli-'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const demoRoot = join(REPO_ROOT, 'demo', 'workspace');
const demoKey = join(REPO_ROOT, 'demo', 'expectations.json');

describe('topics and --explain on the demo', () => {
  it('prints topics with readable words, exemplar files and the CUR summary', async () => {
    const r = await run('topics', demoRoot);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/^\d+ files in \d+ topics \(count chosen by silhouette, 0\.\d\d\)/);
    expect(r.out).toMatch(/CUR \(deim, rank \d+\) picked \d+ files and \d+ terms; error \d\.\d\d× the best rank-\d+ error/);
    expect(r.out).toMatch(/^1 {2}\S+, \S+/m); // a topic is named by its words, never "Topic N"
    expect(r.out).not.toMatch(/Topic \d/);
    expect(r.out).toMatch(/files, (in \S+ \d+%|spread over many folders)/);
    expect(r.out).toMatch(/similarity {2}exemplar file/);
  });

  it('--json lists every file once and names planted topics with planted keywords', async () => {
    const r = await run('topics', demoRoot, '--json', '--topics', '6');
    expect(r.code).toBe(0);
    const report = JSON.parse(r.out) as {
      topics: { members: string[]; terms: { word: string; term: string }[] }[];
      loose: { path: string }[];
      unplaced: string[];
      count: { chosen: string };
    };
    expect(report.topics).toHaveLength(6);
    expect(report.count.chosen).toBe('given');
    const key = JSON.parse(readFileSync(demoKey, 'utf8')) as { fileCount: { min: number; max: number }; topics: { keywords: string[] }[] };
    const members = report.topics
      .flatMap((t) => t.members)
      .concat(
        report.unplaced,
        report.loose.map((l) => l.path),
      );
    expect(new Set(members).size).toBe(members.length);
    expect(members.length).toBeGreaterThanOrEqual(key.fileCount.min);
    const words = new Set(report.topics.flatMap((t) => t.terms.map((x) => x.word)));
    // Words are spellings from the files, not stems: at least one differs from its stem.
    expect(report.topics.some((t) => t.terms.some((x) => x.word !== x.term))).toBe(true);
    const plantedHits = key.topics.filter((t) => t.keywords.some((k) => words.has(k))).length;
    // Names are scored against the sibling topics, so keywords the planted topics share (the
    // answer key lists some in two topics' files) give way to each topic's own words.
    expect(plantedHits).toBeGreaterThanOrEqual(4);
  });

  it('ask --explain prints shares under each result that add up to its score', async () => {
    const r = await run('ask', demoRoot, 'refund a cancelled trip', '--explain', '--top', '5');
    expect(r.code).toBe(0);
    const lines = r.out.split('\n');
    const results = lines.filter((l) => /^\s+\d+\s+\d\.\d{3}\s+\S/.test(l));
    const whys = lines.filter((l) => l.includes('why:') && l.includes('(= '));
    expect(results).toHaveLength(5);
    expect(whys).toHaveLength(5);
    results.forEach((line, i) => {
      const score = Number(line.trim().split(/\s+/)[1]);
      const total = Number(/\(= (-?\d\.\d{3})\)/.exec(whys[i])![1]);
      expect(total).toBeCloseTo(score, 2);
      const parts = [...whys[i].matchAll(/ (-?\d\.\d{3})(?=,|\s\s)/g)].map((m) => Number(m[1]));
      expect(parts.reduce((s, x) => s + x, 0)).toBeCloseTo(score, 1);
    });
    expect(r.out).toMatch(/~ marks a word not in the file/);
  });

  it('ask --explain --json gives term shares, concept and word-match parts, summing to the score', async () => {
    const r = await run('ask', demoRoot, 'engine overheating alarm', '--explain', '--json', '--top', '3');
    const out = JSON.parse(r.out) as {
      results: {
        score: number;
        explain: { score: number; terms: { share: number; word: string }[]; rest: { share: number }; feedback: number };
      }[];
    };
    expect(out.results).toHaveLength(3);
    for (const res of out.results) {
      expect(res.explain.score).toBeCloseTo(res.score, 3);
      expect(res.explain.terms.reduce((s, t) => s + t.share, 0) + res.explain.rest.share + res.explain.feedback).toBeCloseTo(res.score, 3);
      expect(res.explain.terms.map((t) => t.word)).toContain('engine');
    }
  });

  it('nearby --explain gives the words two files share in meaning, with readable spellings', async () => {
    const file = 'notes/maintenance/coolant-temperature-alarms.md';
    const plain = await run('nearby', demoRoot, file, '--top', '3', '--json');
    const explained = await run('nearby', demoRoot, file, '--top', '3', '--json', '--explain');
    const a = JSON.parse(plain.out) as { results: { path: string; score: number }[] };
    const b = JSON.parse(explained.out) as {
      results: { path: string; score: number; explain: { score: number; terms: { word: string; term: string }[] } }[];
    };
    expect(b.results.map((x) => x.path)).toEqual(a.results.map((x) => x.path));
    b.results.forEach((res, i) => expect(res.explain.score).toBeCloseTo(a.results[i].score, 3));
    expect(b.results[0].explain.terms.some((t) => t.word === 'temperature' && t.term !== 'temperature')).toBe(true);
    const table = await run('nearby', demoRoot, file, '--top', '2', '--explain');
    expect(table.out.split('\n').filter((l) => l.includes('why:'))).toHaveLength(3); // 2 results + legend
  });
});

// The CMake manual (test/fixtures/topic-trees, cmake-doc from Debian): big enough for sub-topics.
let cmakeRoot = '';
describe('topic tree of a real documentation folder', () => {
  beforeAll(() => {
    cmakeRoot = join(dir, 'cmake');
    for (const line of gunzipSync(readFileSync(fixturePath('topic-trees/cmake.jsonl.gz')))
      .toString('utf8')
      .split('\n')) {
      if (!line.trim()) continue;
      const d = JSON.parse(line) as { path: string; text: string };
      mkdirSync(join(cmakeRoot, d.path, '..'), { recursive: true });
      writeFileSync(join(cmakeRoot, d.path), d.text);
    }
  });

  it('--depth shows sub-topics indented under their topic; --json has the whole tree', async () => {
    const two = await run('topics', cmakeRoot, '--depth', '2');
    expect(two.code).toBe(0);
    expect(two.out).toMatch(/^ {2}1\.1 {2}\S/m);
    const json = JSON.parse((await run('topics', cmakeRoot, '--json')).out) as {
      levels: number;
      topics: { path: string; size: number; members: string[]; children: { path: string; members: string[] }[] }[];
    };
    expect(json.levels).toBeGreaterThan(1);
    const opened = json.topics.filter((t) => t.children.length > 0);
    expect(opened.length).toBeGreaterThan(0);
    for (const t of opened) expect(t.children.flatMap((c) => c.members).sort()).toEqual([...t.members].sort());
    expect((await run('topics', cmakeRoot, '--depth', '0')).code).not.toBe(0);
  });

  it('--in lists the topics a sub-folder holds, and refuses a folder with no indexed file', async () => {
    const sub = 'command';
    const r = await run('topics', cmakeRoot, '--in', sub, '--json');
    expect(r.code).toBe(0);
    const got = JSON.parse(r.out) as { folder: string; files: number; outside: number; topics: { files: number; name: string }[] };
    expect(got.folder).toBe(sub);
    expect(got.topics.reduce((s, t) => s + t.files, 0) + got.outside).toBe(got.files);
    expect(got.topics.every((t) => !/^Topic/.test(t.name))).toBe(true);
    const none = await run('topics', cmakeRoot, '--in', 'no-such-folder');
    expect(none.code).not.toBe(0);
    expect(none.err).toMatch(/no indexed file lies in "no-such-folder"/);
  });
});

const cran = loadCollection('cran');
describe('topics on odd folders', () => {
  const folder = (name: string, files: Record<string, string>) => {
    const root = join(dir, name);
    mkdirSync(root, { recursive: true });
    for (const [p, text] of Object.entries(files)) writeFileSync(join(root, p), text);
    return root;
  };

  it('a one-file folder gives one topic', async () => {
    const r = await run('topics', folder('one', { 'only.md': cran.docs[0].text }));
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/^1 file in 1 topic \(too few files to split\)/);
    expect(r.out).toMatch(/only\.md/);
  });

  it('fifteen hundred identical files give one topic and say why', async () => {
    const files: Record<string, string> = {};
    for (let i = 0; i < 1500; i++) files[`copy-${i}.md`] = cran.docs[1].text;
    const r = await run('topics', folder('same', files));
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/^1,?500 files in 1 topic \(every file points the same way: one topic\)/);
  });

  it('a folder of empty files is refused with a clear message', async () => {
    const r = await run('topics', folder('empty', { 'a.md': '', 'b.txt': '   \n' }));
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/undertone topics: .*(no indexable words|Nothing indexable)/);
  });

  it('a bad --topics value is refused before any work', async () => {
    const r = await run('topics', folder('bad', { 'x.md': cran.docs[2].text }), '--topics', 'zero');
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/--topics needs a positive whole number/);
  });
});
