/**
 * Locates the test fixtures (test/fixtures: published checks and public test collections, with
 * their provenance in a README beside each). A missing fixture is a failure, never a skip: the
 * checks against published values must run on every checkout.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

export const REPO_ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..');
export const FIXTURES_DIR = resolve(REPO_ROOT, 'test', 'fixtures');

/** A fixture the tests need is not in the checkout. */
export class FixtureMissingError extends Error {
  constructor(rel: string) {
    super(`test/fixtures/${rel} is missing from the checkout (see test/fixtures/*/README.md for how it is made)`);
    this.name = 'FixtureMissingError';
  }
}

/** Absolute path of a file under test/fixtures. @throws FixtureMissingError when it is absent. */
export function fixturePath(rel: string): string {
  const p = join(FIXTURES_DIR, rel);
  if (!existsSync(p)) throw new FixtureMissingError(rel);
  return p;
}

export interface JudgedCollection {
  docs: { id: string; text: string }[];
  queries: { id: string; text: string }[];
  qrels: Map<string, Set<string>>;
}

/**
 * Reads one of test/fixtures/corpora/<name> (docs.jsonl, queries.jsonl, qrels.tsv).
 * @throws FixtureMissingError when the collection is absent.
 */
export function loadCollection(name: string): JudgedCollection {
  const dir = fixturePath(`corpora/${name}`);
  const jsonl = (f: string) =>
    readFileSync(join(dir, f), 'utf8')
      .split('\n')
      .filter((l) => l.trim().length > 0)
      .map((l) => JSON.parse(l) as { id: string; text: string });
  const qrels = new Map<string, Set<string>>();
  for (const line of readFileSync(join(dir, 'qrels.tsv'), 'utf8').split('\n')) {
    const [q, d, rel] = line.split('\t');
    if (!q || !d || !(Number(rel) > 0)) continue;
    if (!qrels.has(q)) qrels.set(q, new Set());
    qrels.get(q)!.add(d);
  }
  return { docs: jsonl('docs.jsonl'), queries: jsonl('queries.jsonl'), qrels };
}

/** Debian's Python, which holds the reference libraries (python3-scipy). */
const PYTHON = '/usr/bin/python3';

/**
 * The Python that runs the scipy reference checks. @throws Error naming the Debian package when
 * scipy is not installed: a reference check that cannot run is a failure, not a skip.
 */
export function referencePython(): string {
  const r = spawnSync(PYTHON, ['-c', 'import scipy.io, scipy.sparse.linalg'], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`the reference library scipy is missing (${PYTHON}): apt-get install python3-scipy`);
  return PYTHON;
}
