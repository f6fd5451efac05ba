/**
 * `undertone topics <folder>`: the folder's topics, each named by signature terms and exemplar
 * files (core/topics/topics.ts); `--topics N` fixes the count, `--json` for machines.
 * Terms are index stems; the words shown are their most frequent spelling in the topic's files.
 */
import { join, resolve } from 'node:path';
import { InvalidInputError } from '../../core/errors.js';
import { SurfaceForms } from '../../core/text/surfaceForms.js';
import { findTopics, type TopicsReport } from '../../core/topics/topics.js';
import { DEFAULT_MAX_FILE_BYTES, readIndexableText } from '../../node/scan.js';
import { ensureIndex, positiveInt, type Flags } from '../context.js';
import { formatTable, type Io } from '../output.js';
import { round } from './askCommand.js';

/** Files per topic read to find readable word forms (enough to name stems; bounded on big folders). */
const FILES_READ_PER_TOPIC = 40;

export async function topicsCommand(folder: string, flags: Flags, io: Io): Promise<number> {
  const count = parseTopicCount(flags.topics);
  const { index } = await ensureIndex(folder, flags, io);
  const report = findTopics(index, { topics: count, seed: index.settings.seed });
  const forms = await readForms(folder, report, index.settings.tokenize.stem, flags);
  if (flags.json) {
    io.out(JSON.stringify(toJson(report, forms)));
    return 0;
  }
  for (const line of describe(report, index.size, forms)) io.out(line);
  return 0;
}

async function readForms(folder: string, report: TopicsReport, stem: boolean, flags: Flags): Promise<SurfaceForms> {
  const wanted = new Set(report.topics.flatMap((t) => t.terms.map((x) => x.term)));
  const forms = new SurfaceForms({ stem }, wanted);
  const maxBytes = positiveInt(flags['max-file-size'], 'max-file-size') ?? DEFAULT_MAX_FILE_BYTES;
  for (const t of report.topics) {
    for (const path of t.members.slice(0, FILES_READ_PER_TOPIC)) {
      const got = await readIndexableText(join(resolve(folder), path), maxBytes).catch(() => null);
      if (got?.kind === 'text') forms.add(got.text);
    }
  }
  return forms;
}

function toJson(r: TopicsReport, forms: SurfaceForms): unknown {
  return {
    topics: r.topics.map((t) => ({
      id: t.id,
      size: t.size,
      cohesion: round(t.cohesion),
      terms: t.terms.map((x) => ({ word: forms.wordFor(x.term), term: x.term, weight: round(x.weight), picked: x.picked })),
      files: t.files.map((f) => ({ path: f.path, similarity: round(f.similarity), picked: f.picked })),
      members: t.members,
    })),
    unplaced: r.unplaced,
    count: { topics: r.count.topics, chosen: r.count.chosen, silhouettes: r.count.scores.map((s) => ({ topics: s.topics, silhouette: round(s.silhouette) })) },
    cur: { ...r.cur, errorRatio: r.cur.errorRatio === null ? null : round(r.cur.errorRatio) },
  };
}

function describe(r: TopicsReport, files: number, forms: SurfaceForms): string[] {
  const lines: string[] = [];
  const how =
    r.count.chosen === 'given'
      ? 'count given'
      : r.count.scores.length > 0
        ? `count chosen by silhouette, ${r.count.scores.find((s) => s.topics === r.count.topics)?.silhouette.toFixed(2) ?? '–'}`
        : files - r.unplaced.length < 3
          ? 'too few files to split'
          : 'every file points the same way: one topic';
  lines.push(`${files} file${files === 1 ? '' : 's'} in ${r.topics.length} topic${r.topics.length === 1 ? '' : 's'} (${how})`);
  const err = r.cur.errorRatio === null ? 'exact at this rank' : `error ${r.cur.errorRatio.toFixed(2)}× the best rank-${r.cur.rank} error`;
  lines.push(`CUR (${r.cur.method}, rank ${r.cur.rank}) picked ${r.cur.files} files and ${r.cur.terms} terms; ${err}. * marks CUR picks.`);
  for (const t of r.topics) {
    lines.push('');
    lines.push(`Topic ${t.id}: ${t.terms.slice(0, 3).map((x) => forms.wordFor(x.term)).join(', ') || '(no distinctive words)'}  ·  ${t.size} file${t.size === 1 ? '' : 's'}, cohesion ${t.cohesion.toFixed(2)}`);
    lines.push(`  terms: ${t.terms.map((x) => `${forms.wordFor(x.term)}${x.picked ? '*' : ''}`).join(', ') || '–'}`);
    const rows = t.files.map((f) => [f.similarity.toFixed(3), `${f.path}${f.picked ? ' *' : ''}`]);
    for (const line of formatTable(['similarity', 'exemplar file'], rows, [true, false])) lines.push(`  ${line}`);
    if (t.size > t.files.length) lines.push(`  … and ${t.size - t.files.length} more`);
  }
  if (r.unplaced.length > 0) {
    lines.push('');
    lines.push(`${r.unplaced.length} file${r.unplaced.length === 1 ? ' has' : 's have'} no indexed words and no topic: ${r.unplaced.slice(0, 5).join(', ')}${r.unplaced.length > 5 ? ', …' : ''}`);
  }
  return lines;
}

function parseTopicCount(value: unknown): number | undefined {
  const n = positiveInt(value, 'topics');
  if (n !== undefined && n > 1000) throw new InvalidInputError(`--topics ${n} is more than anyone can read; pick at most 1000`);
  return n;
}
