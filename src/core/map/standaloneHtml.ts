/**
 * One self-contained, offline HTML file of the concept map: the bundled page script and its
 * stylesheet inlined under the same locked-down CSP as the editor webview (mapHtml.ts), and the
 * map data (with the embedded query data, so the page can answer searches alone) in a JSON data
 * block the script reads. Everything inlined is escaped so no text in the data (a file path such
 * as "</script>") can end its element early.
 *
 * The nonce of a static file is not a secret (it is in the file); it still marks exactly which
 * inline script and style the page may run. By default it is derived from the content (FNV-1a),
 * so the same input gives the same file.
 */
import { InvalidInputError } from '../errors.js';
import type { MapPageData } from './mapData.js';
import { escapeHtml, mapContentSecurityPolicy } from './mapHtml.js';

export interface StandaloneHtmlInput {
  /** The bundled page script (media/map/map.js). */
  readonly script: string;
  /** The page stylesheet (media/map/map.css). */
  readonly styles: string;
  readonly data: MapPageData;
  readonly nonce?: string;
}

export const MAP_DATA_ELEMENT_ID = 'undertone-map-data';

export function buildStandaloneHtml(input: StandaloneHtmlInput): string {
  if (input.data.embedded === null) {
    throw new InvalidInputError('a standalone map needs embedded query data so its search box works without a host');
  }
  const json = JSON.stringify(input.data)
    .replace(/</g, '\\u003c')
    .replace(/\u2028/g, '\\u2028')
    .replace(/\u2029/g, '\\u2029');
  const script = input.script.replace(/<\/(script)/gi, '<\\/$1').replace(/<!--/g, '<\\!--');
  const styles = input.styles.replace(/<\/(style)/gi, '<\\/$1');
  const nonce = input.nonce ?? contentNonce(script, styles, json);
  if (!/^[A-Za-z0-9+/=_-]{16,}$/.test(nonce)) throw new InvalidInputError('a nonce must be at least 16 base64 characters');
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="${escapeHtml(mapContentSecurityPolicy({ nonce }))}">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(input.data.title)}</title>
<style nonce="${nonce}">
${styles}
</style>
</head>
<body>
<div id="undertone-map" data-mode="standalone"></div>
<script type="application/json" id="${MAP_DATA_ELEMENT_ID}">${json}</script>
<script nonce="${nonce}">
${script}
</script>
</body>
</html>
`;
}

/** 128-bit FNV-1a-style digest of the parts as 22 base64url characters (four 32-bit lanes). */
function contentNonce(...parts: string[]): string {
  const lanes = [0x811c9dc5, 0x01000193, 0x9e3779b9, 0x85ebca6b];
  for (const part of parts) {
    for (let i = 0; i < part.length; i++) {
      const c = part.charCodeAt(i);
      for (let l = 0; l < 4; l++) lanes[l] = Math.imul(lanes[l] ^ (c + l), 0x01000193) >>> 0;
    }
  }
  const alphabet = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_';
  let out = '';
  for (const lane of lanes) {
    let v = lane;
    for (let j = 0; j < 6; j++) {
      out += alphabet[v & 63];
      v >>>= 6;
    }
  }
  return out.slice(0, 22);
}
