/**
 * The `undertone` command line: a thin adapter over the core and the node layer.
 * Exit codes: 0 success, 1 a problem with the input (message on stderr), 2 a usage error.
 */
import { parseArgs } from 'node:util';
import { UndertoneError } from '../core/errors.js';
import { DEFAULT_MAX_FILE_BYTES } from '../node/scanTypes.js';
import { askCommand } from './commands/askCommand.js';
import { evalCommand } from './commands/evalCommand.js';
import { exportCommand } from './commands/exportCommand.js';
import { importFactorsCommand } from './commands/importFactorsCommand.js';
import { indexCommand } from './commands/indexCommand.js';
import { lookalikesCommand } from './commands/lookalikesCommand.js';
import { mapCommand } from './commands/mapCommand.js';
import { nearbyCommand } from './commands/nearbyCommand.js';
import { topicsCommand } from './commands/topicsCommand.js';
import { COMMON_OPTIONS, type Flags } from './context.js';
import { processIo, type Io } from './output.js';

export const USAGE = `undertone — find files by meaning (latent semantic indexing of a folder)

usage:
  undertone index  <folder>                 build or refresh the saved index
  undertone ask    <folder> "<text>"        files ranked by meaning for plain-language text
  undertone ask    <folder> --queries q.jsonl   batch: one JSON line out per {"id","text"} line in
  undertone nearby <folder> <file>          the files nearest in meaning to one file
  undertone eval   <folder> --queries q.jsonl --qrels qrels.tsv   MAP, P@10, nDCG@10
  undertone topics <folder>                 topics, each named by its words and example files
  undertone lookalikes <folder>             exact copies, near-copies and same-content pairs
  undertone export <folder> --format mtx --out DIR   weighted term-document matrix (Matrix Market),
                                            terms.txt and files.txt, for an SVD elsewhere
  undertone import-factors <folder> --u U.mtx --s S.txt --v V.mtx   load factors computed elsewhere
  undertone map    <folder> --out FILE.html  the concept map and spectrum as one offline HTML file

options:
  --top N                    how many results (default 10)
  --k N|auto                 concept dimensions (default auto: grows with the collection)
  --weighting log-entropy|tfidf   term weighting (default log-entropy)
  --json                     machine-readable output
  --cache-dir DIR            where saved indexes live (default: the user cache folder,
                             or $UNDERTONE_CACHE_DIR)
  --max-file-size BYTES      skip larger files (default ${DEFAULT_MAX_FILE_BYTES})
  --include GLOB, --exclude GLOB   extra file filters (repeatable)
  --no-gitignore             index files that .gitignore excludes
  --rebuild                  (index) rebuild from scratch
  --explain                  (ask, nearby) the words behind each score, with their shares
  --topics N                 (topics, map) how many topics (default: chosen automatically)
  --depth N                  (topics) levels of sub-topics to find and show (default 2; with
                             --json the whole tree, up to 4)
  --in FOLDER                (topics) the topics of one sub-folder: how many of its files each holds
  --threshold J              (lookalikes) shingle Jaccard for near-copies (default 0.8)
  --layout both|quick|faithful   (map) layouts in the page (default both, opening on faithful;
                             quick skips the slower faithful layout; faithful is the same as both,
                             since the page places queries with the quick projection)
  --max-terms N              (map) words the page's search box knows: the N most frequent index
                             terms (default 20000; each costs about k bytes of file size)
  -q, --quiet                no notes or summary on stderr
`;

const EXTRA_OPTIONS = {
  queries: { type: 'string' },
  qrels: { type: 'string' },
  rebuild: { type: 'boolean' },
  explain: { type: 'boolean' },
  topics: { type: 'string' },
  depth: { type: 'string' },
  in: { type: 'string' },
  threshold: { type: 'string' },
  layout: { type: 'string' },
  'max-terms': { type: 'string' },
  format: { type: 'string' },
  out: { type: 'string' },
  u: { type: 'string' },
  s: { type: 'string' },
  v: { type: 'string' },
  terms: { type: 'string' },
  files: { type: 'string' },
  help: { type: 'boolean', short: 'h' },
} as const;

export async function main(argv: string[], io: Io = processIo): Promise<number> {
  let parsed;
  try {
    parsed = parseArgs({ args: argv, options: { ...COMMON_OPTIONS, ...EXTRA_OPTIONS }, allowPositionals: true, strict: true });
  } catch (err) {
    io.err(`undertone: ${(err as Error).message}\n\n${USAGE}`);
    return 2;
  }
  const flags = parsed.values as Flags;
  const [command, folder, arg] = parsed.positionals;
  if (flags.help || !command) {
    (flags.help ? io.out : io.err)(USAGE);
    return flags.help ? 0 : 2;
  }
  const needsFolder = ['index', 'ask', 'nearby', 'eval', 'topics', 'lookalikes', 'export', 'import-factors', 'map'];
  if (!needsFolder.includes(command)) {
    io.err(`undertone: unknown command "${command}"\n\n${USAGE}`);
    return 2;
  }
  if (!folder) {
    io.err(`undertone ${command}: missing <folder>\n\n${USAGE}`);
    return 2;
  }
  try {
    switch (command) {
      case 'index':
        return await indexCommand(folder, flags, io);
      case 'ask':
        return await askCommand(folder, arg, flags, io);
      case 'nearby':
        return await nearbyCommand(folder, arg, flags, io);
      case 'topics':
        return await topicsCommand(folder, flags, io);
      case 'lookalikes':
        return await lookalikesCommand(folder, flags, io);
      case 'export':
        return await exportCommand(folder, flags, io);
      case 'import-factors':
        return await importFactorsCommand(folder, flags, io);
      case 'map':
        return await mapCommand(folder, flags, io);
      default:
        return await evalCommand(folder, flags, io);
    }
  } catch (err) {
    if (err instanceof UndertoneError) {
      io.err(`undertone ${command}: ${err.message}`);
      return 1;
    }
    throw err;
  }
}
