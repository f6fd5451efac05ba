/**
 * HTML shells for the map page, both locked down the same way: a Content Security Policy that
 * starts from default-src 'none', allows scripts only with the page's nonce, no inline event
 * handlers, no eval, no network (no connect-src), and images only from data: URLs. The page's
 * script builds its own DOM, so a shell is just a root element plus the script and stylesheet.
 * The editor webview loads script and style from its resource origin (cspSource); the standalone
 * file inlines both (standaloneHtml.ts).
 */

export interface CspOptions {
  readonly nonce: string;
  /** The webview's resource origin; absent for the standalone file. */
  readonly cspSource?: string;
}

export function mapContentSecurityPolicy(o: CspOptions): string {
  const style = o.cspSource ? `${o.cspSource} 'nonce-${o.nonce}'` : `'nonce-${o.nonce}'`;
  const img = o.cspSource ? `${o.cspSource} data:` : 'data:';
  return [
    "default-src 'none'",
    `script-src 'nonce-${o.nonce}'`,
    `style-src ${style}`,
    `img-src ${img}`,
    "base-uri 'none'",
    "form-action 'none'",
  ].join('; ');
}

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] as string);
}

export interface WebviewHtmlOptions {
  readonly nonce: string;
  readonly cspSource: string;
  readonly scriptUri: string;
  readonly styleUri: string;
  /** @default 'Concept map' */
  readonly title?: string;
}

/** The editor webview's HTML; the host sends the data afterwards with an 'init' message. */
export function buildMapWebviewHtml(o: WebviewHtmlOptions): string {
  const title = escapeHtml(o.title ?? 'Concept map');
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="${escapeHtml(mapContentSecurityPolicy(o))}">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${title}</title>
<link rel="stylesheet" href="${escapeHtml(o.styleUri)}" nonce="${escapeHtml(o.nonce)}">
</head>
<body>
<div id="undertone-map" data-mode="host"></div>
<script nonce="${escapeHtml(o.nonce)}" src="${escapeHtml(o.scriptUri)}"></script>
</body>
</html>
`;
}
