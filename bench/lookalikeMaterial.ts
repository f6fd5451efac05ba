/**
 * The real material the look-alike research benches read, loaded one way: the Debian retellings
 * fixture (test/fixtures/lookalike-retellings: files and the key of natural retellings), a manual
 * stored as gzipped JSON lines (test/fixtures/cmake-doc, test/fixtures/django-doc, the topic-trees manuals) and the demo
 * workspace with its planted paraphrase pairs (demo/expectations.json).
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { gunzipSync } from 'node:zlib';

export interface MaterialFile {
  id: string;
  text: string;
}

export interface RetellingsCorpus {
  files: (MaterialFile & { source: string })[];
  /** [file a, file b, source set] of each natural retelling. */
  retellings: [string, string, string][];
}

/** One key for an unordered pair of file ids. */
export const pairKey = (a: string, b: string): string => (a < b ? `${a}|${b}` : `${b}|${a}`);

export function retellingsCorpus(): RetellingsCorpus {
  return JSON.parse(gunzipSync(readFileSync('test/fixtures/lookalike-retellings/corpus.json.gz')).toString('utf8')) as RetellingsCorpus;
}

/** The files of a gzipped JSON-lines fixture (one {id, text} per line). */
export function jsonlFiles(path: string): MaterialFile[] {
  return gunzipSync(readFileSync(path))
    .toString('utf8')
    .split('\n')
    .filter((l) => l.length > 0)
    .map((l) => JSON.parse(l) as MaterialFile);
}

/** The files of a topic-trees fixture (test/fixtures/topic-trees/*.jsonl.gz: one {path, text} per line). */
export function pathFiles(path: string): MaterialFile[] {
  return (jsonlFiles(path) as unknown as { path: string; text: string }[]).map((f) => ({ id: f.path, text: f.text }));
}

const DEMO = 'demo/workspace';

function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((n) => {
    if (n.startsWith('.')) return [];
    const p = join(dir, n);
    return statSync(p).isDirectory() ? walk(p) : [p];
  });
}

/** Every file of the demo workspace, ids relative to it with forward slashes. */
export function demoFiles(): MaterialFile[] {
  return walk(DEMO).map((p) => ({ id: relative(DEMO, p).split('\\').join('/'), text: readFileSync(p, 'utf8') }));
}

/** The demo's planted paraphrase pairs. */
export function demoParaphrases(): [string, string][] {
  return (JSON.parse(readFileSync('demo/expectations.json', 'utf8')) as { paraphrases: [string, string][] }).paraphrases;
}
