/// <reference lib="dom" />
/**
 * The page's link to its host. Inside the editor it is the webview API (postMessage out, window
 * 'message' events in). In a standalone file there is no host, so a stand-in answers the same
 * messages from the data embedded in the file: 'ready' → 'init', 'query' → folded locally by the
 * EmbeddedQueryEngine with the engine's own tokenizer, 'open' → 'select'. Either way every
 * outgoing message is also announced as an 'undertone-map-message' DOM event for observers.
 */
import { EmbeddedQueryEngine, type Tokenize } from '../../core/map/embeddedQuery.js';
import { pageDataProblems, type MapPageData } from '../../core/map/mapData.js';
import { isHostToPageMessage, type HostToPageMessage, type PageToHostMessage } from '../../core/map/mapMessages.js';
import { interpolateFromNeighbours } from '../../core/map/neighbourInterpolation.js';
import { MAP_DATA_ELEMENT_ID } from '../../core/map/standaloneHtml.js';
import { NoKnownTermsError } from '../../core/errors.js';

interface WebviewApi {
  postMessage(message: unknown): void;
  getState(): unknown;
  setState(state: unknown): void;
}

declare const acquireVsCodeApi: (() => WebviewApi) | undefined;

export interface MapBridge {
  readonly mode: 'host' | 'standalone';
  post(message: PageToHostMessage): void;
  listen(handler: (message: HostToPageMessage) => void): void;
  loadState(): unknown;
  saveState(state: unknown): void;
}

export const MESSAGE_EVENT = 'undertone-map-message';

function announce(message: PageToHostMessage): void {
  window.dispatchEvent(new CustomEvent(MESSAGE_EVENT, { detail: message }));
}

export function createBridge(tokenize: Tokenize): MapBridge {
  if (typeof acquireVsCodeApi === 'function') return hostBridge(acquireVsCodeApi());
  return standaloneBridge(tokenize);
}

function hostBridge(api: WebviewApi): MapBridge {
  return {
    mode: 'host',
    post(message) {
      announce(message);
      api.postMessage(message);
    },
    listen(handler) {
      window.addEventListener('message', (e: MessageEvent) => {
        if (isHostToPageMessage(e.data)) handler(e.data);
      });
    },
    loadState: () => api.getState(),
    saveState: (s) => api.setState(s),
  };
}

function standaloneBridge(tokenize: Tokenize): MapBridge {
  const handlers: ((m: HostToPageMessage) => void)[] = [];
  const deliver = (m: HostToPageMessage) => setTimeout(() => handlers.forEach((h) => h(m)), 0);
  let data: MapPageData | null = null;
  let engine: EmbeddedQueryEngine | null = null;
  return {
    mode: 'standalone',
    post(message) {
      announce(message);
      switch (message.type) {
        case 'ready': {
          data = readEmbeddedData();
          engine = data.embedded ? new EmbeddedQueryEngine(data.embedded, tokenize) : null;
          deliver({ type: 'init', data });
          break;
        }
        case 'query':
          if (data && engine) deliver(answerQuery(data, engine, message.requestId, message.text));
          break;
        case 'open':
          deliver({ type: 'select', index: message.index });
          break;
        case 'layoutChanged':
        case 'openSection': // a standalone file has no trail
          break;
      }
    },
    listen: (h) => void handlers.push(h),
    loadState: () => null,
    saveState: () => undefined,
  };
}

function readEmbeddedData(): MapPageData {
  const text = document.getElementById(MAP_DATA_ELEMENT_ID)?.textContent ?? '';
  const parsed: unknown = text ? JSON.parse(text) : null;
  const problems = pageDataProblems(parsed);
  if (problems.length > 0) throw new Error(`The map data in this file is damaged: ${problems.join('; ')}`);
  return parsed as MapPageData;
}

function answerQuery(data: MapPageData, engine: EmbeddedQueryEngine, requestId: number, text: string): HostToPageMessage {
  try {
    const r = engine.search(text);
    const distances = Array.from(r.similarities, (s) => Math.sqrt(Math.max(0, 2 - 2 * s)));
    const f = data.layouts.faithful;
    return {
      type: 'queryResult',
      requestId,
      text,
      positions: { quick: r.quick, faithful: f ? interpolateFromNeighbours(f.x, f.y, r.neighbours, distances) : null },
      neighbours: Array.from(r.neighbours),
      similarities: Array.from(r.similarities),
    };
  } catch (e) {
    const message = e instanceof NoKnownTermsError ? e.message : `The query could not be placed: ${(e as Error).message}`;
    return { type: 'queryError', requestId, message };
  }
}
