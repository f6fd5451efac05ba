/**
 * Mutation test of the saved index (serialize.ts, indexFileCheck.ts): a real index file, built
 * from 300 abstracts of the CRAN collection (test/fixtures/corpora/cran, public test collection)
 * with a few edits folded in and one file removed, is damaged 12,000 times at random (seeded):
 * bit flips, zeroed runs, truncation, extension (bytes appended or inserted), and swaps of bytes
 * or words, spread evenly over every region of the file (preamble, JSON header, padding, and each
 * of the 17 payload sections). Each damaged file must either be rejected with CorruptIndexError
 * (and so be rebuilt) or give answers identical to the undamaged file's: zero silent
 * differences, zero crashes (any other exception, at load or while answering).
 * A second part recomputes both checksums after damaging the header's JSON or the payload (a
 * writer with a bug, or a forged file), which the checksums cannot see: then only the structural
 * checks stand between the file and a crash, and the assertion is zero crashes and no
 * non-finite or out-of-range score.
 */
import { describe, expect, it } from 'vitest';
import { CorruptIndexError } from '../../../../src/core/errors.js';
import { IndexBuilder } from '../../../../src/core/index/model/indexBuilder.js';
import type { LsiIndex } from '../../../../src/core/index/lsiIndex.js';
import {
  decodeIndex,
  encodeIndex,
  INDEX_PREAMBLE_BYTES,
  payloadOf,
  readIndexHeader,
  sealIndexFile,
} from '../../../../src/core/index/persistence/serialize.js';
import { createRandom } from '../../../../src/core/random.js';
import { loadCollection } from '../../../helpers/shared.js';

const cran = loadCollection('cran');

const MUTATIONS = 12_000;
const FORGED = 1_200;
const SEED = 90_210;

function buildIndex(): LsiIndex {
  const b = new IndexBuilder();
  for (const d of cran.docs.slice(0, 300))
    b.addText({ path: `cran/${d.id}.txt`, size: d.text.length, mtimeMs: 1_700_000_000_000 + Number(d.id) }, d.text);
  const index = b.build();
  for (const d of cran.docs.slice(300, 305)) index.foldIn({ path: `later/${d.id}.md`, size: d.text.length, mtimeMs: 5 }, d.text);
  index.remove('cran/7.txt');
  return index;
}

/** What a user can get from the index: a few searches, a few nearby lists, the file list and the settings. */
function answers(index: LsiIndex): string {
  const queries = cran.queries.slice(0, 3).map((q) => {
    try {
      return index.search(q.text, { top: 10 });
    } catch (err) {
      if (err instanceof CorruptIndexError || (err as Error).name === 'NoKnownTermsError') return (err as Error).name;
      throw err;
    }
  });
  const near = ['cran/1.txt', 'cran/150.txt', 'later/302.md'].map((p) => (index.has(p) ? index.nearby(p, { top: 5 }) : 'absent'));
  return JSON.stringify({
    queries,
    near,
    paths: index.paths(),
    k: index.k,
    settings: index.settings,
    staleness: index.staleness(),
    vocab: index.vocab.size,
  });
}

interface Region {
  readonly name: string;
  readonly from: number;
  readonly to: number;
}

function regionsOf(bytes: Uint8Array): Region[] {
  const header = readIndexHeader(bytes);
  const start = payloadOf(bytes).byteOffset - bytes.byteOffset;
  const len = new DataView(bytes.buffer, bytes.byteOffset).getUint32(8, true);
  const regions: Region[] = [
    { name: 'magic', from: 0, to: 8 },
    { name: 'header length', from: 8, to: 12 },
    { name: 'header checksum', from: 12, to: INDEX_PREAMBLE_BYTES },
    { name: 'header JSON', from: INDEX_PREAMBLE_BYTES, to: INDEX_PREAMBLE_BYTES + len },
  ];
  if (start > INDEX_PREAMBLE_BYTES + len) regions.push({ name: 'header padding', from: INDEX_PREAMBLE_BYTES + len, to: start });
  header.sections.forEach((s, i) => {
    const end = i + 1 < header.sections.length ? header.sections[i + 1].offset : header.payloadBytes;
    if (end > s.offset) regions.push({ name: `section ${s.name}`, from: start + s.offset, to: start + end });
  });
  return regions;
}

type Kind = 'flip' | 'zero' | 'truncate' | 'extend' | 'swap';
const KINDS: Kind[] = ['flip', 'zero', 'truncate', 'extend', 'swap'];

describe('saved index under random damage', () => {
  it(`detects or is unaffected by each of ${MUTATIONS} seeded mutations in every region (zero silent differences, zero crashes)`, () => {
    const original = encodeIndex(buildIndex(), new Date('2026-12-02T00:00:00Z'));
    const reference = answers(decodeIndex(original.slice()));
    const regions = regionsOf(original);
    expect(regions.length).toBeGreaterThanOrEqual(20);
    const random = createRandom(SEED);
    const int = (n: number): number => Math.floor(random.next() * n);
    const work = original.slice();
    const tally = { detected: 0, identical: 0, unchangedBytes: 0, silent: 0, crashed: 0 };
    const perRegion = new Map<string, number>();
    const problems: string[] = [];

    for (let m = 0; m < MUTATIONS; m++) {
      const region = regions[m % regions.length];
      const kind = KINDS[Math.floor(m / regions.length) % KINDS.length];
      const at = region.from + int(region.to - region.from);
      let damaged: Uint8Array = work;
      const saved: [number, number][] = [];
      const set = (i: number, v: number): void => {
        saved.push([i, work[i]]);
        work[i] = v;
      };
      if (kind === 'flip') {
        for (let b = 1 + int(3); b > 0; b--) {
          const i = region.from + int(region.to - region.from);
          set(i, work[i] ^ (1 << int(8)));
        }
      } else if (kind === 'zero') {
        const run = 1 + int(16);
        for (let i = at; i < Math.min(at + run, work.length); i++) set(i, 0);
      } else if (kind === 'swap') {
        const width = [1, 4, 8][int(3)];
        const other = int(2) === 0 ? region.from + int(region.to - region.from) : int(work.length);
        const a = Math.min(at, work.length - width);
        const b = Math.min(other, work.length - width);
        const tmp = work.slice(a, a + width);
        const tmpB = work.slice(b, b + width);
        for (let i = 0; i < width; i++) set(b + i, tmp[i]);
        for (let i = 0; i < width; i++) set(a + i, tmpB[i]);
      } else if (kind === 'truncate') {
        damaged = work.subarray(0, at);
      } else {
        const extra = new Uint8Array(1 + int(64)).map(() => int(256));
        if (int(2) === 0) {
          damaged = new Uint8Array(work.length + extra.length);
          damaged.set(work);
          damaged.set(extra, work.length);
        } else {
          damaged = new Uint8Array(work.length + extra.length);
          damaged.set(work.subarray(0, at));
          damaged.set(extra, at);
          damaged.set(work.subarray(at), at + extra.length);
        }
      }
      perRegion.set(region.name, (perRegion.get(region.name) ?? 0) + 1);
      const sameBytes = damaged.length === original.length && saved.every(([i]) => work[i] === original[i]);
      try {
        const index = decodeIndex(damaged);
        const got = answers(index);
        if (got === reference) {
          tally.identical++;
          if (sameBytes) tally.unchangedBytes++;
        } else {
          tally.silent++;
          problems.push(`silent difference: ${kind} in ${region.name} at ${at}`);
        }
      } catch (err) {
        if (err instanceof CorruptIndexError) tally.detected++;
        else {
          tally.crashed++;
          problems.push(`crash: ${kind} in ${region.name} at ${at}: ${(err as Error).stack}`);
        }
      }
      for (let i = saved.length - 1; i >= 0; i--) work[saved[i][0]] = saved[i][1];
    }

    console.log(`index mutation test (${original.length} bytes, ${regions.length} regions, seed ${SEED}):`, JSON.stringify(tally));
    expect(problems.slice(0, 5)).toEqual([]);
    expect(tally.silent).toBe(0);
    expect(tally.crashed).toBe(0);
    expect(tally.detected + tally.identical).toBe(MUTATIONS);
    // Every damaged byte is covered by a checksum: only mutations that left the bytes as they were go undetected.
    expect(tally.identical).toBe(tally.unchangedBytes);
    for (const r of regions) expect(perRegion.get(r.name)).toBeGreaterThanOrEqual(Math.floor(MUTATIONS / regions.length));
  });

  it(`never crashes on ${FORGED} damaged files whose checksums were recomputed (header JSON and payload)`, () => {
    const original = encodeIndex(buildIndex(), new Date('2026-12-02T00:00:00Z'));
    const header = readIndexHeader(original);
    const json = new TextEncoder().encode(JSON.stringify(header));
    const payload = payloadOf(original);
    const random = createRandom(SEED + 1);
    const int = (n: number): number => Math.floor(random.next() * n);
    const tally = { rejected: 0, accepted: 0, crashed: 0, badScores: 0 };
    const problems: string[] = [];
    for (let m = 0; m < FORGED; m++) {
      let file: Uint8Array;
      let where: string;
      if (m % 2 === 0) {
        // Header JSON: change one byte to a character that keeps JSON plausible.
        const text = json.slice();
        const at = int(text.length);
        text[at] = '0123456789-.e"{}[],:truefalsnk'.charCodeAt(int(31));
        where = `header byte ${at}`;
        let parsed: unknown;
        try {
          parsed = JSON.parse(new TextDecoder().decode(text));
        } catch {
          tally.rejected++;
          continue;
        }
        try {
          file = sealIndexFile(parsed as ReturnType<typeof readIndexHeader>, payload);
        } catch {
          tally.rejected++; // not even an object that can be written as a header
          continue;
        }
      } else {
        const p = payload.slice();
        const at = int(p.length);
        p[at] ^= 1 << int(8);
        if (int(2) === 0) p[int(p.length)] = 0xff;
        where = `payload byte ${at}`;
        file = sealIndexFile(header, p);
      }
      try {
        const index = decodeIndex(file);
        tally.accepted++;
        const hits = [...index.search(cran.queries[0].text, { top: 10 }), ...index.nearby(index.paths()[0], { top: 5 })];
        if (hits.some((h) => !Number.isFinite(h.score) || Math.abs(h.score) > 1 + 1e-3)) {
          tally.badScores++;
          problems.push(`score out of range after ${where}`);
        }
      } catch (err) {
        if (err instanceof CorruptIndexError || (err as Error).name === 'NoKnownTermsError') tally.rejected++;
        else {
          tally.crashed++;
          problems.push(`crash after ${where}: ${(err as Error).stack}`);
        }
      }
    }
    console.log(`forged-file test (seed ${SEED + 1}):`, JSON.stringify(tally));
    expect(problems.slice(0, 5)).toEqual([]);
    expect(tally.crashed + tally.badScores).toBe(0);
    expect(tally.rejected).toBeGreaterThan(FORGED / 2);
  });
});
