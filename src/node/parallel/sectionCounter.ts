/**
 * Counts of section texts over a frozen vocabulary with the build's fast counter (wordCounter.ts):
 * the same DocTerms as countTerms(tokenize(text, options), vocab, false), i.e. ids ascending, a
 * word the vocabulary lacks dropped, and length the number of known tokens. Local ids of the
 * counter are translated to the vocabulary's once per new term (−1 for an unknown one).
 * test/node/parallel/sectionCounter.test.ts checks the equality.
 */
import type { DocTerms, Vocabulary } from '../../core/counting/termCounts.js';
import type { TokenizeOptions } from '../../core/text/tokenize.js';
import { WordCounter } from './wordCounter.js';

export class SectionCounter {
  private readonly counter: WordCounter;
  private toVocab = new Int32Array(1 << 12);
  private known = 0;
  /** Scratch: a section's count of each vocabulary id it holds. */
  private readonly countOf: Int32Array;

  constructor(
    private readonly vocab: Vocabulary,
    options: Partial<TokenizeOptions>,
  ) {
    this.counter = new WordCounter(options);
    this.countOf = new Int32Array(vocab.size);
  }

  /** countTerms(tokenize(text, options), vocab, false), faster. */
  count(text: string): DocTerms {
    const local = this.counter.count(text);
    this.learnNewTerms();
    const tr = this.toVocab;
    let n = 0;
    for (let i = 0; i < local.ids.length; i++) if (tr[local.ids[i]] >= 0) n++;
    const termIds = new Int32Array(n);
    n = 0;
    for (let i = 0; i < local.ids.length; i++) {
      const id = tr[local.ids[i]];
      if (id < 0) continue;
      termIds[n++] = id;
      this.countOf[id] = local.counts[i];
    }
    // Vocabulary ids ascending (the local order differs); ids are distinct, so counts follow by id.
    termIds.sort();
    const counts = new Float32Array(n);
    let length = 0;
    for (let i = 0; i < n; i++) {
      counts[i] = this.countOf[termIds[i]];
      length += counts[i];
    }
    return { termIds, counts, length };
  }

  private learnNewTerms(): void {
    const fresh = this.counter.takeNewTerms();
    if (fresh.length === 0) return;
    if (this.known + fresh.length > this.toVocab.length) {
      const next = new Int32Array(Math.max(this.toVocab.length * 2, this.known + fresh.length));
      next.set(this.toVocab.subarray(0, this.known));
      this.toVocab = next;
    }
    for (const t of fresh) this.toVocab[this.known++] = this.vocab.idOf(t) ?? -1;
  }
}
