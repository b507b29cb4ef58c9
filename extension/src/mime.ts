// The MIME renderer for application/vnd.chemcheck.report+json.

import type { IRenderMime } from '@jupyterlab/rendermime-interfaces';
import { Widget } from '@lumino/widgets';

import { el } from './dom';
import { MOL3D_MIME, mol3dFactory } from './mol3d';
import { isReport, renderReport } from './render';

export const MIME_TYPE = 'application/vnd.chemcheck.report+json';

export class ReportView extends Widget implements IRenderMime.IRenderer {
  constructor(options: IRenderMime.IRendererOptions) {
    super();
    this._mimeType = options.mimeType;
    this.addClass('cc-output');
  }

  renderModel(model: IRenderMime.IMimeModel): Promise<void> {
    const data = model.data[this._mimeType];
    this.node.replaceChildren();
    if (!isReport(data)) {
      this.node.appendChild(el('p', 'cc-muted', 'This chemcheck output could not be read (unknown format).'));
      return Promise.resolve();
    }
    this.node.appendChild(renderReport(data));
    return Promise.resolve();
  }

  private _mimeType: string;
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
