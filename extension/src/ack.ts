// The bridge between the MIME renderer (which knows nothing of notebooks) and the review
// plugin (which does). Both entry points live in one labextension bundle and share this
// module, so the plugin installs the bridge and renderers use it when it is there.

import type { Finding } from './payload';
import type { Acknowledgement } from './render';

export const METADATA_KEY = 'chemcheck';

export interface ReviewSettings {
  reviewerName: string;
  defaultFilter: 'all' | 'error' | 'warning' | 'info';
  show3d: boolean;
}

export interface AckBridge {
  /** Acknowledgements stored on the cell that holds this output node. */
  acknowledgementsFor(node: HTMLElement): Acknowledgement[] | null;
  /** Store an acknowledgement on the cell that holds this output node. */
  acknowledge(node: HTMLElement, finding: Finding, key: string, note: string): boolean;
  /** Who is reviewing (settings, else JupyterLab's user identity). */
  reviewer(): string;
  settings(): ReviewSettings;
}

let current: AckBridge | null = null;
const listeners = new Set<() => void>();

export function setBridge(bridge: AckBridge | null): void {
  current = bridge;
  notify();
}

export function getBridge(): AckBridge | null {
  return current;
}

/** Renderers subscribe to re-render when acknowledgements or settings change. */
export function onAcksChanged(fn: () => void): () => void {
  listeners.add(fn);
  return () => listeners.delete(fn);
}

export function notify(): void {
  for (const fn of [...listeners]) {
    try {
      fn();
    } catch (err) {
      console.error('chemcheck: listener failed', err);
    }
  }
}

/** Read acknowledgements from a cell's metadata value, ignoring anything malformed. */
export function parseAcks(meta: unknown): Acknowledgement[] {
  if (!meta || typeof meta !== 'object') {
    return [];
  }
  const list = (meta as Record<string, unknown>).acknowledgements;
  if (!Array.isArray(list)) {
    return [];
  }
  const out: Acknowledgement[] = [];
  for (const a of list) {
    if (a && typeof a === 'object') {
      const r = a as Record<string, unknown>;
      if (typeof r.finding === 'string' && typeof r.rule === 'string') {
        out.push({
          finding: r.finding,
          rule: r.rule,
          who: typeof r.who === 'string' ? r.who : '',
          when: typeof r.when === 'string' ? r.when : '',
          note: typeof r.note === 'string' ? r.note : ''
        });
      }
    }
  }
  return out;
}

/** The metadata value after adding one acknowledgement (replacing an older one of the same finding). */
export function withAck(meta: unknown, ack: Acknowledgement): Record<string, unknown> {
  const base = meta && typeof meta === 'object' ? { ...(meta as Record<string, unknown>) } : {};
  const acks = parseAcks(base).filter(a => a.finding !== ack.finding);
  acks.push(ack);
  base.acknowledgements = acks;
  return base;
}
