/**
 * `undertone overlaps` end to end through main(). References: the demo workspace's answer key
 * (demo/expectations.json: its exact copies); a brute-force exact Jaccard of 5-word shingles
 * written here for a planted near-copy made from real text (CRAN abstracts, test/fixtures/corpora).
 */
import { mkdirSync, mkdtempSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../helpers/cliRunner.js';
import { loadCollection, REPO_ROOT } from '../helpers/shared.js';

let dir: string;
const run = (...args: string[]) => runCli(args, ['--cache-dir', join(dir, 'cache'), '--quiet']);
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'undertone-lookalikes-cli-'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

type Pair = { a: string; b: string; jaccard: number; sharedLines: number; sharedWords: number; cosine?: number; margin?: number };
type Report = {
  threshold: number;
  partialThreshold: number;
  retoldMaxJaccard: number;
  labels: Record<string, string>;
  exact: { files: string[]; words: number }[];
  near: Pair[];
  partial: Pair[];
  retold: Pair[];
  stats: { files: number; emptyFiles: number; skippedShort: number; unreadable: number; sameFile: number };
};

const demoRoot = join(REPO_ROOT, 'demo', 'workspace');
const demoKey = join(REPO_ROOT, 'demo', 'expectations.json');

describe('overlaps on the demo', () => {
  it('--json reports the planted exact copies', async () => {
    const r = await run('overlaps', demoRoot, '--json');
    expect(r.code).toBe(0);
    const report = JSON.parse(r.out) as Report;
    const key = JSON.parse(readFileSync(demoKey, 'utf8')) as { exactCopies: string[][] };
    const found = report.exact.map((g) => [...g.files].sort().join(' | ')).sort();
    expect(found).toEqual(key.exactCopies.map((g) => [...g].sort().join(' | ')).sort());
    expect(report.stats.unreadable).toBe(0);
  });
});

/**
 * Exact Jaccard of the sets of 5 consecutive words, as Broder 1997 defines resemblance (words:
 * lowercased runs of letters, marks, digits and '_', nothing dropped — the look-alike finder's
 * documented tokens), on strings rather than hashes: a brute-force reference for one pair.
 */
function jaccard5(a: string, b: string): number {
  const sh = (t: string) => {
    const tok = t.toLowerCase().match(/[\p{L}\p{M}\p{N}_]+/gu) ?? [];
    return new Set(tok.slice(0, Math.max(0, tok.length - 4)).map((_, i) => tok.slice(i, i + 5).join(' ')));
  };
  const x = sh(a);
  const y = sh(b);
  let both = 0;
  for (const s of x) if (y.has(s)) both++;
  return both / (x.size + y.size - both);
}

const cran = loadCollection('cran');
describe('overlaps on a folder of real abstracts', () => {
  let root: string;
  let original: string;
  let edited: string;
  beforeAll(() => {
    root = join(dir, 'ws');
    mkdirSync(root, { recursive: true });
    const docs = cran.docs.filter((d) => d.text.split(/\s+/).length > 150).slice(0, 30);
    docs.forEach((d, i) => writeFileSync(join(root, `abstract-${i}.md`), d.text));
    original = docs[0].text;
    // A near-copy: one word changed near the end.
    const words = original.split(' ');
    words[words.length - 3] = 'propellant';
    edited = words.join(' ');
    writeFileSync(join(root, 'abstract-0-copy.md'), original);
    writeFileSync(join(root, 'abstract-0-edited.md'), edited);
    writeFileSync(join(root, 'empty.md'), '');
    writeFileSync(join(root, 'short.md'), 'boundary layer flow');
    // Half of the abstract kept, the rest from another one: a partial copy.
    const half = original.split(' ');
    writeFileSync(
      join(root, 'abstract-0-half.md'),
      [...half.slice(0, Math.floor(half.length / 2)), ...docs[1].text.split(' ').slice(0, 60)].join(' '),
    );
    symlinkSync(join(root, 'abstract-2.md'), join(root, 'abstract-2-link.md'));
  });

  it('lists exact copies, near-copies and partial copies with their Jaccard, never a link as a copy, and notes empty and short files', async () => {
    const r = await run('overlaps', root, '--json');
    expect(r.code).toBe(0);
    const report = JSON.parse(r.out) as Report;
    expect(report.labels).toEqual({
      exact: 'Exact copies',
      near: 'Near-copies',
      partial: 'Partial copies',
      retold: 'Same content, other words',
    });
    expect(report.exact.map((g) => [...g.files].sort())).toEqual([['abstract-0-copy.md', 'abstract-0.md']]);
    const near = report.near.find((p) => p.a === 'abstract-0-edited.md' || p.b === 'abstract-0-edited.md')!;
    expect(near).toBeDefined();
    expect(near.jaccard).toBeCloseTo(jaccard5(original, edited), 3);
    const partial = report.partial.find((p) => p.a === 'abstract-0-half.md' || p.b === 'abstract-0-half.md')!;
    expect(partial).toBeDefined();
    expect(partial.jaccard).toBeGreaterThanOrEqual(0.2);
    expect(partial.jaccard).toBeLessThan(0.8);
    expect(report.stats.emptyFiles).toBe(1);
    expect(report.stats.skippedShort).toBe(1);
    const table = await run('overlaps', root);
    expect(table.out).toMatch(/Exact copies: 1 group/);
    expect(table.out).toMatch(/Near-copies \(shingle Jaccard ≥ 0\.8\): 1 pair/);
    expect(table.out).toMatch(/Partial copies \(shingle Jaccard 0\.2–0\.8\): \d+ pair/);
    // The bands meet: partial copies start where "other words" ends (issue 10: no pair in no band).
    expect(report.partialThreshold).toBe(0.2);
    expect(report.retoldMaxJaccard).toBe(report.partialThreshold);
    expect(table.out).toMatch(/1 empty file ignored; 1 file too short for near-copy search/);
  });

  it('--threshold changes what counts as a near-copy, and a bad one is refused', async () => {
    const strict = JSON.parse((await run('overlaps', root, '--json', '--threshold', '0.999')).out) as Report;
    expect(strict.threshold).toBe(0.999);
    expect(strict.near.some((p) => p.a === 'abstract-0-edited.md' || p.b === 'abstract-0-edited.md')).toBe(false);
    const bad = await run('overlaps', root, '--threshold', '1.5');
    expect(bad.code).toBe(1);
    expect(bad.err).toMatch(/--threshold needs a number above 0 and at most 1/);
    const low = await run('overlaps', root, '--threshold', '0.15');
    expect(low.code).toBe(1);
    expect(low.err).toMatch(/--threshold must be at least 0\.2 \(where partial copies start\)/);
  });

  it('a folder without overlaps says so', async () => {
    const plain = join(dir, 'plain');
    mkdirSync(plain, { recursive: true });
    cran.docs.slice(40, 46).forEach((d, i) => writeFileSync(join(plain, `n${i}.md`), d.text));
    const r = await run('overlaps', plain);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/^No overlaps among 6 files\./);
    // The command's old name is still accepted and gives the same answer.
    const old = await run('lookalikes', plain);
    expect(old.code).toBe(0);
    expect(old.out).toBe(r.out);
  });
});
