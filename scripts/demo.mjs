// `npm run demo`: indexes the embedded demo workspace with the command line, then shows a search
// by meaning whose best file uses other words than the question, and the nearest files of a file.
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
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

const query = expectations.queries[0];
const json = JSON.parse(run(null, ['ask', 'demo/workspace', query.text, '--top', '5', '--json']));
run(`search by meaning: "${query.text}"`, ['ask', 'demo/workspace', query.text, '--top', '5']);
const best = json.results[0]?.path;
if (best && existsSync(join(workspace, best))) {
  const text = readFileSync(join(workspace, best), 'utf8').toLowerCase();
  const words = (query.absentWords ?? []).filter((w) => !text.includes(w.toLowerCase()));
  if (words.length > 0) {
    process.stdout.write(`# the best file, ${best}, never uses the words ${words.map((w) => `"${w}"`).join(', ')}: a plain text search would miss it\n`);
  }
}

const neighbour = expectations.neighbours[0];
run(`files nearest in meaning to ${neighbour.file}`, ['nearby', 'demo/workspace', neighbour.file, '--top', '5']);
