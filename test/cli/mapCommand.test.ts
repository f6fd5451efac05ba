/**
 * `undertone map <folder> --out <file.html>` end to end through main(). References: the demo
 * workspace's answer key (demo/expectations.json: planted topics and queries whose best file uses
 * other words), the file count `undertone index --json` reports for the same folder, and real text
 * (CRAN abstracts, test/fixtures/corpora/cran): a known-item search, each abstract's own opening words
 * finding it on the page's search, with the number of abstracts written as the expected count.
 */
import { execFileSync } from 'node:child_process';
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build } from 'esbuild';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EmbeddedQueryEngine } from '../../src/core/map/embeddedQuery.js';
import { pageDataProblems, type MapPageData } from '../../src/core/map/mapData.js';
import { MAP_DATA_ELEMENT_ID } from '../../src/core/map/standaloneHtml.js';
import { tokenize } from '../../src/core/text/tokenize.js';
import { runCli } from '../helpers/cliRunner.js';
import { loadCollection, REPO_ROOT } from '../helpers/shared.js';

let dir: string;
const run = (...args: string[]) => runCli(args, ['--cache-dir', join(dir, 'cache'), '--quiet']);

/** The page data embedded in a written map file. */
function readMapData(html: string): MapPageData {
  const m = new RegExp(`<script type="application/json" id="${MAP_DATA_ELEMENT_ID}">([^]*?)</script>`).exec(html);
  if (!m) throw new Error('no map data element');
  return JSON.parse(m[1]) as MapPageData;
}

/** Everything in the file that would make a browser fetch something from elsewhere. */
function remoteReferences(html: string): string[] {
  const patterns = [
    /\b(?:src|href|action|poster|data)\s*=\s*["']?\s*(?:https?:)?\/\//gi,
    /url\(\s*["']?\s*(?:https?:)?\/\//gi,
    /@import\b/gi,
    /<(?:link|iframe|img|object|embed|base)\b/gi,
  ];
  // Network calls in the page script (the data may hold such words: the demo has "fetch").
  const script = /<script nonce="[^"]+">([^]*?)<\/script>/.exec(html)?.[1];
  if (!script) throw new Error('no inline page script');
  const calls = script.match(/\b(?:fetch|XMLHttpRequest|WebSocket|EventSource|sendBeacon|importScripts)\b/g) ?? [];
  return [...patterns.flatMap((p) => html.match(p) ?? []), ...calls];
}

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'undertone-map-cli-'));
  // The page bundle is build output (git-ignored): build it the way `npm run build` does when absent.
  if (!existsSync(join(REPO_ROOT, 'media/map/map.js'))) {
    execFileSync(process.execPath, [join(REPO_ROOT, 'scripts/build-map-page.mjs')], { cwd: REPO_ROOT, stdio: 'pipe' });
  }
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const demoRoot = join(REPO_ROOT, 'demo', 'workspace');
const demoKey = join(REPO_ROOT, 'demo', 'expectations.json');

describe('map command arguments', () => {
  it('asks for --out with an example when it is missing', async () => {
    const r = await run('map', join(REPO_ROOT, 'demo', 'workspace'));
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/map needs --out <file\.html>.*--out map\.html/);
  });

  it('rejects an unknown layout and a zero vocabulary cap', async () => {
    const out = join(dir, 'never.html');
    expect((await run('map', demoRoot, '--out', out, '--layout', 'spiral')).err).toMatch(
      /--layout must be one of both, quick, faithful, got "spiral"/,
    );
    expect((await run('map', demoRoot, '--out', out, '--max-terms', '0')).err).toMatch(/--max-terms needs a positive whole number/);
    expect(existsSync(out)).toBe(false);
  });

  it('says to run npm run build when the page bundle is missing', async () => {
    const empty = mkdtempSync(join(dir, 'no-page-'));
    const before = process.env.UNDERTONE_MAP_PAGE_DIR;
    process.env.UNDERTONE_MAP_PAGE_DIR = empty;
    try {
      const r = await run('map', demoRoot, '--out', join(dir, 'never.html'));
      expect(r.code).toBe(1);
      expect(r.err).toMatch(/map\.js is missing\. Run `npm run build`/);
    } finally {
      if (before === undefined) delete process.env.UNDERTONE_MAP_PAGE_DIR;
      else process.env.UNDERTONE_MAP_PAGE_DIR = before;
    }
  });
});

describe('map of the demo', () => {
  const key = JSON.parse(readFileSync(demoKey, 'utf8')) as {
    topics: { files: string[] }[];
    queries: { text: string; expectTop3: string[] }[];
  };
  let html = '';
  let data: MapPageData;
  let summary = '';

  beforeAll(async () => {
    const out = join(dir, 'demo', 'map.html');
    const r = await run('map', demoRoot, '--out', out);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    summary = r.out;
    html = readFileSync(out, 'utf8');
    data = readMapData(html);
  });

  it('writes one self-contained file and says how big it is and how many files it shows', async () => {
    const out = join(dir, 'demo', 'map.html');
    const bytes = statSync(out).size;
    const indexed = JSON.parse((await run('index', demoRoot, '--json')).out) as { files: number };
    expect(summary).toContain(`wrote ${out}: ${(bytes / 1024).toFixed(1)} KiB, ${indexed.files} files`);
    expect(readdirSync(join(dir, 'demo'))).toEqual(['map.html']); // the atomic write left no temporary file
    expect(pageDataProblems(data)).toEqual([]);
    expect(data.files.paths).toHaveLength(indexed.files);
    expect(data.layouts.quick.x).toHaveLength(indexed.files);
    expect(data.layouts.faithful?.x).toHaveLength(indexed.files);
    for (const v of [...data.layouts.quick.x, ...data.layouts.quick.y, ...data.layouts.faithful!.x, ...data.layouts.faithful!.y])
      expect(Number.isFinite(v)).toBe(true);
    for (const t of key.topics) for (const f of t.files) expect(data.files.paths).toContain(f);
  });

  it('fetches nothing: no remote reference, and a policy that allows none', () => {
    expect(remoteReferences(html)).toEqual([]);
    expect(html).toMatch(/http-equiv="Content-Security-Policy" content="default-src &#39;none&#39;;/);
    expect(html.match(/<script\b/g)).toHaveLength(2); // the data block and the inline page script
  });

  it('carries the spectrum and names topics and files with words from the files', () => {
    expect(data.spectrum.k).toBeGreaterThan(1);
    expect(data.spectrum.singularValues.length).toBeGreaterThanOrEqual(data.spectrum.k);
    expect(data.spectrum.totalEnergy).toBeGreaterThan(0);
    expect(data.topicLabels.length).toBeGreaterThanOrEqual(2);
    const inFiles = new Set(data.topicLabels.flatMap((l) => l.split(', ')));
    // Readable words, not stems: demo stems such as "timet" would not be words of the files.
    const demoText = data.files.paths.map((f) => readFileSync(join(demoRoot, f), 'utf8').toLowerCase()).join(' ');
    for (const w of inFiles) expect(demoText).toContain(w);
  });

  it('answers the planted questions on its own search: the best file is among the ringed neighbours', () => {
    const engine = new EmbeddedQueryEngine(data.embedded!, (t) => tokenize(t));
    for (const q of key.queries) {
      const r = engine.search(q.text);
      const ringed = Array.from(r.neighbours, (i) => data.files.paths[i]);
      for (const f of q.expectTop3) expect(ringed).toContain(f);
    }
  });

  it('--layout quick leaves the faithful layout out and --max-terms caps the search words', async () => {
    const out = join(dir, 'demo-small.html');
    const r = await run('map', demoRoot, '--out', out, '--layout', 'quick', '--max-terms', '50', '--topics', '3', '--json');
    expect(r.code).toBe(0);
    const small = readMapData(readFileSync(out, 'utf8'));
    expect(small.layouts.faithful).toBeNull();
    expect(small.embedded!.terms).toHaveLength(50);
    expect(small.topicLabels).toHaveLength(3);
    const s = JSON.parse(r.out) as { bytes: number; files: number; layouts: string[]; searchTerms: number };
    expect(s).toMatchObject({ bytes: statSync(out).size, files: data.files.paths.length, layouts: ['quick'], searchTerms: 50 });
    expect(s.bytes).toBeLessThan(Buffer.byteLength(html));
  });
});

describe('map of a folder with a single file', () => {
  it('still writes a map with one point on both layouts', async () => {
    const folder = join(dir, 'one');
    mkdirSync(folder);
    writeFileSync(join(folder, 'note.md'), 'The harbour timetable moves with the tide; the harbour master posts the timetable.');
    const out = join(dir, 'one.html');
    const r = await run('map', folder, '--out', out);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/, 1 file, 1 topic, quick \+ faithful layouts, /);
    const data = readMapData(readFileSync(out, 'utf8'));
    expect(data.files.paths).toEqual(['note.md']);
    expect(data.layouts.faithful!.x).toHaveLength(1);
    expect(data.files.topTerms[0]).toContain('timetable'); // spelled as in the file, not as its stem
  });
});

describe('the bundled command line', () => {
  it('finds the page beside its dist folder, as an installed package lays it out', async () => {
    // An installed layout in a temporary folder: dist/cli.js bundled as scripts/build.mjs does, media/map beside it.
    const pkg = join(dir, 'installed');
    mkdirSync(join(pkg, 'media', 'map'), { recursive: true });
    for (const f of ['map.js', 'map.css']) copyFileSync(join(REPO_ROOT, 'media', 'map', f), join(pkg, 'media', 'map', f));
    await build({
      entryPoints: [join(REPO_ROOT, 'src/cli/bin.ts')],
      outfile: join(pkg, 'dist', 'cli.js'),
      bundle: true,
      platform: 'node',
      target: 'node20',
      format: 'cjs',
      logLevel: 'error',
    });
    const out = join(dir, 'installed-map.html');
    const env = { ...process.env, UNDERTONE_MAP_PAGE_DIR: '' };
    const stdout = execFileSync(
      process.execPath,
      [join(pkg, 'dist', 'cli.js'), 'map', demoRoot, '--out', out, '--cache-dir', join(dir, 'cache'), '--quiet'],
      { env, encoding: 'utf8' },
    );
    expect(stdout).toMatch(/^wrote .*installed-map\.html: [\d.]+ KiB, \d+ files, /);
    const html = readFileSync(out, 'utf8');
    expect(html).toContain(
      readFileSync(join(pkg, 'media', 'map', 'map.css'), 'utf8')
        .trim()
        .slice(0, 200),
    );
    expect(pageDataProblems(readMapData(html))).toEqual([]);
  });
});

const cran = loadCollection('cran');
const CRAN_FILES = 300;

describe('map of a folder of CRAN abstracts', () => {
  it('shows every abstract, and an abstract’s opening words find it on the page’s search', async () => {
    const folder = join(dir, 'cran');
    mkdirSync(folder);
    const docs = cran.docs.slice(0, CRAN_FILES);
    docs.forEach((d) => writeFileSync(join(folder, `abstract-${d.id.padStart(4, '0')}.txt`), d.text));
    const out = join(dir, 'cran.html');
    const r = await run('map', folder, '--out', out);
    expect(r.code).toBe(0);
    expect(r.out).toContain(`, ${CRAN_FILES} files,`);
    const html = readFileSync(out, 'utf8');
    expect(remoteReferences(html)).toEqual([]);
    expect(html.length).toBeGreaterThan(40_000); // the page script is inlined
    const data = readMapData(html);
    expect(pageDataProblems(data)).toEqual([]);
    expect(data.files.paths).toHaveLength(CRAN_FILES);
    expect(data.layouts.faithful!.x).toHaveLength(CRAN_FILES);
    const engine = new EmbeddedQueryEngine(data.embedded!, (t) => tokenize(t));
    let found = 0;
    const probes = docs.filter((_, i) => i % 15 === 0);
    for (const d of probes) {
      const opening = d.text.split(/\s+/).slice(0, 15).join(' ');
      const top = Array.from(engine.search(opening, 3).neighbours, (i) => data.files.paths[i]);
      if (top.includes(`abstract-${d.id.padStart(4, '0')}.txt`)) found++;
    }
    // Known-item search by a document's own words (common practice): measured 20 of 20 here.
    expect(found).toBeGreaterThanOrEqual(Math.ceil(0.9 * probes.length));
  });
});
