/**
 * `undertone count <folder> --list` prints the files the index would read (its scan rules), one per
 * line in the index's path order: the list a cluster job splits into shares.
 * `undertone count <folder> --files LIST --out SHARD`: tokenizes and counts one share of a
 * folder's files with exactly the reader and tokenizer the index uses (src/node/scanRead.ts,
 * src/core/text/tokenize.ts with the index's default options), for counting a collection too
 * large for one machine on many (see cluster/README.md). LIST holds paths relative to <folder>,
 * one per line ('/' between folders, as the index names files). Written, each atomically
 * (temporary name, then rename), the manifest last so its presence marks a complete shard:
 *   SHARD.mtx    Matrix Market coordinate integer general: row i = line i of SHARD.files,
 *                column j = line j of SHARD.terms, value = how often the term occurs in the file;
 *   SHARD.terms  the shard's terms, one per line, in code-unit order (the index's term order);
 *   SHARD.files  the counted files, one per line, in LIST order (a file with no word is a row
 *                without entries);
 *   SHARD.json   manifest: format, version, tokenizer options, the size cap, how many files were
 *                listed and counted, and every listed file that was not counted, with the reason
 *                (binary, too-large, unreadable): nothing is dropped without a record.
 */
import { createWriteStream } from 'node:fs';
import { readFile, rename, writeFile } from 'node:fs/promises';
import { once } from 'node:events';
import { join, resolve } from 'node:path';
import { InvalidInputError } from '../../core/errors.js';
import { DEFAULT_INDEX_SETTINGS } from '../../core/index/model/settings.js';
import { countTerms, Vocabulary, type DocTerms } from '../../core/counting/termCounts.js';
import { tokenize } from '../../core/text/tokenize.js';
import { comparePaths } from '../../core/index/model/indexBuilder.js';
import { scanFolder } from '../../node/scan.js';
import { readIndexableText } from '../../node/scanRead.js';
import { positiveInt, scanFrom, type Flags } from '../context.js';
import { formatCount, type Io } from '../output.js';

export const SHARD_FORMAT = 'undertone-count-shard';
export const SHARD_VERSION = 1;
/** The index's default size cap (src/node/folderIndexer.ts). */
const DEFAULT_MAX_FILE_BYTES = 1_048_576;

export interface ShardManifest {
  format: typeof SHARD_FORMAT;
  version: number;
  tokenize: typeof DEFAULT_INDEX_SETTINGS.tokenize;
  maxFileBytes: number;
  listed: number;
  counted: number;
  terms: number;
  nonZeros: number;
  skipped: { path: string; reason: 'binary' | 'too-large' | 'unreadable'; detail?: string }[];
}

export async function countCommand(folder: string, flags: Flags, io: Io): Promise<number> {
  if (flags.list) {
    // The files the index would read (same scan rules and filters), one per line, in path order.
    const scan = await scanFolder(folder, scanFrom(flags));
    const paths = scan.files.map((f) => f.path).sort(comparePaths);
    for (const p of paths)
      if (/[\r\n]/.test(p))
        throw new InvalidInputError(`the path ${JSON.stringify(p)} holds a line break and cannot be listed one per line`);
    for (let i = 0; i < paths.length; i += 4096) io.out(paths.slice(i, i + 4096).join('\n'));
    return 0;
  }
  if (typeof flags.files !== 'string' || flags.files.length === 0)
    throw new InvalidInputError('count needs --files LIST (paths relative to the folder, one per line)');
  if (typeof flags.out !== 'string' || flags.out.length === 0)
    throw new InvalidInputError('count needs --out SHARD (the shard files SHARD.mtx, .terms, .files, .json are written)');
  const maxFileBytes = positiveInt(flags['max-file-size'], 'max-file-size') ?? DEFAULT_MAX_FILE_BYTES;
  const root = resolve(folder);
  let listText: string;
  try {
    listText = await readFile(flags.files, 'utf8');
  } catch (err) {
    throw new InvalidInputError(`cannot read the file list ${flags.files}: ${(err as Error).message}`);
  }
  const paths = listText
    .split('\n')
    .map((l) => l.replace(/\r$/, ''))
    .filter((l) => l.length > 0);
  const seen = new Set<string>();
  for (const p of paths) {
    if (p.startsWith('/') || p.split('/').includes('..'))
      throw new InvalidInputError(`the file list must hold paths inside the folder, relative to it; got "${p}"`);
    if (seen.has(p)) throw new InvalidInputError(`the file list names "${p}" twice`);
    seen.add(p);
  }
  const tokenizeOptions = DEFAULT_INDEX_SETTINGS.tokenize;
  const vocab = new Vocabulary();
  const counted: { path: string; terms: DocTerms }[] = [];
  const skipped: ShardManifest['skipped'] = [];
  for (const path of paths) {
    const got = await readIndexableText(join(root, path), maxFileBytes);
    if (got.kind === 'text') counted.push({ path, terms: countTerms(tokenize(got.text, tokenizeOptions), vocab, true) });
    else skipped.push(got.kind === 'unreadable' ? { path, reason: 'unreadable', detail: got.message } : { path, reason: got.kind });
  }
  // Shard columns in code-unit order of the terms (the order IndexBuilder numbers terms in).
  const terms = vocab.terms;
  for (const t of terms)
    if (/\s/.test(t)) throw new InvalidInputError(`a term holds white space and cannot be written one per line: ${JSON.stringify(t)}`);
  const order = Array.from({ length: terms.length }, (_, i) => i).sort((a, b) => (terms[a] < terms[b] ? -1 : terms[a] > terms[b] ? 1 : 0));
  const column = new Int32Array(terms.length);
  order.forEach((id, c) => (column[id] = c));
  let nonZeros = 0;
  for (const d of counted) nonZeros += d.terms.termIds.length;

  const out = resolve(flags.out);
  await atomically(`${out}.mtx`, matrixChunks(counted, column, terms.length, nonZeros));
  await atomically(`${out}.terms`, lineChunks(order.map((id) => terms[id])));
  await atomically(`${out}.files`, lineChunks(counted.map((d) => d.path)));
  const manifest: ShardManifest = {
    format: SHARD_FORMAT,
    version: SHARD_VERSION,
    tokenize: tokenizeOptions,
    maxFileBytes,
    listed: paths.length,
    counted: counted.length,
    terms: terms.length,
    nonZeros,
    skipped,
  };
  await writeFile(`${out}.json.tmp`, `${JSON.stringify(manifest, null, 1)}\n`);
  await rename(`${out}.json.tmp`, `${out}.json`);
  if (flags.json)
    io.out(JSON.stringify({ out, listed: paths.length, counted: counted.length, skipped: skipped.length, terms: terms.length, nonZeros }));
  else if (!flags.quiet)
    io.err(
      `counted ${formatCount(counted.length)} of ${formatCount(paths.length)} files (${skipped.length} skipped), ${formatCount(terms.length)} terms, ${formatCount(nonZeros)} non-zeros → ${out}.mtx`,
    );
  return 0;
}

function* matrixChunks(docs: readonly { terms: DocTerms }[], column: Int32Array, cols: number, nnz: number): Generator<string> {
  yield '%%MatrixMarket matrix coordinate integer general\n';
  yield '% Undertone term counts of one shard: rows are files (.files), columns are terms (.terms)\n';
  yield `${docs.length} ${cols} ${nnz}\n`;
  let buf: string[] = [];
  for (let i = 0; i < docs.length; i++) {
    const t = docs[i].terms;
    // Entries of a row in column order (the order of the term strings).
    const idx = Array.from({ length: t.termIds.length }, (_, j) => j).sort((a, b) => column[t.termIds[a]] - column[t.termIds[b]]);
    for (const j of idx) buf.push(`${i + 1} ${column[t.termIds[j]] + 1} ${t.counts[j]}`);
    if (buf.length >= 8192) {
      yield `${buf.join('\n')}\n`;
      buf = [];
    }
  }
  if (buf.length > 0) yield `${buf.join('\n')}\n`;
}

function* lineChunks(items: readonly string[]): Generator<string> {
  for (let i = 0; i < items.length; i += 4096) yield `${items.slice(i, i + 4096).join('\n')}\n`;
}

async function atomically(path: string, chunks: Iterable<string>): Promise<void> {
  const tmp = `${path}.tmp`;
  const stream = createWriteStream(tmp, { encoding: 'utf8' });
  const failed = once(stream, 'error').then(([err]) =>
    Promise.reject(new InvalidInputError(`cannot write ${tmp}: ${(err as Error).message}`)),
  );
  failed.catch(() => undefined);
  for (const chunk of chunks) if (!stream.write(chunk)) await Promise.race([once(stream, 'drain'), failed]);
  stream.end();
  await Promise.race([once(stream, 'finish'), failed]);
  await rename(tmp, path);
}
