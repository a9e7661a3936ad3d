// The one way this UI builds DOM. Text goes in through textContent and attributes through
// setAttribute, so corpus-derived strings (terms, previews, file names) are never parsed as
// HTML. Attributes that can run code or load something are refused outright: even our own
// code should not put data there.

export type Child = Node | string | null | undefined | false;

export interface ElementProps {
  className?: string;
  text?: string;
  attrs?: Record<string, string | number | boolean | null | undefined>;
}

const refusedAttribute = /^(on|style$|href$|src$|srcdoc$|action$|formaction$|xlink:href$)/i;

export function el<K extends keyof HTMLElementTagNameMap>(
  tag: K,
  props: ElementProps = {},
  children: readonly Child[] = [],
): HTMLElementTagNameMap[K] {
  const node = document.createElement(tag);
  if (props.className) node.className = props.className;
  if (props.attrs) {
    for (const [name, value] of Object.entries(props.attrs)) setSafeAttribute(node, name, value);
  }
  if (props.text !== undefined) node.textContent = props.text;
  for (const child of children) {
    if (child === null || child === undefined || child === false) continue;
    node.append(typeof child === 'string' ? document.createTextNode(child) : child);
  }
  return node;
}

/** setAttribute for attributes that cannot execute or fetch; `false`/null/undefined removes it. */
export function setSafeAttribute(node: Element, name: string, value: string | number | boolean | null | undefined): void {
  if (refusedAttribute.test(name)) throw new Error(`refusing to set attribute ${name}`);
  if (value === false || value === null || value === undefined) node.removeAttribute(name);
  else node.setAttribute(name, value === true ? '' : String(value));
}

/** Replaces all children of `node`. */
export function replaceChildren(node: Element, children: readonly Child[]): void {
  node.replaceChildren(...children.filter((c): c is Node | string => c !== null && c !== undefined && c !== false));
}

let idCounter = 0;
/** A document-unique id for aria-labelledby / aria-describedby links. */
export function uniqueId(prefix: string): string {
  idCounter += 1;
  return `${prefix}-${idCounter}`;
}
