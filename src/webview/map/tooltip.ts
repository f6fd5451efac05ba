/// <reference lib="dom" />
/** The hover card for one file (path, topic with its colour, length and top terms) or one section of the trail. */
import { el, formatCount } from './dom.js';

export interface TooltipContent {
  readonly path: string;
  readonly topic: string;
  readonly colour: string;
  readonly tokens: number;
  readonly terms: readonly string[];
}

export class Tooltip {
  readonly element = el('div', { className: 'um-tooltip', attrs: { role: 'tooltip', id: 'um-tooltip' } });

  constructor(private readonly container: HTMLElement) {
    this.element.hidden = true;
    container.append(this.element);
  }

  show(c: TooltipContent, clientX: number, clientY: number): void {
    const swatch = el('span', { className: 'um-swatch' });
    swatch.style.background = c.colour;
    this.element.replaceChildren(
      el('div', { className: 'um-tooltip-path', text: c.path }),
      el('div', { className: 'um-tooltip-topic' }, [swatch, el('span', { text: `${c.topic} · ${formatCount(c.tokens)} tokens` })]),
      el(
        'div',
        { className: 'um-tooltip-terms' },
        c.terms.map((t) => el('span', { className: 'um-chip', text: t })),
      ),
    );
    this.place(clientX, clientY);
  }

  /** A section of the active file's trail: its title, line range, file and place in reading order. */
  showSection(
    s: { title: string; start: number; end: number; path: string; n: number; of: number },
    clientX: number,
    clientY: number,
  ): void {
    this.element.replaceChildren(
      el('div', { className: 'um-tooltip-path', text: s.title }),
      el('div', { className: 'um-tooltip-topic', text: `lines ${s.start + 1}–${s.end} · section ${s.n} of ${s.of}` }),
      el('div', { className: 'um-tooltip-terms', text: s.path }),
    );
    this.place(clientX, clientY);
  }

  private place(clientX: number, clientY: number): void {
    this.element.hidden = false;
    const box = this.container.getBoundingClientRect();
    const w = this.element.offsetWidth;
    const h = this.element.offsetHeight;
    let left = clientX - box.left + 14;
    let top = clientY - box.top + 14;
    if (left + w > box.width - 6) left = Math.max(6, clientX - box.left - w - 14);
    if (top + h > box.height - 6) top = Math.max(6, clientY - box.top - h - 14);
    this.element.style.left = `${left}px`;
    this.element.style.top = `${top}px`;
  }

  hide(): void {
    this.element.hidden = true;
  }
}
