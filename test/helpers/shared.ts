/** Locates the test fixtures (test/fixtures: published checks and public test collections, with their provenance). */
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

export const REPO_ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..');
export const SHARED_DIR = resolve(REPO_ROOT, 'test', 'fixtures');

/** Absolute path of a file under test/fixtures, or null when it is absent (the caller skips). */
export function sharedPath(rel: string): string | null {
  const p = join(SHARED_DIR, rel);
  return existsSync(p) ? p : null;
}

export function missingMessage(rel: string): string {
  return `skipped: test/fixtures/${rel} is missing from the checkout`;
}

export interface JudgedCollection {
  docs: { id: string; text: string }[];
  queries: { id: string; text: string }[];
  qrels: Map<string, Set<string>>;
}

/** Reads one of test/fixtures/corpora/<name> (docs.jsonl, queries.jsonl, qrels.tsv). */
export function loadCollection(name: string): JudgedCollection | null {
  const dir = sharedPath(`corpora/${name}`);
  if (!dir) return null;
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
