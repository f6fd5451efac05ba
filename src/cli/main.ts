/**
 * The `undertone` command line: a thin adapter over the core and the node layer.
 * Exit codes (failure.ts): 0 success, 1 bad input or nothing found (message on stderr), 2 a usage
 * error, 70 an internal fault (one line, the trace written to a file).
 */
import { parseArgs } from 'node:util';
import { EXIT, EXIT_CODE_HELP, describeFailure } from './failure.js';
import { DEFAULT_MAX_FILE_BYTES } from '../node/scanTypes.js';
import { DEFAULT_MIN_SIMILARITY } from '../core/links/suggestLinks.js';
import { askCommand } from './commands/askCommand.js';
import { evalCommand } from './commands/evalCommand.js';
import { countCommand } from './commands/countCommand.js';
import { exportCommand } from './commands/exportCommand.js';
import { importFactorsCommand } from './commands/importFactorsCommand.js';
import { importModelCommand } from './commands/importModelCommand.js';
import { indexCommand } from './commands/indexCommand.js';
import { linksCommand } from './commands/linksCommand.js';
import { overlapsCommand } from './commands/overlapsCommand.js';
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
  undertone links  <folder> [<file>]        suggested links: notes near in meaning, not yet linked
                                            either way (--top N per note, default 5)
  undertone eval   <folder> --queries q.jsonl --qrels qrels.tsv   MAP, P@10, nDCG@10
  undertone topics <folder>                 topics, each named by its words and example files
  undertone overlaps <folder>               exact copies, near-copies, partial copies and same
                                            content in other words (--top N per band, default 20;
                                            'lookalikes' is the old name, still accepted)
  undertone export <folder> --format mtx --out DIR   weighted term-document matrix (Matrix Market),
                                            terms.txt and files.txt, for an SVD elsewhere
                                            (--format model --out FILE: the concept model, to share)
  undertone import-factors <folder> --u U.mtx --s S.txt --v V.mtx   load factors computed elsewhere
  undertone count  <folder> --files LIST --out SHARD   term counts of some files (one shard of a
                                            cluster job; --list prints the files the index reads)
  undertone import-model <folder> --model FILE   use a shared concept model (cluster/) instead of
                                            a local SVD (--model none: back to the local SVD)
  undertone map    <folder> --out FILE.html  the concept map and spectrum as one offline HTML file

options:
  --top N                    how many results (default 10)
  --sections                 (ask) rank sections (headings, declarations) instead of files;
                             (nearby, with --line N) the sections nearest to the one at line N
  --skip-sections            (index) build without section vectors (a smaller index file)
  --k N|auto                 concept dimensions (default auto: grows with the collection)
  --weighting log-entropy|tfidf   term weighting (default log-entropy)
  --power-iterations N       power iterations of the randomized SVD (default 4, shifted; more settle the
                             concepts closer to the exact SVD, e.g. to match a cluster model)
  --json                     machine-readable output
  --cache-dir DIR            where saved indexes live (default: the user cache folder,
                             or $UNDERTONE_CACHE_DIR)
  --max-file-size BYTES      skip larger files (default ${DEFAULT_MAX_FILE_BYTES})
  --include GLOB, --exclude GLOB   extra file filters (repeatable)
  --no-gitignore             index files that .gitignore excludes
  --rebuild                  (index) rebuild from scratch
  --explain                  (ask, nearby) the words behind each score, with their shares;
                             with --sections or --line, from each section's own words
  --like FILE, --unlike FILE (ask) more / fewer files like this indexed file (repeatable; the text
                             may then be empty: ask <folder> "" --like FILE)
  --topics N                 (topics, map) how many topics (default: chosen automatically)
  --depth N                  (topics) levels of sub-topics to find and show (default 2; with
                             --json the whole tree, up to 4)
  --in FOLDER                (topics) the topics of one sub-folder: how many of its files each holds
  --min-similarity S         (links) the least similarity worth suggesting (default
                             ${DEFAULT_MIN_SIMILARITY}, calibrated on linked documentation)
  --threshold J              (overlaps) shingle Jaccard for near-copies (default 0.8)
  --layout both|quick|faithful   (map) layouts in the page (default both, opening on faithful;
                             quick skips the slower faithful layout; faithful is the same as both,
                             since the page places queries with the quick projection)
  --max-terms N              (map) words the page's search box knows: the N most frequent index
                             terms (default 20000; each costs about k bytes of file size)
  --follow-links             also read files that symbolic links reach outside the folder
                             (off by default; devices, FIFOs and sockets are never read)
  -q, --quiet                no notes or summary on stderr

${EXIT_CODE_HELP}
`;

/** Options that only some commands use (the rest apply to every command): others are warned about. */
const APPLIES_TO: Record<string, readonly string[]> = {
  top: ['ask', 'nearby', 'links'],
  queries: ['ask', 'eval'],
  qrels: ['eval'],
  rebuild: ['index'],
  explain: ['ask', 'nearby'],
  topics: ['topics', 'map'],
  threshold: ['overlaps'],
  'min-similarity': ['links'],
  layout: ['map'],
  'max-terms': ['map'],
  format: ['export'],
  out: ['export', 'map'],
  u: ['import-factors'],
  s: ['import-factors'],
  v: ['import-factors'],
  terms: ['import-factors'],
  files: ['import-factors'],
};

const HINT = 'Run `undertone --help` for the commands and options.';

/**
 * Lets an option's value start with '-' when it is a number (`--top -1`), so the command says
 * what is wrong with the number instead of parseArgs calling the option ambiguous.
 */
function joinNegativeNumbers(argv: readonly string[], valued: ReadonlySet<string>): string[] {
  const out: string[] = [];
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    const next = argv[i + 1];
    if (
      a.startsWith('--') &&
      !a.includes('=') &&
      valued.has(a.slice(2)) &&
      next !== undefined &&
      /^-\d|^-\.\d|^-Infinity$|^-NaN$/.test(next)
    ) {
      out.push(`${a}=${next}`);
      i++;
    } else out.push(a);
  }
  return out;
}

const EXTRA_OPTIONS = {
  queries: { type: 'string' },
  qrels: { type: 'string' },
  rebuild: { type: 'boolean' },
  explain: { type: 'boolean' },
  line: { type: 'string' },
  like: { type: 'string', multiple: true },
  unlike: { type: 'string', multiple: true },
  topics: { type: 'string' },
  depth: { type: 'string' },
  in: { type: 'string' },
  threshold: { type: 'string' },
  'min-similarity': { type: 'string' },
  layout: { type: 'string' },
  'max-terms': { type: 'string' },
  format: { type: 'string' },
  out: { type: 'string' },
  u: { type: 'string' },
  s: { type: 'string' },
  v: { type: 'string' },
  terms: { type: 'string' },
  files: { type: 'string' },
  list: { type: 'boolean' },
  model: { type: 'string' },
  help: { type: 'boolean', short: 'h' },
} as const;

export async function main(argv: string[], io: Io = processIo): Promise<number> {
  const options = { ...COMMON_OPTIONS, ...EXTRA_OPTIONS };
  const valued = new Set(
    Object.entries(options)
      .filter(([, o]) => o.type === 'string')
      .map(([name]) => name),
  );
  let parsed;
  try {
    parsed = parseArgs({ args: joinNegativeNumbers(argv, valued), options, allowPositionals: true, strict: true });
  } catch (err) {
    io.err(`undertone: ${(err as Error).message}\n${HINT}`);
    return EXIT.usage;
  }
  const flags = parsed.values as Flags;
  const [given, folder, ...rest] = parsed.positionals;
  // `lookalikes` was the command's name before the editor's view became "Overlaps"; still accepted.
  const command = given === 'lookalikes' ? 'overlaps' : given;
  if (flags.help || !command) {
    (flags.help ? io.out : io.err)(USAGE);
    return flags.help ? EXIT.ok : EXIT.usage;
  }
  const needsFolder = [
    'index',
    'ask',
    'nearby',
    'links',
    'eval',
    'topics',
    'overlaps',
    'export',
    'import-factors',
    'map',
    'count',
    'import-model',
  ];
  if (!needsFolder.includes(command)) {
    io.err(`undertone: unknown command "${command}"\n${HINT}`);
    return EXIT.usage;
  }
  if (!folder) {
    io.err(`undertone ${command}: missing <folder>\n${HINT}`);
    return EXIT.usage;
  }
  // An unquoted question arrives as several words: join them (ask); other commands take at most one more.
  const arg = command === 'ask' ? (rest.length > 0 ? rest.join(' ') : undefined) : rest[0];
  if (command !== 'ask' && rest.length > (command === 'nearby' || command === 'links' ? 1 : 0)) {
    io.err(
      `undertone ${command}: unexpected argument${rest.length > 1 ? 's' : ''} ${rest.map((r) => `"${r}"`).join(' ')}${command === 'nearby' || command === 'links' ? ` (${command} takes one file; quote a name with spaces)` : ''}\n${HINT}`,
    );
    return EXIT.usage;
  }
  if (typeof flags['cache-dir'] === 'string' && flags['cache-dir'].trim() === '') {
    io.err(`undertone ${command}: --cache-dir needs a folder name, got an empty string\n${HINT}`);
    return EXIT.usage;
  }
  if (!flags.quiet) {
    for (const name of Object.keys(flags)) {
      const applies = APPLIES_TO[name];
      if (applies && !applies.includes(command))
        io.err(`note: --${name} does not apply to ${command} (only to ${applies.join(', ')}); ignored.`);
    }
  }
  try {
    switch (command) {
      case 'index':
        return await indexCommand(folder, flags, io);
      case 'ask':
        return await askCommand(folder, arg, flags, io);
      case 'nearby':
        return await nearbyCommand(folder, arg, flags, io);
      case 'links':
        return await linksCommand(folder, arg, flags, io);
      case 'topics':
        return await topicsCommand(folder, flags, io);
      case 'overlaps':
        return await overlapsCommand(folder, flags, io);
      case 'export':
        return await exportCommand(folder, flags, io);
      case 'import-factors':
        return await importFactorsCommand(folder, flags, io);
      case 'count':
        return await countCommand(folder, flags, io);
      case 'import-model':
        return await importModelCommand(folder, flags, io);
      case 'map':
        return await mapCommand(folder, flags, io);
      default:
        return await evalCommand(folder, flags, io);
    }
  } catch (err) {
    const failure = describeFailure(command, err);
    io.err(failure.message);
    return failure.code;
  }
}
