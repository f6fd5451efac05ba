/// <reference lib="dom" />
/**
 * Small DOM helpers for the map page. Text always goes in through textContent (never innerHTML),
 * so file paths and terms can never inject markup; no inline handlers or style attributes are
 * written, which keeps the page inside its Content Security Policy.
 */

export interface ElementProps {
  readonly className?: string;
  readonly text?: string;
  readonly attrs?: Readonly<Record<string, string>>;
}

export function el<K extends keyof HTMLElementTagNameMap>(
  tag: K,
  props: ElementProps = {},
  children: readonly (Node | string)[] = [],
): HTMLElementTagNameMap[K] {
  const e = document.createElement(tag);
  if (props.className) e.className = props.className;
  if (props.text !== undefined) e.textContent = props.text;
  for (const [k, v] of Object.entries(props.attrs ?? {})) e.setAttribute(k, v);
  for (const c of children) e.append(c);
  return e;
}

export function formatCount(n: number): string {
  return n.toLocaleString('en-US');
}
