/**
 * Building page elements. Everything a user or a file supplies (scenario name, area names, mode
 * names, messages) goes in as a text node, never as markup: this module has no way to set HTML.
 */

type Child = Node | string | null | undefined | false;

export interface ElementOptions {
  class?: string;
  text?: string;
  attrs?: Record<string, string>;
  data?: Record<string, string>;
}

export function el<K extends keyof HTMLElementTagNameMap>(tag: K, options: ElementOptions = {}, ...children: Child[]): HTMLElementTagNameMap[K] {
  const node = document.createElement(tag);
  if (options.class) node.className = options.class;
  if (options.text !== undefined) node.textContent = options.text;
  for (const [name, value] of Object.entries(options.attrs ?? {})) node.setAttribute(name, value);
  for (const [name, value] of Object.entries(options.data ?? {})) node.dataset[name] = value;
  append(node, ...children);
  return node;
}

export function append(parent: Node, ...children: Child[]): void {
  for (const child of children) {
    if (child === null || child === undefined || child === false) continue;
    parent.appendChild(typeof child === 'string' ? document.createTextNode(child) : child);
  }
}

/** Replaces every child of `parent`. */
export function replaceChildren(parent: Element, ...children: Child[]): void {
  parent.replaceChildren();
  append(parent, ...children);
}

/** A unique id for label/field pairs. */
let counter = 0;
export function uniqueId(prefix: string): string {
  counter += 1;
  return `${prefix}-${counter}`;
}
