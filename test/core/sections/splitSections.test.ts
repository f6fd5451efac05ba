/**
 * Section boundaries on real files (test/fixtures/sections/README.md names each file's package,
 * version and licence). Every expected start line was read off the file by hand: the line of the
 * declaration or heading, or the first line of the comment block just above a declaration.
 * Lines are one-based here, as an editor shows them.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { InvalidInputError } from '../../../src/core/errors.js';
import { isBlank, splitLines, splitSections, type Section } from '../../../src/core/sections/splitSections.js';
import { loadRankingFixture } from '../../helpers/rankingChecks.js';

const fixture = (name: string): string => readFileSync(new URL(`../../fixtures/sections/${name}`, import.meta.url), 'utf8');
/** title → one-based first line */
const starts = (sections: readonly Section[]): Record<string, number> => Object.fromEntries(sections.map((s) => [s.title, s.start + 1]));

function expectTiling(sections: readonly Section[], lines: number): void {
  expect(sections[0].start).toBe(0);
  for (let i = 1; i < sections.length; i++) expect(sections[i].start).toBe(sections[i - 1].end);
  expect(sections.at(-1)!.end).toBe(lines);
}

const lineCount = (text: string): number => text.replace(/\s+$/, '').split(/\r\n|\r|\n/).length;

describe('splitSections on real files', () => {
  it('Go (git contrib proxy.go): one section per type and func, the package clause and imports first', () => {
    const text = fixture('proxy.go');
    const { kind, sections } = splitSections('contrib/proxy.go', text);
    expect(kind).toBe('code');
    expect(sections.map((s) => s.title)).toEqual([
      'package main',
      'Proxy',
      'Run',
      'socketContext',
      'Done',
      'serveUnix',
      'handleUnixConn',
      'closeOnIdle',
      'closeOnUpdate',
      'closeOnSignal',
    ]);
    // `type Proxy struct` is on line 31, `func (p *Proxy) Run()` on 41, `func (p *Proxy) closeOnSignal()` on 179.
    expect(starts(sections)).toMatchObject({ Proxy: 31, Run: 41, socketContext: 98, Done: 104, closeOnSignal: 179 });
    expectTiling(sections, lineCount(text));
  });

  it('C (zlib zpipe.c): each function starts at the comment block above it', () => {
    const text = fixture('zpipe.c');
    const { sections } = splitSections('examples/zpipe.c', text);
    expect(sections.map((s) => s.title)).toEqual(['#include <stdio.h>', 'def', 'inf', 'zerr', 'main']);
    // `int def(` is on line 36 under a comment starting on 30; `inf` on 92 under 86; `zerr` 151 under 150; `main` 176 under 175.
    expect(starts(sections)).toMatchObject({ def: 30, inf: 86, zerr: 150, main: 175 });
    expectTiling(sections, lineCount(text));
  });

  it('Rust (flatted lib.rs): functions, and methods of impl blocks named by their impl', () => {
    const { sections } = splitSections('src/lib.rs', fixture('flatted-lib.rs'));
    const s = starts(sections);
    // `pub fn stringify(` 64 (doc comment from 60), `fn push_known(` 102, `pub fn parse<F>(` 234 (doc comment from 230),
    // `fn resolve_ref(` 291, `pub fn parse_simple(` 371 (doc comment from 370); `fn fmt` (33) inside
    // `impl std::fmt::Display for Error` (32): the one-line impl header joins its first method.
    expect(s).toMatchObject({ stringify: 60, push_known: 102, parse: 230, resolve_ref: 291, parse_simple: 370 });
    expect(s['std::fmt::Display for Error.fmt']).toBe(32);
    // A `where F: …` clause continues its function: no section is titled by the bound.
    expect(sections.some((x) => x.title === 'F')).toBe(false);
  });

  it('C# (node-gyp Find-VisualStudio.cs): types inside the namespace and methods inside classes, Allman braces', () => {
    const { sections } = splitSections('lib/Find-VisualStudio.cs', fixture('Find-VisualStudio.cs'));
    const s = starts(sections);
    // `[Flags]` above `public enum InstanceState` on 16 (namespace line 14 joins it); `[Guid(…)]` above
    // `public interface IEnumSetupInstances` on 27; `private static string JsonString` 219 (blank line 218 before it).
    expect(s['VisualStudioConfiguration.InstanceState']).toBe(14);
    expect(s['VisualStudioConfiguration.IEnumSetupInstances']).toBe(27);
    expect(s['VisualStudioConfiguration.Main.JsonString']).toBe(219);
    expect(s['VisualStudioConfiguration.Main.InstanceJson']).toBe(224);
  });

  it('Java (Tomcat CompressionFilter.java): the class with its fields, methods from their Javadoc or annotation', () => {
    const text = fixture('CompressionFilter.java');
    const { kind, sections } = splitSections('compressionFilters/CompressionFilter.java', text);
    expect(kind).toBe('code');
    // Javadoc of `public class CompressionFilter` from 34 (the class on 38, its fields 40–71 with it);
    // `@Override` on 73 above `public void init()` 74; the Javadoc of `doFilter` from 129, the method on
    // 146 with its `throws` clause on 147; the file ends on 220.
    expect(sections.map((s) => [s.title, s.start + 1, s.end])).toEqual([
      ['package compressionFilters;', 1, 33],
      ['CompressionFilter', 34, 72],
      ['CompressionFilter.init', 73, 128],
      ['CompressionFilter.doFilter', 129, 220],
    ]);
    expectTiling(sections, lineCount(text));
  });

  it('Java (Tomcat Stockticker.java): methods, a nested interface and a nested class with its own methods', () => {
    const text = fixture('Stockticker.java');
    const { sections } = splitSections('async/Stockticker.java', text);
    const s = starts(sections);
    // `public class Stockticker` 25 (fields 26–30 with it), `public synchronized void start()` 32,
    // `@Override` 84 above `public void run()`, `public interface TickListener` 121,
    // `public static final class Stock` 126 (fields 127–131), its constructor 133, `setCnt` 138,
    // `@Override` 204 above `public Object clone()`.
    expect(s).toMatchObject({
      'package async;': 1,
      Stockticker: 25,
      'Stockticker.start': 32,
      'Stockticker.run': 84,
      'Stockticker.TickListener': 121,
      'Stockticker.Stock': 126,
      'Stockticker.Stock.Stock': 133,
      'Stockticker.Stock.setCnt': 138,
      'Stockticker.Stock.clone': 204,
    });
    // The package and imports, the class, its 6 methods, the interface, the nested class, its constructor and 13 methods.
    expect(sections.length).toBe(1 + 1 + 6 + 1 + 1 + 14);
    expectTiling(sections, lineCount(text));
  });

  it('Python (numba core/utils.py): functions at column 0 and methods of classes', () => {
    const { sections } = splitSections('numba/core/utils.py', fixture('numba-utils.py'));
    const s = starts(sections);
    // `def erase_traceback` 34 (comment above from 31), `class ThreadLocalStack` 203, `def push` 233, `def order_by_target_specificity` 316.
    expect(s).toMatchObject({
      ThreadLocalStack: 203,
      'ThreadLocalStack.push': 233,
      order_by_target_specificity: 316,
    });
    expect(s.erase_traceback).toBeLessThanOrEqual(34);
    expect(s.erase_traceback).toBeGreaterThanOrEqual(31);
  });

  it('TypeScript (rxjs internal/Subject.ts): the class and each of its members', () => {
    const doc = loadRankingFixture('rxjs-src').docs.find((d) => d.id === 'internal/Subject.ts')!;
    const { sections } = splitSections(doc.id, doc.text);
    const s = starts(sections);
    // `export class Subject<T>` on 10, `constructor() {` 27, `next(value: T) {` 44, `export class AnonymousSubject<T>` 134.
    expect(s).toMatchObject({ Subject: 10, 'Subject.constructor': 27, 'Subject.next': 44 });
    expect(sections.find((x) => x.title.startsWith('AnonymousSubject'))!.start + 1).toBe(134);
  });

  it('reStructuredText (numba-doc parallel.rst): over- and underlined titles, labels before the first', () => {
    const text = fixture('parallel.rst');
    const { kind, sections } = splitSections('user/parallel.rst', text);
    expect(kind).toBe('headings');
    // The overline of the document title is line 6; "Supported Operations" 29; "Scheduling" 614.
    expect(starts(sections)).toMatchObject({
      'Automatic parallelization with ``@jit``': 6,
      'Supported Operations': 29,
      'Explicit Parallel Loops': 73,
      Diagnostics: 288,
      Scheduling: 614,
    });
    expectTiling(sections, lineCount(text));
  });

  it('Markdown (bison examples/c/README.md): one section per heading', () => {
    const { sections } = splitSections('README.md', fixture('bison-examples-c.md'));
    expect(sections.map((s) => s.start + 1)).toEqual([1, 8, 16, 22, 30, 34, 41, 52]);
    expect(sections[1].title).toBe('rpcalc - Reverse Polish Notation Calculator');
  });

  it('AsciiDoc (Jetty README.adoc): "===" and "====" headings', () => {
    const { sections } = splitSections('README.adoc', fixture('jetty-home.adoc'));
    expect(sections.map((s) => [s.title, s.start + 1])).toEqual([
      ['ECLIPSE JETTY', 1],
      ['Quick Setup', 14],
    ]);
  });
});

describe('splitSections on other text', () => {
  it('cuts text without structure into overlapping windows that cover it', () => {
    const text = Array.from({ length: 130 }, (_, i) => `line ${i}`).join('\n');
    const { kind, sections } = splitSections('notes.log', text, { windowLines: 60, windowOverlap: 15 });
    expect(kind).toBe('window');
    expect(sections.map((s) => [s.start, s.end])).toEqual([
      [0, 60],
      [45, 105],
      [70, 130],
    ]);
    expect(sections[0].title).toBe('lines 1–60');
  });

  it('cuts an overlong section into windows that keep its title', () => {
    const body = Array.from({ length: 50 }, (_, i) => `text ${i}`).join('\n');
    const { sections } = splitSections('a.md', `# One\n${body}\n# Two\nx\ny\nz`, { maxLines: 20, windowOverlap: 5 });
    expect(sections[0].title).toBe('One (1/4)');
    expect(sections.filter((s) => s.title.startsWith('One (')).length).toBe(4);
    expect(sections.at(-1)!.title).toBe('Two');
  });

  it('ignores "#" lines inside fenced code in Markdown', () => {
    const { sections } = splitSections('a.md', '# Real\ntext\nmore\n```sh\n# not a heading\n```\nand more\n');
    expect(sections.map((s) => s.title)).toEqual(['Real']);
  });

  it('gives no sections for empty text and refuses bad options', () => {
    expect(splitSections('a.ts', '\n\n').sections).toEqual([]);
    expect(() => splitSections('a.ts', 'x', { windowLines: 10, windowOverlap: 10 })).toThrow(InvalidInputError);
  });
});

describe('splitLines', () => {
  it('cuts at "\\n", "\\r\\n" and "\\r" as the pattern split does (reference: String.prototype.split with /\\r\\n|\\r|\\n/)', () => {
    const texts = ['', '\n', 'a', 'a\nb\n', 'a\r\nb\rc\nd', '\r', '\r\n\r\n', 'x\n\r\ny\r\rz', 'tail\r', fixture('proxy.go')];
    for (const t of texts) expect(splitLines(t)).toEqual(t.split(/\r\n|\r|\n/));
  });
});

describe('isBlank', () => {
  it("is true exactly when String.prototype.trim leaves nothing, for every code unit alone and inside text (reference: the engine's trim)", () => {
    for (let c = 0; c < 65536; c++) {
      const ch = String.fromCharCode(c);
      expect(isBlank(ch), `U+${c.toString(16)}`).toBe(ch.trim() === '');
      expect(isBlank(` \t${ch}\u3000`)).toBe(` \t${ch}\u3000`.trim() === '');
    }
    expect(isBlank('')).toBe(true);
  });
});
