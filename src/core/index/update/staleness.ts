/**
 * How far an index has drifted from its last build, the input of the rebuild decision
 * (updatePolicy.ts): the share of documents changed since, the share of folded-in tokens whose
 * terms the model has never seen, and how well folded documents fit the frozen concept space
 * (mean fold-in residual against the build-time mean; folding-in after Berry, Dumais & O'Brien
 * 1995). The counters here are persisted with the index; the rest is read from the slots.
 */
import type { DocTerms } from '../../counting/termCounts.js';

export interface Staleness {
  /** Documents added, changed or removed since the last build. */
  readonly changedFiles: number;
  readonly changedShare: number;
  /** Share of folded documents' tokens whose terms the model does not know. */
  readonly newTermMass: number;
  /** Mean fold-in residual of folded documents divided by the build-time mean (1 = as good). */
  readonly residualRatio: number;
}

export interface StalenessCounters {
  readonly removedSinceBuild: number;
  readonly foldedTokens: number;
  readonly foldedUnknownTokens: number;
}

/** What staleness reads from a slot: folded since the build, and its fold-in residual. */
export interface FoldState {
  readonly folded: boolean;
  readonly residual: number;
}

/** Change counters since the last build. */
export class ChangeCounters {
  private _removedSinceBuild = 0;
  private _foldedTokens = 0;
  private _foldedUnknownTokens = 0;

  /**
   * A document folded in with these terms; ids from vocabBefore on were new to the vocabulary
   * (counted only for those, so pruned-but-known words do not look "new").
   */
  folded(terms: DocTerms, vocabBefore: number): void {
    let brandNew = 0;
    for (let i = 0; i < terms.termIds.length; i++) if (terms.termIds[i] >= vocabBefore) brandNew += terms.counts[i];
    this._foldedTokens += terms.length;
    this._foldedUnknownTokens += brandNew;
  }

  /** A document removed (one folded in since the build is already counted among the folded). */
  removed(wasFolded: boolean): void {
    if (!wasFolded) this._removedSinceBuild++;
  }

  get counters(): StalenessCounters {
    return { removedSinceBuild: this._removedSinceBuild, foldedTokens: this._foldedTokens, foldedUnknownTokens: this._foldedUnknownTokens };
  }

  restore(c: StalenessCounters): void {
    this._removedSinceBuild = c.removedSinceBuild;
    this._foldedTokens = c.foldedTokens;
    this._foldedUnknownTokens = c.foldedUnknownTokens;
  }

  /** Staleness of an index with these slots (null for holes), `size` live documents and model residual mean. */
  measure(slots: readonly (FoldState | null)[], size: number, residualMean: number): Staleness {
    let folded = 0;
    let residual = 0;
    for (const s of slots)
      if (s?.folded) {
        folded++;
        residual += s.residual;
      }
    const changed = folded + this._removedSinceBuild;
    const base = size + this._removedSinceBuild;
    return {
      changedFiles: changed,
      changedShare: base > 0 ? changed / base : 0,
      newTermMass: this._foldedTokens > 0 ? this._foldedUnknownTokens / this._foldedTokens : 0,
      residualRatio: folded > 0 && residualMean > 0 ? residual / folded / residualMean : folded > 0 ? Infinity : 1,
    };
  }
}
