// Turning a report payload into DOM. Pure functions of the payload (and of acknowledgements),
// so they are unit-tested without JupyterLab.

import { el, fmt, svgDataUrl, svgEl, table } from './dom';
import type { Component, Finding, Report } from './payload';

export const SEVERITY_ORDER: Array<Finding['severity']> = ['error', 'warning', 'info'];
export const SEVERITY_WORD: Record<Finding['severity'], string> = {
  error: 'Error',
  warning: 'Warning',
  info: 'Note'
};

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

function componentLabel(c: Component): string {
  return c.name && c.name.toLowerCase() !== c.text.toLowerCase() ? `${c.text} (${c.name})` : c.text;
}

/** The scheme picture with an overlay on which a finding's atoms light up. */
export function renderScheme(report: Report): {
  node: HTMLElement;
  highlight: (f: Finding | null) => void;
} {
  const wrap = el('figure', 'cc-scheme');
  const drawing = report.drawing;
  if (!drawing) {
    wrap.appendChild(el('figcaption', 'cc-muted', report.input.reaction));
    return { node: wrap, highlight: () => undefined };
  }
  const stage = el('div', 'cc-scheme-stage');
  stage.style.maxWidth = `${drawing.width}px`;
  const img = el('img', 'cc-scheme-img');
  img.src = svgDataUrl(drawing.scheme_svg);
  img.alt = `reaction scheme: ${report.input.reaction}`;
  stage.appendChild(img);
  const overlay = svgEl('svg', {
    class: 'cc-scheme-overlay',
    viewBox: `0 0 ${drawing.width} ${drawing.height}`,
    preserveAspectRatio: 'xMinYMin meet',
    'aria-hidden': 'true'
  });
  stage.appendChild(overlay);
  wrap.appendChild(stage);
  const coords = new Map<number, number[][]>();
  for (const c of drawing.components) {
    coords.set(c.component, c.atoms);
  }
  const highlight = (f: Finding | null): void => {
    while (overlay.firstChild) {
      overlay.removeChild(overlay.firstChild);
    }
    if (!f) {
      return;
    }
    for (const [ci, ai] of f.atoms) {
      const xy = coords.get(ci)?.[ai];
      if (!xy) {
        continue;
      }
      overlay.appendChild(
        svgEl('circle', {
          class: `cc-hl cc-hl-${f.severity}`,
          cx: xy[0],
          cy: xy[1],
          r: 14
        })
      );
    }
  };
  return { node: wrap, highlight };
}

export function renderFindings(
  report: Report,
  highlight: (f: Finding | null) => void,
  options: RenderOptions = {}
): HTMLElement {
  const section = el('section', 'cc-findings');
  section.appendChild(el('h4', 'cc-h', 'Findings'));
  if (report.findings.length === 0) {
    section.appendChild(el('p', 'cc-muted', 'No findings.'));
    return section;
  }
  const acks = new Map<string, Acknowledgement>();
  for (const a of options.acknowledgements ?? []) {
    acks.set(a.finding, a);
  }
  const comps = report.components;
  for (const sev of SEVERITY_ORDER) {
    const items = report.findings.filter(f => f.severity === sev);
    if (items.length === 0) {
      continue;
    }
    const group = el('div', `cc-group cc-group-${sev}`);
    group.appendChild(el('h5', 'cc-group-title', `${SEVERITY_WORD[sev]}s (${items.length})`));
    const list = el('ul', 'cc-list');
    for (const f of items) {
      const key = findingKey(f);
      const ack = acks.get(key);
      const li = el('li', `cc-finding cc-${sev}${ack ? ' cc-acknowledged' : ''}`);
      li.tabIndex = 0;
      li.dataset.rule = f.rule;
      li.dataset.key = key;
      const head = el('div', 'cc-finding-head');
      head.appendChild(el('span', `cc-badge cc-badge-${sev}`, SEVERITY_WORD[sev]));
      head.appendChild(el('code', 'cc-rule', f.rule));
      li.appendChild(head);
      li.appendChild(el('p', 'cc-message', f.message));
      if (f.atoms.length > 0) {
        const where = f.atoms
          .filter(a => a[0] < comps.length)
          .map(a => `${comps[a[0]].text} atom ${a[1] + 1}`)
          .join(', ');
        li.appendChild(el('p', 'cc-atoms', `Atoms: ${where}`));
      }
      if (f.fix) {
        const fix = el('p', 'cc-fix');
        fix.appendChild(el('strong', undefined, 'Fix: '));
        fix.appendChild(document.createTextNode(f.fix));
        li.appendChild(fix);
      }
      if (ack) {
        li.appendChild(
          el('p', 'cc-ack-note', `Acknowledged by ${ack.who} (${ack.when})${ack.note ? ': ' + ack.note : ''}`)
        );
      } else if (options.onAcknowledge) {
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
    group.appendChild(list);
    section.appendChild(group);
  }
  return section;
}

export function renderComponents(report: Report): HTMLElement {
  const section = el('section', 'cc-components');
  section.appendChild(el('h4', 'cc-h', 'Components'));
  section.appendChild(
    table(
      'cc-table',
      ['#', 'role', 'as written', 'formula', 'M (g/mol)', 'kind'],
      report.components.map(c => [
        c.index + 1,
        c.role,
        componentLabel(c),
        c.formula,
        c.mw === null ? '' : c.mw.toFixed(2),
        c.kind ?? ''
      ])
    )
  );
  return section;
}

export function renderTables(report: Report): HTMLElement[] {
  const out: HTMLElement[] = [];
  const t = report.table;
  if (t && t.rows.length > 0) {
    const s = el('section', 'cc-stoich');
    s.appendChild(el('h4', 'cc-h', 'Stoichiometry'));
    s.appendChild(
      table(
        'cc-table',
        ['component', ...t.columns, 'read as'],
        t.rows.map(r => [r.text, ...t.columns.map(c => fmt(r.values[c])), r.read_as ?? ''])
      )
    );
    if (t.limiting) {
      s.appendChild(el('p', 'cc-muted', `Limiting reagent: ${t.limiting}`));
    }
    out.push(s);
  }
  const sites = report.basicity ?? [];
  if (sites.length > 0) {
    const s = el('section', 'cc-basicity');
    s.appendChild(el('h4', 'cc-h', 'Basicity (pKa of the conjugate acid, water, 25 °C)'));
    s.appendChild(
      table(
        'cc-table',
        ['component', 'atom', 'kind', 'pKa', '±', 'method'],
        sites.map(b => [
          report.components[b.component]?.text ?? String(b.component),
          b.atom + 1,
          b.kind,
          b.pka === null ? '' : b.pka.toFixed(1),
          b.uncertainty === null ? '' : b.uncertainty.toFixed(1),
          b.method
        ])
      )
    );
    out.push(s);
  }
  const workup = report.workup ?? [];
  if (workup.length > 0) {
    const s = el('section', 'cc-workup');
    s.appendChild(el('h4', 'cc-h', 'Workup'));
    const ul = el('ul', 'cc-list');
    for (const w of workup) {
      ul.appendChild(el('li', undefined, w.message));
    }
    for (const t of report.separations ?? []) {
      ul.appendChild(el('li', undefined, t));
    }
    s.appendChild(ul);
    out.push(s);
  }
  const preds = report.predictions ?? [];
  if (preds.length > 0) {
    const s = el('section', 'cc-predictions');
    s.appendChild(el('h4', 'cc-h', 'Expected products'));
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
      s.appendChild(ul);
    }
    out.push(s);
  }
  const scale = report.scale;
  if (scale && scale.cautions.length > 0) {
    const s = el('section', 'cc-scale');
    s.appendChild(el('h4', 'cc-h', `Scale-up ×${fmt(scale.factor, 3)}: cautions`));
    const ul = el('ul', 'cc-list');
    for (const c of scale.cautions) {
      ul.appendChild(el('li', undefined, c));
    }
    s.appendChild(ul);
    out.push(s);
  }
  return out;
}

export function countsLine(report: Report): string {
  const c = report.counts;
  return `${c.error} error(s), ${c.warning} warning(s), ${c.info} note(s)`;
}

/** The whole report. */
export function renderReport(report: Report, options: RenderOptions = {}): HTMLElement {
  const root = el('div', 'cc-report');
  const header = el('header', 'cc-header');
  header.appendChild(el('h3', 'cc-title', report.input.reaction));
  const counts = el('p', 'cc-counts', countsLine(report));
  header.appendChild(counts);
  root.appendChild(header);
  const scheme = renderScheme(report);
  root.appendChild(scheme.node);
  root.appendChild(renderFindings(report, scheme.highlight, options));
  for (const s of renderTables(report)) {
    root.appendChild(s);
  }
  root.appendChild(renderComponents(report));
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
