/**
 * What the Overlaps view shows, as plain data: one section per band ("Exact copies",
 * "Near-copies", "Partial copies", "Same content, other words"; core/lookalike/types.ts), its
 * groups and pairs, strongest first, each with what the two files share in units that fit them
 * (lines, or words for one-line files). Each section shows `limit` entries and a "Show more"
 * node for the rest. Pairs a person dismissed are left out, and a group left with
 * one pair is shown as that pair. Pair labels name the files by the shortest path endings that
 * tell them apart ("shared/dates.ts ↔ vendor/dates.ts").
 */
import { DEFAULT_LOOKALIKE_OPTIONS } from '../core/lookalike/options.js';
import { BAND_TITLES } from '../core/lookalike/types.js';
import { describeShared } from '../core/lookalike/sharedUnits.js';
import type { LookalikeGroupWire, LookalikeKind, LookalikePairWire, LookalikesResult } from '../node/worker/insightProtocol.js';
import type { FileRef } from '../node/worker/workerProtocol.js';
import type { SettingGetter } from './settings.js';

export interface LookalikeSettings {
  /** Shingle Jaccard from which two files are near-copies. */
  readonly threshold: number;
}

/** Where partial copies start and "other words" ends (core/lookalike/options.ts: partialThreshold, retoldMaxJaccard). */
const PARTIAL_FROM = DEFAULT_LOOKALIKE_OPTIONS.partialThreshold;

/** Defaults, identical to the manifest's and to the core's (core/lookalike/options.ts). */
export const DEFAULT_LOOKALIKE_SETTINGS: LookalikeSettings = Object.freeze({ threshold: 0.8 });

/** Entries per section before "Show more" (common practice: a screenful). */
export const SECTION_PAGE = 25;

export function readLookalikeSettings(get: SettingGetter): LookalikeSettings {
  const v = get('lookalikeThreshold');
  // Below the partial-copy start (0.2) the bands would overlap: fall back to the default.
  return { threshold: typeof v === 'number' && v >= PARTIAL_FROM && v <= 1 ? v : DEFAULT_LOOKALIKE_SETTINGS.threshold };
}

export interface PairNode {
  readonly type: 'pair';
  readonly id: string;
  readonly kind: LookalikeKind;
  /** Order-free key of the two files (what "Not a look-alike" remembers). */
  readonly key: string;
  readonly a: FileRef;
  readonly b: FileRef;
  readonly label: string;
  readonly description: string;
  readonly tooltip: string;
}

export interface GroupNode {
  readonly type: 'group';
  readonly id: string;
  readonly kind: LookalikeKind;
  readonly label: string;
  readonly description: string;
  readonly tooltip: string;
  readonly pairs: readonly PairNode[];
}

export interface SectionNode {
  readonly type: 'section';
  readonly id: string;
  readonly kind: LookalikeKind;
  readonly label: string;
  readonly description: string;
  readonly tooltip: string;
  readonly children: readonly (GroupNode | PairNode | MoreNode)[];
}

/** "Show more": the section's next page. */
export interface MoreNode {
  readonly type: 'more';
  readonly id: string;
  readonly kind: LookalikeKind;
  readonly label: string;
  readonly hidden: number;
}

export type LookalikeNode = SectionNode | GroupNode | PairNode | MoreNode;

export const SECTION_TITLES: Readonly<Record<LookalikeKind, string>> = BAND_TITLES;

/** The order-free key of a pair of index keys. */
export function pairKey(a: string, b: string): string {
  return a < b ? `${a}\n${b}` : `${b}\n${a}`;
}

/** The shortest path endings (same number of segments) that tell two different paths apart. */
export function shortNames(a: string, b: string): [string, string] {
  const sa = a.split('/');
  const sb = b.split('/');
  for (let n = 1; n <= Math.max(sa.length, sb.length); n++) {
    const ea = sa.slice(-n).join('/');
    const eb = sb.slice(-n).join('/');
    if (ea !== eb) return [ea, eb];
  }
  return [a, b];
}

function pairNode(kind: LookalikeKind, p: LookalikePairWire, t: LookalikesResult): PairNode {
  const [na, nb] = shortNames(p.a.key, p.b.key);
  const shared = describeShared(p);
  const measure =
    kind === 'exact'
      ? 'Identical text (after normalising whitespace).'
      : kind === 'near'
        ? `Shingle Jaccard ${p.jaccard.toFixed(2)}: the share of 5-word runs the two files have in common (near-copy from ${t.threshold}).`
        : kind === 'partial'
          ? `Shingle Jaccard ${p.jaccard.toFixed(2)}: ${Math.round(p.jaccard * 100)}% of their 5-word runs are common (partial copy from ${t.partialThreshold}, near-copy from ${t.threshold}).`
          : `Each file is the other's nearest neighbour by the words they use (cosine ${p.similarity.toFixed(2)}, ${(p.gap ?? 0).toFixed(2)} above either file's next neighbour)${p.sharedNames ? `, both name the same ${p.sharedNames} rare option${p.sharedNames === 1 ? '' : 's'} or identifier${p.sharedNames === 1 ? '' : 's'}` : ''}, yet they share little text (Jaccard ${p.jaccard.toFixed(2)}).`;
  const score =
    kind === 'retold' ? `cosine ${p.similarity.toFixed(2)}` : kind === 'exact' ? 'identical' : `Jaccard ${p.jaccard.toFixed(2)}`;
  return {
    type: 'pair',
    id: `lookalike:${kind}:${pairKey(p.a.key, p.b.key)}`,
    kind,
    key: pairKey(p.a.key, p.b.key),
    a: p.a,
    b: p.b,
    label: `${na} ↔ ${nb}`,
    description: `${score} · ${shared}`,
    tooltip: `${p.a.key}\n${p.b.key}\n${measure}\n${shared[0].toUpperCase()}${shared.slice(1)}. Click to compare them side by side.`,
  };
}

function groupNode(g: LookalikeGroupWire, pairs: PairNode[]): GroupNode {
  const files = new Map<string, FileRef>();
  for (const p of pairs) for (const f of [p.a, p.b]) files.set(f.key, f);
  const names = [...files.values()].map((f) => f.relPath.slice(f.relPath.lastIndexOf('/') + 1));
  const more = g.morePairs > 0 ? ` (+${g.morePairs} more pairs not listed)` : '';
  const p0 = g.pairs[0];
  const size = p0 ? `${p0.words[0]} word${p0.words[0] === 1 ? '' : 's'} each` : '';
  return {
    type: 'group',
    id: `lookalike:${g.kind}:group:${[...files.keys()].sort()[0]}`,
    kind: g.kind,
    label: `${names[0]} + ${files.size - 1} more`,
    description: `${files.size + g.morePairs} identical files · ${size}${more}`,
    tooltip: [...files.keys()].join('\n'),
    pairs,
  };
}

export interface LookalikeTree {
  readonly sections: readonly SectionNode[];
  /** Pairs hidden because they were dismissed. */
  readonly hidden: number;
  /** Pairs shown. */
  readonly shown: number;
}

/** The tree; `limits` says how many entries each section shows (SECTION_PAGE by default). */
export function lookalikeTree(
  result: LookalikesResult,
  hidden: ReadonlySet<string>,
  limits: Partial<Record<LookalikeKind, number>> = {},
): LookalikeTree {
  let hiddenCount = 0;
  let shown = 0;
  const sections: SectionNode[] = [];
  for (const kind of ['exact', 'near', 'partial', 'retold'] as const) {
    const all: (GroupNode | PairNode)[] = [];
    for (const g of result.groups.filter((x) => x.kind === kind)) {
      const pairs = g.pairs.map((p) => pairNode(kind, p, result)).filter((p) => !hidden.has(p.key));
      hiddenCount += g.pairs.length - pairs.length;
      if (pairs.length === 1 && g.morePairs === 0) all.push(pairs[0]);
      else if (pairs.length > 0) all.push(groupNode(g, pairs));
    }
    const beyond = result.morePairs?.[kind] ?? 0;
    if (all.length === 0) continue;
    const limit = Math.max(1, limits[kind] ?? SECTION_PAGE);
    const children: (GroupNode | PairNode | MoreNode)[] = all.slice(0, limit);
    for (const c of children) shown += c.type === 'group' ? c.pairs.length : 1;
    const rest = all.length - children.length;
    if (rest > 0)
      children.push({ type: 'more', id: `lookalike:more:${kind}`, kind, label: `Show ${Math.min(rest, SECTION_PAGE)} more`, hidden: rest });
    const unit = kind === 'exact' ? 'group' : 'pair';
    const total = all.length + beyond;
    sections.push({
      type: 'section',
      id: `lookalike:section:${kind}`,
      kind,
      label: SECTION_TITLES[kind],
      description: `${total} ${total === 1 ? unit : `${unit}s`}${beyond > 0 ? ` (${beyond} not sent: the ${all.length} strongest are listed)` : ''}`,
      tooltip: SECTION_HELP[kind],
      children,
    });
  }
  return { sections, hidden: hiddenCount, shown };
}

const SECTION_HELP: Readonly<Record<LookalikeKind, string>> = {
  exact: 'Files with identical text. Longest text first; one-line stubs come last. Links to one file are the same file and are not listed.',
  near: 'Files that share most of their text (shingle Jaccard at or above the near-copy threshold). Highest first.',
  partial: `Files that share a part of their text: a kept part, copied passages or a common template (shingle Jaccard ${PARTIAL_FROM} up to the near-copy threshold). Highest first.`,
  retold: `Files that tell the same thing in other words: each is the other's nearest file by the words they use (after lines repeated across many files are set aside), they share little text (shingle Jaccard under ${DEFAULT_LOOKALIKE_OPTIONS.retoldMaxJaccard}), and they either name the same rare options or identifiers or, when one names none, stand far above every other file; two files that each name devices (device-tree ‘vendor,model’ names) but none in common are never paired, nor companion files such as a source and its header or a test and the file it tests. Strongest first.`,
};

/** The view's message line: what was searched, and why it may be empty. */
export function lookalikeSummary(result: LookalikesResult, tree: LookalikeTree): string {
  const parts: string[] = [];
  if (tree.shown === 0)
    parts.push(
      `No overlaps among ${result.files} files (near-copies from Jaccard ${result.threshold}, partial copies from ${result.partialThreshold}).`,
    );
  if ((result.sameFile ?? 0) > 0)
    parts.push(
      `${result.sameFile} ${result.sameFile === 1 ? 'path is a link' : 'paths are links'} to a file already listed (the same file, not a copy): left out.`,
    );
  if (tree.hidden > 0) parts.push(`${tree.hidden} dismissed ${tree.hidden === 1 ? 'pair' : 'pairs'} hidden.`);
  if (result.unreadable > 0) parts.push(`${result.unreadable} files could not be read.`);
  return parts.join(' ');
}
