/**
 * Bag-of-words counting: a growing vocabulary and per-document sorted (term id, count) vectors.
 * This is the raw, unpruned, unweighted layer; pruning and weighting work on top of it.
 */

/** Term counts of one document: ids ascending, counts aligned. */
export interface DocTerms {
  readonly termIds: Int32Array;
  readonly counts: Float32Array;
  /** Total tokens (sum of counts). */
  readonly length: number;
}

export const EMPTY_DOC_TERMS: DocTerms = Object.freeze({ termIds: new Int32Array(0), counts: new Float32Array(0), length: 0 });

/** Term strings with stable integer ids (ids are never reused). */
export class Vocabulary {
  private readonly _ids = new Map<string, number>();
  private readonly _terms: string[] = [];

  constructor(terms: Iterable<string> = []) {
    for (const t of terms) this.add(t);
  }

  get size(): number {
    return this._terms.length;
  }

  get terms(): readonly string[] {
    return this._terms;
  }

  idOf(term: string): number | undefined {
    return this._ids.get(term);
  }

  termOf(id: number): string {
    return this._terms[id];
  }

  /** The id of term, adding it if new. */
  add(term: string): number {
    let id = this._ids.get(term);
    if (id === undefined) {
      id = this._terms.length;
      this._terms.push(term);
      this._ids.set(term, id);
    }
    return id;
  }
}

/**
 * Counts tokens against a vocabulary. With grow = true unknown terms are added; otherwise they
 * are dropped (folding a query into a frozen index).
 */
export function countTerms(tokens: readonly string[], vocab: Vocabulary, grow: boolean): DocTerms {
  const tally = new Map<number, number>();
  let length = 0;
  for (const t of tokens) {
    const id = grow ? vocab.add(t) : vocab.idOf(t);
    if (id === undefined) continue;
    tally.set(id, (tally.get(id) ?? 0) + 1);
    length++;
  }
  const termIds = Int32Array.from(tally.keys()).sort();
  const counts = new Float32Array(termIds.length);
  for (let i = 0; i < termIds.length; i++) counts[i] = tally.get(termIds[i])!;
  return { termIds, counts, length };
}
