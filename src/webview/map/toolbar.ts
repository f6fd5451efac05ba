/// <reference lib="dom" />
/** The map page's toolbar: title, Map / Spectrum tabs, the search box, the layout switch and Fit. */
import type { LayoutName } from '../../core/map/mapData.js';
import { el } from './dom.js';

export type Tab = 'map' | 'spectrum';

export interface ToolbarHandlers {
  tab(tab: Tab): void;
  layout(name: LayoutName): void;
  /** Submitted text, trimmed ('' clears the query). */
  query(text: string): void;
  fit(): void;
}

export interface Toolbar {
  readonly element: HTMLElement;
  readonly tabs: Record<Tab, HTMLButtonElement>;
  readonly layouts: Record<LayoutName, HTMLButtonElement>;
}

const LAYOUT_TITLES: Record<LayoutName, string> = {
  quick: 'Linear projection on the two main concept axes: instant, may overlap groups',
  faithful: 'Landmark Isomap: keeps neighbourhoods along the shape of the data',
};

export function buildToolbar(title: string, h: ToolbarHandlers): Toolbar {
  const search = el('input', {
    attrs: { type: 'search', placeholder: 'Place a query on the map…', 'aria-label': 'Query', spellcheck: 'false' },
  });
  const form = el('form', { className: 'um-search', attrs: { role: 'search' } }, [
    search,
    el('button', { text: 'Place', attrs: { type: 'submit' } }),
  ]);
  form.addEventListener('submit', (e) => {
    e.preventDefault();
    h.query(search.value.trim());
  });
  search.addEventListener('keydown', (e) => {
    if (e.key === 'Escape') {
      search.value = '';
      h.query('');
    }
  });
  const tab = (t: Tab, label: string) => {
    const b = el('button', { text: label, attrs: { type: 'button', role: 'tab', 'aria-selected': 'false' } });
    b.addEventListener('click', () => h.tab(t));
    return b;
  };
  const layout = (name: LayoutName, label: string) => {
    const b = el('button', { text: label, attrs: { type: 'button', 'aria-pressed': 'false', title: LAYOUT_TITLES[name] } });
    b.addEventListener('click', () => h.layout(name));
    return b;
  };
  const tabs = { map: tab('map', 'Map'), spectrum: tab('spectrum', 'Spectrum') };
  const layouts = { quick: layout('quick', 'Quick'), faithful: layout('faithful', 'Faithful') };
  const fit = el('button', { className: 'um-icon-button', text: 'Fit', attrs: { type: 'button', title: 'Fit the whole map in view (0)' } });
  fit.addEventListener('click', () => h.fit());
  const element = el('header', { className: 'um-toolbar' }, [
    el('span', { className: 'um-title', text: title }),
    el('div', { className: 'um-tabs', attrs: { role: 'tablist' } }, [tabs.map, tabs.spectrum]),
    form,
    el('span', { className: 'um-spacer' }),
    el('div', { className: 'um-segment', attrs: { role: 'group', 'aria-label': 'Layout' } }, [layouts.quick, layouts.faithful]),
    fit,
  ]);
  return { element, tabs, layouts };
}
