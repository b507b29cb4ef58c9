// Small DOM helpers. Every piece of data becomes text (textContent) or an attribute value set
// with setAttribute on an allow-listed attribute: the renderer never parses markup from data.

export function el<K extends keyof HTMLElementTagNameMap>(
  tag: K,
  className?: string,
  text?: string | number | null
): HTMLElementTagNameMap[K] {
  const node = document.createElement(tag);
  if (className) {
    node.className = className;
  }
  if (text !== undefined && text !== null) {
    node.textContent = String(text);
  }
  return node;
}

const SVG_NS = 'http://www.w3.org/2000/svg';

export function svgEl<K extends keyof SVGElementTagNameMap>(
  tag: K,
  attrs: Record<string, string | number>
): SVGElementTagNameMap[K] {
  const node = document.createElementNS(SVG_NS, tag);
  for (const [k, v] of Object.entries(attrs)) {
    node.setAttribute(k, String(v));
  }
  return node;
}

/** An SVG document as an <img> source: shown as a picture, its scripts never run. */
export function svgDataUrl(svg: string): string {
  const bytes = new TextEncoder().encode(svg);
  let binary = '';
  for (let i = 0; i < bytes.length; i += 0x8000) {
    binary += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  }
  return 'data:image/svg+xml;base64,' + btoa(binary);
}

export function table(
  className: string,
  columns: string[],
  rows: Array<Array<string | number | null | undefined>>
): HTMLTableElement {
  const t = el('table', className);
  const head = t.createTHead().insertRow();
  for (const c of columns) {
    const th = el('th', undefined, c);
    th.scope = 'col';
    head.appendChild(th);
  }
  const body = t.createTBody();
  for (const r of rows) {
    const tr = body.insertRow();
    for (const v of r) {
      tr.insertCell().textContent = v === null || v === undefined ? '' : String(v);
    }
  }
  return t;
}

export function fmt(v: unknown, digits = 4): string {
  if (v === null || v === undefined) {
    return '';
  }
  if (typeof v === 'number') {
    if (!Number.isFinite(v)) {
      return '';
    }
    return Math.abs(v) >= 1e5 ? v.toExponential(3) : String(Number(v.toPrecision(digits)));
  }
  return String(v);
}

export interface Cell {
  text: string;
  numeric?: boolean;
  title?: string;
}

/**
 * A data table: numeric columns right-aligned and never wrapped (class cc-num), inside a
 * wrapper that scrolls sideways when the table is wider than the output.
 */
export function dataTable(
  className: string,
  headers: Cell[],
  rows: Array<{ cells: Cell[]; title?: string }>
): HTMLElement {
  const wrap = el('div', 'cc-table-wrap');
  const t = el('table', className);
  const head = t.createTHead().insertRow();
  for (const h of headers) {
    const th = el('th', h.numeric ? 'cc-num' : undefined, h.text);
    th.scope = 'col';
    if (h.title) {
      th.title = h.title;
    }
    head.appendChild(th);
  }
  const body = t.createTBody();
  for (const r of rows) {
    const tr = body.insertRow();
    if (r.title) {
      tr.title = r.title;
    }
    for (const c of r.cells) {
      const td = tr.insertCell();
      td.textContent = c.text;
      if (c.numeric) {
        td.className = 'cc-num';
      }
      if (c.title) {
        td.title = c.title;
      }
    }
  }
  wrap.appendChild(t);
  return wrap;
}
