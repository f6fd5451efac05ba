/**
 * Structure checks the linter cannot make (the layer boundaries themselves are lint rules,
 * eslint.config.mjs): no import cycles among the source files, and nothing in the repository reads
 * a folder outside it.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, normalize, relative } from 'node:path';
import { describe, expect, it } from 'vitest';
import { REPO_ROOT } from './helpers/shared.js';

function filesUnder(dir: string, keep: (p: string) => boolean): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) out.push(...filesUnder(p, keep));
    else if (keep(p)) out.push(p);
  }
  return out;
}

const IMPORT = /(?:^|\n)\s*(?:import|export)\b[^;]*?\bfrom\s*['"](\.{1,2}\/[^'"]+)['"]/g;

/** Relative imports of every .ts file under src, as repo-relative paths. */
function importGraph(): Map<string, string[]> {
  const src = join(REPO_ROOT, 'src');
  const files = filesUnder(src, (p) => p.endsWith('.ts'));
  const known = new Set(files);
  const graph = new Map<string, string[]>();
  for (const f of files) {
    const deps: string[] = [];
    for (const m of readFileSync(f, 'utf8').matchAll(IMPORT)) {
      const target = normalize(join(dirname(f), m[1])).replace(/\.js$/, '.ts');
      if (known.has(target)) deps.push(relative(REPO_ROOT, target));
    }
    graph.set(relative(REPO_ROOT, f), deps);
  }
  return graph;
}

/** Strongly connected components with more than one file (Tarjan 1972). */
function cycles(graph: Map<string, string[]>): string[][] {
  const index = new Map<string, number>();
  const low = new Map<string, number>();
  const stack: string[] = [];
  const onStack = new Set<string>();
  const found: string[][] = [];
  let next = 0;
  const visit = (v: string): void => {
    index.set(v, next);
    low.set(v, next++);
    stack.push(v);
    onStack.add(v);
    for (const w of graph.get(v) ?? []) {
      if (!index.has(w)) {
        visit(w);
        low.set(v, Math.min(low.get(v)!, low.get(w)!));
      } else if (onStack.has(w)) low.set(v, Math.min(low.get(v)!, index.get(w)!));
    }
    if (low.get(v) === index.get(v)) {
      const comp: string[] = [];
      let w: string;
      do {
        w = stack.pop()!;
        onStack.delete(w);
        comp.push(w);
      } while (w !== v);
      if (comp.length > 1) found.push(comp.sort());
    }
  };
  for (const v of graph.keys()) if (!index.has(v)) visit(v);
  return found;
}

describe('source layout', () => {
  it('has no import cycles among the files of src (type-only imports included)', () => {
    const graph = importGraph();
    expect(graph.size).toBeGreaterThan(100);
    expect(cycles(graph)).toEqual([]);
  });

  it('finds a cycle when there is one (the check itself works)', () => {
    const g = new Map([
      ['a', ['b']],
      ['b', ['c']],
      ['c', ['a']],
      ['d', ['a']],
    ]);
    expect(cycles(g)).toEqual([['a', 'b', 'c']]);
  });

  it('reads nothing outside the repository: no ../shared, no absolute path of a machine', () => {
    const roots = ['src', 'test', 'bench', 'scripts'].map((d) => join(REPO_ROOT, d));
    const self = join(REPO_ROOT, 'test', 'architecture.test.ts');
    const offenders: string[] = [];
    for (const root of roots) {
      for (const f of filesUnder(
        root,
        (p) => /\.(ts|mts|mjs|js|sh|json)$/.test(p) && p !== self && !p.includes(`${join('test', 'fixtures')}`),
      )) {
        const text = readFileSync(f, 'utf8');
        if (/\.\.\/shared\b|'\.\.', 'shared'|\/work\/(shared|wt|main)\b/.test(text)) offenders.push(relative(REPO_ROOT, f));
      }
    }
    expect(offenders).toEqual([]);
  });
});
