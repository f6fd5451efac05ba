import { describe, expect, it } from 'vitest';
import { DEFAULT_LOOKALIKE_OPTIONS } from '../../src/core/lookalike/options.js';
import {
  DEFAULT_LOOKALIKE_SETTINGS,
  lookalikeSummary,
  lookalikeTree,
  pairKey,
  readLookalikeSettings,
  SECTION_PAGE,
  shortNames,
  type PairNode,
} from '../../src/extension/lookalikeModel.js';
import type { LookalikeGroupWire, LookalikesResult } from '../../src/node/worker/insightProtocol.js';
import type { FileRef } from '../../src/node/worker/workerProtocol.js';

const ref = (key: string): FileRef => ({ key, fsPath: `/w/ferry/${key}`, folder: 'ferry', relPath: key });
const pair = (
  a: string,
  b: string,
  similarity: number,
  sharedLines = 10,
  lines: [number, number] = [12, 12],
  sharedWords = 80,
  words: [number, number] = [96, 96],
) => ({
  a: ref(a),
  b: ref(b),
  similarity,
  jaccard: similarity,
  sharedLines,
  lines,
  sharedWords,
  words,
});
const group = (kind: LookalikeGroupWire['kind'], pairs: ReturnType<typeof pair>[], morePairs = 0): LookalikeGroupWire => ({
  kind,
  files: [...new Set(pairs.flatMap((p) => [p.a.key, p.b.key]))].map(ref),
  pairs,
  morePairs,
});
const result = (groups: LookalikeGroupWire[]): LookalikesResult => ({
  groups,
  morePairs: { exact: 0, near: 0, partial: 0, retold: 0 },
  sameFile: 0,
  files: 116,
  emptyFiles: 0,
  skippedShort: 0,
  unreadable: 0,
  threshold: 0.8,
  partialThreshold: 0.2,
  ms: 1,
});

// Paths in the style of the demo workspace (demo/expectations.json exactCopies).
const sample = result([
  group('exact', [pair('src/shared/dates.ts', 'tools/roster-import/vendor/dates.ts', 1, 61, [61, 61], 400, [400, 400])]),
  group('near', [pair('src/ticketing/fareCalculator.ts', 'src/ticketing/legacy/fareCalculatorV1.ts', 0.81)]),
  group('near', [pair('src/ticketing/fareCalculator.ts', 'tools/kiosk/src/fareCalc.ts', 0.8)]),
  group('partial', [pair('notes/a.md', 'notes/a-draft.md', 0.45, 6)]),
  // Two one-line files: what they share is told in words, not "0 shared lines".
  group('retold', [pair('notes/x.md', 'notes/y.md', 0.62, 0, [1, 1], 14, [15, 16])]),
]);

describe('look-alike settings', () => {
  it('defaults to the core finder’s own threshold', () => {
    expect(DEFAULT_LOOKALIKE_SETTINGS.threshold).toBe(DEFAULT_LOOKALIKE_OPTIONS.threshold);
    expect(readLookalikeSettings(() => undefined)).toEqual(DEFAULT_LOOKALIKE_SETTINGS);
  });

  it('keeps values in [0.2, 1] (partial copies start at 0.2) and falls back to the default otherwise', () => {
    const values: Record<string, unknown> = { lookalikeThreshold: 0.6 };
    expect(readLookalikeSettings((k) => values[k])).toEqual({ threshold: 0.6 });
    expect(readLookalikeSettings(() => 0.2).threshold).toBe(0.2);
    expect(readLookalikeSettings(() => 0.15).threshold).toBe(0.8);
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

describe('overlaps tree', () => {
  it('puts the four bands in order with the decided labels, each pair telling what the files share', () => {
    const tree = lookalikeTree(sample, new Set());
    expect(tree.sections.map((s) => s.label)).toEqual(['Exact copies', 'Near-copies', 'Partial copies', 'Same content, other words']);
    const exact = tree.sections[0].children[0] as PairNode;
    expect(exact).toMatchObject({
      type: 'pair',
      label: 'shared/dates.ts ↔ vendor/dates.ts',
      description: 'identical · 61 of 61 lines shared',
    });
    expect(tree.sections[1].children.map((c) => (c as PairNode).description)).toEqual([
      'Jaccard 0.81 · 10 of 12 lines shared',
      'Jaccard 0.80 · 10 of 12 lines shared',
    ]);
    expect(tree.sections[2].children[0]).toMatchObject({ type: 'pair', description: 'Jaccard 0.45 · 6 of 12 lines shared' });
    expect(tree.sections[3].children[0]).toMatchObject({ type: 'pair', description: 'cosine 0.62 · 14 of 16 words shared' });
    expect(tree.shown).toBe(5);
  });

  it('gives every node an id of its own', () => {
    const tree = lookalikeTree(sample, new Set());
    const ids = tree.sections.flatMap((s) => [
      s.id,
      ...s.children.flatMap((c) => (c.type === 'group' ? [c.id, ...c.pairs.map((p) => p.id)] : [c.id])),
    ]);
    expect(new Set(ids).size).toBe(ids.length);
  });

  it('leaves out dismissed pairs and drops empty sections', () => {
    const hidden = new Set([
      pairKey('tools/kiosk/src/fareCalc.ts', 'src/ticketing/fareCalculator.ts'),
      pairKey('notes/y.md', 'notes/x.md'),
    ]);
    const tree = lookalikeTree(sample, hidden);
    expect(tree.sections.map((s) => s.kind)).toEqual(['exact', 'near', 'partial']);
    expect(tree.sections[1].children).toHaveLength(1);
    expect(tree).toMatchObject({ hidden: 2, shown: 3 });
    expect(lookalikeSummary(sample, tree)).toBe('2 dismissed pairs hidden.');
  });

  it('keeps an exact group whose pairs were cut short, counting every file', () => {
    const tree = lookalikeTree(result([group('exact', [pair('a/x.ts', 'b/x.ts', 1, 3, [3, 3], 20, [20, 20])], 998)]), new Set());
    expect(tree.sections[0].children[0]).toMatchObject({
      type: 'group',
      description: '1000 identical files · 20 words each (+998 more pairs not listed)',
    });
  });

  it('shows a page per section and a "Show more" node for the rest, and a larger page on request', () => {
    const many = result(Array.from({ length: 60 }, (_, i) => group('retold', [pair(`n/a${i}.md`, `n/b${i}.md`, 0.9 - i / 100)])));
    const tree = lookalikeTree(many, new Set());
    const kids = tree.sections[0].children;
    expect(kids).toHaveLength(SECTION_PAGE + 1);
    expect(kids[SECTION_PAGE]).toMatchObject({ type: 'more', hidden: 60 - SECTION_PAGE });
    expect(tree.sections[0].description).toBe('60 pairs');
    expect(lookalikeTree(many, new Set(), { retold: 60 }).sections[0].children).toHaveLength(60);
  });

  it('says what was searched when nothing was found, and that links to one file are left out', () => {
    const empty = { ...result([]), sameFile: 2 };
    const tree = lookalikeTree(empty, new Set());
    expect(tree.sections).toEqual([]);
    expect(lookalikeSummary(empty, tree)).toBe(
      'No overlaps among 116 files (near-copies from Jaccard 0.8, partial copies from 0.2). 2 paths are links to a file already listed (the same file, not a copy): left out.',
    );
  });
});
