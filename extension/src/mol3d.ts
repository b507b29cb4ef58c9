// 3D view of a component (application/vnd.chemcheck.mol3d+json), drawn with 3Dmol.js loaded
// from this labextension's own static folder: no CDN, works offline.

import { PageConfig, URLExt } from '@jupyterlab/coreutils';
import type { IRenderMime } from '@jupyterlab/rendermime-interfaces';
import { Widget } from '@lumino/widgets';

import { getBridge } from './ack';
import { el, svgDataUrl } from './dom';

export const MOL3D_MIME = 'application/vnd.chemcheck.mol3d+json';
const SCRIPT = 'lab/extensions/chemcheck-jupyterlab/static/3Dmol-min.js';

interface Mol3DPayload {
  label: string;
  molblock: string | null;
  highlights: Array<{ atom: number; color: string; severity?: string }>;
}

const SEVERITY_NAME: Record<string, string> = { error: 'error', warning: 'warning', info: 'note' };

type Viewer3D = {
  addModel: (data: string, format: string) => { selectedAtoms: (sel: Record<string, unknown>) => Array<{ x: number; y: number; z: number }> };
  setStyle: (sel: Record<string, unknown>, style: Record<string, unknown>) => void;
  addSphere: (spec: Record<string, unknown>) => unknown;
  zoomTo: () => void;
  zoom: (factor: number) => void;
  render: () => void;
  resize: () => void;
};

/** The page colour of the current theme, so the 3D frame follows light and dark themes. */
function pageColour(): string {
  const v = getComputedStyle(document.body).getPropertyValue('--jp-layout-color0').trim();
  return /^#[0-9a-fA-F]{3,8}$/.test(v) ? v : 'white';
}

/** A legend: one swatch per highlight colour, with the severity it stands for. */
export function legend3d(highlights: Mol3DPayload['highlights']): HTMLElement | null {
  const seen = new Map<string, string>();
  for (const h of highlights ?? []) {
    if (/^#[0-9a-fA-F]{6}$/.test(h.color) && !seen.has(h.color)) {
      seen.set(h.color, SEVERITY_NAME[h.severity ?? ''] ?? 'flagged');
    }
  }
  if (seen.size === 0) {
    return null;
  }
  const box = el('div', 'cc-mol3d-legend');
  for (const [colour, name] of seen) {
    const item = el('span', 'cc-mol3d-key');
    const swatch = el('span', 'cc-mol3d-swatch');
    swatch.style.backgroundColor = colour;
    item.appendChild(swatch);
    item.appendChild(document.createTextNode(`flagged atom (${name})`));
    box.appendChild(item);
  }
  return box;
}

let loading: Promise<unknown> | null = null;

/** Load 3Dmol.js once, from the labextension's static folder. */
export function load3Dmol(): Promise<unknown> {
  const w = window as unknown as Record<string, unknown>;
  if (w.$3Dmol) {
    return Promise.resolve(w.$3Dmol);
  }
  if (!loading) {
    loading = new Promise((resolve, reject) => {
      const s = document.createElement('script');
      s.src = URLExt.join(PageConfig.getBaseUrl(), SCRIPT);
      s.async = true;
      s.onload = () => resolve(w.$3Dmol);
      s.onerror = () => {
        loading = null;
        reject(new Error('3Dmol.js could not be loaded from the chemcheck extension'));
      };
      document.head.appendChild(s);
    });
  }
  return loading;
}

export class Mol3DView extends Widget implements IRenderMime.IRenderer {
  constructor(options: IRenderMime.IRendererOptions) {
    super();
    this._mimeType = options.mimeType;
    this.addClass('cc-mol3d');
  }

  async renderModel(model: IRenderMime.IMimeModel): Promise<void> {
    const data = model.data[this._mimeType] as unknown as Mol3DPayload;
    this.node.replaceChildren();
    const caption = el('div', 'cc-mol3d-caption', `3D: ${data?.label ?? ''}`);
    const stage = el('div', 'cc-mol3d-stage');
    stage.style.width = '100%';
    stage.style.maxWidth = '560px';
    stage.style.height = '360px';
    stage.style.position = 'relative';
    this.node.appendChild(caption);
    this.node.appendChild(stage);
    if (!data || typeof data.molblock !== 'string') {
      caption.textContent = 'No 3D coordinates for this component.';
      return;
    }
    const svg = model.data['image/svg+xml'];
    if (getBridge()?.settings().show3d === false && typeof svg === 'string') {
      stage.remove();
      const img = el('img', 'cc-mol3d-fallback');
      img.src = svgDataUrl(svg);
      img.alt = data.label;
      this.node.appendChild(img);
      caption.textContent = `2D: ${data.label} (3D views are off in the settings)`;
      return;
    }
    try {
      const lib = (await load3Dmol()) as { createViewer: (n: HTMLElement, o: Record<string, unknown>) => Viewer3D };
      const viewer = lib.createViewer(stage, { backgroundColor: pageColour() });
      const model = viewer.addModel(data.molblock, 'sdf');
      viewer.setStyle({}, { stick: { radius: 0.15 }, sphere: { scale: 0.22 } });
      // a translucent halo round each flagged atom: the atom keeps its element colour
      for (const h of data.highlights ?? []) {
        if (typeof h.atom === 'number' && /^#[0-9a-fA-F]{6}$/.test(h.color)) {
          const [atom] = model.selectedAtoms({ index: h.atom });
          if (atom) {
            viewer.addSphere({ center: { x: atom.x, y: atom.y, z: atom.z }, radius: 0.85, color: h.color, alpha: 0.6 });
          }
        }
      }
      viewer.zoomTo();
      viewer.zoom(0.85); // a margin all round: the whole molecule stays in the frame
      viewer.render();
      const key = legend3d(data.highlights);
      if (key) {
        this.node.appendChild(key);
      }
    } catch (err) {
      caption.textContent = `3D view unavailable: ${(err as Error).message}`;
    }
  }

  private _mimeType: string;
}

export const mol3dFactory: IRenderMime.IRendererFactory = {
  safe: true,
  mimeTypes: [MOL3D_MIME],
  createRenderer: options => new Mol3DView(options)
};
