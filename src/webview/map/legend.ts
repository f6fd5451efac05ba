/// <reference lib="dom" />
/**
 * Topic legend: one row per topic (largest first) with its colour and file count. Hovering a row
 * previews that topic (others fade), clicking pins it, clicking again releases it. A topic with
 * sub-topics (zoom.opens) shows an open button that colours the map by its sub-topics (topicZoom.ts).
 */
import { el, formatCount } from './dom.js';

export interface LegendEntry {
  readonly topic: number;
  readonly label: string;
  readonly count: number;
}

export class Legend {
  readonly element = el('div', { className: 'um-legend', attrs: { role: 'group', 'aria-label': 'Topics' } });
  private pinned: number | null = null;
  private readonly swatches = new Map<number, HTMLElement>();

  constructor(
    entries: readonly LegendEntry[],
    private readonly onFocus: (topic: number | null) => void,
    zoom?: { opens: (topic: number) => boolean; open: (topic: number) => void },
  ) {
    const rows = [...entries].sort((a, b) => b.count - a.count || a.topic - b.topic);
    this.element.append(el('div', { className: 'um-legend-head' }, [el('span', { text: 'Topics' }), el('span', { text: 'Files' })]));
    for (const e of rows) {
      const swatch = el('span', { className: 'um-swatch' });
      this.swatches.set(e.topic, swatch);
      const row = el(
        'button',
        { className: 'um-legend-row', attrs: { type: 'button', 'aria-pressed': 'false', 'data-topic': String(e.topic) } },
        [
          swatch,
          el('span', { className: 'um-legend-label', text: e.label, attrs: { title: e.label } }),
          el('span', { className: 'um-legend-count', text: formatCount(e.count) }),
        ],
      );
      row.addEventListener('mouseenter', () => this.onFocus(e.topic));
      row.addEventListener('mouseleave', () => this.onFocus(this.pinned));
      row.addEventListener('click', () => {
        this.pinned = this.pinned === e.topic ? null : e.topic;
        this.element.querySelectorAll('.um-legend-row').forEach((r) => {
          r.setAttribute('aria-pressed', String(r.getAttribute('data-topic') === String(this.pinned)));
        });
        this.onFocus(this.pinned);
      });
      if (zoom?.opens(e.topic)) {
        const open = el('button', {
          className: 'um-legend-open',
          text: '›',
          attrs: {
            type: 'button',
            title: `Show the sub-topics of ${e.label}`,
            'aria-label': `Show the sub-topics of ${e.label}`,
            'data-open': String(e.topic),
          },
        });
        open.addEventListener('click', (ev) => {
          ev.stopPropagation();
          zoom.open(e.topic);
        });
        row.addEventListener('dblclick', () => zoom.open(e.topic));
        this.element.append(el('div', { className: 'um-legend-line' }, [row, open]));
      } else this.element.append(row);
    }
  }

  setColours(colourOf: (topic: number) => string, shapeOf: (topic: number) => number = () => 0): void {
    for (const [topic, swatch] of this.swatches) {
      swatch.style.background = colourOf(topic);
      swatch.dataset.shape = String(shapeOf(topic));
    }
  }
}
