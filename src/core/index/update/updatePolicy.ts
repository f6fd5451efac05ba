/**
 * When to keep folding edits into the frozen concept model and when to rebuild it.
 *
 * Folding-in (Deerwester et al. 1990; Berry, Dumais & O'Brien 1995, SIAM Review 37(4)) projects a
 * changed document with the frozen global weights and U_k, Σ_k. It is cheap, but new topics and
 * new words stay invisible and the folded vectors drift from what a fresh SVD would give. No
 * published rebuild threshold is known to us, so the triggers below are our own estimates [E]
 * (the same kind of trade-off as folding-up, Tougas & Spiteri 2007, CSDA 52(1), which folds in
 * at once and replaces folded vectors by a proper update from time to time):
 *   - share of files folded in, changed or removed since the last build > 15 %   [E]
 *   - share of folded tokens whose words the model has never seen (new-vocabulary mass) > 10 %  [E]
 *   - mean fold-in residual of folded files > 1.25 × the build-time mean        [E]
 * (A fourth signal, drift of VₖᵀVₖ from I, needs the full V and is not tracked here.)
 *
 * Two guards are common practice, not from a source: the two ratio triggers wait for a few folded
 * files (one file is too small a sample to judge a mean by), and a rebuild waits for the folder to
 * fall quiet, so a burst of changes (a branch switch, a search-and-replace) leads to one rebuild.
 */
import type { Staleness } from './staleness.js';

export interface UpdatePolicy {
  /** Rebuild when more than this share of files changed since the last build. [E] @default 0.15 */
  readonly maxChangedShare: number;
  /** Rebuild when more than this share of folded tokens are words new to the model. [E] @default 0.10 */
  readonly maxNewTermMass: number;
  /** Rebuild when folded files' mean residual exceeds this multiple of the build-time mean. [E] @default 1.25 */
  readonly maxResidualRatio: number;
  /** The two ratio triggers count only once this many files were changed. Common practice. @default 5 */
  readonly minChangedForRatios: number;
  /** A rebuild starts only after this many milliseconds without further changes. Common practice. @default 3000 */
  readonly settleMs: number;
}

export const DEFAULT_UPDATE_POLICY: Readonly<UpdatePolicy> = Object.freeze({
  maxChangedShare: 0.15,
  maxNewTermMass: 0.1,
  maxResidualRatio: 1.25,
  minChangedForRatios: 5,
  settleMs: 3000,
});

export type RebuildReason = 'changed-share' | 'new-vocabulary' | 'residual-growth';

export type UpdateDecision = { readonly action: 'fold-in' } | { readonly action: 'rebuild'; readonly reasons: readonly RebuildReason[] };

/** Whether the index, in the given state, should be rebuilt (pure; same input, same answer). */
export function decideUpdate(staleness: Staleness, policy: UpdatePolicy = DEFAULT_UPDATE_POLICY): UpdateDecision {
  const reasons: RebuildReason[] = [];
  if (staleness.changedShare > policy.maxChangedShare) reasons.push('changed-share');
  if (staleness.changedFiles >= policy.minChangedForRatios) {
    if (staleness.newTermMass > policy.maxNewTermMass) reasons.push('new-vocabulary');
    if (staleness.residualRatio > policy.maxResidualRatio) reasons.push('residual-growth');
  }
  return reasons.length > 0 ? { action: 'rebuild', reasons } : { action: 'fold-in' };
}

/** Milliseconds still to wait before a due rebuild may start (0: start now). */
export function rebuildDelay(lastChangeAt: number, now: number, policy: UpdatePolicy = DEFAULT_UPDATE_POLICY): number {
  return Math.max(0, lastChangeAt + policy.settleMs - now);
}

/** One sentence for people: why a rebuild was started. */
export function describeReasons(reasons: readonly RebuildReason[], staleness: Staleness): string {
  const pct = (x: number): string => `${Math.round(x * 100)}%`;
  const parts = reasons.map((r) =>
    r === 'changed-share'
      ? `${pct(staleness.changedShare)} of files changed`
      : r === 'new-vocabulary'
        ? `${pct(staleness.newTermMass)} of new text uses words the index has not seen`
        : `edited files fit the concepts ${staleness.residualRatio.toFixed(2)}× worse than at build time`,
  );
  return parts.length === 0 ? 'the index is current' : parts.join('; ');
}
