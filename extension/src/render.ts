// Turning a report payload into DOM. Pure functions of the payload (and of acknowledgements),
// so they are unit-tested without JupyterLab.

import { dataTable, el, svgDataUrl, svgEl } from './dom';
import type { Finding, Report } from './payload';
import {
  ACKNOWLEDGEABLE,
  SEVERITY_ORDER,
  SEVERITY_WORD,
  type Sorted,
  compounds,
  fixText,
  fmtNumber,
  reactionText,
  readableTime,
  roleOf,
  sortFindings,
  stoichTable,
  verdict,
  where
} from './present';

export { ACKNOWLEDGEABLE, SEVERITY_ORDER, SEVERITY_WORD };

/** An acknowledgement of one finding, as stored in the cell metadata. */
export interface Acknowledgement {
  finding: string;
  rule: string;
  who: string;
  when: string;
  note: string;
}

/** A stable key of a finding within a report: rule id, message and atoms. */
export function findingKey(f: Finding): string {
  const atoms = f.atoms.map(a => `${a[0]}:${a[1]}`).join(',');
  let h = 0;
  const s = `${f.rule}|${f.message}|${atoms}`;
  for (let i = 0; i < s.length; i++) {
    h = (Math.imul(31, h) + s.charCodeAt(i)) | 0;
  }
  return `${f.rule}#${(h >>> 0).toString(16)}`;
}

export interface RenderOptions {
  acknowledgements?: Acknowledgement[];
  onAcknowledge?: (finding: Finding, key: string, note: string) => void;
}

/** A button that opens a small form: a note, then Save or Cancel. */
export function ackForm(
  f: Finding,
  key: string,
  onAcknowledge: (finding: Finding, key: string, note: string) => void
): HTMLElement {
  const wrap = el('div', 'cc-ack');
  const button = el('button', 'cc-ack-button', 'Acknowledge…');
  button.type = 'button';
  wrap.appendChild(button);
  button.addEventListener('click', () => {
    button.hidden = true;
    const form = el('div', 'cc-ack-form');
    const note = el('textarea', 'cc-ack-note-input');
    note.rows = 2;
    note.placeholder = 'Why this finding is acceptable (e.g. "3 equiv AlCl3 used, see cell 12")';
    note.setAttribute('aria-label', `Note for ${f.rule}`);
    const save = el('button', 'cc-ack-save', 'Save acknowledgement');
    save.type = 'button';
    const cancel = el('button', 'cc-ack-cancel', 'Cancel');
    cancel.type = 'button';
    save.addEventListener('click', () => onAcknowledge(f, key, note.value.trim()));
    cancel.addEventListener('click', () => {
      form.remove();
      button.hidden = false;
    });
    form.appendChild(note);
    form.appendChild(save);
    form.appendChild(cancel);
    wrap.appendChild(form);
    note.focus();
  });
  return wrap;
}

/** A details element, closed by default. */
function details(className: string, title: string, body: HTMLElement[]): HTMLElement {
  const d = el('details', className);
  d.appendChild(el('summary', 'cc-summary', title));
  for (const b of body) {
    d.appendChild(b);
  }
  return d;
}

function ackLine(ack: Acknowledgement): string {
  const when = ack.when ? `, ${readableTime(ack.when)}` : '';
  return `Acknowledged by ${ack.who || 'a reviewer'}${when}${ack.note ? ': ' + ack.note : ''}`;
}

/** The scheme picture with an overlay on which a finding's atoms are ringed. */
export function renderScheme(report: Report): {
  node: HTMLElement;
  highlight: (f: Finding | null) => void;
} {
  const wrap = el('figure', 'cc-scheme');
  const drawing = report.drawing;
  if (!drawing) {
    wrap.appendChild(el('figcaption', 'cc-muted', reactionText(report)));
    return { node: wrap, highlight: () => undefined };
  }
  const stage = el('div', 'cc-scheme-stage');
  stage.style.width = `${drawing.width}px`;
  const img = el('img', 'cc-scheme-img');
  img.src = svgDataUrl(drawing.scheme_svg);
  img.alt = `reaction scheme: ${reactionText(report)}`;
  img.width = drawing.width;
  img.height = drawing.height;
  stage.appendChild(img);
  const overlay = svgEl('svg', {
    class: 'cc-scheme-overlay',
    viewBox: `0 0 ${drawing.width} ${drawing.height}`,
    preserveAspectRatio: 'xMinYMin meet',
    'aria-hidden': 'true'
  });
  stage.appendChild(overlay);
  wrap.appendChild(stage);
  if ((drawing.centre ?? []).length > 0) {
    wrap.appendChild(el('figcaption', 'cc-muted cc-centre-key', 'The bond formed in the reaction is marked in teal.'));
  }
  const coords = new Map<number, { atoms: number[][]; boxes: Array<number[] | null> }>();
  for (const c of drawing.components) {
    coords.set(c.component, { atoms: c.atoms, boxes: c.label_box ?? [] });
  }
  const highlight = (f: Finding | null): void => {
    while (overlay.firstChild) {
      overlay.removeChild(overlay.firstChild);
    }
    if (!f) {
      return;
    }
    for (const [ci, ai] of f.atoms) {
      const c = coords.get(ci);
      const xy = c?.atoms[ai];
      if (!c || !xy) {
        continue;
      }
      overlay.appendChild(
        svgEl('circle', {
          class: `cc-hl cc-hl-${f.severity}`,
          cx: xy[0],
          cy: xy[1],
          r: ringRadius(xy, c.boxes[ai] ?? null)
        })
      );
    }
  };
  return { node: wrap, highlight };
}

/** A ring wide enough to go round the atom's label box: it never covers the label. */
export function ringRadius(xy: number[], box: number[] | null): number {
  let r = 14;
  if (box) {
    const [x, y, w, h] = box;
    for (const [cx, cy] of [[x, y], [x + w, y], [x, y + h], [x + w, y + h]]) {
      r = Math.max(r, Math.hypot(cx - xy[0], cy - xy[1]) + 4);
    }
  }
  return Math.round(r * 10) / 10;
}

export function renderFindings(
  report: Report,
  highlight: (f: Finding | null) => void,
  options: RenderOptions = {},
  sorted: Sorted = sortFindings(report)
): HTMLElement {
  const section = el('section', 'cc-findings');
  section.appendChild(el('h4', 'cc-h', 'Findings'));
  if (sorted.shown.length === 0) {
    section.appendChild(el('p', 'cc-muted', 'No findings.'));
    return section;
  }
  const acks = new Map<string, Acknowledgement>();
  for (const a of options.acknowledgements ?? []) {
    acks.set(a.finding, a);
  }
  const comps = compounds(report);
  const list = el('ul', 'cc-list');
  for (const f of sorted.shown) {
    const sev = f.severity;
    const key = findingKey(f);
    const ack = acks.get(key);
    const li = el('li', `cc-finding cc-${sev}${ack ? ' cc-acknowledged' : ''}`);
    li.tabIndex = 0;
    li.dataset.rule = f.rule;
    li.dataset.key = key;
    const head = el('div', 'cc-finding-head');
    head.appendChild(el('span', `cc-badge cc-badge-${sev}`, SEVERITY_WORD[sev]));
    head.appendChild(el('strong', 'cc-finding-title', f.title || f.rule));
    head.appendChild(el('code', 'cc-rule', f.rule));
    li.appendChild(head);
    li.appendChild(el('p', 'cc-message', f.message));
    const place = where(f, comps);
    if (place) {
      li.appendChild(el('p', 'cc-atoms', `At ${place}`));
    }
    const fix = fixText(f);
    if (fix) {
      const p = el('p', 'cc-fix');
      p.appendChild(el('strong', undefined, 'Fix: '));
      p.appendChild(document.createTextNode(fix));
      li.appendChild(p);
    }
    if (ack) {
      li.appendChild(el('p', 'cc-ack-note', ackLine(ack)));
    } else if (options.onAcknowledge && ACKNOWLEDGEABLE.includes(sev)) {
      li.appendChild(ackForm(f, key, options.onAcknowledge));
    }
    const on = (): void => highlight(f);
    const off = (): void => highlight(null);
    li.addEventListener('mouseenter', on);
    li.addEventListener('focus', on);
    li.addEventListener('mouseleave', off);
    li.addEventListener('blur', off);
    list.appendChild(li);
  }
  section.appendChild(list);
  return section;
}

export function renderSafety(sorted: Sorted): HTMLElement | null {
  if (sorted.safety.length === 0) {
    return null;
  }
  const s = el('section', 'cc-safety');
  s.appendChild(el('h4', 'cc-h', 'Safety'));
  const ul = el('ul', 'cc-safety-list');
  for (const line of sorted.safety) {
    ul.appendChild(el('li', undefined, line));
  }
  s.appendChild(ul);
  if (sorted.safetySentence) {
    s.appendChild(el('p', 'cc-safety-defer', sorted.safetySentence));
  }
  return s;
}

export function renderComponents(report: Report): HTMLElement {
  const comps = compounds(report);
  return details('cc-components', 'Components', [
    dataTable(
      'cc-table',
      [{ text: 'No.' }, { text: 'Compound' }, { text: 'Role' }, { text: 'As written' }, { text: 'Formula' }, { text: 'M (g/mol)', numeric: true }],
      report.components.map(c => ({
        cells: [
          { text: comps.get(c.index)!.number },
          { text: comps.get(c.index)!.label, title: c.smiles },
          { text: roleOf(c) },
          { text: c.text },
          { text: c.formula },
          { text: c.mw === null ? '' : c.mw.toFixed(2), numeric: true }
        ]
      }))
    )
  ]);
}

export function renderStoichiometry(report: Report): HTMLElement | null {
  const st = stoichTable(report);
  if (!st) {
    return null;
  }
  const s = el('section', 'cc-stoich');
  s.appendChild(el('h4', 'cc-h', 'Stoichiometry'));
  s.appendChild(
    dataTable(
      'cc-table',
      [{ text: 'Compound' }, ...st.columns.map(c => ({ text: c.header, numeric: c.numeric }))],
      st.compounds.map((comp, k) => ({
        title: st.readAs[k] ? `read as ${st.readAs[k]}` : undefined,
        cells: [
          { text: comp.label, title: comp.smiles },
          ...st.columns.map(c => ({ text: c.cells[k], numeric: c.numeric }))
        ]
      }))
    )
  );
  const lines: string[] = [];
  if (st.limiting) {
    lines.push(`Limiting reagent: ${st.limiting}`);
  }
  if (st.concentration) {
    lines.push(`Concentration: ${st.concentration}`);
  }
  const m = report.metrics;
  const green: string[] = [];
  if (m?.atom_economy_pct != null) {
    green.push(`atom economy ${m.atom_economy_pct.toFixed(1)} %`);
  }
  if (m?.pmi != null) {
    green.push(`PMI ${m.pmi.toFixed(1)}`);
  }
  if (m?.e_factor != null) {
    green.push(`E-factor ${m.e_factor.toFixed(1)}`);
  }
  if (green.length) {
    lines.push(`Green metrics: ${green.join(', ')}`);
  }
  for (const line of lines) {
    s.appendChild(el('p', 'cc-muted cc-line', line));
  }
  const read = st.compounds.map((c, k) => [c.label, st.readAs[k]]).filter(x => x[1]);
  if (read.length) {
    const ul = el('ul', 'cc-list cc-read-as-list');
    for (const [label, r] of read) {
      ul.appendChild(el('li', undefined, `${label}: ${r}`));
    }
    s.appendChild(details('cc-read-as', 'How the amounts were read', [ul]));
  }
  return s;
}

export function renderTables(report: Report, sorted: Sorted = sortFindings(report)): HTMLElement[] {
  const out: HTMLElement[] = [];
  const comps = compounds(report);
  const scale = report.scale;
  if (scale && scale.cautions.length > 0) {
    const s = el('section', 'cc-scale');
    s.appendChild(el('h4', 'cc-h', `Scale-up ×${fmtNumber(scale.factor)}: cautions`));
    const ul = el('ul', 'cc-list');
    for (const c of scale.cautions) {
      ul.appendChild(el('li', undefined, c));
    }
    s.appendChild(ul);
    out.push(s);
  }
  const sites = report.basicity ?? [];
  if (sites.length > 0) {
    out.push(
      details('cc-basicity', 'Basicity (pKa of the conjugate acid, water, 25 °C)', [
        dataTable(
          'cc-table',
          [{ text: 'Compound' }, { text: 'Atom' }, { text: 'Nitrogen' }, { text: 'pKa (BH⁺)', numeric: true }, { text: 'Uncertainty', numeric: true }, { text: 'Method' }],
          sites.map(b => {
            const c = comps.get(b.component);
            return {
              cells: [
                { text: c?.label ?? String(b.component), title: c?.smiles },
                { text: `${c?.elements[b.atom] ?? 'atom'} ${b.atom + 1}` },
                { text: b.kind.replace(/_/g, ' ') },
                { text: b.pka === null ? '' : b.pka.toFixed(1), numeric: true },
                { text: b.uncertainty === null ? '' : `±${b.uncertainty.toFixed(1)}`, numeric: true },
                { text: b.method, title: b.source }
              ]
            };
          })
        )
      ])
    );
  }
  const workup = report.workup ?? [];
  if (workup.length > 0) {
    const ul = el('ul', 'cc-list');
    for (const w of workup) {
      ul.appendChild(el('li', undefined, w.message));
    }
    for (const t of report.separations ?? []) {
      ul.appendChild(el('li', undefined, t));
    }
    out.push(details('cc-workup', 'Workup', [ul]));
  }
  const preds = report.predictions ?? [];
  if (preds.length > 0) {
    const body: HTMLElement[] = [];
    for (const p of preds) {
      const ul = el('ul', 'cc-list');
      for (const c of p.candidates) {
        const li = el('li', `cc-candidate cc-candidate-${c.label}`);
        li.appendChild(el('strong', undefined, `${p.reaction_class}, ${c.label}: `));
        li.appendChild(el('code', undefined, c.smiles));
        li.appendChild(document.createTextNode(` — ${c.reason}`));
        if (c.svg) {
          const img = el('img', 'cc-candidate-img');
          img.src = svgDataUrl(c.svg);
          img.alt = c.smiles;
          li.appendChild(img);
        }
        ul.appendChild(li);
      }
      body.push(ul);
    }
    out.push(details('cc-predictions', 'Expected products', body));
  }
  out.push(renderComponents(report));
  const balance = report.balance;
  if (balance?.checked) {
    const lines: string[] = [];
    if (sorted.byProducts.length) {
      const names = sorted.byProducts.map(m => (m.count !== 1 ? `${m.count} ${m.name}` : m.name)).join(', ');
      lines.push(`By-products not drawn in the equation (shown greyed in the scheme): ${names}.`);
    }
    for (const f of sorted.balanceNotes) {
      lines.push(f.message);
    }
    if (balance.drawn_balanced) {
      lines.push('The equation balances as drawn.');
    } else if (balance.balanced) {
      const co = Object.entries(balance.coefficients ?? {})
        .filter(([k]) => comps.has(Number(k)))
        .map(([k, v]) => `${v} × ${comps.get(Number(k))!.label}`);
      if (co.length) {
        lines.push(`Balanced with coefficients: ${co.join(', ')}.`);
      }
    } else {
      lines.push('The equation could not be balanced with the components given.');
    }
    const ul = el('ul', 'cc-list');
    for (const line of [...new Set(lines)]) {
      ul.appendChild(el('li', undefined, line));
    }
    out.push(details('cc-balance', 'Balance', [ul]));
  }
  return out;
}

export function countsLine(report: Report): string {
  return verdict(report);
}

/** The whole report: the verdict, the scheme, findings, safety, stoichiometry, then details. */
export function renderReport(report: Report, options: RenderOptions = {}): HTMLElement {
  const root = el('div', 'cc-report');
  const sorted = sortFindings(report);
  const worst = SEVERITY_ORDER.find(sev => sorted.shown.some(f => f.severity === sev)) ?? 'none';
  root.classList.add(`cc-worst-${worst}`);
  const header = el('header', 'cc-header');
  header.appendChild(el('p', 'cc-verdict', verdict(report, sorted)));
  header.appendChild(el('p', 'cc-title', reactionText(report)));
  root.appendChild(header);
  const scheme = renderScheme(report);
  root.appendChild(scheme.node);
  root.appendChild(renderFindings(report, scheme.highlight, options, sorted));
  const safety = renderSafety(sorted);
  if (safety) {
    root.appendChild(safety);
  }
  const stoich = renderStoichiometry(report);
  if (stoich) {
    root.appendChild(stoich);
  }
  for (const s of renderTables(report, sorted)) {
    root.appendChild(s);
  }
  return root;
}

/** A payload that is not of this schema version gets a readable message, not a blank. */
export function isReport(data: unknown): data is Report {
  if (!data || typeof data !== 'object') {
    return false;
  }
  const d = data as Record<string, unknown>;
  return (
    d.schema === 'chemcheck.report' &&
    Array.isArray(d.findings) &&
    Array.isArray(d.components) &&
    typeof d.input === 'object' &&
    d.input !== null
  );
}
