/**
 * `undertone overlaps` as a person runs it: one process per run, wall clock, CPU time and peak RSS
 * from /usr/bin/time -v, and the pairs in each band. No assertions.
 * Run: npm run bench:overlaps -- DIR [runs=3] [--cache-dir D]
 * (the index is built or refreshed first, untimed; the runs then reuse it). For the Linux kernel's
 * Documentation folder copy it out of the source tree first: the tree's own .gitignore hides it.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

const args = process.argv.slice(2);
const cacheAt = args.indexOf('--cache-dir');
const cache = cacheAt >= 0 ? args[cacheAt + 1] : mkdtempSync(join(tmpdir(), 'undertone-overlaps-bench-'));
const rest = args.filter((a, i) => i !== cacheAt && i !== cacheAt + 1);
const dir = rest[0];
const runs = Number(rest[1] ?? 3);
if (!dir || !existsSync(dir)) {
  console.error('usage: npm run bench:overlaps -- DIR [runs] [--cache-dir D]');
  process.exit(2);
}
const cli = resolve('dist', 'cli.js');
execFileSync('node', [cli, 'index', dir, '--cache-dir', cache, '-q'], { stdio: 'inherit' });

const field = (text, name) => {
  const line = text.split('\n').find((l) => l.trim().startsWith(name));
  return line ? line.slice(line.lastIndexOf(': ') + 2).trim() : '';
};
const seconds = (clock) => clock.split(':').reduce((s, x) => s * 60 + Number(x), 0);
const results = [];
let report;
for (let r = 0; r < runs; r++) {
  const out = join(cache, 'overlaps.json');
  const p = spawnSync(
    '/usr/bin/time',
    ['-v', '-o', join(cache, 'time.txt'), 'sh', '-c', `node "${cli}" overlaps "${dir}" --cache-dir "${cache}" --json > "${out}"`],
    {
      encoding: 'utf8',
    },
  );
  if (p.status !== 0) {
    console.error(p.stderr);
    process.exit(1);
  }
  const t = readFileSync(join(cache, 'time.txt'), 'utf8');
  results.push({
    wall: seconds(field(t, 'Elapsed (wall clock)')),
    cpu: Number(field(t, 'User time')) + Number(field(t, 'System time')),
    rss: Number(field(t, 'Maximum resident set size')) / 1024,
  });
  report = JSON.parse(readFileSync(out, 'utf8'));
}
const spread = (k) => {
  const v = results.map((x) => x[k]).sort((a, b) => a - b);
  return `${v[Math.floor(v.length / 2)].toFixed(1)} (${v[0].toFixed(1)}–${v[v.length - 1].toFixed(1)})`;
};
const load = readFileSync('/proc/loadavg', 'utf8').split(' ')[0];
console.log(
  `overlaps of ${dir}: ${report.stats.files} files; ${runs} runs, median (min–max): wall ${spread('wall')} s, CPU ${spread('cpu')} s, peak RSS ${spread('rss')} MB; load average ${load}\n` +
    `  exact groups ${report.exact.length}, near-copies ${report.near.length}, partial copies ${report.partial.length}, same content in other words ${report.retold.length}`,
);
for (const p of report.retold.slice(0, 20))
  console.log(`  ${p.cosine.toFixed(2)} margin ${p.margin.toFixed(2)} J ${p.jaccard.toFixed(2)}  ${p.a}  ~  ${p.b}`);
