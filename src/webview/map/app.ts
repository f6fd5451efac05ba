/// <reference lib="dom" />
/**
 * The map page: toolbar (Map / Spectrum tabs, search box, Quick / Faithful layout switch, Fit),
 * the map canvas with tooltip, topic legend and status line, and the spectrum chart. The host may
 * send the active file's sections as a trail (a line through their points in reading order); a
 * point shows its title and lines on hover and opens the file there on click. State that
 * matters to tests and assistive tech is mirrored on the root element as data-* attributes.
 */
import type { LayoutName, MapPageData } from '../../core/map/mapData.js';
import type { HostToPageMessage, MapPoint, PageTrail } from '../../core/map/mapMessages.js';
import type { MapBridge } from './bridge.js';
import { el, formatCount } from './dom.js';
import { Legend } from './legend.js';
import { RegionLabelLayer } from './regionLabelLayer.js';
import { spectrumGuidance } from '../../core/map/spectrumGuidance.js';
import { MapCanvas } from './mapCanvas.js';
import { baseRadius, type MapScene } from './mapRenderer.js';
import { SpectrumChart } from './spectrumChart.js';
import { readTheme, watchTheme, type MapTheme } from './theme.js';
import { buildToolbar, type Tab } from './toolbar.js';
import { Tooltip } from './tooltip.js';
import { firstLevelView, hasSubTopics, pathTo, subTopicView, type TopicLevelView } from './topicZoom.js';

interface SavedState {
  readonly layout?: LayoutName;
  readonly tab?: Tab;
}
interface QueryState {
  readonly text: string;
  readonly positions: { readonly quick: MapPoint | null; readonly faithful: MapPoint | null };
  readonly neighbours: number[];
  readonly similarities: number[];
}

export class MapApp {
  private readonly n: number;
  private layout: LayoutName;
  private tab: Tab;
  private theme: MapTheme;
  private readonly scene: MapScene;
  private readonly canvas: MapCanvas;
  private readonly spectrum: SpectrumChart;
  private legend: Legend;
  private view: TopicLevelView;
  private readonly zoomBar = el('div', { className: 'um-zoom', attrs: { 'aria-live': 'polite' } });
  private readonly tooltip: Tooltip;
  private readonly status = el('span', { className: 'um-status-text' });
  private readonly statusPath = el('span', { className: 'um-status-path' });
  private readonly layoutButtons: Record<LayoutName, HTMLButtonElement>;
  private readonly tabButtons: Record<Tab, HTMLButtonElement>;
  private readonly panels: Record<Tab, HTMLElement>;
  private query: QueryState | null = null;
  private trail: PageTrail | null = null;
  private nextRequest = 1;
  private pendingRequest = 0;
  private disposed = false;

  constructor(
    private readonly root: HTMLElement,
    private readonly data: MapPageData,
    private readonly bridge: MapBridge,
  ) {
    this.n = data.files.paths.length;
    const saved = (bridge.loadState() ?? {}) as SavedState;
    this.layout = saved.layout === 'quick' || data.layouts.faithful === null ? 'quick' : 'faithful';
    this.tab = saved.tab === 'spectrum' ? 'spectrum' : 'map';
    this.view = firstLevelView(data.files.topicIds, data.topicLabels, data.topicTree);
    this.theme = readTheme(root, data.topicLabels.length);

    const start = this.positions(this.layout);
    const topicIds = Int32Array.from(data.files.topicIds);
    this.scene = {
      x: Float32Array.from(start.x),
      y: Float32Array.from(start.y),
      radius: Float32Array.from(data.files.tokenCounts, (t) => baseRadius(t, this.n)),
      topicIds,
      groups: groupByTopic(topicIds, data.topicLabels.length),
      selected: null,
      hovered: null,
      focusTopic: null,
      query: null,
    };

    const toolbar = buildToolbar(data.title, {
      tab: (t) => this.showTab(t),
      layout: (name) => this.switchLayout(name),
      query: (text) => this.submitQuery(text),
      fit: () => this.canvas.fit(),
    });
    this.tabButtons = toolbar.tabs;
    this.layoutButtons = toolbar.layouts;

    const mapCanvas = el('canvas', {
      className: 'um-map-canvas',
      attrs: {
        tabindex: '0',
        role: 'img',
        'aria-label': `Concept map of ${this.n} files. Scroll to zoom, drag to pan, click a dot to open its file.`,
      },
    });
    const mapPanel = el('section', { className: 'um-panel um-map-panel', attrs: { role: 'tabpanel', 'aria-label': 'Map' } }, [
      mapCanvas,
      // One line at the bottom: the status shrinks (ellipsis, full text on hover) and never runs over the hint.
      el('div', { className: 'um-footer' }, [
        el('div', { className: 'um-status', attrs: { 'aria-live': 'polite' } }, [this.status, this.statusPath]),
        el('div', { className: 'um-hint', text: 'Scroll to zoom · drag to pan · click a dot to open' }),
      ]),
    ]);
    this.tooltip = new Tooltip(mapPanel);
    this.scene.labels = this.regionLabels(this.view.labels);
    this.legend = this.makeLegend();
    mapPanel.append(this.zoomBar, this.legend.element);
    this.zoomBar.hidden = true;
    const spectrumCanvas = el('canvas', { attrs: { role: 'img', 'aria-label': 'Singular value spectrum' } });
    const caption = el('div', { className: 'um-spectrum-caption' });
    const spectrumPanel = el(
      'section',
      { className: 'um-panel um-spectrum-panel', attrs: { role: 'tabpanel', 'aria-label': 'Spectrum' } },
      [spectrumCanvas, caption],
    );
    this.panels = { map: mapPanel, spectrum: spectrumPanel };
    mapPanel.hidden = this.tab !== 'map';
    spectrumPanel.hidden = this.tab !== 'spectrum';
    root.append(toolbar.element, mapPanel, spectrumPanel);

    this.canvas = new MapCanvas(mapCanvas, this.scene, this.theme, {
      hover: (i, cx, cy) => this.hover(i, cx, cy),
      click: (i) => this.click(i),
      hoverTrail: (i, cx, cy) => this.hoverTrail(i, cx, cy),
      clickTrail: (i) => this.bridge.post({ type: 'openSection', point: i }),
    });
    const { singularValues, totalEnergy, k } = data.spectrum;
    this.spectrum = new SpectrumChart(spectrumCanvas, singularValues, totalEnergy, k, this.theme);
    const guidance = spectrumGuidance(singularValues, totalEnergy, k);
    caption.append(
      el('p', { className: 'um-spectrum-guidance', text: guidance.summary }),
      el('p', { text: guidance.advice }),
      el('p', {
        className: 'um-spectrum-legend',
        text: `Bars: the ${singularValues.length} singular values computed for the weighted term–document matrix. Line: the share of its energy (Σσ²/‖A‖²F) kept by the first k concepts.`,
      }),
    );
    this.legend.setColours(
      (t) => this.colourOf(t),
      (t) => this.shapeOf(t),
    );
    watchTheme(() => this.refreshTheme());
    this.showTab(this.tab);
    this.updateLayoutButtons();
    this.setStatus(this.summary());
    root.dataset.files = String(this.n);
  }

  receive(m: HostToPageMessage): void {
    if (this.disposed) return;
    switch (m.type) {
      case 'init':
        break;
      case 'layout':
        (this.data.layouts as { quick: unknown; faithful: unknown })[m.name] = m.layout;
        this.updateLayoutButtons();
        if (m.name === this.layout) this.canvas.showLayout(m.layout.x, m.layout.y, true);
        break;
      case 'queryResult':
        if (m.requestId !== this.pendingRequest) return;
        this.query = m;
        this.applyQuery(true);
        break;
      case 'queryError':
        if (m.requestId !== this.pendingRequest) return;
        this.query = null;
        this.applyQuery(false);
        this.setStatus(m.message);
        break;
      case 'select':
        this.select(m.index, false);
        break;
      case 'theme':
        this.refreshTheme();
        break;
      case 'trail':
        this.trail = m.trail;
        this.applyTrail();
        break;
    }
  }

  /** Puts the trail on the layout shown (each point where its section was placed on it). */
  private applyTrail(): void {
    const points = this.trail?.points ?? [];
    const at = points.map((p) => p[this.layout] ?? p.quick);
    this.scene.trail = points.length ? { x: Float32Array.from(at, (p) => p.x), y: Float32Array.from(at, (p) => p.y) } : null;
    this.scene.trailHovered = null;
    this.root.dataset.trail = String(points.length);
    if (!this.query) this.setStatus(this.summary());
    this.canvas.requestDraw();
  }

  private hoverTrail(i: number | null, clientX: number, clientY: number): void {
    const trail = this.trail;
    if (i === null || !trail) {
      if ((this.scene.trailHovered ?? null) !== null) {
        this.scene.trailHovered = null;
        this.tooltip.hide();
        this.canvas.requestDraw();
      }
      return;
    }
    if (this.scene.trailHovered !== i) {
      this.scene.trailHovered = i;
      this.canvas.requestDraw();
    }
    const p = trail.points[i];
    this.tooltip.showSection(
      { title: p.title, start: p.start, end: p.end, path: trail.path, n: i + 1, of: trail.points.length },
      clientX,
      clientY,
    );
  }

  dispose(): void {
    this.disposed = true;
  }

  private positions(name: LayoutName): { x: number[]; y: number[] } {
    return this.data.layouts[name] ?? this.data.layouts.quick;
  }

  private showTab(tab: Tab): void {
    this.tab = tab;
    for (const t of ['map', 'spectrum'] as const) {
      this.panels[t].hidden = t !== tab;
      this.tabButtons[t].setAttribute('aria-selected', String(t === tab));
    }
    this.root.dataset.tab = tab;
    if (tab === 'spectrum') this.spectrum.draw();
    else this.canvas.requestDraw();
    this.save();
  }

  private switchLayout(name: LayoutName): void {
    if (name === this.layout || this.data.layouts[name] === null) return;
    this.layout = name;
    const p = this.positions(name);
    this.canvas.showLayout(p.x, p.y, true);
    this.applyQuery(false);
    this.applyTrail();
    this.updateLayoutButtons();
    this.bridge.post({ type: 'layoutChanged', layout: name });
    this.setStatus(this.summary());
    this.save();
  }

  private updateLayoutButtons(): void {
    for (const name of ['quick', 'faithful'] as const) {
      const b = this.layoutButtons[name];
      b.setAttribute('aria-pressed', String(name === this.layout));
      b.disabled = this.data.layouts[name] === null;
    }
    this.root.dataset.layout = this.layout;
  }

  private submitQuery(text: string): void {
    this.pendingRequest = text ? this.nextRequest++ : 0;
    if (!text) {
      this.query = null;
      this.applyQuery(false);
      this.setStatus(this.summary());
      return;
    }
    this.setStatus(`Placing “${text}”…`);
    this.bridge.post({ type: 'query', requestId: this.pendingRequest, text });
  }

  private applyQuery(reveal: boolean): void {
    const q = this.query;
    const at = q ? q.positions[this.layout] : null;
    this.scene.query = q && at ? { x: at.x, y: at.y, neighbours: q.neighbours } : null;
    this.root.dataset.queryPlaced = String(this.scene.query !== null);
    if (q && at) {
      const best = q.neighbours[0];
      // The rings are search's own ranking (the worker ranks them as a search does), so the first is search's first answer.
      const near =
        best === undefined ? 'no matching files' : `best: ${this.data.files.paths[best]} (score ${q.similarities[0].toFixed(2)})`;
      const shown = q.text.length > 32 ? `${q.text.slice(0, 31)}…` : q.text;
      this.setStatus(`“${shown}” placed · ringed: its ${q.neighbours.length} best search results · ${near}`);
      const sx = this.canvas.vp.sx(at.x);
      const sy = this.canvas.vp.sy(at.y);
      if (reveal && (sx < 0 || sy < 0 || sx > this.canvas.vp.width || sy > this.canvas.vp.height))
        this.canvas.vp.pan(this.canvas.vp.width / 2 - sx, this.canvas.vp.height / 2 - sy);
    }
    this.canvas.requestDraw();
  }

  private hover(i: number | null, clientX: number, clientY: number): void {
    if (this.scene.hovered !== i) {
      this.scene.hovered = i;
      this.canvas.requestDraw();
    }
    if (i === null) return this.tooltip.hide();
    const t = this.view.topicIds[i];
    this.tooltip.show(
      {
        path: this.data.files.paths[i],
        topic: t >= 0 ? this.view.labels[t] : this.view.focus === null ? 'No topic' : 'Outside this topic',
        colour: this.colourOf(t),
        tokens: this.data.files.tokenCounts[i],
        terms: this.data.files.topTerms[i],
      },
      clientX,
      clientY,
    );
  }

  private click(i: number | null): void {
    this.select(i, true);
    if (i !== null) this.bridge.post({ type: 'open', index: i, path: this.data.files.paths[i] });
  }

  private select(i: number | null, fromClick: boolean): void {
    this.scene.selected = i !== null && i >= 0 && i < this.n ? i : null;
    this.root.dataset.selected = this.scene.selected === null ? '' : String(this.scene.selected);
    this.statusPath.textContent = this.scene.selected === null ? '' : this.data.files.paths[this.scene.selected];
    if (this.scene.selected !== null && !fromClick) {
      const vp = this.canvas.vp;
      const sx = vp.sx(this.scene.x[this.scene.selected]);
      const sy = vp.sy(this.scene.y[this.scene.selected]);
      if (sx < 0 || sy < 0 || sx > vp.width || sy > vp.height) this.canvas.reveal(this.scene.selected);
    }
    this.canvas.requestDraw();
  }

  private refreshTheme(): void {
    this.theme = readTheme(this.root, this.view.labels.length);
    this.canvas.setTheme(this.theme);
    this.spectrum.setTheme(this.theme);
    this.legend.setColours(
      (t) => this.colourOf(t),
      (t) => this.shapeOf(t),
    );
  }

  private shapeOf(topic: number): number {
    return topic >= 0 ? (this.theme.shapes[topic] ?? 0) : 0;
  }

  private colourOf(topic: number): string {
    return topic >= 0 ? this.theme.topics[topic] : this.theme.unassigned;
  }

  private legendEntries() {
    const counts = new Map<number, number>();
    for (const t of this.view.topicIds) counts.set(t, (counts.get(t) ?? 0) + 1);
    const none = this.view.focus === null ? 'No topic' : 'Outside this topic';
    return [...counts].map(([topic, count]) => ({ topic, count, label: topic >= 0 ? this.view.labels[topic] : none }));
  }

  /** Each topic's words over its region (the labels of the level shown). */
  private regionLabels(labels: readonly string[]): RegionLabelLayer {
    const style = getComputedStyle(this.root);
    return new RegionLabelLayer(labels, `600 12px ${style.getPropertyValue('--um-font').trim() || 'sans-serif'}`, (shown) => {
      const value = shown.join(' | ');
      if (this.root.dataset.regionLabels !== value) this.root.dataset.regionLabels = value;
    });
  }

  private makeLegend(): Legend {
    const tree = this.data.topicTree;
    const opens = (topic: number) => topic >= 0 && this.view.nodes !== null && hasSubTopics(tree, this.view.nodes[topic]);
    return new Legend(
      this.legendEntries(),
      (topic) => {
        this.scene.focusTopic = topic;
        this.canvas.requestDraw();
      },
      { opens, open: (topic) => this.zoomTo(this.view.nodes![topic]) },
    );
  }

  /** Colours the map by the sub-topics of a tree node (null: the first level). */
  private zoomTo(node: number | null): void {
    const tree = this.data.topicTree;
    if (!tree) return;
    this.view = node === null ? firstLevelView(this.data.files.topicIds, this.data.topicLabels, tree) : subTopicView(tree, node);
    const scene = this.scene as { topicIds: Int32Array; groups: readonly Int32Array[]; focusTopic: number | null };
    scene.topicIds = this.view.topicIds;
    scene.groups = groupByTopic(this.view.topicIds, this.view.labels.length);
    scene.focusTopic = null;
    this.scene.labels = this.regionLabels(this.view.labels);
    const legend = this.makeLegend();
    this.legend.element.replaceWith(legend.element);
    this.legend = legend;
    this.refreshTheme();
    this.zoomBar.replaceChildren();
    this.zoomBar.hidden = node === null;
    if (node !== null) {
      const back = el('button', { className: 'um-zoom-back', text: '← All topics', attrs: { type: 'button' } });
      back.addEventListener('click', () => this.zoomTo(null));
      const trail = pathTo(tree, node).map((n) => tree.labels[n]);
      this.zoomBar.append(back, el('span', { className: 'um-zoom-path', text: trail.join(' › ') }));
    }
    this.root.dataset.zoom = node === null ? '' : String(node);
    this.setStatus(this.summary());
    this.canvas.requestDraw();
  }

  private summary(): string {
    const topics = this.view.labels.length;
    const method = this.layout === 'faithful' ? 'faithful layout (landmark Isomap)' : 'quick layout (principal axes)';
    const level = this.view.focus === null ? `${topics} topics` : `${topics} sub-topics of one topic`;
    const t = this.trail;
    const trail = t && t.points.length ? ` · trail: ${t.points.length} sections of ${t.path.split('/').pop()}` : '';
    return `${formatCount(this.n)} files · ${level} · ${method}${trail}`;
  }

  private setStatus(text: string): void {
    this.status.textContent = text;
    this.status.title = text;
  }

  private save(): void {
    this.bridge.saveState({ layout: this.layout, tab: this.tab } satisfies SavedState);
  }
}

function groupByTopic(topicIds: Int32Array, topicCount: number): Int32Array[] {
  const counts = new Int32Array(topicCount + 1);
  for (const t of topicIds) counts[t >= 0 && t < topicCount ? t : topicCount]++;
  const groups = Array.from(counts, (c) => new Int32Array(c));
  const fill = new Int32Array(topicCount + 1);
  for (let i = 0; i < topicIds.length; i++) {
    const g = topicIds[i] >= 0 && topicIds[i] < topicCount ? topicIds[i] : topicCount;
    groups[g][fill[g]++] = i;
  }
  return groups;
}
