/**
 * CPU time of the parts of the sections stage on one thread, for profiling the build (not a
 * user-facing benchmark): counting a folder's files as a tokenizing thread does, with and without
 * their sections (threadSections.ts), and folding all sections into a saved index's model.
 *   npx esbuild bench/sectionParts.ts --bundle --platform=node --outfile=dist/sectionParts.js
 *   node dist/sectionParts.js <folder> <index file>
 */
import { readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { foldCountedSections, type CountedSections } from '../src/core/sections/sectionVectors.js';
import { serialExecutor } from '../src/core/matrix/executor.js';
import { loadIndex } from '../src/node/persist.js';
import { FileReader } from '../src/node/parallel/readTextSync.js';
import { WordCounter } from '../src/node/parallel/wordCounter.js';
import { countThreadSections } from '../src/node/parallel/threadSections.js';
import { SectionCounter } from '../src/node/parallel/sectionCounter.js';
import { splitSections, splitLines } from '../src/core/sections/splitSections.js';
import { decodeUtf8 } from '../src/node/scanRead.js';
import { DEFAULT_TOKENIZE_OPTIONS } from '../src/core/text/tokenize.js';

const [folder, indexFile] = process.argv.slice(2);
const files: string[] = [];
const walk = (d: string): void => {
  for (const e of readdirSync(d, { withFileTypes: true })) {
    const p = join(d, e.name);
    if (e.isDirectory()) walk(p);
    else if (e.isFile() && statSync(p).size < 1 << 20) files.push(p);
  }
};
walk(folder);
const cpu = (): number => process.cpuUsage().user / 1e6;
const reader = new FileReader();

function countAll(withSections: boolean, splitOnly = false): number {
  const wc = new WordCounter(DEFAULT_TOKENIZE_OPTIONS);
  wc.recordWords = withSections && process.env.NOTE !== '0';
  const t = cpu();
  let sections = 0;
  for (const p of files) {
    const got = reader.read(p, 1 << 20);
    if (got.kind !== 'bytes') continue;
    const text = got.ascii ? undefined : decodeUtf8(got.bytes);
    const packed = text === undefined ? wc.packAscii(got.bytes, p) : wc.packText(text, p);
    const key = relative(folder, p);
    if (splitOnly) sections += splitSections(key, text ?? got.bytes.toString('latin1')).sections.length;
    else if (withSections && packed.language === undefined)
      sections += countThreadSections(wc, key, text ?? got.bytes.toString('latin1')).starts.length;
    wc.drainPack();
    wc.drainSectionPack();
  }
  const s = cpu() - t;
  console.log(
    `count files${withSections ? ' + sections' : splitOnly ? ' + split only' : ''}: ${s.toFixed(2)} s CPU (${sections} sections)`,
  );
  return s;
}
for (let r = 0; r < 2; r++) {
  countAll(false);
  countAll(false, true);
  countAll(true);
}

const got = await loadIndex(indexFile);
if (got.status !== 'ok') throw new Error('no index');
const index = got.index;
const counter = new SectionCounter(index.vocab, index.settings.tokenize);
const counted: CountedSections[] = [];
let nnz = 0;
for (const p of files) {
  const g = reader.read(p, 1 << 20);
  if (g.kind !== 'bytes') continue;
  const text = g.ascii ? g.bytes.toString('latin1') : decodeUtf8(g.bytes);
  const key = relative(folder, p);
  const cut = splitSections(key, text).sections;
  const lines = splitLines(text);
  const terms = cut.map((s) => counter.count(lines.slice(s.start, s.end).join('\n')));
  const offsets = new Int32Array(cut.length + 1);
  terms.forEach((x, i) => (offsets[i + 1] = offsets[i] + x.termIds.length));
  const termIds = new Int32Array(offsets[cut.length]);
  const counts = new Float32Array(offsets[cut.length]);
  terms.forEach((x, i) => (termIds.set(x.termIds, offsets[i]), counts.set(x.counts, offsets[i])));
  nnz += termIds.length;
  counted.push({
    starts: Int32Array.from(cut, (s) => s.start),
    ends: Int32Array.from(cut, (s) => s.end),
    titles: cut.map((s) => s.title),
    offsets,
    termIds,
    counts,
  });
}
console.log(`section term entries: ${nnz}, k=${index.k}, model columns ${index.model.weights.length}`);
for (let r = 0; r < 3; r++) {
  for (const [name, executor] of [
    ['serial', serialExecutor],
    ['wasm', undefined],
  ] as const) {
    const t = cpu();
    foldCountedSections(index.model, counted, { executor });
    console.log(`fold (${name}): ${(cpu() - t).toFixed(2)} s CPU`);
  }
}
