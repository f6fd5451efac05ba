/**
 * What the Topics view shows, as plain data. Each topic is labelled by its own words (the few
 * that set it apart from the topics around it), with its size and main folder in the
 * description; a topic opens into its sub-topics, and a topic without sub-topics into its files
 * (the most typical first). Files that fit no topic well and files without any known word are
 * gathered apart. With a folder (Show Topics of Folder) only the topics holding its files are
 * shown, most first, each saying how many of them it holds.
 */
import type { FolderTopicsWire, TopicsResult, TopicWire } from '../node/worker/insightProtocol.js';
import type { FileRef } from '../node/worker/workerProtocol.js';
import { locationOf } from './viewModels.js';

export type TopicIcon = 'topic' | 'loose' | 'unplaced';

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
  readonly icon: TopicIcon;
  readonly label: string;
  readonly description: string;
  /** Markdown. */
  readonly tooltip: string;
  readonly children: readonly TopicsTreeNode[];
}

export type TopicsTreeNode = TopicNode | TopicFileNode | TopicNoteNode;

/** Words in a topic's label (more are in its hover). */
export const LABEL_WORDS = 3;
/** A label longer than this drops its last words (never cut inside a word; our choice, about a narrow sidebar). */
export const LABEL_CHARS = 34;

const fileName = (relPath: string) => relPath.slice(relPath.lastIndexOf('/') + 1);
const plural = (n: number, one: string, many: string) => `${n.toLocaleString('en-US')} ${n === 1 ? one : many}`;
const md = (text: string) => text.replace(/[\\`*_{}[\]()#+\-.!|<>~]/g, (c) => `\\${c}`);
const pct = (x: number) => `${Math.round(x * 100)}%`;
const folderName = (f: string) => (f === '' ? 'the top folder' : f);

/** The topic's label: its first words, as many as fit LABEL_CHARS (at least one). */
export function topicLabel(t: Pick<TopicWire, 'terms'>): string {
  const words = t.terms.map((x) => x.word);
  if (words.length === 0) return 'No distinctive words';
  let label = words[0];
  for (const w of words.slice(1, LABEL_WORDS)) {
    if (label.length + 2 + w.length > LABEL_CHARS) break;
    label += `, ${w}`;
  }
  return label;
}

function fileNode(parent: string, f: FileRef & { exemplar?: boolean; picked?: boolean }, multiRoot: boolean, note?: string): TopicFileNode {
  const where = locationOf(f, multiRoot);
  const shown = multiRoot ? `${f.folder}/${f.relPath}` : f.relPath;
  const notes = [
    f.exemplar ? 'One of the files most typical of this topic.' : '',
    f.picked ? 'Also one of the few files that best represent the whole workspace.' : '',
    note ?? '',
  ].filter(Boolean);
  return {
    type: 'file',
    id: `${parent}:${f.key}`,
    file: f,
    label: fileName(f.relPath),
    description: [f.exemplar ? 'typical' : '', where].filter(Boolean).join(' · '),
    tooltip: [shown, ...notes].join('\n'),
  };
}

function inFolder(key: string, folder: string): boolean {
  return folder === '' || key.startsWith(`${folder}/`);
}

function topicNode(t: TopicWire, multiRoot: boolean, folder: FolderTopicsWire | undefined, parentLabel: string | undefined): TopicNode {
  const id = `topic:${t.path}`;
  const label = topicLabel(t);
  const words = t.terms.map((x) => x.word);
  const here = folder?.counts[t.path] ?? 0;
  let children: TopicsTreeNode[];
  if (t.children.length > 0) {
    const subs = folder
      ? t.children.filter((c) => (folder.counts[c.path] ?? 0) > 0).sort((a, b) => folder.counts[b.path] - folder.counts[a.path])
      : t.children;
    children = subs.map((c) => topicNode(c, multiRoot, folder, label));
  } else {
    const files = folder ? t.files.filter((f) => inFolder(f.key, folder.folder)) : t.files;
    children = files.map((f) => fileNode(id, f, multiRoot));
    const more = (folder ? here : t.size) - files.length;
    if (more > 0) children.push({ type: 'note', id: `${id}:more`, label: `… and ${plural(more, 'more file', 'more files')}` });
  }
  const main = t.folders[0];
  const description = folder
    ? `${here.toLocaleString('en-US')} of ${plural(t.size, 'file', 'files')} here`
    : `${plural(t.size, 'file', 'files')}${main ? ` · ${main.share >= 0.995 ? 'all' : pct(main.share)} in ${folderName(main.folder)}` : ''}`;
  const where =
    t.folders.length > 0
      ? `Where its files are: ${t.folders.map((f) => `${md(folderName(f.folder))} (${pct(f.share)})`).join(', ')}.`
      : 'Its files are spread over many folders.';
  const tooltip = [
    `**${md(words.slice(0, LABEL_WORDS).join(', ') || 'No distinctive words')}** · ${plural(t.size, 'file', 'files')}`,
    '',
    parentLabel ? `Part of the topic “${md(parentLabel)}”.` : '',
    words.length > 0
      ? `Words that set these files apart from ${parentLabel ? 'the rest of that topic' : 'the rest of the workspace'}: ${words.map(md).join(', ')}.`
      : '',
    '',
    where,
    '',
    t.children.length > 0 ? `It opens into ${t.children.length} smaller topics.` : 'Its files are listed most typical first.',
    folder ? `\n${plural(here, 'file', 'files')} of ${md(folderName(folder.folder))} are in it.` : '',
  ]
    .filter((line, i, a) => line !== '' || (i > 0 && a[i - 1] !== ''))
    .join('\n');
  return { type: 'topic', id, icon: 'topic', label, description, tooltip, children };
}

export function topicsTree(result: TopicsResult, multiRoot: boolean): TopicNode[] {
  const folder = result.folder;
  const top = folder
    ? result.topics.filter((t) => (folder.counts[t.path] ?? 0) > 0).sort((a, b) => folder.counts[b.path] - folder.counts[a.path])
    : result.topics;
  const nodes = top.map((t) => topicNode(t, multiRoot, folder, undefined));
  const labelOf = new Map(result.topics.map((t) => [t.path, topicLabel(t)]));
  const keep = (f: FileRef) => !folder || inFolder(f.key, folder.folder);
  const loose = result.loose.filter(keep);
  if (loose.length > 0) {
    const id = 'topic:loose';
    const children: TopicsTreeNode[] = loose.map((f) =>
      fileNode(id, f, multiRoot, labelOf.has(f.nearest) ? `Nearest topic: ${labelOf.get(f.nearest)}.` : undefined),
    );
    const more = folder ? 0 : result.looseCount - result.loose.length;
    if (more > 0) children.push({ type: 'note', id: `${id}:more`, label: `… and ${plural(more, 'more file', 'more files')}` });
    nodes.push({
      type: 'topic',
      id,
      icon: 'loose',
      label: 'Fits no topic well',
      description: plural(folder ? loose.length : result.looseCount, 'file', 'files'),
      tooltip:
        'These files are no closer to any topic than to the workspace as a whole, so they are listed here rather than forced into the nearest topic.',
      children,
    });
  }
  const unplaced = result.unplaced.filter(keep);
  if (unplaced.length > 0) {
    const id = 'topic:none';
    const children: TopicsTreeNode[] = unplaced.map((f) => fileNode(id, f, multiRoot));
    const more = folder ? 0 : result.unplacedCount - result.unplaced.length;
    if (more > 0) children.push({ type: 'note', id: `${id}:more`, label: `… and ${plural(more, 'more file', 'more files')}` });
    nodes.push({
      type: 'topic',
      id,
      icon: 'unplaced',
      label: 'No known words',
      description: plural(folder ? unplaced.length : result.unplacedCount, 'file', 'files'),
      tooltip: 'These files have no word the index knows (empty, very short, or only rare words), so they have no place among the topics.',
      children,
    });
  }
  return nodes;
}

/** The view's description: how many topics (and, for a folder, which). */
export function topicsSummary(result: TopicsResult): string {
  if (result.folder) {
    const n = result.topics.filter((t) => (result.folder!.counts[t.path] ?? 0) > 0).length;
    return `${folderName(result.folder.folder)}: ${plural(result.folder.files, 'file', 'files')} in ${plural(n, 'topic', 'topics')}`;
  }
  return plural(result.topics.length, 'topic', 'topics');
}
