import { describe, expect, it } from 'vitest';
import { DEFAULT_LOOKALIKE_OPTIONS } from '../../src/core/lookalike/options.js';
import {
  DEFAULT_LOOKALIKE_SETTINGS, lookalikeSummary, lookalikeTree, pairKey, readLookalikeSettings, shortNames, type GroupNode, type PairNode,
} from '../../src/extension/lookalikeModel.js';
import type { LookalikeGroupWire, LookalikesResult } from '../../src/node/worker/insightProtocol.js';
import type { FileRef } from '../../src/node/worker/workerProtocol.js';

const ref = (key: string): FileRef => ({ key, fsPath: `/w/ferry/${key}`, folder: 'ferry', relPath: key });
const pair = (a: string, b: string, similarity: number, sharedLines = 10) => ({ a: ref(a), b: ref(b), similarity, jaccard: similarity, sharedLines });
const group = (kind: LookalikeGroupWire['kind'], pairs: ReturnType<typeof pair>[], morePairs = 0): LookalikeGroupWire => ({
  kind,
  files: [...new Set(pairs.flatMap((p) => [p.a.key, p.b.key]))].map(ref),
  pairs,
  morePairs,
});
const result = (groups: LookalikeGroupWire[]): LookalikesResult => ({
  groups, files: 116, emptyFiles: 0, skippedShort: 0, unreadable: 0, threshold: 0.8, paraphraseThreshold: 0.95, ms: 1,
});

// Paths in the style of the demo workspace (demo/expectations.json exactCopies).
const sample = result([
  group('exact', [pair('src/shared/dates.ts', 'tools/roster-import/vendor/dates.ts', 1, 61)]),
  group('near', [pair('src/ticketing/fareCalculator.ts', 'src/ticketing/legacy/fareCalculatorV1.ts', 0.81), pair('src/ticketing/fareCalculator.ts', 'tools/kiosk/src/fareCalc.ts', 0.8)]),
  group('paraphrase', [pair('notes/a.md', 'notes/b.md', 0.97, 1)]),
]);

describe('look-alike settings', () => {
  it('defaults to the core finder’s own thresholds', () => {
    expect(DEFAULT_LOOKALIKE_SETTINGS.threshold).toBe(DEFAULT_LOOKALIKE_OPTIONS.threshold);
    expect(DEFAULT_LOOKALIKE_SETTINGS.paraphraseThreshold).toBe(DEFAULT_LOOKALIKE_OPTIONS.paraphraseThreshold);
    expect(readLookalikeSettings(() => undefined)).toEqual(DEFAULT_LOOKALIKE_SETTINGS);
  });

  it('keeps values in (0, 1] and falls back to the default otherwise', () => {
    const values: Record<string, unknown> = { lookalikeThreshold: 0.6, paraphraseThreshold: 1.5 };
    expect(readLookalikeSettings((k) => values[k])).toEqual({ threshold: 0.6, paraphraseThreshold: 0.95 });
    expect(readLookalikeSettings(() => 0).threshold).toBe(0.8);
    expect(readLookalikeSettings(() => '0.7').threshold).toBe(0.8);
  });
});

describe('pair names', () => {
  it('names files by their last segments, as few as tell them apart', () => {
    expect(shortNames('src/shared/dates.ts', 'tools/roster-import/vendor/dates.ts')).toEqual(['shared/dates.ts', 'vendor/dates.ts']);
    expect(shortNames('a/x.md', 'b/y.md')).toEqual(['x.md', 'y.md']);
    expect(shortNames('dates.ts', 'vendor/dates.ts')).toEqual(['dates.ts', 'vendor/dates.ts']);
    expect(shortNames('a/b/c/d.ts', 'x/b/c/d.ts')).toEqual(['a/b/c/d.ts', 'x/b/c/d.ts']);
  });

  it('keys a pair the same way whatever the order', () => {
    expect(pairKey('b', 'a')).toBe(pairKey('a', 'b'));
    expect(pairKey('a', 'b')).not.toBe(pairKey('a', 'c'));
  });
});

describe('look-alike tree', () => {
  it('puts exact copies, near-copies and paraphrases in that order, a single pair shown as the pair', () => {
    const tree = lookalikeTree(sample, new Set());
    expect(tree.sections.map((s) => s.label)).toEqual(['Exact copies', 'Near-copies', 'Same content, different words']);
    const exact = tree.sections[0].children[0] as PairNode;
    expect(exact).toMatchObject({ type: 'pair', label: 'shared/dates.ts ↔ vendor/dates.ts', description: '1.00 · 61 shared lines' });
    const near = tree.sections[1].children[0] as GroupNode;
    expect(near).toMatchObject({ type: 'group', label: 'fareCalculator.ts + 2 more', description: '3 files · 0.80–0.81' });
    expect(near.pairs.map((p) => p.description)).toEqual(['0.81 · 10 shared lines', '0.80 · 10 shared lines']);
    expect(tree.sections[2].children[0]).toMatchObject({ type: 'pair', description: '0.97 · 1 shared line' });
    expect(tree.shown).toBe(4);
  });

  it('gives every node an id of its own', () => {
    const tree = lookalikeTree(sample, new Set());
    const ids = tree.sections.flatMap((s) => [s.id, ...s.children.flatMap((c) => (c.type === 'group' ? [c.id, ...c.pairs.map((p) => p.id)] : [c.id]))]);
    expect(new Set(ids).size).toBe(ids.length);
  });

  it('leaves out hidden pairs, turning a group of two pairs into its remaining pair and dropping empty sections', () => {
    const hidden = new Set([pairKey('tools/kiosk/src/fareCalc.ts', 'src/ticketing/fareCalculator.ts'), pairKey('notes/b.md', 'notes/a.md')]);
    const tree = lookalikeTree(sample, hidden);
    expect(tree.sections.map((s) => s.kind)).toEqual(['exact', 'near']);
    expect(tree.sections[1].children[0]).toMatchObject({ type: 'pair', label: 'fareCalculator.ts ↔ fareCalculatorV1.ts' });
    expect(tree).toMatchObject({ hidden: 2, shown: 2 });
    expect(lookalikeSummary(sample, tree)).toBe('2 pairs marked "Not a look-alike" hidden.');
  });

  it('keeps a group whose pairs were cut short, saying how many more there are', () => {
    const tree = lookalikeTree(result([group('exact', [pair('a/x.ts', 'b/x.ts', 1)], 998)]), new Set());
    expect(tree.sections[0].children[0]).toMatchObject({ type: 'group', description: '2 files · 1.00 (+998 more pairs not listed)' });
  });

  it('says what was searched when nothing was found', () => {
    const empty = result([]);
    const tree = lookalikeTree(empty, new Set());
    expect(tree.sections).toEqual([]);
    expect(lookalikeSummary(empty, tree)).toBe('No look-alikes among 116 files (near-copies from Jaccard 0.8, paraphrases from cosine 0.95).');
  });
});
