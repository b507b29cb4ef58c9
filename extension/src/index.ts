// The review plugin: a sidebar that lists every chemcheck report in the active notebook, with
// counts by severity, a severity filter, click-to-jump and per-finding acknowledgement; it also
// installs the bridge through which report outputs read and write acknowledgements stored in
// the cell metadata under the "chemcheck" key.

import type { JupyterFrontEnd, JupyterFrontEndPlugin } from '@jupyterlab/application';
import { ILabShell } from '@jupyterlab/application';
import type { Cell } from '@jupyterlab/cells';
import { INotebookTracker, NotebookActions, type NotebookPanel } from '@jupyterlab/notebook';
import { showErrorMessage } from '@jupyterlab/apputils';
import { ISettingRegistry } from '@jupyterlab/settingregistry';
import { Widget } from '@lumino/widgets';

import { NO_REVIEWER, type ReviewSettings, acksOf, notify, reviewerFromSettings, setBridge, storeAck } from './ack';
import { el } from './dom';
import type { Finding, Report } from './payload';
import { type Acknowledgement, SEVERITY_ORDER, SEVERITY_WORD, ackForm, findingKey } from './render';
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
    private bridge: { acknowledgeCell: (cell: Cell, f: Finding, key: string, note: string) => void; settings: () => ReviewSettings }
  ) {
    super();
    this.id = 'chemcheck-review';
    this.title.caption = 'chemcheck review';
    this.title.label = 'Review';
    this.addClass('cc-review');
    this.node.tabIndex = 0;
    this._filter = bridge.settings().defaultFilter;
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
      const counts = entry.report.counts;
      const ackKeys = new Set(entry.acks.map(a => a.finding));
      const open = entry.report.findings.filter(f => !ackKeys.has(findingKey(f)));
      const jump = el('button', 'cc-review-jump');
      jump.type = 'button';
      jump.dataset.cell = String(entry.cellIndex);
      jump.appendChild(el('span', 'cc-review-cell', `Cell ${entry.cellIndex + 1}`));
      jump.appendChild(el('code', 'cc-review-reaction', entry.report.input.reaction));
      jump.appendChild(
        el(
          'span',
          'cc-review-counts',
          `${counts.error} error(s), ${counts.warning} warning(s), ${counts.info} note(s); ${entry.report.findings.length - open.length} acknowledged`
        )
      );
      jump.addEventListener('click', () => {
        panel.content.activeCellIndex = entry.cellIndex;
        void panel.content.scrollToItem(entry.cellIndex);
        entry.cell.node.scrollIntoView({ block: 'center' });
      });
      li.appendChild(jump);
      const fl = el('ul', 'cc-review-findings');
      for (const f of entry.report.findings.filter(x => visible(x, this._filter))) {
        const key = findingKey(f);
        const ack = entry.acks.find(a => a.finding === key);
        const item = el('li', `cc-review-finding cc-${f.severity}${ack ? ' cc-acknowledged' : ''}`);
        item.dataset.rule = f.rule;
        item.appendChild(el('span', `cc-badge cc-badge-${f.severity}`, SEVERITY_WORD[f.severity]));
        item.appendChild(document.createTextNode(' '));
        item.appendChild(el('span', 'cc-review-message', f.message));
        if (ack) {
          item.appendChild(el('p', 'cc-ack-note', `Acknowledged by ${ack.who} (${ack.when})${ack.note ? ': ' + ack.note : ''}`));
        } else {
          item.appendChild(
            ackForm(f, key, (finding, k, note) => {
              this.bridge.acknowledgeCell(entry.cell, finding, k, note);
            })
          );
        }
        fl.appendChild(item);
      }
      li.appendChild(fl);
      list.appendChild(li);
    }
    node.appendChild(list);
  }

  private _filter: ReviewSettings['defaultFilter'];
}

const plugin: JupyterFrontEndPlugin<void> = {
  id: PLUGIN_ID,
  description: 'Review panel for chemcheck reports, with acknowledgements stored in the notebook',
  autoStart: true,
  requires: [INotebookTracker],
  optional: [ILabShell, ISettingRegistry],
  activate: (
    app: JupyterFrontEnd,
    tracker: INotebookTracker,
    labShell: ILabShell | null,
    registry: ISettingRegistry | null
  ) => {
    let settings: ReviewSettings = { ...DEFAULTS };

    const reviewer = (): string | null => reviewerFromSettings(settings);

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

    const acknowledgeCell = (cell: Cell, finding: Finding, key: string, note: string): boolean => {
      const who = reviewer();
      if (!who) {
        void showErrorMessage('chemcheck: who is acknowledging?', NO_REVIEWER);
        return false;
      }
      const ack: Acknowledgement = { finding: key, rule: finding.rule, who, when: new Date().toISOString(), note };
      const stored = storeAck(cell.model, ack);
      notify();
      return stored;
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
        return acknowledgeCell(cell, finding, key, note);
      },
      reviewer,
      settings: () => settings
    });

    const panel = new ReviewPanel(tracker, { acknowledgeCell, settings: () => settings });
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
      label: 'Open the chemcheck review panel',
      execute: () => {
        if (labShell) {
          labShell.activateById(panel.id);
        }
        refresh();
      }
    });

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
