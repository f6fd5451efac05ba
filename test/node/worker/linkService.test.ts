/**
 * The worker's suggested links (src/node/worker/linkService.ts) on 60 pages of the Django manual
 * (Debian python-django-doc, test/fixtures/django-doc) written out as Markdown notes with some of
 * the manual's own links as double-bracket links: the answer's shape, the style, the links left
 * out, the words behind each suggestion, and a cached link graph that follows the index.
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { LsiIndex } from '../../../src/core/index/lsiIndex.js';
import { IndexBuilder } from '../../../src/core/index/model/indexBuilder.js';
import { LinkService } from '../../../src/node/worker/linkService.js';
import { RootMap } from '../../../src/node/worker/rootMap.js';
import { loadRankingFixture } from '../../helpers/rankingChecks.js';

const fx = loadRankingFixture('django-doc');
const pages = fx.docs.filter((d) => d.id.startsWith('topics/')).slice(0, 60);
const md = (id: string) => id.replace(/\.html$/, '.md');

let dir: string;
let index: LsiIndex;
let service: LinkService;
const roots = () => new RootMap([{ name: 'ws', fsPath: dir, exclude: [] }]);
const linkedOf = new Map<string, string[]>();

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'undertone-links-worker-'));
  const builder = new IndexBuilder();
  for (const p of pages) {
    const related = [...(fx.qrels.get(p.id) ?? [])].filter((r) => pages.some((q) => q.id === r)).slice(0, 2);
    linkedOf.set(md(p.id), related.map(md));
    const text = `# ${p.id}\n\n${p.text}\n\n${related.map((r) => `[[${md(r).replace(/\.md$/, '')}]]`).join(' ')}\n`;
    const file = join(dir, md(p.id));
    mkdirSync(dirname(file), { recursive: true });
    writeFileSync(file, text);
    builder.addText({ path: md(p.id), size: text.length, mtimeMs: 0 }, text);
  }
  writeFileSync(join(dir, 'tool.py'), 'def f():\n    return 1\n');
  builder.addText({ path: 'tool.py', size: 10, mtimeMs: 0 }, 'def f():\n    return 1\n');
  index = builder.build();
  service = new LinkService({ index: () => index, roots, maxFileBytes: () => 1 << 20 });
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('LinkService.suggest', () => {
  it('answers a note with suggestions in the collection’s style, none linked either way, each with its words', async () => {
    let answered = 0;
    for (const p of pages.slice(0, 10)) {
      const key = md(p.id);
      const got = (await service.suggest(join(dir, key), 5))!;
      expect(got.style).toBe('double-bracket');
      expect(got.minSimilarity).toBeGreaterThan(0);
      for (const s of got.suggestions) {
        answered++;
        expect(linkedOf.get(key)).not.toContain(s.key);
        expect(linkedOf.get(s.key) ?? []).not.toContain(key);
        expect(s.similarity).toBeGreaterThanOrEqual(got.minSimilarity);
        expect(s.link).toMatch(/^\[\[[^\]]+\]\]$/);
        expect(s.fsPath).toBe(join(dir, s.key));
        expect(s.why?.terms.length).toBeGreaterThan(0);
      }
    }
    expect(answered).toBeGreaterThan(0);
  });

  it('reads again only the note that changed, and follows its new link', async () => {
    const key = md(pages[0].id);
    const first = (await service.suggest(join(dir, key), 5))!;
    const target = first.suggestions[0]?.key;
    expect(target).toBeDefined();
    const text = `# ${pages[0].id}\n\n${pages[0].text}\n\n[[${target!.replace(/\.md$/, '')}]]\n`;
    writeFileSync(join(dir, key), text);
    index.foldIn({ path: key, size: text.length, mtimeMs: 1 }, text);
    const again = (await service.suggest(join(dir, key), 5))!;
    expect(service.lastRefresh).toEqual({ read: 1, kept: pages.length - 1 });
    expect(again.suggestions.map((s) => s.key)).not.toContain(target);
    expect(again.linked).toBe(first.linked + 1);
  });

  it('answers null for a file that is not a note, outside the folders, or not indexed', async () => {
    expect(await service.suggest(join(dir, 'tool.py'), 5)).toBeNull();
    expect(await service.suggest('/elsewhere/a.md', 5)).toBeNull();
    expect(await service.suggest(join(dir, 'missing.md'), 5)).toBeNull();
  });
});
