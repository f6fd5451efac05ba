/**
 * `undertone lookalikes <folder>`: exact copies, near-copies (shingle Jaccard ≥ --threshold) and
 * "same content, different words" pairs (concept cosine) among the indexed files
 * (core/lookalike). Shingles need the text, so every indexed file is read again here.
 */
import { join, resolve } from 'node:path';
import { InvalidInputError } from '../../core/errors.js';
import { DEFAULT_LOOKALIKE_OPTIONS, findLookalikes, type LookalikeGroup, type LookalikeReport } from '../../core/lookalike/index.js';
import { DEFAULT_MAX_FILE_BYTES, readIndexableText } from '../../node/scan.js';
import { ensureIndex, positiveInt, type Flags } from '../context.js';
import { formatTable, type Io } from '../output.js';
import { round } from './askCommand.js';

export async function lookalikesCommand(folder: string, flags: Flags, io: Io): Promise<number> {
  const threshold = parseThreshold(flags.threshold);
  const { index } = await ensureIndex(folder, flags, io);
  const root = resolve(folder);
  const maxBytes = positiveInt(flags['max-file-size'], 'max-file-size') ?? DEFAULT_MAX_FILE_BYTES;
  const files: { id: string; text: string }[] = [];
  const vectors: Float32Array[] = [];
  let unreadable = 0;
  for (const path of index.paths()) {
    const got = await readIndexableText(join(root, path), maxBytes).catch(() => null);
    if (got?.kind !== 'text') {
      unreadable++;
      continue;
    }
    files.push({ id: path, text: got.text });
    vectors.push(index.vectorOf(path));
  }
  const concepts = new Float32Array(files.length * index.k);
  vectors.forEach((v, i) => concepts.set(v, i * index.k));
  const report = findLookalikes({ files, concepts: { vectors: concepts, dims: index.k } }, { threshold });
  if (flags.json) {
    io.out(JSON.stringify(toJson(report, threshold, unreadable)));
    return 0;
  }
  for (const line of describe(report, threshold, unreadable)) io.out(line);
  return 0;
}

function parseThreshold(value: unknown): number {
  if (value === undefined) return DEFAULT_LOOKALIKE_OPTIONS.threshold;
  const t = Number(value);
  if (!(t > 0 && t <= 1)) throw new InvalidInputError(`--threshold needs a number above 0 and at most 1 (a Jaccard similarity), got "${String(value)}"`);
  return t;
}

function toJson(r: LookalikeReport, threshold: number, unreadable: number): unknown {
  const group = (g: LookalikeGroup) => ({
    files: g.files,
    pairs: g.pairs.map((p) => ({ a: p.a, b: p.b, similarity: round(p.similarity), jaccard: round(p.jaccard), sharedLines: p.sharedLines })),
  });
  return {
    threshold,
    exactCopies: r.exactGroups.map((g) => ({ files: g.files, sharedLines: g.sharedLines })),
    nearCopies: r.nearGroups.map(group),
    sameContentDifferentWords: r.paraphraseGroups.map(group),
    stats: { ...r.stats, unreadable },
  };
}

function describe(r: LookalikeReport, threshold: number, unreadable: number): string[] {
  const s = r.stats;
  const lines: string[] = [];
  const none = r.exactGroups.length + r.nearGroups.length + r.paraphraseGroups.length === 0;
  lines.push(none ? `No look-alikes among ${s.files} files.` : `Look-alikes among ${s.files} files:`);
  if (r.exactGroups.length > 0) {
    lines.push('', `Exact copies: ${r.exactGroups.length} group${r.exactGroups.length === 1 ? '' : 's'}`);
    r.exactGroups.forEach((g, i) => {
      lines.push(`  ${i + 1}. ${g.files.length} identical files, ${g.sharedLines} lines each`);
      for (const f of g.files) lines.push(`     ${f}`);
    });
  }
  const section = (title: string, groups: readonly LookalikeGroup[], withCosine: boolean): void => {
    if (groups.length === 0) return;
    lines.push('', `${title}: ${groups.length} group${groups.length === 1 ? '' : 's'}`);
    groups.forEach((g, i) => {
      lines.push(`  ${i + 1}. ${g.files.length} files: ${g.files.join(', ')}`);
      const rows = g.pairs.map((p) => [...(withCosine ? [p.similarity.toFixed(3)] : []), p.jaccard.toFixed(3), String(p.sharedLines), p.a, p.b]);
      const header = [...(withCosine ? ['cosine'] : []), 'jaccard', 'shared lines', 'file', 'file'];
      for (const line of formatTable(header, rows, header.map((h) => h !== 'file'))) lines.push(`     ${line}`);
    });
  };
  section(`Near-copies (shingle Jaccard ≥ ${threshold})`, r.nearGroups, false);
  section('Same content, different words (concept cosine high, shingles differ)', r.paraphraseGroups, true);
  const notes: string[] = [];
  if (s.emptyFiles > 0) notes.push(`${s.emptyFiles} empty file${s.emptyFiles === 1 ? '' : 's'} ignored`);
  if (s.skippedShort > 0) notes.push(`${s.skippedShort} file${s.skippedShort === 1 ? '' : 's'} too short for near-copy search (fewer words than one shingle)`);
  if (unreadable > 0) notes.push(`${unreadable} indexed file${unreadable === 1 ? '' : 's'} could not be read again`);
  if (s.cappedBuckets > 0) notes.push(`${s.cappedBuckets} very large candidate bucket${s.cappedBuckets === 1 ? ' was' : 's were'} paired by neighbourhood only`);
  if (notes.length > 0) lines.push('', `Note: ${notes.join('; ')}.`);
  return lines;
}
