/**
 * `npm run bench`: indexing speed on the demo workspace and on a larger real folder (the
 * Documentation folder of Debian's linux-source-6.1, unpacked by scripts/bench-setup.sh into
 * .cache/bench). Prints files/s, MB/s, seconds per stage, peak memory (RSS) and query latency.
 * A benchmark, not a test: it asserts nothing. Each build runs in its own process so its peak
 * RSS is its own. `node dist/bench.js --compare` runs the side-by-side comparison instead
 * (bench/compare/compare.ts, `npm run bench:compare`).
 *
 * Options: --k N (default 200, as the comparison uses), --only demo|docs|tree, --folder DIR (only
 * that folder; e.g. a test collection written out as files by scripts/fixtures/writeFolder.mjs).
 */
import { existsSync } from 'node:fs';
import { runChild, type ChildResult } from './benchChild.js';
import { CORPORA, flag, honoursGitignore, loadLine, measureInChild, type CorpusName } from './benchShared.js';
import { runCompare } from './compare/compare.js';

const f1 = (x: number): string => (Number.isFinite(x) ? x.toFixed(1) : '–');
const f2 = (x: number): string => (Number.isFinite(x) ? x.toFixed(2) : '–');
const mb = (bytes: number): string => (bytes / 1048576).toFixed(1);

function printResult(name: string, r: ChildResult): void {
  const st = r.stages;
  console.log(`\n${name}: ${r.folder}`);
  console.log(`  ${r.files} files, ${mb(r.bytes)} MB read, ${r.terms} terms, ${r.nonZeros} non-zeros, k=${r.k}, ${r.threads} threads`);
  console.log(
    `  build ${f2(r.buildSeconds)} s (${f1(r.files / r.buildSeconds)} files/s, ${f2(r.bytes / 1048576 / r.buildSeconds)} MB/s); with save ${f2(r.totalSeconds)} s; CPU ${f2(r.cpuSeconds)} s`,
  );
  console.log(
    `  stages (s): scan ${f2(st.scan)}  tokenize ${f2(st.tokenize)}  matrix ${f2(st.matrix)}  svd ${f2(st.svd)}  save ${f2(st.save)}`,
  );
  console.log(
    `  peak RSS ${mb(r.buildPeakRssBytes)} MB building, ${mb(r.peakRssBytes)} MB after reopening and querying; saved index ${mb(r.indexBytes)} MB, reopened in ${f2(r.reopenSeconds)} s`,
  );
  console.log(
    `  first search after reopening ${f2(r.firstSearchMs)} ms; prepare ${f2(r.prepareSeconds)} s; next searches ${f2(r.searchMs.median)} ms median, ${f2(r.searchMs.max)} ms worst (${r.searchMs.count} queries); nearby ${f2(r.nearbyMs.median)} ms median, ${f2(r.nearbyMs.max)} ms worst`,
  );
  console.log(
    `  fold in a changed file ${f2(r.foldInMs.median)} ms median, ${f2(r.foldInMs.max)} ms worst, the session's first ${f2(r.foldInMs.first)} ms (${r.foldInMs.count} files); the search after it ${f2(r.searchAfterFoldInMs.median)} ms median, ${f2(r.searchAfterFoldInMs.max)} ms worst`,
  );
}

async function main(): Promise<void> {
  const argv = process.argv.slice(2);
  if (argv[0] === '--child') {
    const k = argv[2] === 'auto' ? 'auto' : Number(argv[2]);
    process.stdout.write(
      `${JSON.stringify(await runChild(argv[1], k, argv[3] === '-' ? undefined : argv[3], argv[4] !== 'no-gitignore'))}\n`,
    );
    return;
  }
  if (argv.includes('--compare')) return runCompare();
  const k = Number(flag('k') ?? 200);
  const only = flag('only') as CorpusName | undefined;
  console.log(`Undertone indexing benchmark (k=${k}); ${loadLine()}`);
  const folder = flag('folder');
  if (folder) {
    printResult('folder', measureInChild(folder, k));
    console.log(`\n${loadLine()} (after the runs)`);
    return;
  }
  for (const name of ['demo', 'docs'] as const) {
    if (only && only !== name) continue;
    const folder = CORPORA[name];
    if (!existsSync(folder)) {
      console.log(`\n${name}: ${folder} is missing${name === 'docs' ? ' (run scripts/bench-setup.sh)' : ''}; skipped`);
      continue;
    }
    printResult(name, measureInChild(folder, k));
  }
  if (only === 'tree') printResult('tree', measureInChild(CORPORA.tree, k, undefined, honoursGitignore('tree')));
  console.log(`\n${loadLine()} (after the runs)`);
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? (err.stack ?? err.message) : String(err));
  process.exitCode = 1;
});
