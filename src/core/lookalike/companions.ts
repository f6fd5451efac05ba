/**
 * Companion files: two files of code that are two halves of one unit by the conventions of their
 * languages, not one content told twice. A reader already knows they go together, so the
 * "same content, other words" band leaves such a pair out (retold.ts, companionVeto):
 *   - an implementation and its interface of the same name: a C-family source and its header
 *     (`rt5663.c` ~ `rt5663.h`, `.cc`/`.cpp`/`.m` ~ `.hpp`/`.hh`/`.h`), an OCaml `.ml` and its
 *     `.mli`, an Ada body `.adb` and its spec `.ads`, a Python module and its `.pyi` stub, a
 *     JavaScript or TypeScript module and its `.d.ts` declarations;
 *   - a test and the file it tests: the same name with a test affix (`foo.test.ts`,
 *     `foo.spec.js`, `foo_test.go`, `test_foo.py`, `FooTest.java`) or the same name under a test
 *     folder (`test/`, `tests/`, `spec/`, `__tests__/`), one of the two not a test.
 * Names compare without letter case and without leading underscores (`_arpack.py` is the module
 * `tests/test_arpack.py` tests). The conventions are the languages' common practice, from memory;
 * no constant here was fitted to a collection. Measured on code nobody here wrote (docs/overlaps.md):
 * of 30 "same content" pairs in five code folders of linux-source-6.1 and Debian's python3-sklearn
 * and python3-scipy, 20 were such companions.
 */
/** Extensions of programming languages (common practice): only such files can be companions. */
const CODE_EXTENSIONS = new Set(
  (
    'ts tsx mts cts js jsx mjs cjs go java kt kts scala groovy cs fs vb c h cc cpp cxx c++ hpp hh hxx h++ m mm ' +
    'rs py pyi rb php swift ml mli adb ads ex exs erl hrl hs lua pl pm sh dart clj zig nim jl r'
  ).split(' '),
);

/** Interface file kinds and the implementation kinds they pair with (by final extension). */
const INTERFACE_OF: Readonly<Record<string, readonly string[]>> = {
  h: ['c', 'cc', 'cpp', 'cxx', 'c++', 'm', 'mm'],
  hh: ['cc', 'cpp', 'cxx', 'c++'],
  hpp: ['cc', 'cpp', 'cxx', 'c++'],
  hxx: ['cc', 'cpp', 'cxx', 'c++'],
  'h++': ['cc', 'cpp', 'cxx', 'c++'],
  mli: ['ml'],
  ads: ['adb'],
  pyi: ['py'],
};

/** Declaration files (`.d.ts`, `.d.mts`, `.d.cts`) and the modules they declare. */
const DECLARED = ['ts', 'tsx', 'js', 'jsx', 'mjs', 'cjs', 'mts', 'cts'];

const TEST_FOLDERS = new Set(['test', 'tests', 'spec', 'specs', '__tests__', 'testing']);
/** A test affix after the name (`.test`, `_spec`, `-test`, `Test`, `Tests`) or before it (`test_`, `test-`, `Test`). */
const TEST_SUFFIX = /(?:[._-](?:test|tests|spec)|(?<=[a-z0-9])(?:Test|Tests|Spec))$/;
const TEST_PREFIX = /^(?:test[_-]|Test(?=[A-Z]))/;

interface PathParts {
  /** Folder segments. */
  readonly folders: readonly string[];
  /** The file name without its last extension (and without `.d` for declarations). */
  readonly stem: string;
  /** The last extension, lowercase ('' when none). */
  readonly ext: string;
  readonly declaration: boolean;
}

function parts(path: string): PathParts {
  const segments = path.split(/[/\\]/);
  const name = segments.pop() ?? '';
  const dot = name.lastIndexOf('.');
  const ext = dot > 0 ? name.slice(dot + 1).toLowerCase() : '';
  let stem = dot > 0 ? name.slice(0, dot) : name;
  const declaration = DECLARED.includes(ext) && /\.d$/i.test(stem);
  if (declaration) stem = stem.slice(0, -2);
  return { folders: segments, stem, ext, declaration };
}

const bare = (stem: string): string => stem.replace(/^_+/, '').toLowerCase();

/** The name a test file tests (its stem without the test affix), or undefined when it is not a test by name. */
function testedName(p: PathParts): string | undefined {
  if (TEST_SUFFIX.test(p.stem)) return bare(p.stem.replace(TEST_SUFFIX, ''));
  if (TEST_PREFIX.test(p.stem)) return bare(p.stem.replace(TEST_PREFIX, ''));
  return undefined;
}

const inTestFolder = (p: PathParts): boolean => p.folders.some((f) => TEST_FOLDERS.has(f.toLowerCase()));

/** True when the two paths are companion files (see the header): an implementation and its interface, or a test and its subject. */
export function companionFiles(a: string, b: string): boolean {
  const pa = parts(a);
  const pb = parts(b);
  if (!CODE_EXTENSIONS.has(pa.ext) || !CODE_EXTENSIONS.has(pb.ext)) return false;
  for (const [x, y] of [
    [pa, pb],
    [pb, pa],
  ]) {
    const sameName = bare(x.stem) === bare(y.stem);
    if (sameName && INTERFACE_OF[x.ext]?.includes(y.ext) && !y.declaration) return true;
    if (sameName && x.declaration && !y.declaration && DECLARED.includes(y.ext)) return true;
    if (testedName(y) !== undefined) continue;
    if (testedName(x) === bare(y.stem)) return true;
    if (sameName && inTestFolder(x) && !inTestFolder(y)) return true;
  }
  return false;
}
