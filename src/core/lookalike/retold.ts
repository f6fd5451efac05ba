/**
 * "Same content, other words": pairs of files that tell the same thing with little shared text.
 *
 * Rule (each file's own neighbourhood decides, not a global cosine level):
 * 1. Full weighted term space (termSpace.ts, sublinear TF-IDF), built from each file's text minus
 *    its boilerplate: lines that occur in `boilerplateFiles` or more files (headers, licence and
 *    "report bugs to" lines a template stamps on every page) are left out, so template siblings
 *    are not drawn together by the template.
 * 2. Each file's nearest neighbours there, with copies collapsed: a neighbour sharing text with
 *    the file (shingle Jaccard ≥ retoldCopyJaccard, 0.3) or with a nearer neighbour is skipped.
 * 3. A pair passes when the two files are each other's nearest neighbour (mutual nearest
 *    neighbours; Jarvis & Patrick 1973), share little text (Jaccard < maxJaccard), have a
 *    cosine ≥ minCosine, and either
 *    a. that cosine stands at least minGap above each file's next neighbour (a margin against
 *       the file's own neighbourhood, as the margin scoring of Artetxe & Schwenk 2019 for mining
 *       translation pairs) — with namesDecide, only when one of the two files holds no rare name:
 *       when both name rare options or identifiers, the names decide (clause b), because two
 *       pages of one template (two modules, two chips, two functions) stand clear of the rest of
 *       a folder as a pair yet each names its own things. With marginMaxSharedNeighbours, the two
 *       files' lists of nearest files may have at most that many files in common (shared
 *       nearest neighbours, Jarvis & Patrick 1973): a retelling sits in another neighbourhood than
 *       its partner (a manual page among pages, a chapter among chapters), two pages of one
 *       family in the same one; or
 *    b. it stands at least minNameGap above them, the two files hold the same rare names
 *       (rareNames.ts: at least minSharedNames, share ≥ minNameShare) and the shorter one has at
 *       least minNameWords words: a retelling repeats the options and identifiers of what it
 *       tells, a same-area neighbour has other ones; a stub page that only points to another
 *       (a property and the variable that sets its default) names the same thing without
 *       telling it.
 *    c. (both files hold rare names) margin and name share add up to at least minEvidence, with
 *       at least minSharedNames names in common (at least minEvidenceFewNames with one or two
 *       fewer, down to 1), the shorter file at least minEvidenceWords words and a cosine of at
 *       least minEvidenceCosine — and a second view agrees: under
 *       another weighting of the same counts (RetoldInput.secondView; findLookalikes uses BM25,
 *       bm25View.ts) the two are still each other's nearest among their term-space neighbours. A pair just short of
 *       clause b's name share or length but standing clear of its neighbourhood tells the same
 *       thing; two pages of one kind that hold each other's names stand clear under one
 *       weighting more often than under two.
 *    d. (off by default: options.ts says why) the full-space cosine stands at least conceptMinDiff
 *       above the pair's cosine in a coarse
 *       concept space (RetoldInput.conceptCosine; findLookalikes uses conceptView.ts, LSI with
 *       k = 50), with a cosine of at least conceptMinCosine and the shorter file at least
 *       conceptMinWords words, and either both files hold rare names, at least one in common with
 *       a share of at least conceptMinNameShare, or one names nothing rare and the margin is at
 *       least conceptMinGap. Two pages of one area sit near 1 in the concept space, so their
 *       full cosine falls below it; a retelling is close in words specific to the two, beyond
 *       what its area explains (the concept view as a second, independent piece of evidence, as
 *       the issue's "agreement between the reduced space and the full term space", turned round).
 *    Whatever the clause, two files that both name devices by rare `vendor,model` strings (the
 *    device-tree form, `ti,tmp108`; rareNames.ts) and share none of them are left out
 *    (devicesApartVeto): two bindings of sibling devices, where a binding and the page about its
 *    driver name the same device or the page names none. Nor is a pair of companion files
 *    (companionVeto; companions.ts): a source file and its header, a test and the file it tests,
 *    two halves of one unit that a reader knows go together.
 *    Either way the shorter file must have at least minWords words: a page of a few dozen words
 *    (a stub that points to another page) is too short to tell the same content.
 *    Pairs only: a file has at most one such partner, so nothing chains.
 * Score for ranking: gap + name share (strongest evidence first).
 */

import type { RareNames } from './rareNames.js';

export interface RetoldParams {
  readonly minCosine: number;
  readonly minGap: number;
  /** Clause b (needs RetoldInput.names): least margin, shared rare names and their share. */
  readonly minNameGap?: number;
  readonly minSharedNames?: number;
  readonly minNameShare?: number;
  /** Clause b: least word count of the shorter file (RetoldInput.words); a stub that points to another page is left to clause a. */
  readonly minNameWords?: number;
  /** Both clauses: least word count of the shorter file (RetoldInput.words). */
  readonly minWords?: number;
  /** Clause a only when a file holds no rare name (needs RetoldInput.names); otherwise clauses b and c decide. */
  readonly namesDecide?: boolean;
  /** Clause c (needs RetoldInput.names and secondView): least margin + name share; absent = off. */
  readonly minEvidence?: number;
  /** Clause c when the pair shares at least 1 but fewer than minSharedNames rare names; absent = those pairs are left out. */
  readonly minEvidenceFewNames?: number;
  /** Clause c: least cosine (may be below minCosine) and least words of the shorter file. */
  readonly minEvidenceCosine?: number;
  readonly minEvidenceWords?: number;
  /** Clause d (needs RetoldInput.conceptCosine): least full cosine minus concept cosine; absent = off. */
  readonly conceptMinDiff?: number;
  /** Clause d: least full cosine, least words of the shorter file, least name share (both named), least margin (one names nothing rare). */
  readonly conceptMinCosine?: number;
  readonly conceptMinWords?: number;
  readonly conceptMinNameShare?: number;
  readonly conceptMinGap?: number;
  /** Clause a (needs RetoldInput.sharedNeighbours): most files the two neighbour lists may share; absent = no limit. */
  readonly marginMaxSharedNeighbours?: number;
  /** Every clause: a pair whose files both name devices and share none of them (RareNames.devicesApart) is left out; absent = on. */
  readonly devicesApartVeto?: boolean;
  /** Every clause: a pair of companion files (RetoldInput.companions; companions.ts) is left out; absent = on. */
  readonly companionVeto?: boolean;
}

export interface RetoldInput {
  /** Each file's cleaned neighbour list (row indices, nearest first) and its cosines. */
  readonly neighbours: readonly (readonly number[])[];
  readonly cosines: readonly (readonly number[])[];
  /** Shingle Jaccard of a pair (exact or estimated). */
  readonly jaccard: (a: number, b: number) => number;
  /** Pairs sharing this much text or more (Jaccard) are not "other words". */
  readonly maxJaccard: number;
  /** Shared rare names of a pair (rareNames.ts); without it only clause a applies. */
  readonly names?: (a: number, b: number) => RareNames;
  /** Each file's word count (minWords, clause b's minNameWords); without it no count is checked. */
  readonly words?: readonly number[];
  /** Whether a second weighting agrees that a and b are each other's nearest (clause c); without it clause c is off. */
  readonly secondView?: (a: number, b: number) => boolean;
  /** Cosine of a and b in a coarse concept space (clause d); without it clause d is off. */
  readonly conceptCosine?: (a: number, b: number) => number;
  /** Files found in both a's and b's nearest-neighbour lists (clause a's limit); without it no limit is checked. */
  readonly sharedNeighbours?: (a: number, b: number) => number;
  /** Whether a and b are companion files (an implementation and its interface, a test and its subject; companions.ts); without it none are. */
  readonly companions?: (a: number, b: number) => boolean;
}

export type RetoldClause = 'margin' | 'names' | 'combined' | 'beyond-topic';

export interface RetoldPair {
  readonly a: number;
  readonly b: number;
  readonly cosine: number;
  /** cosine − the better of the two files' next-neighbour cosines. */
  readonly gap: number;
  /** Rare names both hold and their share (0 without RetoldInput.names). */
  readonly sharedNames: number;
  readonly nameShare: number;
  /** Rare names each file holds (0, 0 without RetoldInput.names). */
  readonly namesHeld: readonly [number, number];
  /** The clause that passed the pair: 'margin' (a), 'names' (b), 'combined' (c) or 'beyond-topic' (d). */
  readonly clause: RetoldClause;
  /** Full cosine minus the concept-space cosine (only when RetoldInput.conceptCosine is given). */
  readonly beyondTopic?: number;
  /** Files in both neighbour lists (only when RetoldInput.sharedNeighbours is given). */
  readonly sharedNeighbours?: number;
  /** gap + nameShare: the ranking. */
  readonly score: number;
}

export function findRetoldPairs(input: RetoldInput, params: RetoldParams): RetoldPair[] {
  const { neighbours, cosines } = input;
  const out: RetoldPair[] = [];
  for (let i = 0; i < neighbours.length; i++) {
    const d = neighbours[i][0];
    if (d === undefined || d <= i || neighbours[d][0] !== i) continue;
    const c = cosines[i][0];
    const evidenceOn = params.minEvidence !== undefined && input.names !== undefined && input.secondView !== undefined;
    const conceptOn = params.conceptMinDiff !== undefined && input.conceptCosine !== undefined;
    const floor = Math.min(
      params.minCosine,
      evidenceOn ? (params.minEvidenceCosine ?? params.minCosine) : Infinity,
      conceptOn ? (params.conceptMinCosine ?? params.minCosine) : Infinity,
    );
    if (c < floor) continue;
    const next = Math.max(cosines[i][1] ?? 0, cosines[d][1] ?? 0);
    const gap = c - next;
    if (gap < Math.min(params.minGap, params.minNameGap ?? Infinity, evidenceOn || conceptOn ? 0 : Infinity)) continue;
    if (input.jaccard(i, d) >= input.maxJaccard) continue;
    if (params.companionVeto !== false && input.companions?.(i, d)) continue;
    const shorter = input.words === undefined ? Infinity : Math.min(input.words[i], input.words[d]);
    if (shorter < (params.minWords ?? 0)) continue;
    const names: RareNames = input.names ? input.names(i, d) : { shared: 0, share: 0, own: [0, 0] as const };
    if (names.devicesApart && params.devicesApartVeto !== false) continue;
    const bothNamed = names.own[0] > 0 && names.own[1] > 0;
    const strong = c >= params.minCosine;
    const shared = input.sharedNeighbours ? input.sharedNeighbours(i, d) : undefined;
    const byGap =
      strong &&
      gap >= params.minGap &&
      !(params.namesDecide === true && input.names !== undefined && bothNamed) &&
      (shared === undefined || shared <= (params.marginMaxSharedNeighbours ?? Infinity));
    const byNames =
      strong &&
      input.names !== undefined &&
      gap >= (params.minNameGap ?? Infinity) &&
      names.shared >= (params.minSharedNames ?? 1) &&
      names.share >= (params.minNameShare ?? Infinity) &&
      shorter >= (params.minNameWords ?? 0);
    const byBoth =
      !byGap &&
      !byNames &&
      evidenceOn &&
      bothNamed &&
      c >= (params.minEvidenceCosine ?? params.minCosine) &&
      names.shared >= 1 &&
      gap + names.share >= ((names.shared >= (params.minSharedNames ?? 1) ? params.minEvidence : params.minEvidenceFewNames) ?? Infinity) &&
      shorter >= (params.minEvidenceWords ?? 0) &&
      input.secondView!(i, d);
    const beyondTopic = input.conceptCosine ? c - input.conceptCosine(i, d) : undefined;
    const byConcept =
      !byGap &&
      !byNames &&
      !byBoth &&
      conceptOn &&
      c >= (params.conceptMinCosine ?? params.minCosine) &&
      shorter >= (params.conceptMinWords ?? 0) &&
      (bothNamed
        ? names.shared >= 1 && names.share >= (params.conceptMinNameShare ?? Infinity)
        : gap >= (params.conceptMinGap ?? Infinity)) &&
      beyondTopic! >= params.conceptMinDiff!;
    if (!byGap && !byNames && !byBoth && !byConcept) continue;
    out.push({
      a: i,
      b: d,
      cosine: c,
      gap,
      sharedNames: names.shared,
      nameShare: names.share,
      namesHeld: [names.own[0], names.own[1]],
      clause: byGap ? 'margin' : byNames ? 'names' : byBoth ? 'combined' : 'beyond-topic',
      ...(beyondTopic === undefined ? {} : { beyondTopic }),
      ...(shared === undefined ? {} : { sharedNeighbours: shared }),
      score: gap + names.share,
    });
  }
  return out.sort((x, y) => y.score - x.score || x.a - y.a);
}

/** Lines (trimmed, lowercased, spaces collapsed) present in at least `minFiles` of the texts. */
export function boilerplateLines(texts: readonly string[], minFiles: number): Set<string> {
  const df = new Map<string, number>();
  for (const t of texts) {
    for (const l of new Set(lineKeys(t))) df.set(l, (df.get(l) ?? 0) + 1);
  }
  const out = new Set<string>();
  for (const [l, n] of df) if (n >= minFiles) out.add(l);
  return out;
}

/** The text without its boilerplate lines. */
export function withoutBoilerplate(text: string, boilerplate: ReadonlySet<string>): string {
  if (boilerplate.size === 0) return text;
  return text
    .split(/\r\n|\r|\n/)
    .filter((l) => !boilerplate.has(lineKey(l)))
    .join('\n');
}

/** A line as boilerplate detection compares it: trimmed, lowercased, spaces collapsed. */
export function lineKey(l: string): string {
  return l.trim().toLowerCase().replace(/\s+/g, ' ');
}

function lineKeys(text: string): string[] {
  const out: string[] = [];
  for (const l of text.split(/\r\n|\r|\n/)) {
    const k = lineKey(l);
    if (k.length > 0) out.push(k);
  }
  return out;
}
