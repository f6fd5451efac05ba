import { describe, expect, it } from 'vitest';
import { IndexBuilder } from '../../../../src/core/index/model/indexBuilder.js';
import type { Staleness } from '../../../../src/core/index/lsiIndex.js';
import { DEFAULT_UPDATE_POLICY, decideUpdate, describeReasons, rebuildDelay } from '../../../../src/core/index/update/updatePolicy.js';
import { loadCollection } from '../../../helpers/shared.js';

const fresh: Staleness = { changedFiles: 0, changedShare: 0, newTermMass: 0, residualRatio: 1 };

describe('decideUpdate thresholds', () => {
  // The three limits are our own estimates [E], documented in src/core/index/update/updatePolicy.ts:
  // > 15 % of files changed, new-term mass > 10 %, residual > 1.25 × the build-time mean.
  it('uses the limits documented in its header', () => {
    expect(DEFAULT_UPDATE_POLICY.maxChangedShare).toBe(0.15);
    expect(DEFAULT_UPDATE_POLICY.maxNewTermMass).toBe(0.1);
    expect(DEFAULT_UPDATE_POLICY.maxResidualRatio).toBe(1.25);
  });

  it('keeps folding in a freshly built index', () => {
    expect(decideUpdate(fresh)).toEqual({ action: 'fold-in' });
  });

  it('rebuilds only when the changed share is strictly above 15 %', () => {
    // 15 of 100 files is exactly the limit ("more than 15 %" in §8.8), 16 of 100 is above it.
    expect(decideUpdate({ ...fresh, changedFiles: 15, changedShare: 15 / 100 }).action).toBe('fold-in');
    expect(decideUpdate({ ...fresh, changedFiles: 16, changedShare: 16 / 100 })).toEqual({ action: 'rebuild', reasons: ['changed-share'] });
  });

  it('ignores the ratio triggers until enough files were folded in', () => {
    const one = { ...fresh, changedFiles: 1, changedShare: 0.01, newTermMass: 0.5, residualRatio: 3 };
    expect(decideUpdate(one).action).toBe('fold-in');
    const five = { ...one, changedFiles: 5, changedShare: 0.05 };
    expect(decideUpdate(five)).toEqual({ action: 'rebuild', reasons: ['new-vocabulary', 'residual-growth'] });
  });

  it('names every reason that holds, in a sentence', () => {
    const s = { changedFiles: 30, changedShare: 0.3, newTermMass: 0.2, residualRatio: 1.5 };
    const d = decideUpdate(s);
    expect(d.action === 'rebuild' && d.reasons).toEqual(['changed-share', 'new-vocabulary', 'residual-growth']);
    expect(describeReasons(['changed-share', 'new-vocabulary'], s)).toBe(
      '30% of files changed; 20% of new text uses words the index has not seen',
    );
  });

  it('waits for the folder to fall quiet before a rebuild', () => {
    expect(rebuildDelay(1000, 1000)).toBe(DEFAULT_UPDATE_POLICY.settleMs);
    expect(rebuildDelay(1000, 1000 + DEFAULT_UPDATE_POLICY.settleMs + 1)).toBe(0);
  });
});

// Real text: ADI (test/fixtures/corpora/adi, 82 abstracts on documentation and retrieval) as the
// indexed folder, and CRAN (test/fixtures/corpora/cran, aerodynamics abstracts) as new files on a
// topic the model has never seen.
const adi = loadCollection('adi');
const cran = loadCollection('cran');

describe('decideUpdate on a real index', () => {
  const build = () => {
    const b = new IndexBuilder();
    for (const d of adi.docs) b.addText({ path: `adi/${d.id}`, size: d.text.length, mtimeMs: 0 }, d.text);
    return b.build();
  };

  it('does not ask for a rebuild when files are saved unchanged', () => {
    const index = build();
    for (const d of adi.docs.slice(0, 10)) index.foldIn({ path: `adi/${d.id}`, size: d.text.length, mtimeMs: 1 }, d.text);
    const s = index.staleness();
    // 10 of 82 files folded: 12 % changed, no word is new.
    expect(s.changedShare).toBeCloseTo(10 / 82, 10);
    expect(s.newTermMass).toBe(0);
    expect(decideUpdate(s)).toEqual({ action: 'fold-in' });
  });

  it('asks for a rebuild when files on an unseen topic arrive', () => {
    const index = build();
    for (const d of cran.docs.slice(0, 8)) index.foldIn({ path: `cran/${d.id}`, size: d.text.length, mtimeMs: 1 }, d.text);
    const s = index.staleness();
    const d = decideUpdate(s);
    expect(d.action).toBe('rebuild');
    // Aerodynamics words are mostly absent from a library-science vocabulary, and the new files
    // lie mostly outside its concept space.
    expect(d.action === 'rebuild' && d.reasons).toContain('new-vocabulary');
    expect(d.action === 'rebuild' && d.reasons).toContain('residual-growth');
  });
});
