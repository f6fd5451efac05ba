/**
 * `undertone overlaps <folder>` (old name `lookalikes`): overlaps among the indexed files in four bands (core/lookalike):
 * "Exact copies", "Near-copies" (shingle Jaccard ≥ --threshold), "Partial copies" (Jaccard ≥ 0.2)
 * and "Same content, other words". Shingles and terms need the text, so every indexed file is read
 * again here. Paths that resolve to one real file (symbolic links) are one file, listed once.
 * The table shows --top pairs per band (default 20), strongest first; --json gives them all.
 */
import { realpath } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { InvalidInputError } from '../../core/errors.js';
import {
  BAND_TITLES,
  DEFAULT_LOOKALIKE_OPTIONS,
  describeShared,
  findLookalikes,
  type LookalikePair,
  type LookalikeReport,
} from '../../core/lookalike/index.js';
import { withIndexCounts } from '../../node/overlapCounts.js';
import { DEFAULT_MAX_FILE_BYTES, readIndexableText } from '../../node/scan.js';
import { ensureIndex, positiveInt, type Flags } from '../context.js';
import { formatTable, type Io } from '../output.js';
import { round } from './askCommand.js';

/** Pairs per band in the table unless --top says otherwise. */
export const DEFAULT_TOP_PER_BAND = 20;

export async function overlapsCommand(folder: string, flags: Flags, io: Io): Promise<number> {
  const threshold = parseThreshold(flags.threshold);
  const top = positiveInt(flags.top, 'top') ?? DEFAULT_TOP_PER_BAND;
  const { index } = await ensureIndex(folder, flags, io);
  const root = resolve(folder);
  const maxBytes = positiveInt(flags['max-file-size'], 'max-file-size') ?? DEFAULT_MAX_FILE_BYTES;
  const files: { id: string; text: string }[] = [];
  const real = new Set<string>();
  let unreadable = 0;
  let sameFile = 0;
  for (const path of index.paths()) {
    const full = join(root, path);
    const target = await realpath(full).catch(() => full);
    if (real.has(target)) {
      sameFile++;
      continue;
    }
    real.add(target);
    const got = await readIndexableText(full, maxBytes).catch(() => null);
    if (got?.kind !== 'text') {
      unreadable++;
      continue;
    }
    files.push({ id: path, text: got.text });
  }
  const report = findLookalikes(withIndexCounts(index, files), { threshold });
  const extra = { unreadable, sameFile };
  if (flags.json) {
    io.out(JSON.stringify(toJson(report, threshold, extra)));
    return 0;
  }
  for (const line of describe(report, threshold, top, extra)) io.out(line);
  return 0;
}

function parseThreshold(value: unknown): number {
  if (value === undefined) return DEFAULT_LOOKALIKE_OPTIONS.threshold;
  const t = Number(value);
  if (!(t > 0 && t <= 1))
    throw new InvalidInputError(`--threshold needs a number above 0 and at most 1 (a Jaccard similarity), got "${String(value)}"`);
  if (t < DEFAULT_LOOKALIKE_OPTIONS.partialThreshold) {
    throw new InvalidInputError(
      `--threshold must be at least ${DEFAULT_LOOKALIKE_OPTIONS.partialThreshold} (where partial copies start), got "${String(value)}"`,
    );
  }
  return t;
}

interface Extra {
  readonly unreadable: number;
  readonly sameFile: number;
}

function toJson(r: LookalikeReport, threshold: number, extra: Extra): unknown {
  const pair = (p: LookalikePair) => ({
    a: p.a,
    b: p.b,
    jaccard: round(p.jaccard),
    sharedLines: p.sharedLines,
    lines: p.lines,
    sharedWords: p.sharedWords,
    words: p.words,
    ...(p.cosine === undefined
      ? {}
      : {
          cosine: round(p.cosine),
          margin: round(p.gap ?? 0),
          names: p.sharedNames ?? 0,
          ...(p.clause ? { clause: p.clause } : {}),
          ...(p.conceptCosine === undefined ? {} : { conceptCosine: round(p.conceptCosine) }),
        }),
  });
  return {
    threshold,
    partialThreshold: DEFAULT_LOOKALIKE_OPTIONS.partialThreshold,
    retoldMaxJaccard: DEFAULT_LOOKALIKE_OPTIONS.retoldMaxJaccard,
    labels: BAND_TITLES,
    exact: r.exactGroups.map((g) => ({ files: g.files, sharedLines: g.sharedLines, words: g.words })),
    near: r.nearPairs.map(pair),
    partial: r.partialPairs.map(pair),
    retold: r.retoldPairs.map(pair),
    stats: { ...r.stats, ...extra },
  };
}

function describe(r: LookalikeReport, threshold: number, top: number, extra: Extra): string[] {
  const s = r.stats;
  const lines: string[] = [];
  const none = r.exactGroups.length + r.nearPairs.length + r.partialPairs.length + r.retoldPairs.length === 0;
  lines.push(none ? `No overlaps among ${s.files} files.` : `Overlaps among ${s.files} files:`);
  const more = (n: number, shown: number): void => {
    if (n > shown) lines.push(`     … and ${n - shown} more (--top ${n} or --json lists them all)`);
  };
  if (r.exactGroups.length > 0) {
    lines.push('', `${BAND_TITLES.exact}: ${r.exactGroups.length} group${r.exactGroups.length === 1 ? '' : 's'}, longest text first`);
    r.exactGroups.slice(0, top).forEach((g, i) => {
      lines.push(
        `  ${i + 1}. ${g.files.length} identical files, ${g.words} word${g.words === 1 ? '' : 's'} in ${g.sharedLines} line${g.sharedLines === 1 ? '' : 's'} each`,
      );
      for (const f of g.files) lines.push(`     ${f}`);
    });
    more(r.exactGroups.length, top);
  }
  const section = (title: string, pairs: readonly LookalikePair[], retold: boolean): void => {
    if (pairs.length === 0) return;
    lines.push('', `${title}: ${pairs.length} pair${pairs.length === 1 ? '' : 's'}`);
    const header = [...(retold ? ['cosine', 'margin', 'names'] : []), 'jaccard', 'shared', 'file', 'file'];
    const rows = pairs
      .slice(0, top)
      .map((p) => [
        ...(retold ? [(p.cosine ?? 0).toFixed(2), (p.gap ?? 0).toFixed(2), String(p.sharedNames ?? 0)] : []),
        p.jaccard.toFixed(2),
        describeShared(p),
        p.a,
        p.b,
      ]);
    for (const line of formatTable(
      header,
      rows,
      header.map((h) => h !== 'file' && h !== 'shared'),
    ))
      lines.push(`  ${line}`);
    more(pairs.length, top);
  };
  section(`${BAND_TITLES.near} (shingle Jaccard ≥ ${threshold})`, r.nearPairs, false);
  section(`${BAND_TITLES.partial} (shingle Jaccard ${DEFAULT_LOOKALIKE_OPTIONS.partialThreshold}–${threshold})`, r.partialPairs, false);
  section(
    `${BAND_TITLES.retold} (each file's clear nearest neighbour by its words; shingle Jaccard under ${DEFAULT_LOOKALIKE_OPTIONS.retoldMaxJaccard})`,
    r.retoldPairs,
    true,
  );
  const notes: string[] = [];
  if (extra.sameFile > 0)
    notes.push(
      `${extra.sameFile} path${extra.sameFile === 1 ? ' is a link' : 's are links'} to a file already listed (the same file, not a copy)`,
    );
  if (s.emptyFiles > 0) notes.push(`${s.emptyFiles} empty file${s.emptyFiles === 1 ? '' : 's'} ignored`);
  if (s.skippedShort > 0)
    notes.push(`${s.skippedShort} file${s.skippedShort === 1 ? '' : 's'} too short for near-copy search (fewer words than one shingle)`);
  if (extra.unreadable > 0) notes.push(`${extra.unreadable} indexed file${extra.unreadable === 1 ? '' : 's'} could not be read again`);
  if (s.cappedBuckets > 0)
    notes.push(`${s.cappedBuckets} very large candidate bucket${s.cappedBuckets === 1 ? ' was' : 's were'} paired by neighbourhood only`);
  if (notes.length > 0) lines.push('', `Note: ${notes.join('; ')}.`);
  return lines;
}
