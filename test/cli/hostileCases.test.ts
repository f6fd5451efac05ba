/**
 * The built command line (src/cli/bin.ts bundled as scripts/build.mjs does) against hostile but
 * fair cases, one row each: damaged or misplaced index files, unwritable caches and outputs,
 * missing and malformed input files, links leaving the folder, odd file names, bad options.
 * Each row checks the exit code (0 success, 1 bad input or nothing found, 2 usage, 70 internal),
 * a message that names the path and the reason, and that no stack trace reaches the terminal.
 * The folder holds abstracts of the CRAN collection (test/fixtures/corpora/cran, public).
 * Cases that need permissions to bite run the command as another user (nobody, via setpriv)
 * when the tests run as root, since root ignores permission bits.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import {
  chmodSync,
  existsSync,
  mkdirSync,
  mkdtempSync,
  readdirSync,
  readFileSync,
  rmSync,
  symlinkSync,
  truncateSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build } from 'esbuild';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadCollection, REPO_ROOT } from '../helpers/shared.js';

const cran = loadCollection('cran');
const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
const hasSetpriv = isRoot && spawnSync('setpriv', ['--version']).status === 0;
const linux = process.platform === 'linux';
/** Permission cases can bite: as a normal user, or as root able to become nobody. */
const canLoseRights = linux && (!isRoot || hasSetpriv);

interface Result {
  code: number | null;
  out: string;
  err: string;
}

let dir = '';
let cli = '';
let ws = '';
let cache = '';

function run(args: string[], opts: { asOther?: boolean; env?: NodeJS.ProcessEnv; input?: string } = {}): Result {
  const cmd = opts.asOther && isRoot ? 'setpriv' : process.execPath;
  const full =
    opts.asOther && isRoot ? ['--reuid=65534', '--regid=65534', '--clear-groups', process.execPath, cli, ...args] : [cli, ...args];
  const r = spawnSync(cmd, full, {
    encoding: 'utf8',
    timeout: 60_000,
    env: { ...process.env, UNDERTONE_CACHE_DIR: cache, ...opts.env },
    input: opts.input ?? '',
  });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

/** A fresh cache folder for one case (so cases do not share saved indexes). */
function freshCache(name: string): string {
  const c = join(dir, 'caches', name);
  mkdirSync(c, { recursive: true });
  chmodSync(c, 0o777);
  return c;
}

function indexFileIn(c: string): string {
  const sub = readdirSync(c).find((n) => existsSync(join(c, n, 'index.undertone')))!;
  return join(c, sub, 'index.undertone');
}

/** No stack trace: no "    at " frame lines and no Node error dump. */
function expectNoTrace(r: Result): void {
  expect(r.err).not.toMatch(/^\s+at .+\(.+:\d+:\d+\)$/m);
  expect(r.err).not.toMatch(/node:internal|Error: .*\n\s+at /);
}

describe('the built command line on hostile cases', () => {
  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'undertone-hostile-'));
    chmodSync(dir, 0o755);
    await build({
      entryPoints: [join(REPO_ROOT, 'src/cli/bin.ts')],
      outfile: join(dir, 'dist', 'cli.js'),
      bundle: true,
      platform: 'node',
      target: 'node20',
      format: 'cjs',
      logLevel: 'error',
    });
    cli = join(dir, 'dist', 'cli.js');
    ws = join(dir, 'ws');
    mkdirSync(ws);
    for (const d of cran.docs.slice(0, 60)) writeFileSync(join(ws, `${d.id}.md`), d.text);
    cache = freshCache('default');
  }, 120_000);
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  // ---- 1. damaged index files --------------------------------------------------------------
  describe('damaged or misplaced index files are rebuilt with a note naming the file', () => {
    it('a changed header byte (a renamed setting) is detected, noted with the path, and rebuilt', () => {
      const c = freshCache('header');
      expect(run(['index', ws, '--cache-dir', c]).code).toBe(0);
      const file = indexFileIn(c);
      const bytes = readFileSync(file);
      const at = bytes.indexOf('lexicalBlend');
      bytes[at] = 'L'.charCodeAt(0);
      writeFileSync(file, bytes);
      const r = run(['ask', ws, 'boundary layer', '--json', '--cache-dir', c]);
      expect(r.code).toBe(0);
      expect(JSON.parse(r.out).results.length).toBeGreaterThan(0);
      expect(r.err).toContain(`could not be used (${file}: index header fails its checksum`);
      expect(run(['index', ws, '--cache-dir', c]).err).toMatch(/index up to date/);
    });

    it('a FIFO at the index path does not hang: noted, answered, and the save problem said', () => {
      const c = freshCache('fifo');
      expect(run(['index', ws, '--cache-dir', c]).code).toBe(0);
      const real = indexFileIn(c);
      rmSync(real);
      execFileSync('mkfifo', [real]);
      const r = run(['ask', ws, 'boundary layer', '--cache-dir', c]);
      expect(r.code).toBe(0);
      expect(r.err).toContain(`${real} is not a regular file`);
      expect(r.out).toMatch(/^rank\s+score\s+path/);
      expect(r.err).toContain(`the index could not be saved (cannot save ${real}: something other than a file is in the way)`);
    });

    it('1.5 GB of junk at the index path is rejected from its first bytes', () => {
      const c = freshCache('junk');
      expect(run(['index', ws, '--cache-dir', c]).code).toBe(0);
      const real = indexFileIn(c);
      writeFileSync(real, 'junk');
      truncateSync(real, 1.5 * 1024 ** 3);
      const r = run(['ask', ws, 'boundary layer', '--cache-dir', c]);
      expect(r.code).toBe(0);
      expect(r.err).toContain(`${real}: not an Undertone index file (bad magic bytes)`);
    });
  });

  // ---- 2. every failure is a message and an exit code ----------------------------------------
  interface Row {
    name: string;
    args: () => string[];
    setup?: () => void;
    code: number;
    /** Must appear in stderr (the path and the reason). */
    err: () => RegExp[];
    out?: RegExp;
    asOther?: boolean;
    skip?: boolean;
  }
  const p = (...parts: string[]): string => join(dir, ...parts);
  const esc = (s: string): string => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  const rows: Row[] = [
    {
      name: 'index path is a directory: ask answers and says the index could not be saved',
      setup: () => {
        const c = freshCache('isdir');
        run(['index', ws, '--cache-dir', c]);
        const f = indexFileIn(c);
        rmSync(f);
        mkdirSync(f);
      },
      args: () => ['ask', ws, 'boundary layer flow', '--cache-dir', p('caches', 'isdir')],
      code: 0,
      out: /^rank/,
      err: () => [
        /is a folder, not an index file/,
        /the index could not be saved \(cannot save \S+index\.undertone: a folder of that name is in the way \(EISDIR\)\)/,
      ],
    },
    {
      name: 'index path is a directory: index fails with exit 1',
      args: () => ['index', ws, '--cache-dir', p('caches', 'isdir')],
      code: 1,
      err: () => [/the index was built but not saved: cannot save \S+index\.undertone: a folder of that name is in the way/],
    },
    {
      name: 'cache folder read-only with changed files: ask answers and says the index could not be saved',
      skip: !canLoseRights,
      setup: () => {
        const c = freshCache('readonly');
        const w = p('ws-ro');
        mkdirSync(w);
        chmodSync(w, 0o755);
        for (const d of cran.docs.slice(0, 30)) writeFileSync(join(w, `${d.id}.md`), d.text);
        run(['index', w, '--cache-dir', c]);
        writeFileSync(join(w, '1.md'), 'supersonic boundary layer flow over a flat plate');
        const sub = readdirSync(c)[0];
        chmodSync(join(c, sub), 0o555);
        if (!isRoot) chmodSync(c, 0o555);
      },
      args: () => ['ask', p('ws-ro'), 'boundary layer flow', '--cache-dir', p('caches', 'readonly')],
      asOther: true,
      code: 0,
      out: /^rank/,
      err: () => [
        /the index could not be saved \(cannot save \S+index\.undertone: permission denied \(EACCES\)\); answering from the index built in memory/,
      ],
    },
    {
      name: 'cache base unwritable (under /proc)',
      skip: !linux,
      args: () => ['ask', ws, 'boundary layer flow', '--cache-dir', '/proc/undertone-cache'],
      code: 0,
      out: /^rank/,
      err: () => [
        /the index could not be saved \(cannot save \/proc\/undertone-cache\/\S+: \/proc\/undertone-cache: it cannot be created there \(ENOENT\)\)/,
      ],
    },
    {
      name: '--cache-dir names a file',
      setup: () => writeFileSync(p('plain.txt'), 'x'),
      args: () => ['ask', ws, 'flow', '--cache-dir', p('plain.txt')],
      code: 1,
      err: () => [new RegExp(`--cache-dir ${esc(p('plain.txt'))} is not a folder`)],
    },
    {
      name: '--cache-dir "" is rejected',
      args: () => ['index', ws, '--cache-dir', ''],
      code: 2,
      err: () => [/--cache-dir needs a folder name, got an empty string/],
    },
    {
      name: 'ask --queries with a missing path',
      args: () => ['ask', ws, '--queries', p('missing.jsonl')],
      code: 1,
      err: () => [new RegExp(`cannot read ${esc(p('missing.jsonl'))}: no such file or folder \\(ENOENT\\)`)],
    },
    {
      name: 'ask --queries with a directory',
      args: () => ['ask', ws, '--queries', ws],
      code: 1,
      err: () => [new RegExp(`cannot read ${esc(ws)}: it is a folder \\(EISDIR\\)`)],
    },
    {
      name: 'eval with a malformed query line',
      setup: () => {
        writeFileSync(p('bad.jsonl'), '{"id": 1, "text": "boundary layer"}\n{"id": 2, "text": \n');
        writeFileSync(p('qrels.tsv'), '1\t1\t1\n');
      },
      args: () => ['eval', ws, '--queries', p('bad.jsonl'), '--qrels', p('qrels.tsv')],
      code: 1,
      err: () => [new RegExp(`${esc(p('bad.jsonl'))}:2: not a JSON line`)],
    },
    {
      name: 'eval with a query without text',
      setup: () => writeFileSync(p('notext.jsonl'), '{"id": 1}\n{"id": 2, "text": "  "}\n'),
      args: () => ['eval', ws, '--queries', p('notext.jsonl'), '--qrels', p('qrels.tsv')],
      code: 1,
      err: () => [new RegExp(`${esc(p('notext.jsonl'))}:1: expected \\{"id": …, "text": "…"\\}`)],
    },
    {
      name: 'eval with a missing qrels file',
      setup: () => writeFileSync(p('good.jsonl'), '{"id": 1, "text": "boundary layer"}\n'),
      args: () => ['eval', ws, '--queries', p('good.jsonl'), '--qrels', p('none.tsv')],
      code: 1,
      err: () => [new RegExp(`cannot read ${esc(p('none.tsv'))}: no such file or folder \\(ENOENT\\)`)],
    },
    {
      name: 'import-factors --terms missing',
      setup: () => {
        run(['index', ws]);
        for (const f of ['U.mtx', 'S.txt', 'V.mtx']) writeFileSync(p(f), '');
      },
      args: () => ['import-factors', ws, '--u', p('U.mtx'), '--s', p('S.txt'), '--v', p('V.mtx'), '--terms', p('terms-missing.txt')],
      code: 1,
      err: () => [new RegExp(`the --terms file: cannot read ${esc(p('terms-missing.txt'))}: no such file or folder \\(ENOENT\\)`)],
    },
    {
      name: 'export --out into an unwritable folder',
      skip: !canLoseRights,
      setup: () => {
        mkdirSync(p('locked'));
        chmodSync(p('locked'), 0o555);
      },
      args: () => ['export', ws, '--out', p('locked', 'out'), '--cache-dir', freshCache('export-locked')],
      asOther: true,
      code: 1,
      err: () => [new RegExp(`cannot save ${esc(p('locked', 'out'))}: permission denied \\(EACCES\\)`)],
    },
    {
      name: 'export --out onto a file',
      args: () => ['export', ws, '--out', p('plain.txt')],
      code: 1,
      err: () => [new RegExp(`cannot save ${esc(p('plain.txt'))}: ${esc(p('plain.txt'))} is a file, not a folder`)],
    },
    {
      name: 'export --out under /proc',
      skip: !linux,
      args: () => ['export', ws, '--out', '/proc/undertone-export'],
      code: 1,
      err: () => [/cannot save \/proc\/undertone-export: it cannot be created there \(ENOENT\)/],
    },
    {
      name: 'map --out naming an existing directory',
      args: () => ['map', ws, '--out', ws],
      code: 1,
      err: () => [new RegExp(`cannot save ${esc(ws)}: it is a folder; name a file`)],
    },
    {
      name: 'map --out /proc/version',
      skip: !linux,
      args: () => ['map', ws, '--out', '/proc/version'],
      code: 1,
      err: () => [/cannot save \/proc\/version: /],
    },
    // ---- 3. files outside the folder ----
    {
      name: 'a link to a secret outside the folder is not read (and its words are not stored)',
      setup: () => {
        mkdirSync(p('ws-link'));
        for (const d of cran.docs.slice(0, 20)) writeFileSync(p('ws-link', `${d.id}.md`), d.text);
        writeFileSync(p('secret.txt'), 'quartermaster vault combination zebracrossing');
        symlinkSync(p('secret.txt'), p('ws-link', 'secret.md'));
        symlinkSync('/etc', p('ws-link', 'etc'));
      },
      args: () => ['ask', p('ws-link'), 'zebracrossing quartermaster', '--cache-dir', freshCache('link')],
      code: 1,
      err: () => [
        /note: 2 links to files outside the folder, not read \(--follow-links reads them\): etc, secret\.md/,
        /None of the words in "zebracrossing quartermaster" occur in the index/,
      ],
    },
    {
      name: 'the same link is read with --follow-links',
      args: () => [
        'ask',
        p('ws-link'),
        'zebracrossing quartermaster',
        '--follow-links',
        '--exclude',
        'etc',
        '--cache-dir',
        freshCache('link-follow'),
      ],
      code: 0,
      out: /secret\.md/,
      err: () => [],
    },
    {
      name: 'a link to /proc is never read, so the index stays up to date',
      skip: !linux,
      setup: () => {
        mkdirSync(p('ws-proc'));
        for (const d of cran.docs.slice(0, 20)) writeFileSync(p('ws-proc', `${d.id}.md`), d.text);
        symlinkSync('/proc/self/status', p('ws-proc', 'status.md'));
        run(['index', p('ws-proc'), '--follow-links', '--cache-dir', freshCache('proc')]);
      },
      args: () => ['index', p('ws-proc'), '--follow-links', '--cache-dir', p('caches', 'proc')],
      code: 0,
      err: () => [/index up to date: 20 files/, /system pseudo-files, never read: status\.md/],
    },
    // ---- 4. leftovers and settings ----
    {
      name: '--k is remembered; a different --k is said and kept',
      setup: () => {
        const c = freshCache('remember');
        run(['index', ws, '--k', '5', '--cache-dir', c]);
      },
      args: () => ['ask', ws, 'boundary layer', '--k', '6', '--cache-dir', p('caches', 'remember')],
      code: 0,
      err: () => [/note: --k 6 differs from the saved index's k=5: rebuilding with k=6, which later commands keep\./, /k=6/],
    },
    // ---- 5. input handling ----
    {
      name: '--top -1 says the number must be positive',
      args: () => ['ask', ws, 'flow', '--top', '-1'],
      code: 1,
      err: () => [/--top needs a positive whole number, got "-1"/],
    },
    {
      name: 'an option that does not apply is warned about',
      args: () => ['nearby', ws, '1.md', '--threshold', '0.5', '--top', '2'],
      code: 0,
      out: /^rank/,
      err: () => [/note: --threshold does not apply to nearby \(only to overlaps\); ignored\./],
    },
    {
      name: 'an unreadable top folder says it cannot be read',
      skip: !canLoseRights,
      setup: () => {
        mkdirSync(p('closed'));
        writeFileSync(p('closed', 'a.md'), 'boundary layer');
        chmodSync(p('closed'), isRoot ? 0o700 : 0o000);
      },
      args: () => ['index', p('closed'), '--cache-dir', freshCache('closed')],
      asOther: true,
      code: 1,
      err: () => [new RegExp(`Cannot scan "${esc(p('closed'))}": it cannot be read \\(EACCES\\)`)],
    },
    {
      name: 'a one-file folder does not talk about a k nobody asked for',
      setup: () => {
        mkdirSync(p('one'));
        writeFileSync(p('one', 'only.md'), cran.docs[0].text);
      },
      args: () => ['index', p('one'), '--cache-dir', freshCache('one')],
      code: 0,
      err: () => [/built index/],
    },
  ];

  for (const row of rows) {
    it.skipIf(row.skip)(row.name, () => {
      row.setup?.();
      const r = run(row.args(), { asOther: row.asOther });
      expect({ code: r.code, err: r.err }).toMatchObject({ code: row.code });
      for (const re of row.err()) expect(r.err).toMatch(re);
      if (row.out) expect(r.out).toMatch(row.out);
      expectNoTrace(r);
      if (row.name.startsWith('a one-file folder')) expect(r.err).not.toMatch(/more than this collection allows/);
    });
  }

  it('a kill between the temporary file and the rename leaves nothing behind after the next run', () => {
    const c = freshCache('temps');
    expect(run(['index', ws, '--cache-dir', c]).code).toBe(0);
    const file = indexFileIn(c);
    const gone = spawnSync(process.execPath, ['-e', '0']).pid!;
    const stale = `${file}.${gone}.0badc0de.tmp`;
    writeFileSync(stale, Buffer.alloc(4096));
    expect(run(['ask', ws, 'flow', '--cache-dir', c]).code).toBe(0);
    expect(existsSync(stale)).toBe(false);
  });

  it('a closed pipe ends the output quietly', () => {
    const queries = cran.queries.map((q) => JSON.stringify({ id: q.id, text: q.text })).join('\n');
    writeFileSync(
      p('many.jsonl'),
      `${queries}\n${queries}\n`.replace(/"id":"(\d+)"/g, (_m, id) => `"id":"${id}-${Math.random()}"`),
    );
    const r = spawnSync(
      'bash',
      [
        '-c',
        `"${process.execPath}" "${cli}" ask "${ws}" --queries "${p('many.jsonl')}" --top 3000 --quiet | head -1 >/dev/null; echo "status \${PIPESTATUS[0]}"`,
      ],
      {
        encoding: 'utf8',
        env: { ...process.env, UNDERTONE_CACHE_DIR: cache },
        timeout: 60_000,
      },
    );
    expect(r.stdout.trim()).toBe('status 0');
    expect(r.stderr).toBe('');
  });

  it('index -q prints nothing; an unquoted question is joined', () => {
    const q = run(['index', ws, '-q']);
    expect(q).toMatchObject({ code: 0, err: '' });
    const joined = run(['ask', ws, 'boundary', 'layer', 'transition', '--json']);
    expect(joined.code).toBe(0);
    expect(JSON.parse(joined.out).query).toBe('boundary layer transition');
  });

  it('eval reads the four-column relevance form and a queries file with a byte-order mark, and warns about what it cannot use', () => {
    const qs = cran.queries.slice(0, 5);
    writeFileSync(
      p('bom.jsonl'),
      `\uFEFF${qs.map((q) => JSON.stringify({ id: q.id, text: q.text })).join('\n')}\n${JSON.stringify({ id: qs[0].id, text: 'again' })}\n`,
    );
    const judged = qs
      .slice(0, 4)
      .flatMap((q) => [...(cran.qrels.get(q.id) ?? [])].filter((d) => Number(d) <= 60).map((d) => `${q.id} 0 ${d} 1`));
    writeFileSync(p('trec.qrels'), `${judged.join('\n')}\n${qs[0].id} 0 9999 1\nthis line is wrong\n`);
    const r = run(['eval', ws, '--queries', p('bom.jsonl'), '--qrels', p('trec.qrels')]);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/^queries [1-9]\d* {2}MAP 0\.\d{4}/);
    expect(r.err).toMatch(
      new RegExp(
        `warning: ${esc(p('trec.qrels'))}:\\d+: 3 columns; expected|warning: ${esc(p('trec.qrels'))}:\\d+: 4 columns|relevance "wrong" is not a number`,
      ),
    );
    expect(r.err).toMatch(/warning: \S+bom\.jsonl:6: query id "?\d+"? appears again; the first one is used/);
    expect(r.err).toMatch(/judged documents? (is|are) not in the index \(query\/document\): \d+\/9999/);
    expect(r.err).toMatch(/no relevant document in \S+trec\.qrels and (is|are) not scored/);
  });

  it.skipIf(!linux)('file names with control characters are escaped; names that are not UTF-8 are named as skipped', () => {
    const w = p('ws-names');
    mkdirSync(w);
    for (const d of cran.docs.slice(0, 20)) writeFileSync(join(w, `${d.id}.md`), d.text);
    writeFileSync(join(w, 'red\x1b[31mtext.md'), `${cran.docs[30].text}`);
    writeFileSync(join(w, 'two\nlines.md'), `${cran.docs[31].text}`);
    writeFileSync(Buffer.concat([Buffer.from(join(w, 'caf')), Buffer.from([0xe9]), Buffer.from('.md')]), cran.docs[32].text);
    const c = freshCache('names');
    const idx = run(['index', w, '--cache-dir', c]);
    expect(idx.code).toBe(0);
    expect(idx.err).toContain('note: 1 file names that are not valid UTF-8, not indexed: caf\\xE9.md');
    const r = run(['ask', w, cran.docs[30].text.slice(0, 200), '--top', '30', '--cache-dir', c]);
    expect(r.code).toBe(0);
    expect(r.out).not.toContain('\x1b');
    expect(r.out).toContain('red\\x1b[31mtext.md');
    expect(r.out).toContain('two\\nlines.md');
    // Each result row, followed by the line naming its best section ("in: …").
    const rows = r.out.trim().split('\n').slice(2);
    for (const line of rows) expect(line).toMatch(/^\s*\d+\s+-?\d\.\d{3}\s+\S|^\s+in: \S/);
    expect(rows.filter((line) => /^\s*\d+\s+-?\d\.\d{3}\s+\S/.test(line)).length).toBeGreaterThan(10);
  });
});
