// Bundles the command line (and, when present, the extension, the worker and the webview pages)
// with esbuild. natural is imported module by module, so none of its database clients is bundled.
import { build } from 'esbuild';
import { chmodSync, existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
// keepNames: errors cross from the worker by class name (NoKnownTermsError, NoIndexError,
// CancelledError…); minified without it, every one arrived as a one-letter name and was shown
// as a red "search failed" instead of its calm answer.
// stopwords-iso holds 57 languages' lists (204 KB); natural's German stemmer and the language
// detection (src/core/text/languages.ts) read only the nine languages of languageCodes.ts.
const ISO_LANGUAGES = ['en', 'de', 'fr', 'es', 'it', 'pt', 'nl', 'sv', 'ru'];
const stopListsSubset = {
  name: 'stopwords-iso-subset',
  setup(b) {
    b.onResolve({ filter: /^stopwords-iso$/ }, () => ({ path: 'stopwords-iso', namespace: 'iso-subset' }));
    b.onLoad({ filter: /.*/, namespace: 'iso-subset' }, () => {
      const all = JSON.parse(readFileSync(join(root, 'node_modules/stopwords-iso/stopwords-iso.json'), 'utf8'));
      return { contents: JSON.stringify(Object.fromEntries(ISO_LANGUAGES.map((l) => [l, all[l]]))), loader: 'json' };
    });
  },
};
/** Node flags the installed `undertone` command starts with (its #! line; bench:compare reads them back). */
const CLI_NODE_FLAGS = '--max-semi-space-size=2';
/**
 * Environment the installed command starts with (its #! line, `env -S`; npm's Windows shims set it
 * too). glibc.malloc.hugetlb=1 has glibc's malloc (2.35 and later) advise transparent huge pages
 * for the blocks it maps (madvise MADV_HUGEPAGE; glibc manual, "Memory Allocation Tunables"), so
 * a large typed array is faulted in 2 MiB at a time instead of 4 KiB: each first touch of a page
 * cost about 12 µs on the 2-core VM measured (a fresh 40 MB array: 124 ms to write, 0.3 ms the
 * second time), and a build touches hundreds of thousands. It acts where the system leaves huge
 * pages to madvise (the usual default) or gives them always; elsewhere, and with other C
 * libraries, it is ignored. It replaces MALLOC_MMAP_THRESHOLD_=131072 (every block of 128 KiB
 * or more mapped on its own and given back when freed): that kept peaks 25–35 MB lower but
 * doubled the page faults. Measured in docs/speed-and-memory.md.
 */
const CLI_ENV = 'GLIBC_TUNABLES=glibc.malloc.hugetlb=1';

const common = {
  plugins: [stopListsSubset],
  bundle: true,
  platform: 'node',
  target: 'node20',
  format: 'cjs',
  sourcemap: true,
  keepNames: true,
  logLevel: 'warning',
  absWorkingDir: root,
};
const entries = [
  // The command's first line caps V8's young generation (semi-spaces of 2 MB instead of up to 16):
  // the Documentation folder's build peaks ~28 MB lower at the same time (docs/speed-and-memory.md);
  // and has malloc advise huge pages for its mapped blocks (CLI_ENV).
  { entryPoints: ['src/cli/bin.ts'], outfile: 'dist/cli.js', banner: { js: `#!/usr/bin/env -S ${CLI_ENV} node ${CLI_NODE_FLAGS}` } },
  { entryPoints: ['src/extension/extension.ts'], outfile: 'dist/extension.js', external: ['vscode'] },
  { entryPoints: ['src/node/worker/indexWorker.ts'], outfile: 'dist/indexWorker.js' },
  // Threads the CLI and the index worker start for tokenizing and the SVD (src/node/parallel/workerPool.ts).
  { entryPoints: ['src/node/parallel/parallelWorker.ts'], outfile: 'dist/parallelWorker.js' },
  { entryPoints: ['bench/bench.ts'], outfile: 'dist/bench.js' },
];
const minify = process.argv.includes('--production');
await Promise.all(entries.filter((e) => existsSync(join(root, e.entryPoints[0]))).map((e) => build({ ...common, ...e, minify })));
// Runnable as `dist/cli.js`, through its #! line, as the installed command runs.
chmodSync(join(root, 'dist', 'cli.js'), 0o755);
if (existsSync(join(root, 'scripts/build-map-page.mjs'))) await import('./build-map-page.mjs');
