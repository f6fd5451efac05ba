/**
 * The command line end to end, on temporary folders built from real text: abstracts of the
 * CRAN collection (test/fixtures/corpora/cran) written out as files, plus odd files.
 */
import { mkdtempSync, readdirSync, rmSync, writeFileSync, mkdirSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../helpers/cliRunner.js';
import { loadCollection } from '../helpers/shared.js';

const cran = loadCollection('cran');

describe('undertone command line', () => {
  let dir: string;
  let folder: string;
  let cache: string;
  const run = (...args: string[]) => runCli(args, ['--cache-dir', cache]);

  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), 'undertone-cli-'));
    folder = join(dir, 'ws');
    cache = join(dir, 'cache');
    mkdirSync(join(folder, 'notes'), { recursive: true });
    for (const d of cran.docs.slice(0, 150)) writeFileSync(join(folder, 'notes', `${d.id}.md`), d.text);
    writeFileSync(join(folder, 'blob.bin'), Buffer.from([1, 2, 0, 3, 4]));
    writeFileSync(join(folder, 'empty.txt'), '');
    mkdirSync(join(folder, 'node_modules', 'x'), { recursive: true });
    writeFileSync(join(folder, 'node_modules', 'x', 'index.js'), 'boundary layer flow');
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('builds, then finds the index up to date, then re-reads only a changed file', async () => {
    const first = await run('index', folder);
    expect(first.code).toBe(0);
    expect(first.err).toMatch(/built index \(read 151 files/);
    expect(first.err).toMatch(/k=\d+/);
    const second = await run('index', folder);
    expect(second.err).toMatch(/index up to date: 151 files/);
    writeFileSync(join(folder, 'notes', '7.md'), `${cran.docs[6].text} shock waves in hypersonic flow`);
    const third = await run('index', folder);
    expect(third.err).toMatch(/0 added, 1 changed, 0 removed, 150 reused/);
  });

  it('ranks files for plain text as a table and as JSON', async () => {
    const target = cran.docs[20];
    const table = await run('ask', folder, target.text.slice(0, 120), '--top', '3');
    expect(table.code).toBe(0);
    const lines = table.out.split('\n');
    expect(lines[0]).toMatch(/^rank\s+score\s+path$/);
    // Each result is followed by its best section ("in: title (lines a–b)").
    expect(lines.filter((l) => !l.startsWith('        in: ')).length).toBe(5);
    expect(lines.filter((l) => /^ {8}in: (.+ \(lines \d+–\d+\)|lines \d+–\d+)$/.test(l)).length).toBe(3);
    expect(table.out).toContain(`notes/${target.id}.md`);
    const json = await run('ask', folder, target.text.slice(0, 120), '--top', '2', '--json');
    const parsed = JSON.parse(json.out);
    expect(parsed.results).toHaveLength(2);
    expect(parsed.results[0].score).toBeGreaterThanOrEqual(parsed.results[1].score);
  });

  it('ranks sections with --sections and lists the sections nearest to a line with nearby --line', async () => {
    const target = cran.docs[20];
    const res = await run('ask', folder, target.text.slice(0, 120), '--top', '3', '--sections', '--explain', '--json');
    expect(res.code).toBe(0);
    type Explained = { score: number; explain: { score: number; terms: { term: string; inBoth: boolean }[] } };
    const parsed = JSON.parse(res.out) as {
      sections: ({ path: string; title: string; startLine: number; endLine: number } & Explained)[];
    };
    expect(parsed.sections).toHaveLength(3);
    expect(parsed.sections.map((s) => s.path)).toContain(`notes/${target.id}.md`);
    for (const s of parsed.sections) expect(s.endLine).toBeGreaterThanOrEqual(s.startLine);
    // Each section's why adds up to the section's own score (rounded to 4 places in the JSON).
    for (const s of parsed.sections) expect(s.explain.score).toBeCloseTo(s.score, 3);
    const near = await run('nearby', folder, `notes/${target.id}.md`, '--line', '1', '--explain', '--json');
    expect(near.code).toBe(0);
    const n = JSON.parse(near.out) as { section: { path: string; startLine: number }; results: ({ path: string } & Explained)[] };
    expect(n.section.path).toBe(`notes/${target.id}.md`);
    expect(n.section.startLine).toBe(1);
    expect(n.results.length).toBeGreaterThan(0);
    expect(n.results.every((r) => r.path !== n.section.path)).toBe(true);
    for (const r of n.results) expect(r.explain.score).toBeCloseTo(r.score, 3);
  });

  it('answers a batch of queries, one JSON line per query id', async () => {
    const qfile = join(dir, 'q.jsonl');
    writeFileSync(qfile, [JSON.stringify({ id: 'a', text: 'boundary layer' }), JSON.stringify({ id: 7, text: 'zzqq' })].join('\n'));
    const res = await run('ask', folder, '--queries', qfile, '--top', '4');
    const lines = res.out.split('\n').map((l) => JSON.parse(l));
    expect(lines[0].id).toBe('a');
    expect(lines[0].results).toHaveLength(4);
    expect(lines[1]).toEqual({ id: 7, results: [], note: 'no known words' });
  });

  it('lists the nearest files of a file, never the file itself', async () => {
    const res = await run('nearby', folder, 'notes/12.md', '--top', '5', '--json');
    const parsed = JSON.parse(res.out);
    expect(parsed.results).toHaveLength(5);
    expect(parsed.results.map((r: { path: string }) => r.path)).not.toContain('notes/12.md');
  });

  it('gives clear messages and non-zero exits for bad input', async () => {
    const missing = await run('index', join(dir, 'nope'));
    expect(missing.code).toBe(1);
    expect(missing.err).toMatch(/does not exist/);
    const unknown = await run('ask', folder, 'qqqzz xxyyzz');
    expect(unknown.code).toBe(1);
    expect(unknown.err).toMatch(/None of the words/);
    const notIndexed = await run('nearby', folder, 'blob.bin');
    expect(notIndexed.code).toBe(1);
    expect(notIndexed.err).toMatch(/not in the index/);
    const usage = await run('frobnicate', folder);
    expect(usage.code).toBe(2);
    const empty = join(dir, 'empty-folder');
    mkdirSync(empty);
    const nothing = await run('index', empty);
    expect(nothing.code).toBe(1);
    expect(nothing.err).toMatch(/Nothing indexable/);
    expect(nothing.err).not.toMatch(/gitignore/);
    // The failed build leaves no index folder behind (the command makes it first, for scratch files).
    expect(readdirSync(cache).filter((name) => name.startsWith('empty-folder-'))).toEqual([]);
  });

  it('says when .gitignore files left everything out, and how to index it anyway', async () => {
    // A folder inside a git working tree whose .gitignore hides its files (as the top-level one of
    // Debian's linux-source-6.1 tarball does: `/*`, then `!/debian/`).
    const repo = join(dir, 'ignored-repo');
    mkdirSync(join(repo, '.git'), { recursive: true });
    mkdirSync(join(repo, 'docs'));
    writeFileSync(join(repo, '.gitignore'), '/*\n!/debian/\n');
    writeFileSync(join(repo, 'docs', 'a.md'), 'Boundary layer notes on laminar flow over a flat plate.');
    writeFileSync(join(repo, 'b.md'), 'Shock waves and supersonic flow.');
    // A cache of its own: the damaged-index test below takes the first index in the shared one.
    const runHere = (...args: string[]) => runCli(args, ['--cache-dir', join(dir, 'cache-gitignore')]);
    const hidden = await runHere('index', repo);
    expect(hidden.code).toBe(1);
    expect(hidden.err).toMatch(/Nothing indexable/);
    expect(hidden.err).toMatch(/\.gitignore files left out 3 files and folders; --no-gitignore indexes them\./);
    const shown = await runHere('index', repo, '--no-gitignore', '--json');
    expect(shown.code).toBe(0);
    expect(JSON.parse(shown.out).files).toBe(3);
  });

  it('clamps a k larger than the collection allows, with a note', async () => {
    const res = await run('ask', folder, 'boundary layer', '--k', '5000', '--top', '1');
    expect(res.code).toBe(0);
    expect(res.err).toMatch(/k=5000 is more than this collection allows; using k=151/);
  });

  it('rebuilds a damaged saved index instead of trusting it', async () => {
    await run('index', folder);
    const sub = readdirSync(cache)[0];
    const file = join(cache, sub, 'index.undertone');
    const bytes = readFileSync(file);
    bytes[bytes.length - 50] ^= 0xff;
    writeFileSync(file, bytes);
    const res = await run('index', folder);
    expect(res.code).toBe(0);
    expect(res.err).toMatch(/could not be used \(\S+index\.undertone: index payload fails its checksum/);
    expect(res.err).toMatch(/built index/);
  });
});
