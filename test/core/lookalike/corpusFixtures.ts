/**
 * Test fixtures for the look-alike tests: random key sets with an exact Jaccard, real abstracts from test/fixtures/corpora and seeded
 * mutations of them (word swaps, deleted and inserted sentences, reordered paragraphs), plus an
 * independent brute-force shingle Jaccard written from the definition (string shingles, JS Sets
 * turned into sorted id lists), sharing no code with src/core/lookalike.
 */
import { createRandom, type RandomSource } from '../../../src/core/random.js';
import { loadCollection } from '../../helpers/shared.js';

export interface TextDoc {
  id: string;
  text: string;
}

/** Docs of a test/fixtures/corpora collection with one sentence per line. */
export function loadCorpusDocs(name: string): TextDoc[] {
  const c = loadCollection(name);
  return c.docs.map((d) => ({ id: `${name}/${d.id}`, text: splitSentences(d.text).join('\n') }));
}

export function splitSentences(text: string): string[] {
  return text
    .split(/(?<=[.?!;])\s+/)
    .map((s) => s.trim())
    .filter((s) => s.length > 0);
}

const pick = <T>(rng: RandomSource, xs: readonly T[]): T => xs[Math.floor(rng.next() * xs.length)];

/**
 * A mutated copy of `text` (sentences on lines): `ops` random edits, each one of
 * swap two neighbouring words (55 %), delete a sentence (15 %), insert a sentence taken from
 * `donors` (15 %), or cut the sentences into 2–3 paragraphs and reorder them (15 %).
 */
export function mutate(text: string, ops: number, donors: readonly string[], rng: RandomSource): string {
  let lines = text.split('\n').filter((l) => l.trim().length > 0);
  for (let o = 0; o < ops; o++) {
    const u = rng.next();
    if (u < 0.55 || lines.length < 2) {
      const l = Math.floor(rng.next() * lines.length);
      const words = lines[l].split(' ');
      if (words.length < 2) continue;
      const w = Math.floor(rng.next() * (words.length - 1));
      [words[w], words[w + 1]] = [words[w + 1], words[w]];
      lines[l] = words.join(' ');
    } else if (u < 0.7) {
      lines.splice(Math.floor(rng.next() * lines.length), 1);
    } else if (u < 0.85) {
      const donor = splitSentences(pick(rng, donors));
      lines.splice(Math.floor(rng.next() * (lines.length + 1)), 0, pick(rng, donor));
    } else {
      const parts = 2 + Math.floor(rng.next() * 2);
      const cut = Math.max(1, Math.floor(lines.length / parts));
      const paragraphs: string[][] = [];
      for (let i = 0; i < lines.length; i += cut) paragraphs.push(lines.slice(i, i + cut));
      for (let i = paragraphs.length - 1; i > 0; i--) {
        const j = Math.floor(rng.next() * (i + 1));
        [paragraphs[i], paragraphs[j]] = [paragraphs[j], paragraphs[i]];
      }
      lines = paragraphs.flat();
    }
  }
  return lines.join('\n');
}

/**
 * Base docs plus seeded look-alikes: `variants` mutated copies (1–5 edits each, some made from
 * earlier copies so chains form) and `copies` exact copies (half with CRLF line ends).
 */
export function buildMutatedCorpus(base: readonly TextDoc[], variants: number, copies: number, seed: number): TextDoc[] {
  const rng = createRandom(seed);
  const docs = base.map((d) => ({ ...d }));
  const donors = base.map((d) => d.text);
  for (let v = 0; v < variants; v++) {
    const source =
      rng.next() < 0.2 && docs.length > base.length
        ? docs[base.length + Math.floor(rng.next() * (docs.length - base.length))]
        : pick(rng, base);
    const ops = 1 + Math.floor(rng.next() * 5);
    docs.push({ id: `variant/${v}-of-${source.id}`, text: mutate(source.text, ops, donors, rng) });
  }
  for (let c = 0; c < copies; c++) {
    const source = pick(rng, docs);
    docs.push({ id: `copy/${c}-of-${source.id}`, text: c % 2 === 0 ? source.text : source.text.replace(/\n/g, '\r\n') });
  }
  return docs;
}

/** Shingles by the definition: lowercased runs of letters/marks/digits/_ , w-grams joined by a space. */
export function referenceShingles(text: string, w: number): Set<string> {
  const tokens = text.toLowerCase().match(/[\p{L}\p{M}\p{N}_]+/gu) ?? [];
  const out = new Set<string>();
  for (let i = 0; i + w <= tokens.length; i++) out.add(tokens.slice(i, i + w).join(' '));
  return out;
}

/** Every pair (i < j) with exact Jaccard ≥ threshold, by brute force over all pairs. */
export function bruteForcePairs(texts: readonly string[], w: number, threshold: number): Map<string, number> {
  const ids = new Map<string, number>();
  const sets = texts.map((t) => {
    const s = [...referenceShingles(t, w)].map((sh) => {
      let id = ids.get(sh);
      if (id === undefined) ids.set(sh, (id = ids.size));
      return id;
    });
    return Int32Array.from(s).sort();
  });
  const found = new Map<string, number>();
  for (let i = 0; i < sets.length; i++) {
    for (let j = i + 1; j < sets.length; j++) {
      const a = sets[i];
      const b = sets[j];
      if (a.length === 0 || b.length === 0) continue;
      // J ≤ min(|A|,|B|) / max(|A|,|B|): pairs failing this bound cannot reach the threshold.
      if (Math.min(a.length, b.length) < threshold * Math.max(a.length, b.length)) continue;
      let p = 0;
      let q = 0;
      let common = 0;
      while (p < a.length && q < b.length) {
        if (a[p] === b[q]) {
          common++;
          p++;
          q++;
        } else if (a[p] < b[q]) p++;
        else q++;
      }
      const jac = common / (a.length + b.length - common);
      if (jac >= threshold) found.set(`${i} ${j}`, jac);
    }
  }
  return found;
}

/** Two sets of distinct random 32-bit keys with |A ∪ B| = union and |A ∩ B| = common (exact Jaccard common/union). */
export function setPairWithJaccard(union: number, common: number, rng: RandomSource): [Uint32Array, Uint32Array] {
  const keys = new Set<number>();
  while (keys.size < union) keys.add(rng.nextUint32());
  const all = [...keys];
  const only = (union - common) / 2;
  const a = all.slice(0, common + only);
  const b = [...all.slice(0, common), ...all.slice(common + only)];
  return [Uint32Array.from(a).sort(), Uint32Array.from(b).sort()];
}
