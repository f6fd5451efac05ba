/**
 * Top-level declarations of source code found by a language-aware heuristic on braces and
 * indentation, without a parser (see the README, "Sections", for why no parser is bundled):
 *
 *  - brace languages (TypeScript/JavaScript, Go, Java, C#, C/C++, Rust): a lexer that knows the
 *    language's comments and string literals tracks the brace depth at the start of every line.
 *    A statement starts on a line at a "member depth" (the top level, or directly inside a class,
 *    interface, struct, enum, trait, impl, namespace or module block) when the line before it
 *    ended the previous statement (with ';', '{' or '}'), was blank, or was a comment. Comments,
 *    decorators and attributes just above a statement belong to it.
 *  - Python: the same on indentation: statements at column 0, and `def` inside a `class` at the
 *    class body's indentation; lines inside triple-quoted strings are skipped.
 *
 * A statement with a name (function, class, method, constant, type…) is a declaration and starts
 * a section titled by its name ("Class.method" for members); runs of other statements (imports,
 * expressions) join into one section titled by their first line. Returns null when no
 * declaration is found.
 */
import type { Section } from './types.js';

export type CodeLanguage = 'ts' | 'go' | 'java' | 'csharp' | 'c' | 'rust' | 'python';

interface Unit {
  /** First line (leading comments and attributes included). */
  start: number;
  /** The line the statement itself starts on. */
  head: number;
  /** Its name, or null for a statement that declares nothing. */
  name: string | null;
  /** The container it sits in ("" at the top level). */
  owner: string;
}

const CONTAINER =
  /^\s*(?:(?:export|default|declare|public|private|protected|internal|static|abstract|sealed|partial|final|pub(?:\([^)]*\))?|unsafe|readonly|async)\s+)*(?:class|interface|struct|trait|impl|namespace|module|record|object|union|mod|extern\s+"C(?:\+\+)?")\b/;

const NAME_PATTERNS: readonly RegExp[] = [
  /\bimpl\b(?:\s*<[^>]*>)?\s+([^{]+?)\s*(?:where\b[^{]*)?\{?\s*$/,
  /\b(?:class|interface|struct|enum|trait|namespace|module|record|object|union|mod|type)\s+([A-Za-z_$][\w$.]*)/,
  /\bfunc\s+(?:\([^)]*\)\s*)?([A-Za-z_]\w*)/,
  /\b(?:function\*?|fn|def)\s+([A-Za-z_$][\w$]*)/,
  /^#\s*define\s+([A-Za-z_]\w*)/,
  /\b(?:const|let|var|static)\s+(?:mut\s+)?([A-Za-z_$][\w$]*)\s*[:=<(]/,
  /^\s*(?:(?:public|private|protected|internal|static|readonly|abstract|async|override|virtual|get|set|declare|final|synchronized)\s+)*([A-Za-z_$#][\w$]*)\s*[?!]?\s*(?::|=(?!=)|<[^>(]*>\s*\()/,
  // A function or method: the identifier before the first "(" (C, C++, Java, C#).
  /^\s*(?:[\w$<>[\],.*&:~]+\s+)*?[*&]*([A-Za-z_$~][\w$]*(?:::~?[A-Za-z_$][\w$]*)*)\s*(?:<[^>(]*>)?\s*\(/,
];
const NOT_NAMES = new Set([
  'if',
  'for',
  'while',
  'switch',
  'return',
  'catch',
  'do',
  'else',
  'new',
  'typeof',
  'sizeof',
  'await',
  'yield',
  'throw',
  'case',
  'using',
  'import',
  'export',
  'require',
  'describe',
  'it',
  'test',
]);

/** The name a statement's first line declares, or null. */
export function declaredName(line: string): string | null {
  for (const re of NAME_PATTERNS) {
    const m = re.exec(line);
    if (m && !NOT_NAMES.has(m[1])) return m[1].replace(/\s+/g, ' ').trim();
  }
  return null;
}

interface LineFacts {
  /** Brace depth at the start of the line. */
  depth: number;
  /** Nothing but a comment or blank (or the line is inside a block comment). */
  quiet: boolean;
  blank: boolean;
  /** Last significant character of the code on the line ('' when none). */
  last: string;
  /** First significant character of the code on the line. */
  first: string;
}

/**
 * Whether a UTF-16 code unit is white space as String.prototype.trim sees it (ECMAScript
 * WhiteSpace and LineTerminator: tab to carriage return, space, no-break space, U+1680,
 * U+2000–U+200A, U+2028, U+2029, U+202F, U+205F, U+3000 and the byte order mark).
 */
function isTrimSpace(u: number): boolean {
  if (u <= 32) return u === 32 || (u >= 9 && u <= 13);
  if (u < 160) return false;
  return (
    u === 160 ||
    u === 0x1680 ||
    (u >= 0x2000 && u <= 0x200a) ||
    u === 0x2028 ||
    u === 0x2029 ||
    u === 0x202f ||
    u === 0x205f ||
    u === 0x3000 ||
    u === 0xfeff
  );
}

/**
 * Brace depth and comment facts of every line of a brace language. The line's code (strings
 * reduced to their two quotes, comments left out) is never laid out as a string: only its first
 * and last characters other than white space are kept, which is all the facts need.
 */
function braceFacts(lines: readonly string[], lang: CodeLanguage): LineFacts[] {
  const out: LineFacts[] = [];
  const templates = lang === 'ts' || lang === 'go';
  let depth = 0;
  let inBlock = false;
  let inTemplate = false; // a backtick string (JS/TS template, Go raw string) spanning lines
  for (const line of lines) {
    const start = depth;
    // The first and last code units of the code other than white space (-1: none yet).
    let first = -1;
    let last = -1;
    for (let i = 0; i < line.length; i++) {
      let u = line.charCodeAt(i);
      if (inBlock) {
        if (u === 42 /* * */ && line.charCodeAt(i + 1) === 47 /* / */) {
          inBlock = false;
          i++;
        }
        continue;
      }
      if (inTemplate) {
        if (u === 92 /* \ */) i++;
        else if (u === 96 /* ` */) inTemplate = false;
        continue;
      }
      if (u === 47 /* / */) {
        const next = line.charCodeAt(i + 1);
        if (next === 47) break;
        if (next === 42 /* * */) {
          inBlock = true;
          i++;
          continue;
        }
      } else if (u === 96 && templates) {
        inTemplate = true;
      } else if (u === 34 /* " */ || (u === 39 /* ' */ && (lang !== 'rust' || /^'(\\.|[^\\'])'/.test(line.slice(i))))) {
        // A string stands for its two quotes.
        let j = i + 1;
        while (j < line.length && line.charCodeAt(j) !== u) j += line.charCodeAt(j) === 92 ? 2 : 1;
        i = j;
      } else if (u === 123 /* { */) depth++;
      else if (u === 125 /* } */) depth = Math.max(0, depth - 1);
      else if (isTrimSpace(u)) u = -1;
      if (u < 0) continue;
      if (first < 0) first = u;
      last = u;
    }
    let blank = true;
    for (let i = 0; i < line.length && blank; i++) blank = isTrimSpace(line.charCodeAt(i));
    out.push({
      depth: start,
      quiet: first < 0,
      blank,
      last: last < 0 ? '' : String.fromCharCode(last),
      first: first < 0 ? '' : String.fromCharCode(first),
    });
  }
  return out;
}

const isAttribute = (line: string, lang: CodeLanguage): boolean =>
  /^\s*(@[A-Za-z]|#!?\[)/.test(line) || (lang === 'csharp' && /^\s*\[.*\]\s*$/.test(line));

function braceUnits(lines: readonly string[], lang: CodeLanguage): Unit[] {
  const facts = braceFacts(lines, lang);
  const units: Unit[] = [];
  // Open blocks whose members are sections: depth at which members sit → owner name.
  const owners: { depth: number; name: string; from: number }[] = [{ depth: 0, name: '', from: 0 }];
  let prevEnded = true;
  let lead = -1; // first line of comments/attributes waiting for their statement
  for (let i = 0; i < lines.length; i++) {
    const f = facts[i];
    while (owners.length > 1 && i >= owners.at(-1)!.from && f.depth < owners.at(-1)!.depth) owners.pop();
    const owner = owners.at(-1)!;
    if (f.depth !== owner.depth) {
      // Inside a body, or an opening brace on a line of its own: what counts is how it ends.
      if (!f.quiet) prevEnded = f.last === ';' || f.last === '}' || f.last === '{';
      continue;
    }
    if (f.blank) {
      lead = -1;
      prevEnded = true;
      continue;
    }
    if (f.quiet || isAttribute(lines[i], lang)) {
      if (lead < 0 && prevEnded) lead = i;
      if (!f.quiet) prevEnded = true;
      continue;
    }
    const continues =
      !prevEnded || /^[)\]}.,+\-*/&|?:=]/.test(f.first) || (lang !== 'python' && /^(?:else|catch|finally|where)\b/.test(lines[i].trim()));
    if (!continues) {
      const name = /^\s*(?:import|export\s+\*|export\s+\{|using|package|use|#\s*include|#\s*(?:if|ifdef|ifndef|endif|else|pragma))\b/.test(
        lines[i],
      )
        ? null
        : declaredName(lines[i]);
      units.push({ start: lead >= 0 ? lead : i, head: i, name, owner: owner.name });
      // A container's members (one level deeper) are sections too; three levels at most.
      if (owners.length <= 3 && CONTAINER.test(lines[i]) && name) {
        const opens = lines.slice(i, i + 4).findIndex((_, j) => facts[i + j + 1]?.depth > f.depth);
        if (opens >= 0) owners.push({ depth: f.depth + 1, name: owner.name ? `${owner.name}.${name}` : name, from: i + opens + 1 });
      }
    }
    lead = -1;
    prevEnded = f.last === ';' || f.last === '}' || f.last === '{' || (f.last === ',' && owner.depth > 0 && lang !== 'ts');
    // Go, Rust and TypeScript end statements without ';' too: a line back at the member depth ends one.
    if (!prevEnded && (lang === 'go' || lang === 'ts') && facts[i + 1]?.depth === owner.depth && /[\w)\]"'`]$/.test(f.last))
      prevEnded = true;
  }
  return units;
}

function pythonUnits(lines: readonly string[]): Unit[] {
  const units: Unit[] = [];
  let quote: string | null = null;
  let classIndent = -1;
  let className = '';
  let memberIndent = -1;
  let lead = -1;
  let openParens = 0;
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i];
    const wasInString = quote !== null;
    // Track triple-quoted strings (count the delimiters on the line).
    for (const m of line.matchAll(/"""|'''/g)) {
      if (quote === null) quote = m[0];
      else if (quote === m[0]) quote = null;
    }
    if (wasInString) continue;
    const trimmed = line.trim();
    if (!trimmed) {
      lead = -1;
      continue;
    }
    const indent = line.length - line.trimStart().length;
    const atStart = openParens === 0;
    openParens = Math.max(0, openParens + (line.match(/[([{]/g)?.length ?? 0) - (line.match(/[)\]}]/g)?.length ?? 0));
    if (!atStart) continue;
    if (classIndent >= 0 && indent <= classIndent) classIndent = -1;
    if (classIndent >= 0 && memberIndent < 0) memberIndent = indent;
    const member = classIndent >= 0 && indent === memberIndent;
    if (indent !== 0 && !member) continue;
    if (trimmed.startsWith('#') || trimmed.startsWith('@')) {
      if (lead < 0) lead = i;
      continue;
    }
    const def = /^(?:async\s+)?(def|class)\s+([A-Za-z_]\w*)/.exec(trimmed);
    if (member && !def) {
      lead = -1;
      continue;
    }
    const named = def ? def[2] : (/^([A-Za-z_]\w*)\s*(?::[^=]*)?=(?!=)/.exec(trimmed)?.[1] ?? null);
    units.push({
      start: lead >= 0 ? lead : i,
      head: i,
      name: /^(import|from)\s/.test(trimmed) ? null : named,
      owner: member ? className : '',
    });
    lead = -1;
    if (def?.[1] === 'class' && indent === 0) {
      classIndent = 0;
      className = def[2];
      memberIndent = -1;
    }
  }
  return units;
}

/** Sections at the top-level declarations of a source file, or null when none is found. */
export function codeSections(lines: readonly string[], lang: CodeLanguage): Section[] | null {
  const units = lang === 'python' ? pythonUnits(lines) : braceUnits(lines, lang);
  if (!units.some((u) => u.name)) return null;
  const out: { start: number; title: string; named: boolean; quiet?: boolean }[] = [];
  if (units[0].start > 0 && lines.slice(0, units[0].start).some((l) => l.trim()))
    out.push({ start: 0, title: firstLine(lines, 0), named: false, quiet: true });
  for (const u of units) {
    const prev = out.at(-1);
    // Statements that declare nothing join the run before them when it declares nothing either
    // (a leading comment block takes the title of the first statement after it).
    if (!u.name && prev && !prev.named) {
      if (prev.quiet) out[out.length - 1] = { start: prev.start, title: firstLine(lines, u.head), named: false };
      continue;
    }
    // Members that declare nothing by this rule (Java's and C#'s typed fields) right after their
    // container's header join it: a class's fields belong to the class, not to a run of their own.
    if (!u.name && u.owner && prev?.named && prev.title === u.owner) continue;
    out.push({
      start: u.start,
      title: u.name ? (u.owner ? `${u.owner}.${u.name}` : u.name) : firstLine(lines, u.head),
      named: u.name !== null,
    });
  }
  return out.map((s, i) => ({ start: s.start, end: out[i + 1]?.start ?? lines.length, title: s.title }));
}

function firstLine(lines: readonly string[], from: number): string {
  const l = lines.slice(from).find((x) => x.trim()) ?? '';
  const t = l.trim().replace(/\s+/g, ' ');
  return t.length > 60 ? `${t.slice(0, 57)}…` : t;
}
