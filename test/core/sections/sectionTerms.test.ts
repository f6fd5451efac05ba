/**
 * Explanations of section results, on rxjs 7.8.2's sources (npm, Apache-2.0; test/fixtures/rxjs-src,
 * made by scripts/fixtures/code_known_item.mjs) with their doc-comment queries. References:
 *  - the index's own section scores (searchSections and nearbySections, separate code): the shares
 *    must add up to them;
 *  - each section's terms and concept vector recomputed here from the section's lines of the file
 *    (its own line split, the tokenizer, the vocabulary looked up term by term, the weights and U_k
 *    read from the model): which terms are in the section, each term's concept share, and that the
 *    sum is the cosine with the SECTION's vector, not the whole file's.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { explainSides, QueryExplainer } from '../../../src/core/explain/explain.js';
import { sharedSectionConcepts } from '../../../src/core/explain/sharedConcepts.js';
import type { LsiIndex } from '../../../src/core/index/lsiIndex.js';
import { nearbySections, searchSections } from '../../../src/core/sections/sectionSearch.js';
import type { SectionHit } from '../../../src/core/sections/sectionStore.js';
import { sectionSide } from '../../../src/core/sections/sectionTerms.js';
import { foldContextOf, foldSections } from '../../../src/core/sections/sectionVectors.js';
import { tokenize } from '../../../src/core/text/tokenize.js';
import { buildFixtureIndex, loadRankingFixture } from '../../helpers/rankingChecks.js';

const fx = loadRankingFixture('rxjs-src');
const textOf = new Map(fx.docs.map((d) => [d.id, d.text]));

/** The section's tokens, counted here: its lines split on their own, tokenized with the index's settings. */
function tokensOf(index: LsiIndex, h: Pick<SectionHit, 'path' | 'start' | 'end'>): Map<string, number> {
  const lines = textOf
    .get(h.path)!
    .split(/\r\n|\r|\n/)
    .slice(h.start, h.end);
  const out = new Map<string, number>();
  for (const t of tokenize(lines.join('\n'), index.settings.tokenize)) out.set(t, (out.get(t) ?? 0) + 1);
  return out;
}

/** The unit concept vector of some token counts, from the model's arrays: Σ_t l(tf)·g_t·S·u_t, normalised. */
function foldHere(index: LsiIndex, tokens: Map<string, number>): Float64Array {
  const m = index.model;
  const k = m.k;
  const x = new Float64Array(k);
  const cols: { col: number; tf: number }[] = [];
  for (const [term, tf] of tokens) {
    const id = index.vocab.idOf(term);
    const col = id === undefined || id >= m.columnOf.length ? -1 : m.columnOf[id];
    if (col >= 0) cols.push({ col, tf });
  }
  // Local weight log(1 + tf) for log-entropy (Dumais 1991), 1 + ln tf for tf-idf (Salton & Buckley 1988),
  // times the term's global weight; the document's norm cancels in the unit vector.
  for (const { col, tf } of cols) {
    const w = (m.scheme === 'tfidf' ? 1 + Math.log(tf) : Math.log1p(tf)) * m.weights[col];
    for (let c = 0; c < k; c++) x[c] += w * m.axisScale[c] * m.termVectors[col * k + c];
  }
  const n = Math.hypot(...x);
  return x.map((v) => v / n);
}

const dot = (a: ArrayLike<number>, b: ArrayLike<number>): number => {
  let s = 0;
  for (let c = 0; c < a.length; c++) s += a[c] * b[c];
  return s;
};

describe('explanations of sections on rxjs sources', () => {
  let index: LsiIndex;
  beforeAll(() => {
    index = buildFixtureIndex(fx);
    const ctx = foldContextOf(index);
    for (const d of fx.docs) index.sections.set(d.id, foldSections(ctx, d.id, d.text));
  });

  it('a section side recounts the section’s terms and keeps the vector the index scored with', () => {
    let checked = 0;
    for (const path of index.paths().slice(0, 30)) {
      const f = index.sections.get(path)!;
      for (let i = 0; i < f.starts.length; i++) {
        const side = sectionSide(index, path, i, textOf.get(path)!)!;
        expect(side).not.toBeNull();
        const tokens = tokensOf(index, side);
        // Every counted term is a token of the section's own lines, with the same count.
        side.terms.termIds.forEach((id, j) => expect(tokens.get(index.vocab.termOf(id))).toBe(side.terms.counts[j]));
        const here = foldHere(index, tokens);
        if (Math.hypot(...side.vector) > 0) expect(dot(here, side.vector)).toBeGreaterThan(1 - 1e-5);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(100);
  });

  it('refuses a section whose file was edited since it was folded', () => {
    const path = index.paths().find((p) => (index.sections.get(p)?.starts.length ?? 0) > 1)!;
    const f = index.sections.get(path)!;
    const lines = textOf.get(path)!.split('\n');
    const edited = [...lines];
    edited.splice(f.starts[1], f.ends[1] - f.starts[1], 'unrelated words about gardening tomatoes and weather');
    expect(sectionSide(index, path, 1, edited.join('\n'))).toBeNull();
    expect(sectionSide(index, path, f.starts.length, textOf.get(path)!)).toBeNull();
  });

  it('section search: shares add up to the section score, concept shares against the section’s own vector', () => {
    let checked = 0;
    let differsFromFile = 0;
    for (const q of fx.queries.slice(0, 12)) {
      const plan = index.searchPlan(q.text);
      const explainer = new QueryExplainer(index, q.text);
      for (const h of searchSections(index, q.text, { top: 5 })) {
        const side = sectionSide(index, h.path, h.index, textOf.get(h.path)!)!;
        const e = explainer.explainSection(h.path, side);
        expect(e.score).toBeCloseTo(h.score, 5);
        // The concept part is (1 − λ)·cos(q′, ŝ) with ŝ folded here from the section's text.
        const concept = e.terms.reduce((s, t) => s + t.concept, 0) + e.feedback;
        const s = foldHere(index, tokensOf(index, h));
        expect(concept).toBeCloseTo((1 - plan.lambda) * dot(plan.vector, s), 4);
        // A term is "in both" exactly when the section's own text has it (not the file's).
        const tokens = tokensOf(index, h);
        for (const t of e.terms) expect(t.inBoth).toBe(tokens.has(t.term));
        const whole = explainer.explain(h.path);
        if (Math.abs(whole.terms.reduce((x, t) => x + t.concept, 0) + whole.feedback - concept) > 1e-3) differsFromFile++;
        checked++;
      }
    }
    expect(checked).toBe(60);
    // Sections of files with several sections explain another score than their file.
    expect(differsFromFile).toBeGreaterThan(checked / 2);
  });

  it('nearby at a section: shares over both sections’ terms add up to the cosine; concepts too', () => {
    let checked = 0;
    for (const path of index.paths().slice(0, 15)) {
      const near = nearbySections(index, path, 0, { top: 4 });
      if (!near) continue;
      const a = sectionSide(index, path, near.from.index, textOf.get(path)!)!;
      const ta = tokensOf(index, near.from);
      for (const h of near.hits) {
        const b = sectionSide(index, h.path, h.index, textOf.get(h.path)!)!;
        const tb = tokensOf(index, h);
        const e = explainSides(index, a, b);
        expect(e.score).toBeCloseTo(h.score, 5);
        expect(e.score).toBeCloseTo(dot(foldHere(index, ta), foldHere(index, tb)), 4);
        for (const t of e.terms) {
          // Only the two sections' words take part, and "in both" means both sections have it.
          expect(ta.has(t.term) || tb.has(t.term)).toBe(true);
          expect(t.inBoth).toBe(ta.has(t.term) && tb.has(t.term));
        }
        const shared = sharedSectionConcepts(index, a, b);
        expect(shared.concepts.reduce((x, c) => x + c.share, 0) + shared.rest).toBeCloseTo(h.score, 5);
        expect(shared.wordMatch).toBe(0);
        for (const c of shared.concepts) for (const w of c.terms) expect(ta.has(w) || tb.has(w)).toBe(true);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(30);
  });
});
