// `npm run demo`: indexes the embedded demo workspace with the command line, then shows a search
// by meaning whose best file uses other words than the question, and the nearest files of a file.
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const workspace = join(root, 'demo', 'workspace');
const cache = join(root, '.cache', 'demo-index');
const cli = join(root, 'dist', 'cli.js');
const expectations = JSON.parse(readFileSync(join(root, 'demo', 'expectations.json'), 'utf8'));

function run(title, args) {
  process.stdout.write(`\n$ undertone ${args.map((a) => (a.includes(' ') ? JSON.stringify(a) : a)).join(' ')}\n`);
  if (title) process.stdout.write(`# ${title}\n`);
  const res = spawnSync(process.execPath, [cli, ...args, '--cache-dir', cache], { cwd: root, encoding: 'utf8' });
  process.stdout.write(res.stdout);
  process.stderr.write(res.stderr);
  if (res.status !== 0) process.exit(res.status ?? 1);
  return res.stdout;
}

run('build (or refresh) the saved index of the demo workspace', ['index', 'demo/workspace']);

// Two planted questions whose best answer is worded differently from the question.
for (const query of expectations.queries.slice(0, 2)) {
  const out = run(`search by meaning: "${query.text}"`, ['ask', 'demo/workspace', query.text, '--top', '5']);
  const target = query.expectTop3[0];
  const rank = out.split('\n').findIndex((line) => line.trim().endsWith(target)) - 1;
  const text = readFileSync(join(workspace, target), 'utf8').toLowerCase();
  const absent = (query.absentWords ?? []).filter((w) => !text.includes(w.toLowerCase()));
  if (rank >= 1 && absent.length > 0) {
    process.stdout.write(
      `# rank ${rank}, ${target}, never contains ${absent.map((w) => `"${w}"`).join(', ')}: a plain text search for those words misses it\n`,
    );
  }
}

const neighbour = expectations.neighbours[0];
run(`files nearest in meaning to ${neighbour.file}`, ['nearby', 'demo/workspace', neighbour.file, '--top', '5']);
