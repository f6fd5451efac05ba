/**
 * Retrieval quality measures over ranked lists and binary relevance judgments, as defined in
 * Manning, Raghavan & Schütze, "Introduction to Information Retrieval" (2008), ch. 8:
 * average precision (mean over judged queries = MAP), precision at 10, and nDCG at 10 with
 * binary gains and log2 discounts (Järvelin & Kekäläinen 2002).
 */

export function averagePrecision(ranked: readonly string[], relevant: ReadonlySet<string>): number {
  if (relevant.size === 0) return 0;
  let hits = 0;
  let sum = 0;
  ranked.forEach((id, i) => {
    if (relevant.has(id)) {
      hits++;
      sum += hits / (i + 1);
    }
  });
  return sum / relevant.size;
}

export function precisionAt(ranked: readonly string[], relevant: ReadonlySet<string>, n: number): number {
  let hits = 0;
  for (let i = 0; i < Math.min(n, ranked.length); i++) if (relevant.has(ranked[i])) hits++;
  return hits / n;
}

export function ndcgAt(ranked: readonly string[], relevant: ReadonlySet<string>, n: number): number {
  let dcg = 0;
  for (let i = 0; i < Math.min(n, ranked.length); i++) if (relevant.has(ranked[i])) dcg += 1 / Math.log2(i + 2);
  let ideal = 0;
  for (let i = 0; i < Math.min(n, relevant.size); i++) ideal += 1 / Math.log2(i + 2);
  return ideal > 0 ? dcg / ideal : 0;
}

export interface EvaluationSummary {
  readonly queries: number;
  readonly map: number;
  readonly precisionAt10: number;
  readonly ndcgAt10: number;
}

/** Averages the three measures over the queries that have judgments. */
export function evaluateRuns(
  runs: ReadonlyMap<string, readonly string[]>,
  qrels: ReadonlyMap<string, ReadonlySet<string>>,
): EvaluationSummary {
  let n = 0,
    ap = 0,
    p10 = 0,
    nd = 0;
  for (const [qid, relevant] of qrels) {
    if (relevant.size === 0) continue;
    const ranked = runs.get(qid) ?? [];
    n++;
    ap += averagePrecision(ranked, relevant);
    p10 += precisionAt(ranked, relevant, 10);
    nd += ndcgAt(ranked, relevant, 10);
  }
  return { queries: n, map: n ? ap / n : 0, precisionAt10: n ? p10 / n : 0, ndcgAt10: n ? nd / n : 0 };
}
