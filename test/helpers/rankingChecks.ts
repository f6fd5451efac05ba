/**
 * Ranking checks on public material (test/fixtures/<name>, provenance in each README): loads a
 * fixture (plain or gzipped JSON lines), ranks it with an index, and scores the rankings the way
 * scripts/fixtures/ranking_baselines.py scores the reference methods (same measures, same query
 * order and quartiles), so the figures compare one to one with the stored baselines.json.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gunzipSync } from 'node:zlib';
import { NoKnownTermsError } from '../../src/core/errors.js';
import { averagePrecision, ndcgAt } from '../../src/core/eval/retrievalMetrics.js';
import { IndexBuilder } from '../../src/core/index/model/indexBuilder.js';
import type { LsiIndex } from '../../src/core/index/lsiIndex.js';
import type { IndexSettings } from '../../src/core/index/model/settings.js';
import { fixturePath } from './shared.js';

export interface RankingFixture {
  docs: { id: string; text: string }[];
  queries: { id: string; text: string; size?: number }[];
  qrels: Map<string, Set<string>>;
  baselines: BaselineFile | null;
}

export interface MethodFigures {
  ndcg10: number;
  map?: number;
  mrr10?: number;
  mrr10ByQuartile?: (number | null)[];
  k?: number;
}

export interface BaselineFile {
  sklearn: string;
  queries: number;
  documents: number;
  methods: Record<'tfidf' | 'bm25' | 'lsi', MethodFigures>;
}

function lines(dir: string, name: string): string[] {
  const p = join(dir, name);
  const text = existsSync(p) ? readFileSync(p, 'utf8') : gunzipSync(readFileSync(`${p}.gz`)).toString('utf8');
  return text.split('\n').filter((l) => l.trim().length > 0);
}

/** Reads test/fixtures/<name>. @throws FixtureMissingError when it is absent. */
/** Every ranking check with its kind, in the order the research scripts (scripts/fixtures/ranking*.ts) print them. */
export const RANKING_CHECKS: readonly (readonly [string, 'nearby' | 'search'])[] = [
  ['cmake-doc', 'nearby'],
  ['django-doc', 'nearby'],
  ['sphinx-doc', 'nearby'],
  ['rxjs-src', 'search'],
  ['lodash-src', 'search'],
  ['corpora/cisi', 'search'],
  ['corpora/cran', 'search'],
  ['corpora/cacm', 'search'],
  ['corpora/adi', 'search'],
];

/** A figure for the research scripts' tables: four decimals, or a dash where there is none. */
export const figure = (x: number | undefined | null): string => (x == null ? '  -  ' : x.toFixed(4));

export function loadRankingFixture(name: string): RankingFixture {
  const dir = fixturePath(name);
  const qrels = new Map<string, Set<string>>();
  for (const line of lines(dir, 'qrels.tsv')) {
    const [q, d, rel] = line.split('\t');
    if (!q || !d || !(Number(rel) > 0)) continue;
    if (!qrels.has(q)) qrels.set(q, new Set());
    qrels.get(q)!.add(d);
  }
  const baselinePath = join(dir, 'baselines.json');
  return {
    docs: lines(dir, 'docs.jsonl').map((l) => JSON.parse(l) as { id: string; text: string }),
    queries: lines(dir, 'queries.jsonl').map((l) => JSON.parse(l) as { id: string; text: string; size?: number }),
    qrels,
    baselines: existsSync(baselinePath) ? (JSON.parse(readFileSync(baselinePath, 'utf8')) as BaselineFile) : null,
  };
}

export function buildFixtureIndex(fixture: RankingFixture, settings: Partial<IndexSettings> = {}): LsiIndex {
  const builder = new IndexBuilder(settings);
  for (const d of fixture.docs) builder.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
  return builder.build();
}

/** Nearby of every judged page (itself excluded), nDCG@10 with binary gains. */
export function nearbyFigures(index: LsiIndex, fixture: RankingFixture): MethodFigures {
  let sum = 0;
  let n = 0;
  for (const q of fixture.queries) {
    const rel = fixture.qrels.get(q.id);
    if (!rel || !index.has(q.id)) continue;
    sum += ndcgAt(
      index.nearby(q.id, { top: 10 }).map((h) => h.path),
      rel,
      10,
    );
    n++;
  }
  return { ndcg10: n ? sum / n : 0 };
}

function rr10(ranked: readonly string[], rel: ReadonlySet<string>): number {
  for (let i = 0; i < Math.min(10, ranked.length); i++) if (rel.has(ranked[i])) return 1 / (i + 1);
  return 0;
}

/** Search with every judged query (all documents ranked): MAP, nDCG@10, MRR@10 overall and per size quartile. */
export function searchFigures(index: LsiIndex, fixture: RankingFixture): Required<Omit<MethodFigures, 'k'>> {
  const judged = fixture.queries.filter((q) => fixture.qrels.has(q.id));
  const ordered = [...judged].sort((a, b) => (a.size ?? 0) - (b.size ?? 0) || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  const quartile = new Map(ordered.map((q, i) => [q.id, Math.floor((4 * i) / ordered.length)]));
  let ap = 0,
    nd = 0,
    rr = 0;
  const perQ = [
    [0, 0],
    [0, 0],
    [0, 0],
    [0, 0],
  ];
  for (const q of judged) {
    const rel = fixture.qrels.get(q.id)!;
    let ranked: string[] = [];
    try {
      ranked = index.search(q.text, { top: index.size }).map((h) => h.path);
    } catch (err) {
      if (!(err instanceof NoKnownTermsError)) throw err;
    }
    ap += averagePrecision(ranked, rel);
    nd += ndcgAt(ranked, rel, 10);
    const r = rr10(ranked, rel);
    rr += r;
    const qq = perQ[quartile.get(q.id)!];
    qq[0] += r;
    qq[1]++;
  }
  const n = judged.length || 1;
  return { map: ap / n, ndcg10: nd / n, mrr10: rr / n, mrr10ByQuartile: perQ.map(([s, c]) => (c ? s / c : null)) };
}
