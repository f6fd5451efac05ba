/**
 * The demo workspace (demo/workspace, an invented ferry-operator scenario written by the demo
 * author) against its hand-made answer key demo/expectations.json: exactCopies, nearCopies and
 * paraphrases. Checks: every planted exact copy is found as an exact group, no exact group is
 * invented, and every near-copy pair reported at the default threshold is one the key lists (no
 * false alarms); every planted paraphrase pair (a staff runbook and a public page telling one
 * procedure, sharing its codes) is a "same content, other words" pair and no other pair is.
 * Near-copy recall is printed, not asserted: several planted pairs sit below J = 0.8 by design
 * of the key (it lists look-alikes, not a Jaccard level). This is a demo regression, not a check
 * against an outside source: the demo is invented.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';
import { findLookalikes } from '../../../src/core/lookalike/findLookalikes.js';
import { REPO_ROOT } from '../../helpers/shared.js';

const workspace = join(REPO_ROOT, 'demo', 'workspace');
const keyPath = join(REPO_ROOT, 'demo', 'expectations.json');

interface AnswerKey {
  exactCopies: string[][];
  nearCopies: string[][];
  paraphrases: [string, string][];
}

function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    if (name.startsWith('.') || name === 'node_modules') return [];
    const p = join(dir, name);
    return statSync(p).isDirectory() ? walk(p) : [p];
  });
}

const pairKey = (a: string, b: string): string => (a < b ? `${a}|${b}` : `${b}|${a}`);

describe('findLookalikes on the demo workspace', () => {
  it('finds the planted exact copies and paraphrases and raises no near-copy or same-content pair the answer key lacks', () => {
    const key = JSON.parse(readFileSync(keyPath, 'utf8')) as AnswerKey;
    const files = walk(workspace).map((p) => ({ id: relative(workspace, p).split('\\').join('/'), text: readFileSync(p, 'utf8') }));
    const report = findLookalikes({ files });

    const sorted = (g: readonly string[]): string => [...g].sort().join('|');
    expect(report.exactGroups.map((g) => sorted(g.files)).sort()).toEqual(key.exactCopies.map(sorted).sort());

    const listed = new Set<string>();
    for (const g of [...key.nearCopies, ...key.exactCopies]) {
      for (let i = 0; i < g.length; i++) for (let j = i + 1; j < g.length; j++) listed.add(pairKey(g[i], g[j]));
    }
    const reported = report.nearPairs.map((p) => pairKey(p.a, p.b));
    expect(reported.filter((k) => !listed.has(k))).toEqual([]);

    const plantedPairs = key.nearCopies.flatMap((g) => g.flatMap((a, i) => g.slice(i + 1).map((b) => pairKey(a, b))));
    const found = plantedPairs.filter((k) => reported.includes(k)).length;
    const retold = report.retoldPairs.map((p) => pairKey(p.a, p.b)).sort();
    expect(retold).toEqual(key.paraphrases.map(([a, b]) => pairKey(a, b)).sort());
    for (const p of report.retoldPairs) expect(p.clause).toBe('names');

    console.log(
      `lookalike demo: ${files.length} files, exact groups ${report.exactGroups.length}/${key.exactCopies.length}, near pairs found ${found}/${plantedPairs.length} at J ≥ 0.8, same content ${retold.length}/${key.paraphrases.length}`,
    );
  });
});
