/**
 * CPU time of a tokenizing thread's counting, in process on one thread (issue 13: counting was
 * the largest share of the Documentation folder's build): scans a folder, then reads and counts
 * every file and its sections as a thread of a build from scratch does (parallelWorker.ts,
 * keepCounts with sections), and prints the CPU seconds per pass and a digest of everything
 * counted (terms in id order, each file's ids, counts, length and language, the section packs),
 * so a change that should leave the counts alone can show it did. Usage:
 *   npx esbuild bench/countCpu.ts --bundle --platform=node --outfile=dist/countCpu.js
 *   node dist/countCpu.js <folder> [--runs N] [--no-sections] [--profile]
 */
import { createHash } from 'node:crypto';
import { loadavg } from 'node:os';
import { DEFAULT_INDEX_SETTINGS } from '../src/core/index/model/settings.js';
import { decodeUtf8 } from '../src/node/scanRead.js';
import { scanFolder } from '../src/node/scan.js';
import { translateRun } from '../src/node/parallel/parallelCount.js';
import { FileReader } from '../src/node/parallel/readTextSync.js';
import { countThreadSections } from '../src/node/parallel/threadSections.js';
import { WordCounter } from '../src/node/parallel/wordCounter.js';

const args = process.argv.slice(2);
const folder = args.find((a, i) => !a.startsWith('--') && args[i - 1] !== '--runs');
const runsAt = args.indexOf('--runs');
const runs = runsAt >= 0 ? Number(args[runsAt + 1]) : 3;
const sections = !args.includes('--no-sections');
if (!folder) {
  console.error('usage: countCpu.js <folder> [--runs N] [--no-sections]');
  process.exit(2);
}

async function main(): Promise<void> {
  const scan = await scanFolder(folder!, {});
  const files = scan.files.map((f) => ({ absPath: f.absPath, key: f.path }));
  console.log(
    `${files.length} files, load ${loadavg()
      .map((l) => l.toFixed(2))
      .join(' ')}`,
  );
  for (let r = 0; r < runs; r++) {
    const cpu0 = process.cpuUsage();
    const digest = createHash('sha256');
    const wc = new WordCounter(DEFAULT_INDEX_SETTINGS.tokenize);
    wc.recordWords = sections;
    const reader = new FileReader();
    const lengths: number[] = [];
    const fileRuns: number[] = [];
    const sectionRuns: number[] = [];
    let sectionCount = 0;
    for (const f of files) {
      const got = reader.read(f.absPath, 1 << 20);
      if (got.kind !== 'bytes') {
        lengths.push(-1);
        continue;
      }
      const text = got.ascii ? undefined : decodeUtf8(got.bytes);
      const packed = text === undefined ? wc.packAscii(got.bytes, f.absPath) : wc.packText(text, f.absPath);
      if (sections && packed.language === undefined) {
        const s = countThreadSections(wc, f.key, text ?? got.bytes.toString('latin1'));
        sectionCount += s.starts.length;
        for (let i = 0; i + 1 < s.offsets.length; i++) sectionRuns.push(s.offsets[i], s.offsets[i + 1]);
        digest.update(new Uint8Array(s.offsets.buffer, s.offsets.byteOffset, s.offsets.byteLength));
      }
      fileRuns.push(packed.at, packed.at + packed.terms);
      lengths.push(packed.at, packed.terms, packed.length);
      if (packed.language !== undefined) digest.update(packed.language);
    }
    const cpu = process.cpuUsage(cpu0);
    // Each file's and section's run with its ids in order (the thread's packs need not be).
    const terms = wc.takeNewTerms();
    const identity = Int32Array.from(terms, (_, i) => i);
    const pack = wc.drainPack();
    const sp = wc.drainSectionPack();
    const out = new Float32Array(Math.max(pack.ids.length, sp.ids.length));
    for (const [p, runs] of [
      [pack, fileRuns],
      [sp, sectionRuns],
    ] as const) {
      const ids = new Int32Array(p.ids.length);
      for (let r = 0; r < runs.length; r += 2) translateRun(p.ids, p.counts, runs[r], runs[r + 1], identity, ids, out);
      digest.update(new Uint8Array(ids.buffer));
      digest.update(new Uint8Array(out.buffer, 0, 4 * p.ids.length));
    }
    digest.update(new Uint8Array(Int32Array.from(lengths).buffer));
    digest.update(terms.join('\n'));
    console.log(
      `run ${r + 1}: CPU ${((cpu.user + cpu.system) / 1e6).toFixed(2)} s (user ${(cpu.user / 1e6).toFixed(2)}, sys ${(cpu.system / 1e6).toFixed(2)}), ` +
        `${sectionCount} sections, digest ${digest.digest('hex').slice(0, 16)}, load ${loadavg()[0].toFixed(2)}`,
    );
  }
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
