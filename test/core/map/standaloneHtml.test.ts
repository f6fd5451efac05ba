import { describe, expect, it } from 'vitest';
import { buildEmbeddedQueryData } from '../../../src/core/map/embeddedQueryData.js';
import { buildMapPageData, type MapPageData } from '../../../src/core/map/mapData.js';
import { buildMapWebviewHtml, mapContentSecurityPolicy } from '../../../src/core/map/mapHtml.js';
import { MAP_DATA_ELEMENT_ID, buildStandaloneHtml } from '../../../src/core/map/standaloneHtml.js';
import { fitFrame } from '../../../src/core/map/layoutFrame.js';
import { InvalidInputError } from '../../../src/core/errors.js';

const HOSTILE_PATH = 'docs/</script><script>alert(1)</script>.md';

function pageData(withEmbedded = true): MapPageData {
  const vectors = Float32Array.from([1, 0, 0, 1]);
  const embedded = withEmbedded
    ? buildEmbeddedQueryData({
        count: 2,
        dimensions: 2,
        fileVectors: vectors,
        terms: ['alpha'],
        termVectors: Float32Array.from([1, 0]),
        globalWeights: [1],
        localWeighting: 'log1p',
        quick: { mean: [0.5, 0.5], axes: [1, 0, 0, 1], frame: fitFrame(Float64Array.from([0, 1]), Float64Array.from([0, 1])) },
      })
    : null;
  return buildMapPageData(
    {
      count: 2,
      dimensions: 2,
      vectors,
      paths: [HOSTILE_PATH, 'b\u2028c.md'],
      tokenCounts: [5, 6],
      topicIds: [0, 0],
      topicLabels: ['<b>bold</b> topic'],
      topTerms: [['alpha'], ['beta']],
      singularValues: Float64Array.from([1, 0.5]),
      k: 1,
      totalEnergy: 2,
    },
    { quick: { x: [0, 1], y: [0, 1] }, faithful: null },
    embedded,
    { title: 'Map & "notes"' },
  );
}

const SCRIPT = 'console.log("</script>"); var a = 1 <!--2;';

describe('buildStandaloneHtml', () => {
  const html = buildStandaloneHtml({ script: SCRIPT, styles: 'body{color:red}</style><i>', data: pageData() });

  it('locks the page down: default-src none, nonce-only script and style, no network', () => {
    const csp = /http-equiv="Content-Security-Policy" content="([^"]+)"/.exec(html)?.[1].replace(/&#39;/g, "'") ?? '';
    expect(csp).toContain("default-src 'none'");
    const nonce = /'nonce-([^']+)'/.exec(csp)?.[1] ?? '';
    expect(nonce.length).toBeGreaterThanOrEqual(16);
    expect(csp).not.toContain('unsafe-inline');
    expect(csp).not.toContain('unsafe-eval');
    expect(csp).not.toMatch(/connect-src|https?:/);
    // Every executable script and every style element carries the nonce.
    const scripts = [...html.matchAll(/<script([^>]*)>/g)].map((m) => m[1]);
    expect(scripts.filter((a) => !a.includes('application/json')).every((a) => a.includes(`nonce="${nonce}"`))).toBe(true);
    expect(/<style nonce="([^"]+)">/.exec(html)?.[1]).toBe(nonce);
    expect(html).not.toMatch(/\son[a-z]+=/i);
    expect(html).not.toMatch(/(src|href)="https?:/);
  });

  it('escapes everything inlined so no data can close its element', () => {
    expect(html.match(/<\/script>/g)?.length).toBe(2);
    expect(html.match(/<\/style>/g)?.length).toBe(1);
    expect(html).toContain('<title>Map &amp; &quot;notes&quot;</title>');
    const json = new RegExp(`<script type="application/json" id="${MAP_DATA_ELEMENT_ID}">([^]*?)</script>`).exec(html)?.[1] ?? '';
    const back = JSON.parse(json) as MapPageData;
    expect(back.files.paths).toEqual([HOSTILE_PATH, 'b\u2028c.md']);
    expect(back.topicLabels).toEqual(['<b>bold</b> topic']);
  });

  it('is deterministic for the same input, and uses a given nonce', () => {
    expect(buildStandaloneHtml({ script: SCRIPT, styles: '', data: pageData() })).toBe(
      buildStandaloneHtml({ script: SCRIPT, styles: '', data: pageData() }),
    );
    expect(buildStandaloneHtml({ script: SCRIPT, styles: '', data: pageData(), nonce: 'abcdefghijklmnop1234' })).toContain(
      '<script nonce="abcdefghijklmnop1234">',
    );
  });

  it('refuses data without the embedded query data, and a short nonce', () => {
    expect(() => buildStandaloneHtml({ script: '', styles: '', data: pageData(false) })).toThrow(InvalidInputError);
    expect(() => buildStandaloneHtml({ script: '', styles: '', data: pageData(), nonce: 'short' })).toThrow(InvalidInputError);
  });
});

describe('buildMapWebviewHtml', () => {
  it('loads script and style from the webview origin under the same CSP style', () => {
    const html = buildMapWebviewHtml({
      nonce: 'n0nceN0nceN0nce12',
      cspSource: 'https://file+.vscode-resource.example',
      scriptUri: 'https://x/map.js',
      styleUri: 'https://x/map.css',
    });
    expect(html).toContain('<script nonce="n0nceN0nceN0nce12" src="https://x/map.js"></script>');
    expect(mapContentSecurityPolicy({ nonce: 'n', cspSource: 'vs' })).toBe(
      "default-src 'none'; script-src 'nonce-n'; style-src vs 'nonce-n'; img-src vs data:; base-uri 'none'; form-action 'none'",
    );
  });
});
