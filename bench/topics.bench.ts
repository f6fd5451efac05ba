/**
 * Timing of look-alikes, topics (with CUR) and explanations on real folders (speed figures only,
 * no assertions). Run from the repository root:
 *   npx esbuild bench/topics.bench.ts --bundle --platform=node --format=esm --outfile=/tmp/topics-bench.mjs
 *   node /tmp/topics-bench.mjs [demo|cisi|cacm|linux|all]      (default: all that are present)
 * Folders: the demo workspace (demo/workspace); CISI and CACM abstracts (test/fixtures/corpora), each
 * written out as one file per abstract in a temporary folder and read back; the kernel's
 * Documentation tree when scripts/bench-setup.sh has unpacked it under .cache/bench.
 * The index build is timed too, for scale; look-alike and topic times exclude it.
 * Measured once on a shared 2-core machine under load (CPU ms; wall was 1.5–3× that):
 *   demo 116 files: look-alikes 191, topics (auto, 7) 444, CUR DEIM rank 20 53;
 *   CISI 1460: look-alikes 753, topics (auto, 20) 2768, topics (12 given) 1255;
 *   CACM 3204: look-alikes 1002, topics (auto, 20) 2350, topics (12 given) 1219;
 *   kernel Documentation 5128 files / 26 MiB: look-alikes 9073, topics (auto, 18) 5234, CUR 638.
 */
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative, sep } from 'node:path';
import { QueryExplainer } from '../src/core/explain/explain.js';
import { IndexBuilder } from '../src/core/index/model/indexBuilder.js';
import { findLookalikes } from '../src/core/lookalike/index.js';
import { curDecomposition } from '../src/core/topics/cur.js';
import { leadingFactors, weightedMatrix } from '../src/core/topics/indexMatrix.js';
import { findTopics } from '../src/core/topics/topics.js';

const which = process.argv[2] ?? 'all';
const LINUX_DOCS = '.cache/bench/linux-source-6.1/Documentation';
const MAX_LINUX_FILES = 20000;

function walk(dir: string, keep: (p: string) => boolean, out: string[] = []): string[] {
  for (const name of readdirSync(dir).sort()) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) walk(p, keep, out);
    else if (keep(p) && out.length < MAX_LINUX_FILES) out.push(p);
  }
  return out;
}

function readFolder(root: string, keep: (p: string) => boolean = () => true): { path: string; text: string }[] {
  return walk(root, keep).map((f) => ({ path: relative(root, f).split(sep).join('/'), text: readFileSync(f, 'utf8') }));
}

/** Abstracts written as files in a temporary folder, then read back like any folder. */
function corpusFolder(name: string): { path: string; text: string }[] | null {
  const src = join('test', 'fixtures', 'corpora', name, 'docs.jsonl');
  if (!existsSync(src)) return null;
  const dir = mkdtempSync(join(tmpdir(), `undertone-bench-${name}-`));
  try {
    mkdirSync(join(dir, 'docs'));
    for (const line of readFileSync(src, 'utf8').split('\n')) {
      if (!line.trim()) continue;
      const d = JSON.parse(line) as { id: string; text: string };
      writeFileSync(join(dir, 'docs', `${d.id}.txt`), d.text);
    }
    return readFolder(dir);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

const time = <T>(label: string, f: () => T): T => {
  const t0 = performance.now();
  const c0 = process.cpuUsage();
  const r = f();
  const cpu = process.cpuUsage(c0);
  console.log(
    `  ${label.padEnd(44)} ${(performance.now() - t0).toFixed(0).padStart(7)} ms wall ${((cpu.user + cpu.system) / 1000).toFixed(0).padStart(7)} ms cpu`,
  );
  return r;
};

function bench(name: string, files: { path: string; text: string }[], queries: string[]): void {
  const bytes = files.reduce((s, f) => s + f.text.length, 0);
  console.log(`\n${name}: ${files.length} files, ${(bytes / 1024 / 1024).toFixed(1)} MiB`);
  const index = time('index build (tokenize, weight, SVD)', () => {
    const b = new IndexBuilder();
    for (const f of files) b.addText({ path: f.path, size: f.text.length, mtimeMs: 0 }, f.text);
    return b.build();
  });
  console.log(`  (k = ${index.k}, ${index.model.keptIds.length} terms, ${index.model.nonZeros} non-zeros)`);
  const k = index.k;
  const paths = index.paths();
  const byPath = new Map(files.map((f) => [f.path, f.text]));
  const vectors = new Float32Array(paths.length * k);
  paths.forEach((p, i) => vectors.set(index.vectorOf(p), i * k));
  const look = time('overlaps (exact, near, partial, same content in other words)', () =>
    findLookalikes({ files: paths.map((p) => ({ id: p, text: byPath.get(p)! })) }),
  );
  console.log(
    `  (${look.exactGroups.length} exact groups, ${look.nearPairs.length} near, ${look.partialPairs.length} partial, ${look.retoldPairs.length} retold pairs, ${look.stats.candidates} LSH candidates)`,
  );
  const topics = time('topics, count chosen automatically', () => findTopics(index));
  console.log(
    `  (${topics.topics.length} topics, CUR error ratio ${topics.cur.errorRatio?.toFixed(3) ?? '–'}, largest "${topics.topics[0]?.terms
      .slice(0, 4)
      .map((t) => t.term)
      .join(', ')}")`,
  );
  time('topics, 12 given', () => findTopics(index, { topics: Math.min(12, paths.length) }));
  const im = time('weighted matrix + leading factors (rank 20)', () => {
    const m = weightedMatrix(index);
    return { m, f: leadingFactors(index, m, 20, 1) };
  });
  for (const method of ['deim', 'column-select'] as const) {
    const cur = time(`CUR ${method}, rank 20`, () => curDecomposition(im.m.matrix, { rank: 20, method }, im.f));
    console.log(
      `  (${cur.rows.indices.length} files, ${cur.columns.indices.length} terms, ‖A−CUR‖/‖A−A_k‖ = ${cur.error.ratio?.toFixed(3) ?? '–'})`,
    );
  }
  time(`explain top 10 of ${queries.length} queries`, () => {
    for (const q of queries) {
      try {
        const ex = new QueryExplainer(index, q);
        for (const h of index.search(q, { top: 10 })) ex.explain(h.path);
      } catch {
        /* a query with no known word: nothing to explain */
      }
    }
  });
}

const queriesOf = (name: string): string[] => {
  const src = join('test', 'fixtures', 'corpora', name, 'queries.jsonl');
  if (!existsSync(src)) return [];
  return readFileSync(src, 'utf8')
    .split('\n')
    .filter((l) => l.trim())
    .slice(0, 20)
    .map((l) => (JSON.parse(l) as { text: string }).text);
};

const demoQueries = ['refund a cancelled trip', 'engine overheating', 'crew fatigue and rest hours', 'storm warning cancels sailings'];
if ((which === 'all' || which === 'demo') && existsSync('demo/workspace'))
  bench('demo workspace', readFolder('demo/workspace'), demoQueries);
for (const name of ['cisi', 'cacm']) {
  if (which !== 'all' && which !== name) continue;
  const files = corpusFolder(name);
  if (files) bench(`${name.toUpperCase()} abstracts as files`, files, queriesOf(name));
  else console.log(`\n${name}: skipped (test/fixtures/corpora/${name} missing)`);
}
if (which === 'all' || which === 'linux') {
  if (existsSync(LINUX_DOCS))
    bench(
      'linux Documentation',
      readFolder(LINUX_DOCS, (p) => /\.(rst|txt)$/.test(p)),
      demoQueries,
    );
  else console.log(`\nlinux Documentation: skipped (${LINUX_DOCS} missing; scripts/bench-setup.sh unpacks it)`);
}
