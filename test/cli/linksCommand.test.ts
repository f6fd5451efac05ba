/**
 * `undertone links` end to end through main(), on real pages: 60 pages of the Django manual
 * (Debian python-django-doc, test/fixtures/django-doc) written out as Markdown notes, some of them
 * linked to each other with the links written into their text. Checks the wiring: linked notes
 * are never suggested, suggestions obey --top and --min-similarity, links come in the collection's
 * style and resolve back to their target.
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { LinkGraph } from '../../src/core/links/linkGraph.js';
import { runCli } from '../helpers/cliRunner.js';
import { loadRankingFixture } from '../helpers/rankingChecks.js';

interface Report {
  file?: string;
  style: string;
  notes: number;
  linkedPairs: number;
  minSimilarity: number;
  suggestions: {
    file: string;
    path: string;
    title: string;
    score: number;
    similarity: number;
    link: string;
    words: { word: string; share: number }[];
  }[];
}

let dir: string;
const run = (root: string, ...args: string[]) => runCli(['links', root, ...args], ['--cache-dir', join(dir, 'cache'), '--quiet']);
const fx = loadRankingFixture('django-doc');
const pages = fx.docs.filter((d) => d.id.startsWith('topics/')).slice(0, 60);
const md = (id: string) => id.replace(/\.html$/, '.md');

function writeNotes(root: string, linkOf: (fromId: string, toId: string) => string): void {
  for (const p of pages) {
    const related = [...(fx.qrels.get(p.id) ?? [])].filter((r) => pages.some((q) => q.id === r)).slice(0, 3);
    const links = related.map((r) => linkOf(p.id, r)).join(' ');
    const file = join(root, md(p.id));
    mkdirSync(dirname(file), { recursive: true });
    writeFileSync(file, `# ${p.id}\n\n${p.text}\n\nSee also: ${links}\n`);
  }
}

let mdRoot: string;
let wikiRoot: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'undertone-links-cli-'));
  mdRoot = join(dir, 'markdown');
  wikiRoot = join(dir, 'wiki');
  const rel = (from: string, to: string) => {
    const up = from
      .split('/')
      .slice(0, -1)
      .map(() => '..');
    return [...up, md(to)].join('/');
  };
  writeNotes(mdRoot, (from, to) => `[${to}](${rel(from, to)})`);
  writeNotes(wikiRoot, (_from, to) => `[[${md(to).split('/').pop()!.replace(/\.md$/, '')}]]`);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('undertone links', () => {
  it('--json for the whole folder: no suggested pair is already linked; relative Markdown links that resolve', async () => {
    const r = await run(mdRoot, '--json');
    expect(r.code).toBe(0);
    const report = JSON.parse(r.out) as Report;
    expect(report.style).toBe('markdown');
    expect(report.notes).toBe(pages.length);
    expect(report.linkedPairs).toBeGreaterThan(20);
    expect(report.suggestions.length).toBeGreaterThan(0);
    const graph = LinkGraph.fromNotes(pages.map((p) => ({ key: md(p.id), text: '' })));
    for (const s of report.suggestions) {
      expect(s.similarity).toBeGreaterThanOrEqual(report.minSimilarity);
      expect(s.words.length).toBeGreaterThan(0);
      expect(s.link).toMatch(/^\[.+\]\(.+\.md\)$/);
      // The link written into its note reaches the suggested note.
      const g = LinkGraph.fromNotes([
        ...graph.notes
          .keys()
          .filter((k) => k !== s.file)
          .map((k) => ({ key: k, text: '' })),
        { key: s.file, text: s.link },
      ]);
      expect(g.linksFrom(s.file)).toEqual([s.path]);
    }
    const text = await run(mdRoot);
    expect(text.out).toContain('relative Markdown links');
    expect(text.out).toContain('link to add');
  });

  it('one note: at most --top suggestions, none it links with; --min-similarity 1 leaves it quiet', async () => {
    const note = md(pages[0].id);
    const r = await run(mdRoot, note, '--json', '--top', '2', '--min-similarity', '0');
    const report = JSON.parse(r.out) as Report;
    expect(report.file).toBe(note);
    expect(report.suggestions).toHaveLength(2);
    const linked = new Set([...(fx.qrels.get(pages[0].id) ?? [])].map(md));
    for (const s of report.suggestions) expect(linked.has(s.path)).toBe(false);
    const quiet = await run(mdRoot, note, '--min-similarity', '1');
    expect(quiet.code).toBe(0);
    expect(quiet.out).toContain('No links worth suggesting');
  });

  it('writes double-bracket links in a collection that uses them', async () => {
    const r = await run(wikiRoot, '--json', '--min-similarity', '0');
    const report = JSON.parse(r.out) as Report;
    expect(report.style).toBe('double-bracket');
    expect(report.suggestions.length).toBeGreaterThan(0);
    for (const s of report.suggestions) expect(s.link).toMatch(/^\[\[[^\]]+\]\]$/);
  });

  it('refuses a file that is not a note, and a bad --min-similarity', async () => {
    writeFileSync(join(mdRoot, 'tool.py'), 'def models_and_databases():\n    return "query sets"\n');
    const r = await run(mdRoot, 'tool.py');
    expect(r.code).toBe(1);
    expect(r.err).toContain('not one');
    const bad = await run(mdRoot, '--min-similarity', '2');
    expect(bad.code).not.toBe(0);
    expect(bad.err).toContain('--min-similarity');
  });
});
