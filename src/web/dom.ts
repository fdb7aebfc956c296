/**
 * Small DOM helpers for the page: building elements without HTML strings (user text never becomes
 * markup), showing an error in plain words, placing the library's SVG figure safely under the
 * page's Content-Security-Policy, copying to the clipboard and saving a file, all without a
 * network request.
 */
import type { PlainError } from './protocol.js';

type Child = Node | string | null | undefined | false;

/**
 * Create an element with attributes and children; text children become text nodes.
 *
 * @example
 * ```ts
 * h('p', { class: 'note' }, 'd = ', h('strong', {}, '1.23'));
 * ```
 */
export function h<K extends keyof HTMLElementTagNameMap>(
  tag: K, attrs: Record<string, string | boolean | number | undefined> = {}, ...children: Child[]
): HTMLElementTagNameMap[K] {
  const el = document.createElement(tag);
  for (const [name, value] of Object.entries(attrs)) {
    if (value === undefined || value === false) continue;
    el.setAttribute(name, value === true ? '' : String(value));
  }
  for (const c of children) if (c !== null && c !== undefined && c !== false) el.append(c);
  return el;
}

/**
 * Text with the trade's notation set as symbols: d_L, d_U, d_4 with subscripts, <= and >= as
 * the signs ≤ and ≥ (the text stays text: no markup is parsed).
 *
 * @example
 * ```ts
 * h('p', {}, ...symbolText('d <= d_L')); // d ≤ d<sub>L</sub>
 * ```
 */
export function symbolText(text: string): (Node | string)[] {
  const out: (Node | string)[] = [];
  const re = /\b([dk])_(L|U|\d+)\b/g;
  const signs = (s: string) => s.replace(/<=/g, '\u2264').replace(/>=/g, '\u2265');
  let last = 0;
  for (const m of text.matchAll(re)) {
    out.push(signs(text.slice(last, m.index)));
    const sub = document.createElement('sub');
    sub.textContent = m[2];
    const i = document.createElement('i');
    i.textContent = m[1];
    const span = document.createElement('span');
    span.append(i, sub);
    out.push(span);
    last = (m.index ?? 0) + m[0].length;
  }
  out.push(signs(text.slice(last)));
  return out.filter((c) => c !== '');
}

/** The element with this id (the page's own markup guarantees it exists). */
export function byId<T extends HTMLElement = HTMLElement>(id: string): T {
  const el = document.getElementById(id);
  if (!el) throw new Error(`The page has no element #${id}.`);
  return el as T;
}

/** Show an error (message, then what to do) in a box, or hide the box with null. */
export function showError(box: HTMLElement, error: PlainError | null): void {
  box.replaceChildren();
  box.hidden = error === null;
  if (!error) return;
  box.append(h('p', { class: 'error-message' }, error.message));
  if (error.hint) box.append(h('p', { class: 'error-hint' }, error.hint));
}

const SVG_NS = 'http://www.w3.org/2000/svg';
const FIGURE_SHEET = ':host { display: block; } svg { display: block; width: 100%; height: auto; max-width: 100%; }';

/**
 * Place an SVG document (from the library's renderer) into `host`, inside a shadow root so that
 * its own styles stay with it. Scripts, event handlers, foreign objects and outside links are
 * dropped; style attributes and style elements are applied through the CSS object model, which the
 * page's strict policy (no inline style) allows. Returns false when the text is not an SVG.
 */
export function placeSvg(host: HTMLElement, svgText: string): boolean {
  const doc = new DOMParser().parseFromString(svgText, 'image/svg+xml');
  const root = doc.documentElement;
  if (root.namespaceURI !== SVG_NS || root.localName !== 'svg' || doc.getElementsByTagName('parsererror').length > 0) return false;
  const sheets: CSSStyleSheet[] = [];
  const sheet = new CSSStyleSheet();
  sheet.replaceSync(FIGURE_SHEET);
  sheets.push(sheet);
  for (const el of Array.from(root.querySelectorAll('script, foreignObject, iframe, object, embed'))) el.remove();
  for (const el of Array.from(root.querySelectorAll('style'))) {
    const s = new CSSStyleSheet();
    s.replaceSync((el.textContent ?? '').replace(/@import[^;]*;/g, ''));
    sheets.push(s);
    el.remove();
  }
  const styled: { path: number[]; css: string }[] = [];
  const walk = (el: Element, path: number[]): void => {
    for (const attr of Array.from(el.attributes)) {
      const name = attr.name.toLowerCase();
      if (name.startsWith('on')) el.removeAttribute(attr.name);
      else if ((name === 'href' || name === 'xlink:href') && !attr.value.startsWith('#')) el.removeAttribute(attr.name);
      else if (name === 'style') { styled.push({ path, css: attr.value }); el.removeAttribute(attr.name); }
    }
    Array.from(el.children).forEach((c, i) => walk(c, [...path, i]));
  };
  walk(root, []);
  const svg = document.importNode(root, true) as unknown as SVGSVGElement;
  for (const { path, css } of styled) {
    let el: Element = svg;
    for (const i of path) el = el.children[i];
    (el as SVGElement).style.cssText = css;
  }
  const shadow = host.shadowRoot ?? host.attachShadow({ mode: 'open' });
  shadow.adoptedStyleSheets = sheets;
  shadow.replaceChildren(svg);
  return true;
}

/** Copy text to the clipboard; falls back to a selection copy where the clipboard API is refused. */
export async function copyText(text: string): Promise<boolean> {
  try {
    await navigator.clipboard.writeText(text);
    return true;
  } catch {
    const area = h('textarea', { class: 'visually-hidden', readonly: true, 'aria-hidden': 'true' });
    area.value = text;
    document.body.append(area);
    area.select();
    let ok = false;
    try { ok = document.execCommand('copy'); } catch { ok = false; }
    area.remove();
    return ok;
  }
}

/** Offer text as a file to save (a local blob: URL; nothing leaves the computer). */
export function saveText(fileName: string, type: string, text: string): void {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const a = h('a', { href: url, download: fileName, class: 'visually-hidden' });
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}
