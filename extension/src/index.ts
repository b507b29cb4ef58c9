// The review plugin: a sidebar that lists every chemcheck report in the active notebook, with
// counts by severity, a severity filter, click-to-jump and per-finding acknowledgement; it also
// installs the bridge through which report outputs read and write acknowledgements stored in
// the cell metadata under the "chemcheck" key.

import type { JupyterFrontEnd, JupyterFrontEndPlugin } from '@jupyterlab/application';
import { ILabShell } from '@jupyterlab/application';
import { ICommandPalette, InputDialog } from '@jupyterlab/apputils';
import type { Cell, ICodeCellModel } from '@jupyterlab/cells';
import { INotebookTracker, NotebookActions, type NotebookPanel } from '@jupyterlab/notebook';
import { ISettingRegistry } from '@jupyterlab/settingregistry';
import { SplitPanel, Widget } from '@lumino/widgets';

import { type ReviewSettings, acksOf, notify, setBridge, storeAck } from './ack';
import { ACK_BLOCK, ackBlock } from './ackhtml';
import { el } from './dom';
import type { Finding, Report } from './payload';
import { ACKNOWLEDGEABLE, compounds, reactionText, readableTime, sortFindings } from './present';
import { type Acknowledgement, SEVERITY_ORDER, SEVERITY_WORD, findingKey, isReport } from './render';
import { readReport } from './validate';

const PLUGIN_ID = 'chemcheck-jupyterlab:review';
const MIME = 'application/vnd.chemcheck.report+json';

const DEFAULTS: ReviewSettings = { reviewerName: '', defaultFilter: 'all', show3d: true };

interface Entry {
  cellIndex: number;
  cell: Cell;
  report: Report;
  acks: Acknowledgement[];
}

/** The execution count as the prompt shows it: "[2]", or "[ ]" for a cell not run. */
export function promptOf(cell: Cell): string {
  const count = (cell.model as ICodeCellModel).executionCount;
  return count === null || count === undefined ? '[ ]' : `[${count}]`;
}

/** The reaction in compound labels: "benzylamine (1) + acid chloride 2 → 3". */
export function reactionInLabels(report: Report): string {
  const comps = compounds(report);
  const side = (role: string): string =>
    report.components
      .filter(c => c.role === role)
      .map(c => (role === 'product' ? comps.get(c.index)!.number : comps.get(c.index)!.label))
      .join(' + ');
  const products = side('product');
  return `${side('reactant')} → ${products || '?'}`;
}

/** Findings a reviewer still has to look at: warnings and errors not yet acknowledged. */
export function openFindings(entry: Entry): Finding[] {
  const keys = new Set(entry.acks.map(a => a.finding));
  return sortFindings(entry.report).shown.filter(f => ACKNOWLEDGEABLE.includes(f.severity) && !keys.has(findingKey(f)));
}

type Outputs = {
  length: number;
  get: (i: number) => { toJSON: () => Record<string, unknown> };
  set: (i: number, value: Record<string, unknown>) => void;
};

/** Write the cell's acknowledgements into the static HTML of its recorded reports. */
export function recordAcksInOutputs(cell: Cell, acks: Acknowledgement[]): void {
  if (cell.model.type !== 'code') {
    return;
  }
  const outputs = (cell.model as unknown as { outputs: Outputs }).outputs;
  for (let i = 0; i < outputs.length; i++) {
    const json = outputs.get(i).toJSON();
    const data = (json.data ?? {}) as Record<string, unknown>;
    const report = data[MIME];
    if (!isReport(report)) {
      continue;
    }
    const raw = data['text/html'];
    const html = (Array.isArray(raw) ? raw.join('') : typeof raw === 'string' ? raw : '').replace(ACK_BLOCK, '');
    const next = html + ackBlock(report, acks);
    if (next !== (Array.isArray(raw) ? raw.join('') : raw)) {
      outputs.set(i, { ...json, data: { ...data, 'text/html': next } });
    }
  }
}

/** Bring a cell into view and put the focus on one finding of its report (and open its note form). */
export function revealFinding(panel: NotebookPanel, entry: Entry, key: string | null, openForm: boolean): void {
  panel.content.activeCellIndex = entry.cellIndex;
  void panel.content.scrollToItem(entry.cellIndex);
  const find = (): HTMLElement | null =>
    key ? (entry.cell.node.querySelector(`.cc-finding[data-key="${CSS.escape(key)}"]`) as HTMLElement | null) : null;
  const go = (): void => {
    const li = find();
    if (!li) {
      entry.cell.node.scrollIntoView({ block: 'center' });
      return;
    }
    li.scrollIntoView({ block: 'center' });
    li.focus();
    if (openForm) {
      (li.querySelector('.cc-ack-button') as HTMLButtonElement | null)?.click();
    }
  };
  // the notebook may render the cell only once scrolled to it
  window.requestAnimationFrame(() => window.setTimeout(go, 50));
}

/** Every report output in a notebook, in cell order. */
export function collectReports(panel: NotebookPanel): Entry[] {
  const out: Entry[] = [];
  panel.content.widgets.forEach((cell, cellIndex) => {
    if (cell.model.type !== 'code') {
      return;
    }
    const outputs = (cell.model as unknown as { outputs: { length: number; get: (i: number) => { data: Record<string, unknown> } } }).outputs;
    for (let i = 0; i < outputs.length; i++) {
      const report = readReport(outputs.get(i).data[MIME]).report; // checked against the schema
      if (report) {
        out.push({ cellIndex, cell, report, acks: acksOf(cell.model) });
      }
    }
  });
  return out;
}

function visible(f: Finding, filter: ReviewSettings['defaultFilter']): boolean {
  if (filter === 'all') {
    return true;
  }
  return SEVERITY_ORDER.indexOf(f.severity) <= SEVERITY_ORDER.indexOf(filter);
}

class ReviewPanel extends Widget {
  constructor(
    private tracker: INotebookTracker,
    bridge: { settings: () => ReviewSettings }
  ) {
    super();
    this.id = 'chemcheck-review';
    this.title.caption = 'chemcheck review';
    this.title.label = 'Review';
    this.addClass('cc-review');
    this.node.tabIndex = 0;
    this._filter = bridge.settings().defaultFilter;
  }

  protected onAfterShow(): void {
    this.widen();
    this.refresh();
  }

  /**
   * The sidebar opens at about 250 px, too narrow for finding titles: the first time the panel
   * is shown, widen it to about 380 px (at most 40 % of the window). It stays resizable.
   */
  widen(): void {
    if (this._widened) {
      return;
    }
    let split: Widget | null = this.parent;
    while (split && !(split instanceof SplitPanel)) {
      split = split.parent;
    }
    if (!split) {
      return;
    }
    const panel = split as SplitPanel;
    const total = panel.node.getBoundingClientRect().width;
    const index = panel.widgets.findIndex(w => w.node.contains(this.node));
    if (!total || index < 0) {
      return;
    }
    this._widened = true;
    const sizes = panel.relativeSizes();
    const want = Math.min(380, 0.4 * total) / total;
    if (sizes[index] >= want) {
      return;
    }
    const main = sizes.indexOf(Math.max(...sizes.filter((_, i) => i !== index)));
    const delta = want - sizes[index];
    sizes[index] += delta;
    sizes[main] -= delta;
    panel.setRelativeSizes(sizes);
  }

  set filter(value: ReviewSettings['defaultFilter']) {
    this._filter = value;
    this.refresh();
  }

  refresh(): void {
    const node = this.node;
    node.replaceChildren();
    const head = el('div', 'cc-review-head');
    head.appendChild(el('h3', 'cc-review-title', 'chemcheck review'));
    const select = el('select', 'cc-review-filter');
    select.setAttribute('aria-label', 'Show findings of at least this severity');
    for (const [value, label] of [
      ['all', 'All findings'],
      ['error', 'Errors'],
      ['warning', 'Errors and warnings'],
      ['info', 'Errors, warnings and notes']
    ]) {
      const opt = el('option', undefined, label);
      opt.value = value;
      opt.selected = value === this._filter;
      select.appendChild(opt);
    }
    select.addEventListener('change', () => {
      this.filter = select.value as ReviewSettings['defaultFilter'];
    });
    head.appendChild(select);
    node.appendChild(head);
    const panel = this.tracker.currentWidget;
    if (!panel) {
      node.appendChild(el('p', 'cc-muted', 'Open a notebook to review its chemcheck reports.'));
      return;
    }
    const entries = collectReports(panel);
    node.appendChild(el('p', 'cc-muted', `${panel.title.label}: ${entries.length} report(s)`));
    if (entries.length === 0) {
      node.appendChild(el('p', 'cc-muted', 'No chemcheck reports in this notebook yet.'));
      return;
    }
    const list = el('ol', 'cc-review-list');
    for (const entry of entries) {
      const li = el('li', 'cc-review-entry');
      const sorted = sortFindings(entry.report);
      const ackKeys = new Set(entry.acks.map(a => a.finding));
      const asked = sorted.shown.filter(f => ACKNOWLEDGEABLE.includes(f.severity));
      const done = asked.filter(f => ackKeys.has(findingKey(f))).length;
      const n = (sev: Finding['severity']): number => sorted.shown.filter(f => f.severity === sev).length;
      const jump = el('button', 'cc-review-jump');
      jump.type = 'button';
      jump.dataset.cell = String(entry.cellIndex);
      jump.title = reactionText(entry.report);
      const line = el('span', 'cc-review-line');
      line.appendChild(el('span', 'cc-review-cell', promptOf(entry.cell)));
      line.appendChild(document.createTextNode(' '));
      line.appendChild(el('span', 'cc-review-labels', reactionInLabels(entry.report)));
      jump.appendChild(line);
      const parts = [`${n('error')} error${n('error') === 1 ? '' : 's'}`, `${n('warning')} warning${n('warning') === 1 ? '' : 's'}`];
      if (n('info')) {
        parts.push(`${n('info')} note${n('info') === 1 ? '' : 's'}`);
      }
      jump.appendChild(
        el('span', 'cc-review-counts', `${parts.join(', ')}${asked.length ? `; ${done} of ${asked.length} acknowledged` : ''}`)
      );
      jump.addEventListener('click', () => revealFinding(panel, entry, null, false));
      li.appendChild(jump);
      const fl = el('ul', 'cc-review-findings');
      for (const f of sorted.shown.filter(x => visible(x, this._filter))) {
        const key = findingKey(f);
        const ack = entry.acks.find(a => a.finding === key);
        const item = el('li', `cc-review-finding cc-${f.severity}${ack ? ' cc-acknowledged' : ''}`);
        item.dataset.rule = f.rule;
        item.dataset.key = key;
        item.appendChild(el('span', `cc-badge cc-badge-${f.severity}`, SEVERITY_WORD[f.severity]));
        item.appendChild(document.createTextNode(' '));
        item.appendChild(el('span', 'cc-review-message', f.title || f.message));
        item.title = f.message;
        if (ack) {
          const note = el('p', 'cc-ack-note', `Acknowledged by ${ack.who || 'a reviewer'}`);
          if (ack.when) {
            note.appendChild(document.createTextNode(', '));
            const time = el('time', 'cc-review-time', readableTime(ack.when));
            time.dateTime = ack.when;
            note.appendChild(time);
          }
          if (ack.note) {
            note.appendChild(document.createTextNode(`: ${ack.note}`));
          }
          item.appendChild(note);
        } else if (ACKNOWLEDGEABLE.includes(f.severity)) {
          // the note is written where the finding is: in the report, in the notebook
          const go = el('button', 'cc-ack-button cc-review-ack', 'Acknowledge in the notebook…');
          go.type = 'button';
          go.addEventListener('click', () => revealFinding(panel, entry, key, true));
          item.appendChild(go);
        }
        fl.appendChild(item);
      }
      li.appendChild(fl);
      list.appendChild(li);
    }
    node.appendChild(list);
  }

  private _filter: ReviewSettings['defaultFilter'];
  private _widened = false;
}

const plugin: JupyterFrontEndPlugin<void> = {
  id: PLUGIN_ID,
  description: 'Review panel for chemcheck reports, with acknowledgements stored in the notebook',
  autoStart: true,
  requires: [INotebookTracker],
  optional: [ILabShell, ISettingRegistry, ICommandPalette],
  activate: (
    app: JupyterFrontEnd,
    tracker: INotebookTracker,
    labShell: ILabShell | null,
    registry: ISettingRegistry | null,
    palette: ICommandPalette | null
  ) => {
    let settings: ReviewSettings = { ...DEFAULTS };
    let sessionName = '';

    const reviewer = (): string => settings.reviewerName || sessionName;

    /** The reviewer's name: the setting, else asked once (and saved to the setting). */
    const askReviewer = async (): Promise<string | null> => {
      if (reviewer()) {
        return reviewer();
      }
      const answer = await InputDialog.getText({
        title: 'Your name for acknowledgements',
        label: 'Recorded with each acknowledgement in this notebook (Settings → chemcheck review → Reviewer name).',
        placeholder: 'e.g. A. Chemist'
      });
      const name = answer.button.accept ? (answer.value ?? '').trim() : '';
      if (!name) {
        return null;
      }
      sessionName = name;
      if (registry) {
        await registry.set(PLUGIN_ID, 'reviewerName', name).catch(err => console.warn('chemcheck: name not saved', err));
      }
      return name;
    };

    const cellOf = (node: HTMLElement): Cell | null => {
      let found: Cell | null = null;
      tracker.forEach(panel => {
        for (const cell of panel.content.widgets) {
          if (cell.node.contains(node)) {
            found = cell;
          }
        }
      });
      return found;
    };

    const acknowledgeCell = (cell: Cell, finding: Finding, key: string, note: string): void => {
      void askReviewer().then(who => {
        if (!who) {
          notify(); // no name given: nothing is recorded, the form comes back
          return;
        }
        const ack: Acknowledgement = { finding: key, rule: finding.rule, who, when: new Date().toISOString(), note };
        storeAck(cell.model, ack); // append-only; another shape under "chemcheck" is left alone
        try {
          recordAcksInOutputs(cell, acksOf(cell.model));
        } catch (err) {
          console.warn('chemcheck: acknowledgements not written into the static report', err);
        }
        notify();
      });
    };

    setBridge({
      acknowledgementsFor: node => {
        const cell = cellOf(node);
        return cell ? acksOf(cell.model) : null;
      },
      acknowledge: (node, finding, key, note) => {
        const cell = cellOf(node);
        if (!cell) {
          return false;
        }
        acknowledgeCell(cell, finding, key, note); // asks for the reviewer's name first if none is set
        return true;
      },
      reviewer,
      settings: () => settings
    });

    const panel = new ReviewPanel(tracker, { settings: () => settings });
    const refresh = (): void => panel.refresh();
    if (labShell) {
      labShell.add(panel, 'right', { rank: 900 });
    } else {
      app.shell.add(panel, 'right');
    }
    tracker.currentChanged.connect(refresh);
    NotebookActions.executed.connect(refresh);
    let timer = 0;
    const later = (): void => {
      window.clearTimeout(timer);
      timer = window.setTimeout(refresh, 300);
    };
    tracker.widgetAdded.connect((_, nb) => {
      nb.context.model.contentChanged.connect(later);
      nb.context.model.metadataChanged?.connect?.(later);
    });
    // changes of metadata (acknowledgements) and outputs arrive as content changes
    void app.restored.then(refresh);
    notify();
    refresh();

    app.commands.addCommand('chemcheck:open-review', {
      label: 'chemcheck: Open the review panel',
      execute: () => {
        if (labShell) {
          labShell.activateById(panel.id);
        }
        refresh();
      }
    });
    app.commands.addCommand('chemcheck:next-unacknowledged', {
      label: 'chemcheck: Go to the next unacknowledged finding',
      execute: () => {
        const nb = tracker.currentWidget;
        if (!nb) {
          return;
        }
        const entries = collectReports(nb);
        const from = nb.content.activeCellIndex;
        // after the active cell first, then from the top
        const order = [...entries.filter(e => e.cellIndex > from), ...entries.filter(e => e.cellIndex <= from)];
        for (const entry of order) {
          const open = openFindings(entry);
          if (open.length) {
            revealFinding(nb, entry, findingKey(open[0]), false);
            return;
          }
        }
      }
    });
    if (palette) {
      palette.addItem({ command: 'chemcheck:open-review', category: 'chemcheck' });
      palette.addItem({ command: 'chemcheck:next-unacknowledged', category: 'chemcheck' });
    }

    if (registry) {
      void registry.load(PLUGIN_ID).then(loaded => {
        const apply = (): void => {
          settings = { ...DEFAULTS, ...(loaded.composite as Partial<ReviewSettings>) };
          panel.filter = settings.defaultFilter;
          notify();
        };
        loaded.changed.connect(apply);
        apply();
      }).catch(err => console.warn('chemcheck: settings not loaded', err));
    }
  }
};

export default plugin;
