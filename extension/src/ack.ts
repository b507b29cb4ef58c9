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
  /** Who is reviewing: the name set in the settings, or null when none is set. */
  reviewer(): string | null;
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

/** Where acknowledgements are written when the `chemcheck` key holds a value of another shape. */
export const FALLBACK_KEY = 'chemcheck-review';

/** What the bridge needs of a cell model (JupyterLab's ICellModel has both methods). */
export interface MetadataHolder {
  getMetadata(key: string): unknown;
  setMetadata(key: string, value: unknown): void;
}

function whoName(who: unknown): string {
  if (typeof who === 'string') {
    return who;
  }
  if (who && typeof who === 'object' && typeof (who as Record<string, unknown>).name === 'string') {
    return (who as Record<string, string>).name;
  }
  return '';
}

/**
 * Read acknowledgements from a cell's metadata value, ignoring anything malformed (which stays
 * in the metadata untouched). Later entries come last: the latest of a finding wins.
 */
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
          who: whoName(r.who),
          when: typeof r.when === 'string' ? r.when : '',
          note: typeof r.note === 'string' ? r.note : ''
        });
      }
    }
  }
  return out;
}

/** The acknowledgements of a cell, from `chemcheck` and the fall-back key; the latest of a finding last. */
export function acksOf(cell: MetadataHolder): Acknowledgement[] {
  const latest = new Map<string, Acknowledgement>();
  for (const a of [...parseAcks(cell.getMetadata(METADATA_KEY)), ...parseAcks(cell.getMetadata(FALLBACK_KEY))]) {
    latest.delete(a.finding);
    latest.set(a.finding, a);
  }
  return [...latest.values()];
}

function appendable(meta: unknown): meta is Record<string, unknown> | undefined {
  if (meta === undefined || meta === null) {
    return true;
  }
  return typeof meta === 'object' && !Array.isArray(meta) && ((meta as Record<string, unknown>).acknowledgements === undefined || Array.isArray((meta as Record<string, unknown>).acknowledgements));
}

/**
 * The metadata value after appending one acknowledgement. Append-only: every field and entry
 * already there, understood or not, is kept as it was (an older acknowledgement of the same
 * finding too; the newest is the one read). The input is not changed. Null when `meta` has
 * another shape (then the fall-back key is used, see storeAck).
 */
export function withAck(meta: unknown, ack: Acknowledgement): Record<string, unknown> | null {
  if (!appendable(meta)) {
    return null;
  }
  const base: Record<string, unknown> = meta ? { ...meta } : {};
  const list = Array.isArray(base.acknowledgements) ? (base.acknowledgements as unknown[]) : [];
  base.acknowledgements = [...list, { ...ack }];
  return base;
}

/** Store an acknowledgement on a cell: under `chemcheck`, or the fall-back key when that holds something else. */
export function storeAck(cell: MetadataHolder, ack: Acknowledgement): boolean {
  for (const key of [METADATA_KEY, FALLBACK_KEY]) {
    const next = withAck(cell.getMetadata(key), ack);
    if (next) {
      cell.setMetadata(key, next);
      return true;
    }
  }
  return false;
}

/**
 * The name recorded with an acknowledgement: the reviewer name set in the settings
 * (chemcheck review → Reviewer name), trimmed; null when none is set. JupyterLab's session
 * identity is not used: on a server without accounts it is a random guest name.
 */
export function reviewerFromSettings(settings: Pick<ReviewSettings, 'reviewerName'>): string | null {
  const name = typeof settings.reviewerName === 'string' ? settings.reviewerName.trim() : '';
  return name ? name : null;
}

/** Said when someone acknowledges before setting their name. */
export const NO_REVIEWER =
  'Set your name first: Settings → Settings Editor → chemcheck review → Reviewer name. ' +
  'Acknowledgements record who made them.';
