// Bundles the concept map page (src/webview/map/main.ts) into media/map/map.js with esbuild:
// one IIFE for the browser, no eval, no source map inlined, so it runs under the page's strict CSP.
// Running or importing this module builds the page (the main build imports it); --dev skips minifying.
import { build } from 'esbuild';
import { fileURLToPath } from 'node:url';
import path from 'node:path';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

export async function buildMapPage({ minify = true } = {}) {
  const result = await build({
    entryPoints: [path.join(root, 'src/webview/map/main.ts')],
    outfile: path.join(root, 'media/map/map.js'),
    bundle: true,
    format: 'iife',
    platform: 'browser',
    target: ['es2022', 'chrome114'],
    minify,
    legalComments: 'none',
    sourcemap: false,
    metafile: true,
    logLevel: 'warning',
  });
  const bytes = Object.values(result.metafile.outputs).reduce((s, o) => s + o.bytes, 0);
  return { outfile: 'media/map/map.js', bytes };
}

const { outfile, bytes } = await buildMapPage({ minify: !process.argv.includes('--dev') });
console.log(`map page: ${outfile} (${(bytes / 1024).toFixed(1)} KiB)`);
