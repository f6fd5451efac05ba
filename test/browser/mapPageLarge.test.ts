/**
 * The map page with 50,000 files in Chromium: it must draw them and still hit-test a dot under
 * the pointer. Data: random clustered unit vectors in 16 concept dimensions (generated here),
 * the quick layout from the core, and a small generated vocabulary so the standalone file's
 * embedded query data is complete. No timing is asserted (speed belongs in benchmarks); the
 * screenshot lets a person judge how a crowded map reads.
 */
import { writeFileSync } from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildEmbeddedQueryData } from '../../src/core/map/embeddedQueryData.js';
import { buildMapPageData } from '../../src/core/map/mapData.js';
import { quickLayout } from '../../src/core/map/quickLayout.js';
import { buildStandaloneHtml } from '../../src/core/map/standaloneHtml.js';
import { createRandom } from '../../src/core/random.js';
import { builtPage, findDot, HAVE_CHROMIUM, inkShare, launch, outputDir, record, type Session } from './browserHarness.js';

const suite = HAVE_CHROMIUM ? describe : describe.skip;

function largeMap(n: number, k: number, clusters: number) {
  const rng = createRandom(31);
  const centres = Array.from({ length: clusters }, () => Array.from({ length: k }, () => Math.abs(rng.normal())));
  const vectors = new Float32Array(n * k);
  const topicIds = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const c = Math.floor(rng.next() * clusters);
    topicIds[i] = c;
    const v = centres[c].map((x) => x + 0.35 * rng.normal());
    const s = Math.hypot(...v);
    v.forEach((x, d) => (vectors[i * k + d] = x / s));
  }
  const terms = Array.from(
    { length: 64 },
    (_, t) => `term${String.fromCharCode(97 + (t % 26))}${String.fromCharCode(97 + Math.floor(t / 26))}`,
  );
  const termVectors = Float32Array.from({ length: 64 * k }, () => rng.normal());
  const quick = quickLayout(vectors, n, k);
  const source = {
    count: n,
    dimensions: k,
    vectors,
    paths: Array.from({ length: n }, (_, i) => `area-${String(topicIds[i]).padStart(2, '0')}/item-${String(i).padStart(5, '0')}.txt`),
    tokenCounts: Int32Array.from({ length: n }, () => Math.round(20 * Math.exp(4 * rng.next()))),
    topicIds,
    topicLabels: Array.from({ length: clusters }, (_, c) => `${terms[c]} · ${terms[c + clusters]}`),
    topTerms: Array.from({ length: n }, (_, i) => [terms[topicIds[i]], terms[topicIds[i] + clusters]]),
    singularValues: Float64Array.from({ length: 24 }, (_, i) => 10 / (1 + i)),
    k,
    totalEnergy: 200,
  };
  const embedded = buildEmbeddedQueryData({
    count: n,
    dimensions: k,
    fileVectors: vectors,
    terms,
    termVectors,
    globalWeights: new Float32Array(64).fill(1),
    localWeighting: 'log1p',
    quick,
  });
  return { source, page: buildMapPageData(source, { quick, faithful: null }, embedded, { title: 'Concept map · 50,000 generated files' }) };
}

suite('map page with 50,000 files in Chromium', () => {
  let session: Session;
  let map: ReturnType<typeof largeMap>;

  beforeAll(async () => {
    map = largeMap(50_000, 16, 30);
    const { script, styles } = builtPage();
    const file = path.join(outputDir(), 'map-standalone-50k.html');
    writeFileSync(file, buildStandaloneHtml({ script, styles, data: map.page }));
    session = await launch();
  });

  afterAll(async () => {
    await session?.close();
  });

  it('draws every file and still finds the dot under the pointer', async () => {
    const page = await session.context.newPage();
    const log = record(page);
    await page.goto(pathToFileURL(path.join(outputDir(), 'map-standalone-50k.html')).href);
    await page.waitForSelector('#undertone-map[data-files="50000"]');
    expect(await page.getAttribute('#undertone-map', 'data-layout')).toBe('quick');
    expect(await page.locator('.um-segment button:has-text("Faithful")').isDisabled()).toBe(true);
    expect(await inkShare(page, '.um-map-canvas')).toBeGreaterThan(0.02);
    const dot = await findDot(page);
    await page.mouse.move(dot.x, dot.y);
    await page.locator('.um-tooltip').waitFor({ state: 'visible' });
    expect(map.source.paths).toContain(await page.textContent('.um-tooltip-path'));
    await page.screenshot({ path: path.join(outputDir(), 'standalone-50k.png') });
    expect(log.errors).toEqual([]);
  });
});
