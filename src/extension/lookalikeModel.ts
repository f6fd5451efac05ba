/**
 * What the Look-alikes view shows, as plain data: one section per kind (exact copies, near-copies,
 * "same content, different words"), its groups, and each group's pairs with their similarity and
 * shared line count. Pairs a person marked "Not a look-alike" are left out, and a group left with
 * one pair is shown as that pair. Pair labels name the files by the shortest path endings that
 * tell them apart ("shared/dates.ts ↔ vendor/dates.ts").
 */
import type { LookalikeGroupWire, LookalikeKind, LookalikePairWire, LookalikesResult } from '../node/worker/insightProtocol.js';
import type { FileRef } from '../node/worker/workerProtocol.js';
import type { SettingGetter } from './settings.js';

export interface LookalikeSettings {
  /** Shingle Jaccard from which two files are near-copies. */
  readonly threshold: number;
  /** Concept cosine from which two files say the same in other words. */
  readonly paraphraseThreshold: number;
}

/** Defaults, identical to the manifest's and to the core's (core/lookalike/options.ts). */
export const DEFAULT_LOOKALIKE_SETTINGS: LookalikeSettings = Object.freeze({ threshold: 0.8, paraphraseThreshold: 0.95 });

export function readLookalikeSettings(get: SettingGetter): LookalikeSettings {
  const unit = (v: unknown, fallback: number) => (typeof v === 'number' && v > 0 && v <= 1 ? v : fallback);
  return {
    threshold: unit(get('lookalikeThreshold'), DEFAULT_LOOKALIKE_SETTINGS.threshold),
    paraphraseThreshold: unit(get('paraphraseThreshold'), DEFAULT_LOOKALIKE_SETTINGS.paraphraseThreshold),
  };
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
  readonly children: readonly (GroupNode | PairNode)[];
}

export type LookalikeNode = SectionNode | GroupNode | PairNode;

export const SECTION_TITLES: Readonly<Record<LookalikeKind, string>> = {
  exact: 'Exact copies',
  near: 'Near-copies',
  paraphrase: 'Same content, different words',
};

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
  const lines = `${p.sharedLines} shared ${p.sharedLines === 1 ? 'line' : 'lines'}`;
  const measure =
    kind === 'exact' ? 'Identical text (after normalising whitespace).'
    : kind === 'near' ? `Shingle Jaccard ${p.jaccard.toFixed(2)}: the share of 5-word runs the two files have in common (near-copy from ${t.threshold}).`
    : `Concept cosine ${p.similarity.toFixed(2)} with shingle Jaccard only ${p.jaccard.toFixed(2)}: the same content in other words (from cosine ${t.paraphraseThreshold}).`;
  return {
    type: 'pair',
    id: `lookalike:${kind}:${pairKey(p.a.key, p.b.key)}`,
    kind,
    key: pairKey(p.a.key, p.b.key),
    a: p.a,
    b: p.b,
    label: `${na} ↔ ${nb}`,
    description: `${p.similarity.toFixed(2)} · ${lines}`,
    tooltip: `${p.a.key}\n${p.b.key}\n${measure}\n${lines}. Click to compare them side by side.`,
  };
}

function groupNode(g: LookalikeGroupWire, pairs: PairNode[]): GroupNode {
  const files = new Map<string, FileRef>();
  for (const p of pairs) for (const f of [p.a, p.b]) files.set(f.key, f);
  const names = [...files.values()].map((f) => f.relPath.slice(f.relPath.lastIndexOf('/') + 1));
  const sims = g.pairs.filter((p) => pairs.some((n) => n.key === pairKey(p.a.key, p.b.key))).map((p) => p.similarity);
  const lo = Math.min(...sims).toFixed(2);
  const hi = Math.max(...sims).toFixed(2);
  const more = g.morePairs > 0 ? ` (+${g.morePairs} more pairs not listed)` : '';
  return {
    type: 'group',
    id: `lookalike:${g.kind}:group:${[...files.keys()].sort()[0]}`,
    kind: g.kind,
    label: `${names[0]} + ${files.size - 1} more`,
    description: `${files.size} files · ${lo === hi ? hi : `${lo}–${hi}`}${more}`,
    tooltip: [...files.keys()].join('\n'),
    pairs,
  };
}

export interface LookalikeTree {
  readonly sections: readonly SectionNode[];
  /** Pairs hidden by "Not a look-alike". */
  readonly hidden: number;
  /** Pairs shown. */
  readonly shown: number;
}

export function lookalikeTree(result: LookalikesResult, hidden: ReadonlySet<string>): LookalikeTree {
  let hiddenCount = 0;
  let shown = 0;
  const sections: SectionNode[] = [];
  for (const kind of ['exact', 'near', 'paraphrase'] as const) {
    const children: (GroupNode | PairNode)[] = [];
    for (const g of result.groups.filter((x) => x.kind === kind)) {
      const pairs = g.pairs.map((p) => pairNode(kind, p, result)).filter((p) => !hidden.has(p.key));
      hiddenCount += g.pairs.length - pairs.length;
      shown += pairs.length;
      if (pairs.length === 1 && g.morePairs === 0) children.push(pairs[0]);
      else if (pairs.length > 0) children.push(groupNode(g, pairs));
    }
    if (children.length === 0) continue;
    sections.push({
      type: 'section',
      id: `lookalike:section:${kind}`,
      kind,
      label: SECTION_TITLES[kind],
      description: `${children.length} ${children.length === 1 ? 'group' : 'groups'}`,
      children,
    });
  }
  return { sections, hidden: hiddenCount, shown };
}

/** The view's message line: what was searched, and why it may be empty. */
export function lookalikeSummary(result: LookalikesResult, tree: LookalikeTree): string {
  const parts: string[] = [];
  if (tree.shown === 0) parts.push(`No look-alikes among ${result.files} files (near-copies from Jaccard ${result.threshold}, paraphrases from cosine ${result.paraphraseThreshold}).`);
  if (tree.hidden > 0) parts.push(`${tree.hidden} ${tree.hidden === 1 ? 'pair' : 'pairs'} marked "Not a look-alike" hidden.`);
  if (result.unreadable > 0) parts.push(`${result.unreadable} files could not be read.`);
  return parts.join(' ');
}
