// The MIME renderer for application/vnd.chemcheck.report+json.

import type { IRenderMime } from '@jupyterlab/rendermime-interfaces';
import { Widget } from '@lumino/widgets';

import { getBridge, onAcksChanged } from './ack';
import { MOL3D_MIME, mol3dFactory } from './mol3d';
import type { Report } from './payload';
import { renderReport } from './render';
import { readReport, unreadableNotice as unreadable } from './validate';

export const MIME_TYPE = 'application/vnd.chemcheck.report+json';

export class ReportView extends Widget implements IRenderMime.IRenderer {
  constructor(options: IRenderMime.IRendererOptions) {
    super();
    this._mimeType = options.mimeType;
    this.addClass('cc-output');
    this._redraw = this._redraw.bind(this); // bound once, so the listener can be removed
  }

  renderModel(model: IRenderMime.IMimeModel): Promise<void> {
    this._data = model.data[this._mimeType];
    this._redraw();
    return Promise.resolve();
  }

  protected onAfterAttach(): void {
    this._unsubscribe = onAcksChanged(this._redraw);
    this._redraw(); // now the node sits in a cell: its acknowledgements can be read
  }

  protected onBeforeDetach(): void {
    this._unsubscribe?.();
    this._unsubscribe = null;
  }

  private _redraw(): void {
    // one unreadable output shows a notice; it never throws into the notebook
    this.node.replaceChildren();
    const { report, errors } = readReport(this._data);
    if (!report) {
      this.node.appendChild(unreadable(errors));
      return;
    }
    try {
      this._draw(report);
    } catch (err) {
      console.warn('chemcheck: report not rendered', err);
      this.node.replaceChildren(unreadable([String(err)]));
    }
  }

  private _draw(data: Report): void {
    const bridge = getBridge();
    const acks = bridge?.acknowledgementsFor(this.node) ?? null;
    this.node.appendChild(
      renderReport(data, {
        acknowledgements: acks ?? [],
        onAcknowledge:
          bridge && acks !== null
            ? (finding, key, note) => {
                if (bridge.acknowledge(this.node, finding, key, note)) {
                  this._redraw();
                }
              }
            : undefined
      })
    );
  }

  private _mimeType: string;
  private _data: unknown = null;
  private _unsubscribe: (() => void) | null = null;
}

export const rendererFactory: IRenderMime.IRendererFactory = {
  safe: true,
  mimeTypes: [MIME_TYPE],
  createRenderer: options => new ReportView(options)
};

const reportExtension: IRenderMime.IExtension = {
  id: 'chemcheck-jupyterlab:report-renderer',
  description: 'Renders chemcheck reaction reports',
  rendererFactory,
  rank: 0,
  dataType: 'json'
};

const mol3dExtension: IRenderMime.IExtension = {
  id: 'chemcheck-jupyterlab:mol3d-renderer',
  description: `Renders 3D views of molecules (${MOL3D_MIME}) with a local 3Dmol.js`,
  rendererFactory: mol3dFactory,
  rank: 0,
  dataType: 'json'
};

export default [reportExtension, mol3dExtension];
