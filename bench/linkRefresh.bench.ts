/**
 * Suggested links after an edit, on a notes collection of a few thousand notes: the worker's
 * LinkService (src/node/worker/linkService.ts) answering one note's suggestions right after one
 * other note changed and was folded into the index (it reads that note again and keeps the
 * others' parses), against a service with nothing kept (it reads every note, as before the
 * service kept parses). Figures only, no assertions; alternating runs, median and range.
 * Notes: the pages of the Django manual (Debian python-django-doc 3:4.2, test/fixtures/django-doc)
 * cycled to the count asked, each as Markdown with three double-bracket links to other notes.
 *
 * Run: npm run bench:links -- [notes=3000] [runs=5]
 */
import { gunzipSync } from 'node:zlib';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { IndexBuilder } from '../src/core/index/model/indexBuilder.js';
import { LinkService } from '../src/node/worker/linkService.js';
import { RootMap } from '../src/node/worker/rootMap.js';

const count = Number(process.argv[2] ?? 3000);
const runs = Number(process.argv[3] ?? 5);
const repo = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..');
const docs = gunzipSync(readFileSync(join(repo, 'test/fixtures/django-doc/docs.jsonl.gz')))
  .toString('utf8')
  .split('\n')
  .filter((l) => l.length > 0)
  .map((l) => JSON.parse(l) as { id: string; text: string });
const dir = mkdtempSync(join(tmpdir(), 'undertone-links-bench-'));
const roots = new RootMap([{ name: 'ws', fsPath: dir, exclude: [] }]);
const keyOf = (i: number): string => `n${Math.floor(i / docs.length)}/${docs[i % docs.length].id.replace(/\.html$/, '')}.md`;
const noteText = (i: number, edit: number): string => {
  const links = [1, 7, 31].map((d) => `[[${keyOf((i + d) % count).replace(/\.md$/, '')}]]`).join(' ');
  return `# ${keyOf(i)}\n\n${docs[i % docs.length].text}\n\n${links}\n${edit > 0 ? `\nedit ${edit}\n` : ''}`;
};

const builder = new IndexBuilder();
for (let i = 0; i < count; i++) {
  const text = noteText(i, 0);
  const file = join(dir, keyOf(i));
  mkdirSync(dirname(file), { recursive: true });
  writeFileSync(file, text);
  builder.addText({ path: keyOf(i), size: text.length, mtimeMs: 0 }, text);
}
const t0 = performance.now();
const index = builder.build();
console.log(`${count} notes (${docs.length} manual pages cycled), index built in ${((performance.now() - t0) / 1000).toFixed(1)} s`);

const source = { index: () => index, roots: () => roots, maxFileBytes: () => 1 << 20 };
const kept = new LinkService(source);
await kept.suggest(join(dir, keyOf(0)), 5);
const incremental: number[] = [];
const full: number[] = [];
for (let r = 1; r <= runs; r++) {
  const changed = (r * 97) % count;
  const text = noteText(changed, r);
  writeFileSync(join(dir, keyOf(changed)), text);
  index.foldIn({ path: keyOf(changed), size: text.length, mtimeMs: r }, text);
  for (const mode of r % 2 === 0 ? ['kept', 'full'] : ['full', 'kept']) {
    const service = mode === 'kept' ? kept : new LinkService(source);
    const s = performance.now();
    await service.suggest(join(dir, keyOf((changed + 1) % count)), 5);
    (mode === 'kept' ? incremental : full).push(performance.now() - s);
    if (mode === 'kept' && kept.lastRefresh.read !== 1) throw new Error(`read ${kept.lastRefresh.read} notes after one edit`);
  }
}
const fmt = (xs: number[]): string => {
  const s = [...xs].sort((a, b) => a - b);
  return `median ${s[Math.floor(s.length / 2)].toFixed(0)} ms (${s[0].toFixed(0)}-${s[s.length - 1].toFixed(0)})`;
};
console.log(`suggest after one edit, parses kept (1 note read): ${fmt(incremental)}`);
console.log(`suggest after one edit, nothing kept (${count} notes read): ${fmt(full)}`);
rmSync(dir, { recursive: true, force: true });
