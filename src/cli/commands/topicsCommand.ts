/**
 * `undertone topics <folder>`: the folder's topics as a tree (core/topics/topics.ts), each named
 * by its distinctive words, with exemplar files and the folders that hold it; `--depth N` levels
 * (default 2 shown; with --json the whole tree, up to 4 levels), `--topics N` fixes the first
 * level's count, `--in SUB` lists the topics a sub-folder holds, `--json` for machines.
 * Terms are index stems; the words shown are their most frequent spelling in the topic's files.
 */
import { join, resolve } from 'node:path';
import { InvalidInputError } from '../../core/errors.js';
import { SurfaceForms } from '../../core/text/surfaceForms.js';
import { inFolder, topicsOfFolder } from '../../core/topics/folderTopics.js';
import type { FolderShare } from '../../core/topics/folderShares.js';
import { DEFAULT_TOPICS_OPTIONS, findTopics, topicsAtLevel, walkTopics, type Topic, type TopicsReport } from '../../core/topics/topics.js';
import { DEFAULT_MAX_FILE_BYTES, readIndexableText } from '../../node/scan.js';
import { ensureIndex, positiveInt, type Flags } from '../context.js';
import { formatTable, type Io } from '../output.js';
import { round } from './askCommand.js';

/** Files per topic read to find readable word forms (enough to name stems; bounded on big folders). */
const FILES_READ_PER_TOPIC = 40;
/** Levels shown as text when --depth is not given (the first level and its sub-topics). */
const TEXT_DEPTH = 2;
/** Words in a topic's name line. */
const NAME_WORDS = 4;

export async function topicsCommand(folder: string, flags: Flags, io: Io): Promise<number> {
  const count = parseTopicCount(flags.topics);
  const depthFlag = positiveInt(flags.depth, 'depth');
  if (depthFlag !== undefined && depthFlag > 10)
    throw new InvalidInputError(`--depth ${depthFlag} is deeper than anyone reads; pick at most 10`);
  const depth = depthFlag ?? (flags.json ? DEFAULT_TOPICS_OPTIONS.depth : TEXT_DEPTH);
  const { index } = await ensureIndex(folder, flags, io);
  const sub = typeof flags.in === 'string' ? flags.in : undefined;
  const subFolder = sub?.replace(/^\.\/?/, '').replace(/\/+$/, '');
  if (subFolder !== undefined && !index.paths().some((p) => inFolder(p, subFolder)))
    throw new InvalidInputError(`no indexed file lies in "${sub}" (give a folder relative to ${folder})`);
  const report = findTopics(index, { topics: count, depth, seed: index.settings.seed });
  const forms = await readForms(folder, report, index.settings.tokenize.stem, flags);
  if (sub !== undefined) {
    const level = depthFlag ?? 1;
    const got = topicsOfFolder(topicsAtLevel(report.topics, level), [...report.loose.map((l) => l.path), ...report.unplaced], sub);
    if (got.total === 0) throw new InvalidInputError(`no indexed file lies in "${sub}" (give a folder relative to ${folder})`);
    if (flags.json) {
      io.out(
        JSON.stringify({
          folder: got.folder,
          files: got.total,
          outside: got.outside,
          topics: got.topics.map((t) => ({
            path: t.topic.path,
            name: nameOf(t.topic, forms),
            files: t.files,
            shareOfFolder: round(t.shareOfFolder),
            shareOfTopic: round(t.shareOfTopic),
          })),
        }),
      );
      return 0;
    }
    io.out(
      `${got.folder || '(top)'}: ${got.total} file${got.total === 1 ? '' : 's'} in ${got.topics.length} topic${got.topics.length === 1 ? '' : 's'} (level ${level})${got.outside > 0 ? `, ${got.outside} in no topic` : ''}`,
    );
    const rows = got.topics.map((t) => [
      String(t.files),
      pct(t.shareOfFolder),
      `${pct(t.shareOfTopic)} of ${t.topic.size}`,
      t.topic.path,
      nameOf(t.topic, forms),
    ]);
    for (const line of formatTable(['files', 'of folder', 'of topic', 'topic', 'named'], rows, [true, true, true, false, false]))
      io.out(`  ${line}`);
    return 0;
  }
  if (flags.json) {
    io.out(JSON.stringify(toJson(report, forms)));
    return 0;
  }
  for (const line of describe(report, index.size, forms, depth)) io.out(line);
  return 0;
}

async function readForms(folder: string, report: TopicsReport, stem: boolean, flags: Flags): Promise<SurfaceForms> {
  const all = [...walkTopics(report.topics)];
  const wanted = new Set(all.flatMap((t) => t.terms.map((x) => x.term)));
  const forms = new SurfaceForms({ stem }, wanted);
  const maxBytes = positiveInt(flags['max-file-size'], 'max-file-size') ?? DEFAULT_MAX_FILE_BYTES;
  const seen = new Set<string>();
  // First-level members give most spellings; leaves add their own words.
  for (const t of all) {
    for (const path of t.members.slice(0, t.level === 1 ? FILES_READ_PER_TOPIC : 5)) {
      if (seen.has(path)) continue;
      seen.add(path);
      const got = await readIndexableText(join(resolve(folder), path), maxBytes).catch(() => null);
      if (got?.kind === 'text') forms.add(got.text);
    }
  }
  return forms;
}

function nameOf(t: Topic, forms: SurfaceForms): string {
  return (
    t.terms
      .slice(0, NAME_WORDS)
      .map((x) => forms.wordFor(x.term))
      .join(', ') || '(no distinctive words)'
  );
}

function foldersJson(f: readonly FolderShare[]) {
  return f.map((x) => ({ folder: x.folder, files: x.files, share: round(x.share) }));
}

function topicJson(t: Topic, forms: SurfaceForms): unknown {
  return {
    id: t.id,
    path: t.path,
    level: t.level,
    name: nameOf(t, forms),
    size: t.size,
    cohesion: round(t.cohesion),
    terms: t.terms.map((x) => ({ word: forms.wordFor(x.term), term: x.term, weight: round(x.weight), picked: x.picked })),
    files: t.files.map((f) => ({ path: f.path, similarity: round(f.similarity), picked: f.picked })),
    folders: foldersJson(t.folders),
    members: t.members,
    children: t.children.map((c) => topicJson(c, forms)),
  };
}

function toJson(r: TopicsReport, forms: SurfaceForms): unknown {
  return {
    topics: r.topics.map((t) => topicJson(t, forms)),
    levels: r.levels,
    loose: r.loose.map((l) => ({ path: l.path, nearest: l.nearest, similarity: round(l.similarity), overall: round(l.overall) })),
    unplaced: r.unplaced,
    count: {
      topics: r.count.topics,
      chosen: r.count.chosen,
      silhouettes: r.count.scores.map((s) => ({ topics: s.topics, silhouette: round(s.silhouette) })),
    },
    cur: { ...r.cur, errorRatio: r.cur.errorRatio === null ? null : round(r.cur.errorRatio) },
  };
}

const pct = (x: number) => `${Math.round(x * 100)}%`;
const where = (f: readonly FolderShare[]) =>
  f.length > 0
    ? `in ${f.map((x) => `${x.folder === '' ? '(top)' : `${x.folder}/`} ${pct(x.share)}`).join(', ')}`
    : 'spread over many folders';

function describe(r: TopicsReport, files: number, forms: SurfaceForms, depth: number): string[] {
  const lines: string[] = [];
  const how =
    r.count.chosen === 'given'
      ? 'count given'
      : r.count.scores.length > 0
        ? `count chosen by silhouette, ${r.count.scores.find((s) => s.topics === r.count.topics)?.silhouette.toFixed(2) ?? '–'}`
        : files - r.unplaced.length < 3
          ? 'too few files to split'
          : 'every file points the same way: one topic';
  const sub = r.levels > 1 ? `, sub-topics ${r.levels - 1} level${r.levels > 2 ? 's' : ''} down` : '';
  lines.push(`${files} file${files === 1 ? '' : 's'} in ${r.topics.length} topic${r.topics.length === 1 ? '' : 's'} (${how}${sub})`);
  const err = r.cur.errorRatio === null ? 'exact at this rank' : `error ${r.cur.errorRatio.toFixed(2)}× the best rank-${r.cur.rank} error`;
  lines.push(`CUR (${r.cur.method}, rank ${r.cur.rank}) picked ${r.cur.files} files and ${r.cur.terms} terms; ${err}. * marks CUR picks.`);
  for (const t of r.topics) {
    lines.push('');
    lines.push(`${t.path}  ${nameOf(t, forms)}  ·  ${t.size} file${t.size === 1 ? '' : 's'}, ${where(t.folders)}`);
    lines.push(`  terms: ${t.terms.map((x) => `${forms.wordFor(x.term)}${x.picked ? '*' : ''}`).join(', ') || '–'}`);
    const rows = t.files.map((f) => [f.similarity.toFixed(3), `${f.path}${f.picked ? ' *' : ''}`]);
    for (const line of formatTable(['similarity', 'exemplar file'], rows, [true, false])) lines.push(`  ${line}`);
    const subLines = (children: readonly Topic[], indent: string) => {
      for (const c of children) {
        if (c.level > depth) return;
        lines.push(`${indent}${c.path}  ${nameOf(c, forms)}  ·  ${c.size} file${c.size === 1 ? '' : 's'}, ${where(c.folders)}`);
        subLines(c.children, `${indent}  `);
      }
    };
    subLines(t.children, '  ');
  }
  if (r.loose.length > 0) {
    lines.push('');
    lines.push(
      `${r.loose.length} file${r.loose.length === 1 ? ' fits' : 's fit'} no topic well (no closer to any topic than to the workspace as a whole): ${r.loose
        .slice(0, 5)
        .map((l) => l.path)
        .join(', ')}${r.loose.length > 5 ? ', …' : ''}`,
    );
  }
  if (r.unplaced.length > 0) {
    lines.push('');
    lines.push(
      `${r.unplaced.length} file${r.unplaced.length === 1 ? ' has' : 's have'} no indexed words and no topic: ${r.unplaced.slice(0, 5).join(', ')}${r.unplaced.length > 5 ? ', …' : ''}`,
    );
  }
  return lines;
}

function parseTopicCount(value: unknown): number | undefined {
  const n = positiveInt(value, 'topics');
  if (n !== undefined && n > 1000) throw new InvalidInputError(`--topics ${n} is more than anyone can read; pick at most 1000`);
  return n;
}
