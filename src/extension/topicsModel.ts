/**
 * What the Topics view shows, as plain data: each topic with its signature words in the
 * description, then its files (exemplars first, marked, then the other members closest to the
 * topic's centre first), and the files that have no topic. Terms and files that the CUR selection
 * picked are marked in the tooltips (they are the actual rows and columns that span the concepts).
 */
import type { TopicsResult, TopicWire } from '../node/worker/insightProtocol.js';
import type { FileRef } from '../node/worker/workerProtocol.js';
import { locationOf } from './viewModels.js';

export interface TopicFileNode {
  readonly type: 'file';
  readonly id: string;
  readonly file: FileRef;
  readonly label: string;
  readonly description: string;
  readonly tooltip: string;
}

export interface TopicNoteNode {
  readonly type: 'note';
  readonly id: string;
  readonly label: string;
}

export interface TopicNode {
  readonly type: 'topic';
  readonly id: string;
  readonly label: string;
  readonly description: string;
  /** Markdown. */
  readonly tooltip: string;
  readonly children: readonly (TopicFileNode | TopicNoteNode)[];
}

export type TopicsTreeNode = TopicNode | TopicFileNode | TopicNoteNode;

/** Signature words in a topic's description (the rest are in its tooltip). */
export const DESCRIPTION_WORDS = 6;

const fileName = (relPath: string) => relPath.slice(relPath.lastIndexOf('/') + 1);
const plural = (n: number, one: string, many: string) => `${n.toLocaleString('en-US')} ${n === 1 ? one : many}`;
const md = (text: string) => text.replace(/[\\`*_{}[\]()#+\-.!|<>~]/g, (c) => `\\${c}`);

function fileNode(parent: string, f: FileRef & { similarity?: number | null; exemplar?: boolean; picked?: boolean }, multiRoot: boolean): TopicFileNode {
  const where = locationOf(f, multiRoot);
  const mark = f.exemplar ? `exemplar${f.similarity != null ? ` ${f.similarity.toFixed(2)}` : ''}` : '';
  const shown = multiRoot ? `${f.folder}/${f.relPath}` : f.relPath;
  const notes = [
    f.exemplar ? `An exemplar of the topic${f.similarity != null ? ` (cosine ${f.similarity.toFixed(2)} with its centre)` : ''}.` : '',
    f.picked ? 'Picked by the CUR selection: one of the actual files that span the concepts.' : '',
  ].filter(Boolean);
  return {
    type: 'file',
    id: `${parent}:${f.key}`,
    file: f,
    label: fileName(f.relPath),
    description: [mark, where].filter(Boolean).join(' · '),
    tooltip: [shown, ...notes].join('\n'),
  };
}

function topicNode(t: TopicWire, multiRoot: boolean): TopicNode {
  const id = `topic:${t.id}`;
  const words = t.terms.map((x) => x.word);
  const children: (TopicFileNode | TopicNoteNode)[] = t.files.map((f) => fileNode(id, f, multiRoot));
  if (t.moreFiles > 0) children.push({ type: 'note', id: `${id}:more`, label: `… and ${plural(t.moreFiles, 'more file', 'more files')}` });
  const terms = t.terms.map((x) => (x.picked ? `**${md(x.word)}**` : md(x.word))).join(', ');
  const tooltip = [
    `**Topic ${t.id}** · ${plural(t.size, 'file', 'files')} · cohesion ${t.cohesion.toFixed(2)} (mean cosine with the centre)`,
    '',
    `Signature terms: ${terms || '–'}`,
    '',
    'Bold terms were picked by the CUR selection (actual terms that span the concepts); exemplar files come first.',
  ].join('\n');
  return {
    type: 'topic',
    id,
    label: `Topic ${t.id} (${t.size})`,
    description: words.length > 0 ? words.slice(0, DESCRIPTION_WORDS).join(', ') + (words.length > DESCRIPTION_WORDS ? ', …' : '') : '(no distinctive words)',
    tooltip,
    children,
  };
}

export function topicsTree(result: TopicsResult, multiRoot: boolean): TopicNode[] {
  const nodes = result.topics.map((t) => topicNode(t, multiRoot));
  if (result.unplacedCount > 0) {
    const id = 'topic:none';
    const children: (TopicFileNode | TopicNoteNode)[] = result.unplaced.map((f) => fileNode(id, f, multiRoot));
    const more = result.unplacedCount - result.unplaced.length;
    if (more > 0) children.push({ type: 'note', id: `${id}:more`, label: `… and ${plural(more, 'more file', 'more files')}` });
    nodes.push({
      type: 'topic',
      id,
      label: `No topic (${result.unplacedCount})`,
      description: 'no word the index knows',
      tooltip: 'Files without any word the concept model knows (empty, very short, or only rare words) have no place in the concept space.',
      children,
    });
  }
  return nodes;
}

/** The view's description: how many topics and how they were found. */
export function topicsSummary(result: TopicsResult): string {
  const n = result.topics.length;
  return `${plural(n, 'topic', 'topics')}${result.chosen === 'auto' ? ' (count chosen automatically)' : ''}`;
}
