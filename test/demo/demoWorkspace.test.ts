/**
 * Demo regression: the embedded demo workspace is invented data (demo/README.md), so this is not
 * a check of the method against an outside source; it keeps the demo showing what it promises:
 * each planted question's best-worded-differently file in the top 3, and each planted neighbour
 * among its file's 5 nearest (demo/expectations.json).
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { indexFolder } from '../../src/node/folderIndexer.js';
import { REPO_ROOT } from '../helpers/shared.js';

const expectations = JSON.parse(readFileSync(join(REPO_ROOT, 'demo', 'expectations.json'), 'utf8')) as {
  queries: { text: string; expectTop3: string[] }[];
  neighbours: { file: string; expectAmongTop5: string[] }[];
};

describe('demo workspace', async () => {
  const dir = mkdtempSync(join(tmpdir(), 'undertone-demo-'));
  const { index } = await indexFolder(join(REPO_ROOT, 'demo', 'workspace'), { indexFile: join(dir, 'index.undertone') });
  rmSync(dir, { recursive: true, force: true });

  for (const q of expectations.queries) {
    it(`puts ${q.expectTop3[0]} in the top 3 for "${q.text}"`, () => {
      expect(index.search(q.text, { top: 3 }).map((h) => h.path)).toContain(q.expectTop3[0]);
    });
  }
  for (const n of expectations.neighbours) {
    it(`lists ${n.expectAmongTop5.join(', ')} among the 5 nearest files of ${n.file}`, () => {
      const near = index.nearby(n.file, { top: 5 }).map((h) => h.path);
      for (const f of n.expectAmongTop5) expect(near).toContain(f);
    });
  }
});
