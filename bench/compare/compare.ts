/**
 * `npm run bench:compare`: the commands as a user runs them, side by side (see runCommandCompare
 * below); with --detail, the in-process comparison that follows.
 *
 * The in-process comparison: Undertone and the reference pipeline (bench/compare/reference.py:
 * Debian's scikit-learn, TfidfVectorizer(sublinear_tf, min_df 2, max_df 0.5) + TruncatedSVD
 * (randomized, n_iter 5, n_oversamples 10), same k; the vectoriser opens the files itself) on
 * the same files, in one run. Corpora: the demo, the linux-source-6.1 Documentation folder and
 * the full tree (scripts/bench-setup.sh installs the packages and unpacks the tree). For each:
 * stage times, totals, peak RSS, ratios
 * Undertone / reference, and the accuracy of our leading k singular values against scipy's
 * ARPACK (svds) on our own weighted matrix, exported in Matrix Market format.
 *
 * Options: --k N (default 200), --only demo|docs|tree, --runs N (default 3), --detail,
 * --no-arpack (with --detail); for the commands side by side, --before <cli.js> also runs another
 * build of the command line (say, main's dist/cli.js: before and after a change, alternating) and
 * --no-current leaves out the reference's current configuration.
 */
import { spawnSync } from 'node:child_process';
import { closeSync, existsSync, mkdtempSync, openSync, readFileSync, readSync, rmSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import type { ChildResult } from '../benchChild.js';
import { CORPORA, flag, honoursGitignore, loadLine, measureInChild, REPO, type CorpusName } from '../benchShared.js';

const PYTHON = '/usr/bin/python3';
const REFERENCE = join(REPO, 'bench', 'compare', 'reference.py');

interface ReferenceResult {
  files: number;
  docs: number;
  terms: number;
  nnz: number;
  k: number;
  seconds: { read: number; vectorize: number; svd: number };
  total: number;
  cpuSeconds: number;
  peakRss: number;
}

interface ArpackResult {
  k: number;
  seconds: { read: number; svds: number };
  exact: number[];
  maxRelError: number;
  meanRelError: number;
  worstIndex: number;
}

function python(args: string[]): unknown {
  const r = spawnSync(PYTHON, [REFERENCE, ...args], { encoding: 'utf8', maxBuffer: 256 * 1024 * 1024 });
  if (r.status !== 0) throw new Error(`reference.py ${args[0]} failed:\n${r.stderr}`);
  return JSON.parse(r.stdout.trim().split('\n').pop()!);
}

function ensureReference(): void {
  const probe = spawnSync(PYTHON, ['-c', 'import sklearn, scipy.sparse.linalg'], { encoding: 'utf8' });
  if (probe.status === 0) return;
  console.log('python3-sklearn / python3-scipy missing: running scripts/bench-setup.sh (apt)');
  const r = spawnSync('bash', [join(REPO, 'scripts', 'bench-setup.sh')], { stdio: 'inherit' });
  if (r.status !== 0) throw new Error('scripts/bench-setup.sh failed');
}

const pad = (s: string, n: number): string => s.padStart(n);
const sec = (x: number): string => (Number.isFinite(x) ? x.toFixed(2) : '–');
const ratio = (a: number, b: number): string => (b > 0 ? `${(a / b).toFixed(2)}×` : '–');
const mb = (bytes: number): string => `${(bytes / 1048576).toFixed(0)} MB`;

function printComparison(name: string, ours: ChildResult, ref: ReferenceResult, arpack?: ArpackResult, ourS?: number[]): void {
  const oursBuild = ours.buildSeconds;
  console.log(`\n=== ${name}: ${ours.files} files (${(ours.bytes / 1048576).toFixed(1)} MB), k=${ours.k} ===`);
  console.log(
    `  matrix: Undertone ${ours.terms} terms × ${ours.files} files, ${ours.nonZeros} non-zeros; reference ${ref.terms} terms × ${ref.docs} files, ${ref.nnz} non-zeros`,
  );
  console.log(`  ${'stage'.padEnd(34)}${pad('Undertone s', 12)}${pad('reference s', 13)}`);
  const row = (label: string, a: number, b: number): void => console.log(`  ${label.padEnd(34)}${pad(sec(a), 12)}${pad(sec(b), 13)}`);
  row('scan (list files)', ours.stages.scan, NaN);
  row('read + tokenize (ref: file sizes)', ours.stages.tokenize, ref.seconds.read);
  row('matrix (ref: read + TfidfVectorizer)', ours.stages.matrix, ref.seconds.vectorize);
  row('SVD (+ document vectors)', ours.stages.svd, ref.seconds.svd);
  row('build total', oursBuild, ref.total);
  row('CPU seconds, all threads (ours incl. save)', ours.cpuSeconds, ref.cpuSeconds);
  row('save index (Undertone only)', ours.stages.save, NaN);
  console.log(`  build time ratio Undertone / reference: ${ratio(oursBuild, ref.total)} (target ≤ 0.5×)`);
  console.log(
    `  peak RSS of the build: Undertone ${mb(ours.buildPeakRssBytes)}, reference ${mb(ref.peakRss)}, ratio ${ratio(ours.buildPeakRssBytes, ref.peakRss)} (target ≤ 1×); Undertone after reopening a second copy and querying: ${mb(ours.peakRssBytes)}`,
  );
  if (arpack && ourS) {
    const rel = arpack.exact.map((e, i) => Math.abs(ourS[i] - e) / Math.max(e, 1e-9 * arpack.exact[0]));
    const top = (n: number): string => (Math.max(...rel.slice(0, n)) * 100).toFixed(3);
    console.log(
      `  singular values vs ARPACK (svds, ${sec(arpack.seconds.svds)} s): worst ${(arpack.maxRelError * 100).toFixed(3)}% (index ${arpack.worstIndex + 1}), ` +
        `mean ${(arpack.meanRelError * 100).toFixed(3)}%; worst of the first 10 / 50 / 100: ${top(10)}% / ${top(50)}% / ${top(100)}%`,
    );
  }
  console.log(
    `  reopen saved index ${sec(ours.reopenSeconds)} s; first search ${sec(ours.firstSearchMs)} ms; prepare (in the background in the editor) ${sec(ours.prepareSeconds)} s; next searches ${sec(ours.searchMs.median)} ms median / ${sec(ours.searchMs.max)} ms worst; nearby ${sec(ours.nearbyMs.median)} / ${sec(ours.nearbyMs.max)} ms`,
  );
  console.log(
    `  fold in a changed file ${sec(ours.foldInMs.median)} ms median, ${sec(ours.foldInMs.max)} ms worst, the first ${sec(ours.foldInMs.first)} ms; the search after it ${sec(ours.searchAfterFoldInMs.median)} ms median`,
  );
}

export async function runCompare(): Promise<void> {
  if (process.argv.includes('--detail')) return runDetail();
  return runCommandCompare();
}

/**
 * How a build of the command starts when installed: the environment and the Node flags its #! line
 * names (`#!/usr/bin/env -S NAME=value… node --flag…`), so `NAME=value node <flags> cli.js` runs it
 * as `undertone` does.
 */
function launchOf(cli: string): { flags: string[]; env: Record<string, string> } {
  const fd = openSync(cli, 'r');
  try {
    const head = Buffer.alloc(256);
    const n = readSync(fd, head, 0, head.length, 0);
    const first = head.subarray(0, n).toString('utf8').split('\n')[0];
    const m = /^#!\s*\/usr\/bin\/env\s+(?:-S\s+)?((?:[A-Za-z_][A-Za-z0-9_]*=\S*\s+)*)node(?:\s+(.*))?$/.exec(first);
    const env: Record<string, string> = {};
    for (const pair of m?.[1]?.trim().split(/\s+/) ?? [])
      if (pair !== '') env[pair.slice(0, pair.indexOf('='))] = pair.slice(pair.indexOf('=') + 1);
    return { flags: m?.[2] ? m[2].trim().split(/\s+/) : [], env };
  } finally {
    closeSync(fd);
  }
}

/** One process measured by /usr/bin/time -v: wall clock, CPU (user + system), peak RSS, and the load when it ended. */
interface Timed {
  wall: number;
  cpu: number;
  peakRss: number;
  load: number;
  stdout: string;
}

function timed(cmd: string, args: string[], env?: NodeJS.ProcessEnv): Timed {
  const r = spawnSync('/usr/bin/time', ['-v', cmd, ...args], { encoding: 'utf8', env, maxBuffer: 256 * 1024 * 1024 });
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(' ')} failed:\n${r.stderr.slice(-4000)}`);
  const wallText = /Elapsed \(wall clock\).*: ([\d:.]+)\s*$/m.exec(r.stderr)?.[1] ?? 'NaN';
  const wall = wallText.split(':').reduce((acc, part) => acc * 60 + Number(part), 0);
  const peakKb = Number(/Maximum resident set size \(kbytes\): (\d+)/.exec(r.stderr)?.[1] ?? NaN);
  const seconds = (what: string): number => Number(new RegExp(`${what} time \\(seconds\\): ([\\d.]+)`).exec(r.stderr)?.[1] ?? NaN);
  return { wall, cpu: seconds('User') + seconds('System'), peakRss: peakKb * 1024, load: loadavg()[0], stdout: r.stdout };
}

interface Side {
  label: string;
  runs: Timed[];
}

const median = (xs: number[]): number => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};
const spread = (xs: number[], f: (x: number) => string): string => `${f(median(xs))} (${f(Math.min(...xs))}–${f(Math.max(...xs))})`;

/**
 * The comparison as a user meets it: `undertone index <folder> --k K --rebuild` as one process
 * against reference.py as one process, each timed by /usr/bin/time -v (wall clock, peak RSS of
 * the whole process), in alternating order (ours, fastest reference, current reference, ours…)
 * so all sides see the same load. The reference reads the files Undertone's scan keeps
 * (`undertone count <folder> --list`). Prints medians with the range over the runs, and ratios.
 */
function runCommandCompare(): void {
  const k = Number(flag('k') ?? 200);
  const runs = Number(flag('runs') ?? 3);
  const only = flag('only') as CorpusName | undefined;
  ensureReference();
  const cli = join(REPO, 'dist', 'cli.js');
  console.log(`Commands side by side, k=${k}, ${runs} alternating runs each; ${loadLine()}`);
  for (const name of ['demo', 'docs', 'tree'] as const) {
    if (only && only !== name) continue;
    const folder = CORPORA[name];
    if (!existsSync(folder)) {
      console.log(`\n${name}: ${folder} is missing${name === 'demo' ? '' : ' (run scripts/bench-setup.sh)'}; skipped`);
      continue;
    }
    const dir = mkdtempSync(join(tmpdir(), `undertone-cmd-${name}-`));
    try {
      const env = { ...process.env, UNDERTONE_CACHE_DIR: join(dir, 'cache') };
      // The corpora sit in this repository's git work tree, so the scan would read their .gitignore
      // files; the tree's top-level one (from Debian's packaging repository: `/*`, `!/debian/`)
      // would then hide every file. A user's unpacked tarball or demo folder is outside any work
      // tree and scanned without them (scanRules.ts), which --no-gitignore reproduces here (the
      // Documentation folder and the demo keep the same files either way: 8,863 and 119).
      const scanFlags = ['--no-gitignore'];
      const list = spawnSync(process.execPath, [cli, 'count', folder, '--list', ...scanFlags], {
        encoding: 'utf8',
        env,
        maxBuffer: 256 * 1024 * 1024,
      });
      if (list.status !== 0) throw new Error(`undertone count --list failed:\n${list.stderr}`);
      const paths = list.stdout.split('\n').filter((p) => p !== '');
      writeFileSync(join(dir, 'paths.txt'), paths.map((p) => join(folder, p)).join('\n') + '\n');
      const refArgs = (extra: string[]): string[] => [REFERENCE, 'pipeline', '--files', join(dir, 'paths.txt'), '--k', String(k), ...extra];
      const ourArgs = (path: string): string[] => [
        ...launchOf(path).flags,
        path,
        'index',
        folder,
        '--k',
        String(k),
        '--rebuild',
        '--json',
        ...scanFlags,
      ];
      const ourEnv = (path: string): NodeJS.ProcessEnv => ({ ...env, ...launchOf(path).env });
      const sides: Side[] = [
        { label: `undertone index --k ${k} --rebuild`, runs: [] },
        { label: 'reference, fastest (in memory, letters-first)', runs: [] },
      ];
      const steps: (() => Timed)[] = [
        () => timed(process.execPath, ourArgs(cli), ourEnv(cli)),
        () => timed(PYTHON, refArgs(['--in-memory', '--letters-first'])),
      ];
      if (!process.argv.includes('--no-current')) {
        sides.push({ label: 'reference, current (input=filename)', runs: [] });
        steps.push(() => timed(PYTHON, refArgs([])));
      }
      const before = flag('before');
      if (before) {
        sides.push({ label: 'undertone, before (--before)', runs: [] });
        steps.push(() => timed(process.execPath, ourArgs(resolve(before)), ourEnv(resolve(before))));
      }
      console.log(`\n=== ${name}: ${paths.length} files ===`);
      for (let r = 0; r < runs; r++) {
        steps.forEach((step, i) => {
          const t = step();
          sides[i].runs.push(t);
          console.log(
            `  run ${r + 1} ${sides[i].label.padEnd(48)} ${sec(t.wall).padStart(7)} s ${mb(t.peakRss).padStart(8)}  cpu ${sec(t.cpu).padStart(6)} s  load ${t.load.toFixed(2)}`,
          );
        });
      }
      const ours = JSON.parse(sides[0].runs[0].stdout) as {
        terms: number;
        nonZeros: number;
        files: number;
        seconds: Record<string, number>;
      };
      const fast = JSON.parse(sides[1].runs[0].stdout.trim().split('\n').pop()!) as ReferenceResult;
      const current = sides.findIndex((s) => s.label.startsWith('reference, current'));
      const slow = current < 0 ? undefined : (JSON.parse(sides[current].runs[0].stdout.trim().split('\n').pop()!) as ReferenceResult);
      console.log(
        `  matrix: Undertone ${ours.terms} terms × ${ours.files} files, ${ours.nonZeros} non-zeros; ` +
          `fastest reference ${fast.terms} × ${fast.docs}, ${fast.nnz}` +
          (slow ? `; current reference ${slow.terms} × ${slow.docs}, ${slow.nnz}` : ''),
      );
      console.log(`  ${''.padEnd(48)} ${'wall s, median (range)'.padEnd(24)} ${'peak RSS MB, median (range)'.padEnd(28)} cpu s (user+sys)`);
      for (const s of sides)
        console.log(
          `  ${s.label.padEnd(48)} ${spread(
            s.runs.map((t) => t.wall),
            sec,
          ).padEnd(24)} ${spread(
            s.runs.map((t) => t.peakRss / 1048576),
            (x) => x.toFixed(0),
          ).padEnd(28)} ${spread(
            s.runs.map((t) => t.cpu),
            sec,
          )}`,
        );
      for (const ref of sides.slice(1)) {
        const wr = sides[0].runs.map((t, i) => t.wall / ref.runs[i].wall);
        const mr = sides[0].runs.map((t, i) => t.peakRss / ref.runs[i].peakRss);
        console.log(
          `  Undertone / ${ref.label}: time ${spread(wr, (x) => `${x.toFixed(2)}×`)}, peak RSS ${spread(mr, (x) => `${x.toFixed(2)}×`)} (per-run ratios)`,
        );
      }
      const loads = sides.flatMap((s) => s.runs.map((t) => t.load));
      console.log(`  load average (1 min) at the end of each run: ${Math.min(...loads).toFixed(2)}–${Math.max(...loads).toFixed(2)}`);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }
  console.log(`\n${loadLine()} (after the runs)`);
}

async function runDetail(): Promise<void> {
  const k = Number(flag('k') ?? 200);
  const only = flag('only') as CorpusName | undefined;
  const arpackWanted = !process.argv.includes('--no-arpack');
  ensureReference();
  console.log(`Undertone vs reference pipeline (scikit-learn TfidfVectorizer + TruncatedSVD), k=${k}; ${loadLine()}`);
  for (const name of ['demo', 'docs', 'tree'] as const) {
    if (only && only !== name) continue;
    const folder = CORPORA[name];
    if (!existsSync(folder)) {
      console.log(`\n${name}: ${folder} is missing${name === 'demo' ? '' : ' (run scripts/bench-setup.sh)'}; skipped`);
      continue;
    }
    const dir = mkdtempSync(join(tmpdir(), `undertone-compare-${name}-`));
    try {
      const ours = measureInChild(folder, k, dir, honoursGitignore(name));
      const ref = python(['pipeline', '--files', join(dir, 'paths.txt'), '--k', String(ours.k)]) as ReferenceResult;
      let arpack: ArpackResult | undefined;
      if (arpackWanted)
        arpack = python([
          'arpack',
          '--mtx',
          join(dir, 'matrix.mtx'),
          '--k',
          String(ours.k),
          '--ours',
          join(dir, 'singular-values.txt'),
        ]) as ArpackResult;
      const ourS = readFileSync(join(dir, 'singular-values.txt'), 'utf8')
        .split('\n')
        .filter((x) => x.trim())
        .map(Number);
      printComparison(name, ours, ref, arpack, ourS);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }
  console.log(`\n${loadLine()} (after the runs)`);
}
