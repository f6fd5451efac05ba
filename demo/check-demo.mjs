#!/usr/bin/env node
// Structural check of the demo workspace against demo/expectations.json.
// Plain Node, no dependencies. Run from anywhere: `node demo/check-demo.mjs`.
// It checks what can be checked without the search engine: file counts, paths, topic sizes,
// absent query words, bridge co-occurrences, exact and near copies, paraphrase overlap and file
// lengths. Query ranking and neighbours need the real engine and are not checked here.

import { readFileSync, readdirSync, statSync, existsSync } from "node:fs";
import { join, relative, sep, dirname } from "node:path";
import { fileURLToPath } from "node:url";

const here = dirname(fileURLToPath(import.meta.url));
const root = join(here, "workspace");
const expectations = JSON.parse(readFileSync(join(here, "expectations.json"), "utf8"));

const failures = [];
const fail = (msg) => failures.push(msg);
const fmt = (x) => x.toFixed(3);

// ---------- files ----------
function walk(dir) {
  const out = [];
  for (const name of readdirSync(dir)) {
    const full = join(dir, name);
    if (statSync(full).isDirectory()) out.push(...walk(full));
    else out.push(relative(root, full).split(sep).join("/"));
  }
  return out;
}
const files = walk(root).sort();
const fileSet = new Set(files);
const read = (p) => readFileSync(join(root, p), "utf8");

console.log(`Files in workspace: ${files.length}`);
const { min, max } = expectations.fileCount ?? { min: 100, max: 160 };
if (files.length < min || files.length > max) fail(`file count ${files.length} outside ${min}-${max}`);

// ---------- every path mentioned exists ----------
const mentioned = new Set();
for (const t of expectations.topics) t.files.forEach((f) => mentioned.add(f));
for (const f of expectations.unassigned ?? []) mentioned.add(f);
for (const g of [...expectations.exactCopies, ...expectations.nearCopies, ...expectations.paraphrases]) g.forEach((f) => mentioned.add(f));
for (const q of expectations.queries) q.expectTop3.forEach((f) => mentioned.add(f));
for (const n of expectations.neighbours) [n.file, ...n.expectAmongTop5].forEach((f) => mentioned.add(f));
if (expectations.editScenario) mentioned.add(expectations.editScenario.file);
const missing = [...mentioned].filter((p) => !fileSet.has(p));
console.log(`Paths in expectations: ${mentioned.size}, missing: ${missing.length}`);
missing.forEach((p) => fail(`path in expectations does not exist: ${p}`));

// ---------- topics ----------
console.log("\nTopics:");
const topicOf = new Map();
const nTopics = expectations.topics.length;
if (nTopics < 5 || nTopics > 7) fail(`expected 5-7 topics, found ${nTopics}`);
for (const t of expectations.topics) {
  const md = t.files.filter((f) => f.endsWith(".md")).length;
  const ts = t.files.filter((f) => f.endsWith(".ts")).length;
  console.log(`  ${t.name.padEnd(26)} ${String(t.files.length).padStart(3)} files (${md} md, ${ts} ts, ${t.files.length - md - ts} other)`);
  if (t.files.length < 12) fail(`topic "${t.name}" has only ${t.files.length} files`);
  if (md === 0 || ts === 0) fail(`topic "${t.name}" does not mix notes and code`);
  for (const f of t.files) {
    if (topicOf.has(f)) fail(`${f} is in two topics: ${topicOf.get(f)} and ${t.name}`);
    topicOf.set(f, t.name);
  }
}
const accounted = new Set([...topicOf.keys(), ...(expectations.unassigned ?? [])]);
const unlisted = files.filter((f) => !accounted.has(f));
console.log(`  unassigned: ${(expectations.unassigned ?? []).length}; not listed anywhere: ${unlisted.length}`);
unlisted.forEach((f) => fail(`file neither in a topic nor in "unassigned": ${f}`));

// ---------- tokenising ----------
// Split camelCase and non-letters, lower-case. Matches what a reader would call "the words".
function tokens(text) {
  return text
    .replace(/([a-z0-9])([A-Z])/g, "$1 $2")
    .replace(/([A-Z]+)([A-Z][a-z])/g, "$1 $2")
    .toLowerCase()
    .split(/[^a-z0-9]+/)
    .filter(Boolean);
}
const lowerText = (p) => tokens(read(p)).join(" ");
const hasPhrase = (joined, phrase) => (" " + joined).includes(" " + tokens(phrase).join(" "));

// ---------- absent words and bridges ----------
console.log("\nQueries (absent words in expected files; bridge files elsewhere):");
for (const q of expectations.queries) {
  console.log(`  "${q.text}"`);
  for (const f of q.expectTop3) {
    if (!fileSet.has(f)) continue;
    const toks = tokens(read(f));
    for (const w of q.absentWords) {
      const stem = w.toLowerCase();
      const hits = [...new Set(toks.filter((t) => t.startsWith(stem)))];
      if (hits.length > 0) fail(`query "${q.text}": expected file ${f} contains "${w}" as ${hits.join(", ")}`);
    }
    console.log(`    absent ${JSON.stringify(q.absentWords)} from ${f}: ${q.absentWords.every((w) => !toks.some((t) => t.startsWith(w.toLowerCase()))) ? "yes" : "NO"}`);
  }
  for (const [word, synonyms] of Object.entries(q.bridges ?? {})) {
    const bridging = files.filter((f) => {
      if (q.expectTop3.includes(f)) return false;
      const joined = lowerText(f);
      const hasWord = joined.split(" ").some((t) => t.startsWith(word));
      return hasWord && synonyms.some((s) => hasPhrase(joined, s));
    });
    console.log(`    bridge "${word}" + ${JSON.stringify(synonyms)}: ${bridging.length} files`);
    if (bridging.length < 3) fail(`query "${q.text}": only ${bridging.length} files bridge "${word}" to its synonyms`);
  }
}

// ---------- exact copies ----------
console.log("\nExact copies:");
for (const group of expectations.exactCopies) {
  const [first, ...rest] = group.map((p) => readFileSync(join(root, p)));
  const same = rest.every((b) => b.equals(first));
  console.log(`  ${same ? "identical" : "DIFFER   "} ${group.join("  ==  ")}`);
  if (!same) fail(`exact copies differ: ${group.join(", ")}`);
}

// ---------- near copies ----------
function lineSet(p) {
  return new Set(read(p).split(/\r?\n/).map((l) => l.trim()).filter(Boolean));
}
function jaccard(a, b) {
  let inter = 0;
  for (const x of a) if (b.has(x)) inter++;
  const union = a.size + b.size - inter;
  return union === 0 ? 1 : inter / union;
}
// Shingles use plain lower-cased word runs (no camelCase splitting), as near-copy detectors do.
function shingles(p, n = 5) {
  const t = read(p).toLowerCase().match(/[\p{L}\p{N}_]+/gu) ?? [];
  const s = new Set();
  for (let i = 0; i + n <= t.length; i++) s.add(t.slice(i, i + n).join(" "));
  return s;
}
console.log("\nNear copies (line Jaccard / word 5-gram Jaccard):");
for (const group of expectations.nearCopies) {
  for (let i = 0; i < group.length; i++) {
    for (let j = i + 1; j < group.length; j++) {
      const [a, b] = [group[i], group[j]];
      if (!fileSet.has(a) || !fileSet.has(b)) continue;
      const identical = read(a) === read(b);
      const lj = jaccard(lineSet(a), lineSet(b));
      const sj = jaccard(shingles(a), shingles(b));
      console.log(`  ${fmt(lj)} / ${fmt(sj)}  ${a}  ~  ${b}`);
      if (identical) fail(`near copies are identical: ${a}, ${b}`);
      if (lj < 0.5) fail(`near copies share too few lines (line Jaccard ${fmt(lj)}): ${a}, ${b}`);
    }
  }
}
const groupsOf3 = expectations.nearCopies.filter((g) => g.length >= 3).length;
if (expectations.nearCopies.length < 4) fail("fewer than 4 near-copy groups");
if (groupsOf3 < 1) fail("no near-copy group of 3 or more");
if (expectations.exactCopies.length < 2) fail("fewer than 2 exact-copy pairs");

// ---------- paraphrases ----------
const STOP = new Set("a an and are as at be but by can do for from has have if in is it its may more most no not of on or our so than that the their them then there they this to up us we what when which who will with you your".split(" "));
function contentWords(p) {
  return new Set(tokens(read(p)).filter((t) => t.length > 2 && !STOP.has(t)));
}
console.log("\nParaphrases (word 5-gram Jaccard must be < 0.2; content-word Jaccard shown for reference):");
for (const [a, b] of expectations.paraphrases) {
  if (!fileSet.has(a) || !fileSet.has(b)) continue;
  const sj = jaccard(shingles(a), shingles(b));
  const cj = jaccard(contentWords(a), contentWords(b));
  console.log(`  ${fmt(sj)} (content ${fmt(cj)})  ${a}  ~  ${b}`);
  if (sj >= 0.2) fail(`paraphrase pair overlaps too much literally (5-gram Jaccard ${fmt(sj)}): ${a}, ${b}`);
}
if (expectations.paraphrases.length < 2) fail("fewer than 2 paraphrase pairs");

// ---------- lengths ----------
console.log("\nLengths (notes 150-800 words, code 40-250 lines):");
let notes = 0;
let code = 0;
for (const f of files) {
  const text = read(f);
  if (f.startsWith("notes/") && f.endsWith(".md")) {
    notes++;
    const words = text.split(/\s+/).filter(Boolean).length;
    if (words < 150 || words > 800) fail(`${f}: ${words} words`);
  } else if (f.endsWith(".ts")) {
    code++;
    const lines = text.split("\n").length;
    if (lines < 40 || lines > 250) fail(`${f}: ${lines} lines`);
  }
}
console.log(`  ${notes} notes, ${code} TypeScript files, ${files.length - notes - code} other`);

// ---------- edit scenario ----------
if (expectations.editScenario) {
  const e = expectations.editScenario;
  const queryWords = tokens(e.query).filter((t) => t.length > 3 && !STOP.has(t));
  const before = files.filter((f) => queryWords.filter((w) => lowerText(f).split(" ").includes(w)).length >= 2);
  console.log(`\nEdit scenario: append to ${e.file}; files already holding 2+ of the query's words: ${before.length}`);
  if (before.includes(e.file)) fail(`edit scenario: ${e.file} already matches the query before the edit`);
}

// ---------- result ----------
console.log("");
if (failures.length > 0) {
  console.log(`FAIL (${failures.length})`);
  for (const f of failures) console.log(`  - ${f}`);
  process.exit(1);
}
console.log("PASS");
