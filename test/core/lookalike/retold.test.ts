/**
 * The "same content, other words" rule (retold.ts) on neighbour lists built by hand, each case
 * checking one clause of the rule as documented there (no external source: the rule is ours).
 */
import { describe, expect, it } from 'vitest';
import { boilerplateLines, findRetoldPairs, withoutBoilerplate } from '../../../src/core/lookalike/retold.js';

const rule = { minCosine: 0.5, minGap: 0.3 };
const lowJ = () => 0.02;
/** Three files: 0 and 1 each other's nearest, 2 nearest to 1. */
const TRIO = [
  [1, 2],
  [0, 2],
  [1, 0],
];
/** The rule with the rare-names clause deciding. */
const namesRule = { ...rule, minNameGap: 0, minSharedNames: 3, minNameShare: 0.85, minNameWords: 200, namesDecide: true };

/** Three files where 0 and 1 are each other's nearest and stand 0.4 clear of their next neighbours. */
const clearPair = {
  neighbours: [
    [1, 2],
    [0, 2],
    [0, 1],
  ],
  cosines: [
    [0.8, 0.3],
    [0.8, 0.4],
    [0.3, 0.4],
  ],
  jaccard: lowJ,
  maxJaccard: 0.15,
};

describe('findRetoldPairs', () => {
  it('keeps mutual nearest neighbours that stand clear of both files’ next neighbours', () => {
    const pairs = findRetoldPairs(clearPair, rule);
    expect(pairs).toHaveLength(1);
    expect(pairs[0]).toMatchObject({ a: 0, b: 1, cosine: 0.8 });
    expect(pairs[0].gap).toBeCloseTo(0.4, 12); // 0.8 − max(0.3, 0.4)
  });

  it('leaves out a pair whose files both name devices and share none of them, unless the veto is off', () => {
    const apart = (devicesApart: boolean) => () => ({ shared: 0, share: 0, own: [0, 0] as const, devicesApart });
    expect(findRetoldPairs({ ...clearPair, names: apart(true) }, rule)).toEqual([]);
    expect(findRetoldPairs({ ...clearPair, names: apart(false) }, rule)).toHaveLength(1);
    expect(findRetoldPairs({ ...clearPair, names: apart(true) }, { ...rule, devicesApartVeto: false })).toHaveLength(1);
  });

  it('leaves out a pair of companion files, unless the veto is off', () => {
    const companions = (yes: boolean) => () => yes;
    expect(findRetoldPairs({ ...clearPair, companions: companions(true) }, rule)).toEqual([]);
    expect(findRetoldPairs({ ...clearPair, companions: companions(false) }, rule)).toHaveLength(1);
    expect(findRetoldPairs({ ...clearPair, companions: companions(true) }, { ...rule, companionVeto: false })).toHaveLength(1);
  });

  it('refuses a pair that is not mutual, too close to a third file, too weak, or sharing text', () => {
    const base = {
      neighbours: [
        [1, 2],
        [2, 0],
        [1, 0],
      ],
      cosines: [
        [0.8, 0.3],
        [0.9, 0.8],
        [0.9, 0.3],
      ],
      jaccard: lowJ,
      maxJaccard: 0.15,
    };
    // 0's nearest is 1 but 1's nearest is 2: not mutual; 1 ↔ 2 are mutual but 1's next (0.8) is too close.
    expect(findRetoldPairs(base, rule)).toEqual([]);
    const clear = { neighbours: [[1], [0]], cosines: [[0.45], [0.45]], jaccard: lowJ, maxJaccard: 0.15 };
    expect(findRetoldPairs(clear, rule)).toEqual([]); // below minCosine
    expect(findRetoldPairs({ ...clear, cosines: [[0.7], [0.7]] }, rule)).toHaveLength(1);
    expect(findRetoldPairs({ ...clear, cosines: [[0.7], [0.7]], jaccard: () => 0.2 }, rule)).toEqual([]); // shares text
  });

  it('never chains: a file has at most one partner', () => {
    const pairs = findRetoldPairs(
      { neighbours: [[1], [0], [3], [2]], cosines: [[0.9], [0.9], [0.7], [0.7]], jaccard: lowJ, maxJaccard: 0.15 },
      rule,
    );
    expect(pairs.map((p) => [p.a, p.b])).toEqual([
      [0, 1],
      [2, 3],
    ]); // strongest margin first
  });
});

describe('findRetoldPairs, clause b: a smaller margin with the same rare names', () => {
  const input = {
    neighbours: TRIO,
    cosines: [
      [0.6, 0.45],
      [0.6, 0.4],
      [0.5, 0.4],
    ],
    jaccard: lowJ,
    maxJaccard: 0.15,
  };
  const withNames = { ...rule, minNameGap: 0.1, minSharedNames: 2, minNameShare: 0.8 };
  it('passes a mutual pair only 0.15 clear when it shares enough rare names', () => {
    expect(findRetoldPairs(input, rule)).toEqual([]); // margin 0.15 < 0.3, no names given
    const names = (a: number, b: number) =>
      a + b === 1 ? { shared: 3, share: 0.85, own: [3, 4] as const } : { shared: 0, share: 0, own: [0, 0] as const };
    const pairs = findRetoldPairs({ ...input, names }, withNames);
    expect(pairs).toHaveLength(1);
    expect(pairs[0]).toMatchObject({ a: 0, b: 1, sharedNames: 3, nameShare: 0.85 });
    expect(pairs[0].score).toBeCloseTo(0.15 + 0.85, 12);
  });
  it('refuses it with too few names, too small a share, or too small a margin', () => {
    const few = () => ({ shared: 1, share: 0.95, own: [1, 1] as const });
    const thin = () => ({ shared: 5, share: 0.7, own: [7, 8] as const });
    const full = () => ({ shared: 5, share: 0.95, own: [5, 6] as const });
    expect(findRetoldPairs({ ...input, names: few }, withNames)).toEqual([]);
    expect(findRetoldPairs({ ...input, names: thin }, withNames)).toEqual([]);
    expect(findRetoldPairs({ ...input, names: full }, { ...withNames, minNameGap: 0.2 })).toEqual([]);
  });
  it('refuses it when the shorter file is a stub (fewer words than minNameWords); clause a is not affected', () => {
    const full = () => ({ shared: 5, share: 0.95, own: [5, 6] as const });
    const stub = { ...input, names: full, words: [40, 500, 500] };
    expect(findRetoldPairs(stub, { ...withNames, minNameWords: 100 })).toEqual([]);
    expect(findRetoldPairs(stub, { ...withNames, minNameWords: 40 })).toHaveLength(1);
    expect(findRetoldPairs({ ...stub, words: [100, 500, 500] }, { ...withNames, minNameWords: 100 })).toHaveLength(1);
    // The same short pair 0.35 clear passes by its margin alone.
    const clear = {
      ...stub,
      cosines: [
        [0.8, 0.45],
        [0.8, 0.4],
        [0.5, 0.4],
      ],
    };
    expect(findRetoldPairs(clear, { ...withNames, minNameWords: 100 })).toHaveLength(1);
  });
  it('refuses a pair by either clause when the shorter file has fewer than minWords words', () => {
    const full = () => ({ shared: 5, share: 0.95, own: [5, 6] as const });
    const clear = {
      ...input,
      names: full,
      words: [40, 500, 500],
      cosines: [
        [0.8, 0.45],
        [0.8, 0.4],
        [0.5, 0.4],
      ],
    };
    expect(findRetoldPairs(clear, { ...withNames, minWords: 0 })).toHaveLength(1);
    expect(findRetoldPairs(clear, { ...withNames, minWords: 50 })).toEqual([]);
    expect(findRetoldPairs({ ...clear, words: [50, 500, 500] }, { ...withNames, minWords: 50 })).toHaveLength(1);
  });
});

describe('findRetoldPairs, namesDecide: when both files hold rare names, the names decide', () => {
  // A mutual pair 0.4 clear of both files' next neighbours: clause a passes it on its margin.
  const clear = {
    neighbours: TRIO,
    cosines: [
      [0.8, 0.4],
      [0.8, 0.35],
      [0.5, 0.4],
    ],
    jaccard: lowJ,
    maxJaccard: 0.15,
  };
  const params = { ...rule, minNameGap: 0, minSharedNames: 3, minNameShare: 0.85, namesDecide: true };
  it('refuses a clear pair whose files each name their own things (two pages of one template)', () => {
    const siblings = () => ({ shared: 0, share: 0, own: [4, 5] as const });
    expect(findRetoldPairs({ ...clear, names: siblings }, { ...params, namesDecide: false })).toHaveLength(1);
    expect(findRetoldPairs({ ...clear, names: siblings }, params)).toEqual([]);
  });
  it('keeps the margin clause when one file names nothing rare', () => {
    const oneNameless = () => ({ shared: 0, share: 0, own: [0, 5] as const });
    const pairs = findRetoldPairs({ ...clear, names: oneNameless }, params);
    expect(pairs).toHaveLength(1);
    expect(pairs[0]).toMatchObject({ clause: 'margin', namesHeld: [0, 5] });
  });
  it('passes a mutual pair with little margin on its shared names, and says so', () => {
    const close = {
      ...clear,
      cosines: [
        [0.6, 0.58],
        [0.6, 0.5],
        [0.5, 0.4],
      ],
    };
    const same = () => ({ shared: 4, share: 0.9, own: [4, 5] as const });
    const pairs = findRetoldPairs({ ...close, names: same }, params);
    expect(pairs).toHaveLength(1);
    expect(pairs[0]).toMatchObject({ a: 0, b: 1, clause: 'names', sharedNames: 4 });
    expect(pairs[0].gap).toBeCloseTo(0.02, 12);
  });
});

describe('findRetoldPairs, clause c: margin and name share together, when a second view agrees', () => {
  // Mutual pair, cosine 0.45 (below minCosine 0.5), margin 0.2 over both files' next neighbours.
  const close = {
    neighbours: TRIO,
    cosines: [
      [0.45, 0.25],
      [0.45, 0.2],
      [0.3, 0.2],
    ],
    jaccard: lowJ,
    maxJaccard: 0.15,
    words: [300, 300, 300],
  };
  const params = {
    ...namesRule,
    minEvidence: 1,
    minEvidenceCosine: 0.4,
    minEvidenceWords: 150,
  };
  const names = () => ({ shared: 4, share: 0.8, own: [5, 5] as const });
  const agrees = () => true;
  it('passes a pair whose margin + name share reach minEvidence, below clause b’s share and cosine', () => {
    const pairs = findRetoldPairs({ ...close, names, secondView: agrees }, params);
    expect(pairs).toHaveLength(1);
    expect(pairs[0]).toMatchObject({ a: 0, b: 1, clause: 'combined', sharedNames: 4, nameShare: 0.8 });
    expect(pairs[0].score).toBeCloseTo(0.2 + 0.8, 12);
  });
  it('refuses it when the second view disagrees, without a second view, or when the clause is off', () => {
    expect(findRetoldPairs({ ...close, names, secondView: () => false }, params)).toEqual([]);
    expect(findRetoldPairs({ ...close, names }, params)).toEqual([]);
    expect(findRetoldPairs({ ...close, names, secondView: agrees }, { ...params, minEvidence: undefined })).toEqual([]);
  });
  it('refuses it below minEvidence, minEvidenceCosine, minEvidenceWords or minSharedNames, or when a file names nothing rare', () => {
    const input = { ...close, names, secondView: agrees };
    expect(findRetoldPairs(input, { ...params, minEvidence: 1.05 })).toEqual([]);
    expect(findRetoldPairs(input, { ...params, minEvidenceCosine: 0.5 })).toEqual([]);
    expect(findRetoldPairs({ ...input, words: [149, 300, 300] }, params)).toEqual([]);
    expect(findRetoldPairs({ ...input, names: () => ({ shared: 2, share: 0.9, own: [2, 2] as const }) }, params)).toEqual([]);
    expect(findRetoldPairs({ ...input, names: () => ({ shared: 0, share: 0, own: [0, 5] as const }) }, params)).toEqual([]);
  });
  it('holds pairs sharing fewer than minSharedNames names to minEvidenceFewNames, and leaves them out without it', () => {
    const two = () => ({ shared: 2, share: 1, own: [2, 2] as const });
    const input = { ...close, names: two, secondView: agrees }; // margin 0.2 + share 1 = 1.2
    expect(findRetoldPairs(input, params)).toEqual([]);
    expect(findRetoldPairs(input, { ...params, minEvidenceFewNames: 1.25 })).toEqual([]);
    const pairs = findRetoldPairs(input, { ...params, minEvidenceFewNames: 1.2 });
    expect(pairs).toHaveLength(1);
    expect(pairs[0]).toMatchObject({ clause: 'combined', sharedNames: 2 });
    const none = () => ({ shared: 0, share: 0, own: [2, 2] as const });
    expect(findRetoldPairs({ ...input, names: none }, { ...params, minEvidenceFewNames: 0 })).toEqual([]);
  });
  it('asks the second view only about pairs the other clauses refuse', () => {
    const asked: [number, number][] = [];
    const spy = (a: number, b: number) => (asked.push([a, b]), false);
    const strong = () => ({ shared: 4, share: 0.9, own: [4, 4] as const });
    const clear = {
      ...close,
      cosines: [
        [0.7, 0.25],
        [0.7, 0.2],
        [0.3, 0.2],
      ],
    };
    const pairs = findRetoldPairs({ ...clear, names: strong, secondView: spy }, params);
    expect(pairs).toHaveLength(1);
    expect(pairs[0].clause).toBe('names');
    expect(asked).toEqual([]);
  });
});

describe('findRetoldPairs, clause d: closer in words than the broad topic explains', () => {
  // Mutual pair, cosine 0.48 (below minCosine 0.5), margin 0.13 over both files' next neighbours.
  const close = {
    neighbours: TRIO,
    cosines: [
      [0.48, 0.35],
      [0.48, 0.3],
      [0.4, 0.3],
    ],
    jaccard: lowJ,
    maxJaccard: 0.15,
    words: [150, 300, 300],
  };
  const params = {
    ...namesRule,
    conceptMinDiff: -0.15,
    conceptMinCosine: 0.45,
    conceptMinWords: 100,
    conceptMinNameShare: 0.9,
    conceptMinGap: 0.2,
  };
  const one = () => ({ shared: 1, share: 1, own: [1, 1] as const });
  // Concept cosine 0.6: the full cosine 0.48 is 0.12 below it, within −0.15.
  const concept = () => 0.6;
  it('passes a pair sharing one rare name when its full cosine is not far below its concept cosine', () => {
    const pairs = findRetoldPairs({ ...close, names: one, conceptCosine: concept }, params);
    expect(pairs).toHaveLength(1);
    expect(pairs[0]).toMatchObject({ a: 0, b: 1, clause: 'beyond-topic', sharedNames: 1 });
    expect(pairs[0].beyondTopic).toBeCloseTo(0.48 - 0.6, 12);
  });
  it('refuses it when the concept space puts the two much closer than their words (one area), or when the clause is off', () => {
    expect(findRetoldPairs({ ...close, names: one, conceptCosine: () => 0.64 }, params)).toEqual([]); // 0.48 − 0.64 < −0.15
    expect(findRetoldPairs({ ...close, names: one }, params)).toEqual([]);
    expect(findRetoldPairs({ ...close, names: one, conceptCosine: concept }, { ...params, conceptMinDiff: undefined })).toEqual([]);
  });
  it('refuses it below conceptMinCosine, conceptMinWords or conceptMinNameShare, or with no name in common', () => {
    const input = { ...close, names: one, conceptCosine: concept };
    expect(findRetoldPairs(input, { ...params, conceptMinCosine: 0.5 })).toEqual([]);
    expect(findRetoldPairs({ ...input, words: [99, 300, 300] }, params)).toEqual([]);
    expect(findRetoldPairs({ ...input, names: () => ({ shared: 2, share: 0.85, own: [3, 2] as const }) }, params)).toEqual([]);
    expect(findRetoldPairs({ ...input, names: () => ({ shared: 0, share: 0, own: [2, 2] as const }) }, params)).toEqual([]);
  });
  it('asks a pair where a file names nothing rare for conceptMinGap instead', () => {
    const none = () => ({ shared: 0, share: 0, own: [0, 3] as const });
    const input = { ...close, names: none, conceptCosine: concept };
    expect(findRetoldPairs(input, params)).toEqual([]); // margin 0.13 < 0.2
    expect(findRetoldPairs(input, { ...params, conceptMinGap: 0.13 })).toHaveLength(1);
  });
  it('leaves a pair the other clauses pass to them', () => {
    const clear = {
      ...close,
      cosines: [
        [0.8, 0.35],
        [0.8, 0.3],
        [0.4, 0.3],
      ],
      words: [300, 300, 300],
    };
    const pairs = findRetoldPairs(
      { ...clear, names: () => ({ shared: 4, share: 0.9, own: [4, 4] as const }), conceptCosine: concept },
      params,
    );
    expect(pairs).toHaveLength(1);
    expect(pairs[0].clause).toBe('names');
  });
});

describe('findRetoldPairs, clause a with a limit on shared nearest neighbours', () => {
  // sharedNeighbours says how many files the two files' neighbour lists hold in common.
  const clear = clearPair;
  it('refuses a clear pair whose neighbour lists share more files than marginMaxSharedNeighbours (one family)', () => {
    const input = { ...clear, sharedNeighbours: () => 7 };
    expect(findRetoldPairs(input, { ...rule, marginMaxSharedNeighbours: 6 })).toEqual([]);
    const pairs = findRetoldPairs(input, { ...rule, marginMaxSharedNeighbours: 7 });
    expect(pairs).toHaveLength(1);
    expect(pairs[0]).toMatchObject({ a: 0, b: 1, clause: 'margin', sharedNeighbours: 7 });
  });
  it('applies no limit without the level or without the count', () => {
    expect(findRetoldPairs({ ...clear, sharedNeighbours: () => 9 }, rule)).toHaveLength(1);
    expect(findRetoldPairs(clear, { ...rule, marginMaxSharedNeighbours: 0 })).toHaveLength(1);
  });
  it('leaves the names clause alone', () => {
    const named = {
      ...clear,
      names: () => ({ shared: 4, share: 0.9, own: [4, 4] as const }),
      words: [300, 300, 300],
      sharedNeighbours: () => 9,
    };
    const pairs = findRetoldPairs(named, { ...namesRule, marginMaxSharedNeighbours: 0 });
    expect(pairs).toHaveLength(1);
    expect(pairs[0].clause).toBe('names');
  });
});

describe('boilerplate lines', () => {
  it('finds lines present in at least n files (trimmed, case and spacing ignored) and removes them', () => {
    const texts = ['Report bugs to the list.\nalpha', '  report   bugs to the list.\nbeta', 'REPORT BUGS TO THE LIST.\ngamma\nalpha'];
    const bp = boilerplateLines(texts, 3);
    expect([...bp]).toEqual(['report bugs to the list.']);
    expect(withoutBoilerplate(texts[2], bp)).toBe('gamma\nalpha');
    expect(boilerplateLines(texts, 2).has('alpha')).toBe(true);
  });
});
