/// <reference lib="dom" />
/**
 * Entry point of the map page (bundled to media/map/map.js by scripts/build-map-page.mjs). Finds
 * the root element, connects to the host (or the standalone stand-in, which folds queries with
 * the engine's tokenizer), and starts the app once the data arrives.
 */
import { tokenize } from '../../core/text/tokenize.js';
import { MapApp } from './app.js';
import { createBridge } from './bridge.js';
import { el } from './dom.js';

function start(): void {
  const root = document.getElementById('undertone-map') ?? document.body.appendChild(el('div', { attrs: { id: 'undertone-map' } }));
  root.replaceChildren(el('div', { className: 'um-loading', text: 'Loading the concept map…' }));
  try {
    const bridge = createBridge((text) => tokenize(text));
    let app: MapApp | null = null;
    bridge.listen((m) => {
      if (m.type === 'init') {
        app?.dispose();
        root.replaceChildren();
        app = new MapApp(root, m.data, bridge);
      } else {
        app?.receive(m);
      }
    });
    bridge.post({ type: 'ready' });
  } catch (e) {
    root.replaceChildren(el('div', { className: 'um-error', text: (e as Error).message }));
  }
}

if (document.readyState === 'loading') document.addEventListener('DOMContentLoaded', start);
else start();
