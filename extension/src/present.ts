// How a report reads to a chemist: compound numbers and labels, which findings are shown where,
// the verdict line, and the stoichiometry table with human headers and units that fit the
// scale. The same choices as chemcheck/display/present.py (the static HTML and text report).

import type { Component, Finding, Report } from './payload';

export const SEVERITY_ORDER: Array<Finding['severity']> = ['error', 'warning', 'info'];
export const SEVERITY_WORD: Record<Finding['severity'], string> = {
  error: 'Error',
  warning: 'Warning',
  info: 'Note'
};
/** Notes are information: only warnings and errors are acknowledged in a review. */
export const ACKNOWLEDGEABLE: Array<Finding['severity']> = ['error', 'warning'];
const SAFETY_RULES = ['hazard-caution'];

/** The reaction as written (a scaled report's payload may lack it). */
export function reactionText(report: Report): string {
  return (report.input as { reaction?: string } | undefined)?.reaction ?? '';
}

export function plural(n: number, word: string): string {
  return n === 1 ? `${n} ${word}` : `${n} ${word}s`;
}

export interface Compound {
  index: number;
  number: string;
  label: string;
  role: string;
  smiles: string;
  elements: string[];
}

// Fields the check may add to a component (a compound number, the agent's role): read if there.
type MaybeNumbered = Component & { number?: string | number | null; role_in_reaction?: string | null };

function noun(c: Component): string {
  if (c.role === 'agent' && c.kind) {
    return c.kind;
  }
  if ((c.nitrogens ?? []).some(n => n.kind.endsWith('amine') && !n.kind.includes('aromatic'))) {
    return 'amine';
  }
  return 'compound';
}

/** Number and label of every component ("benzylamine (1)", "amine 1"; agents a, b …). */
export function compounds(report: Report): Map<number, Compound> {
  const extra = new Map((report.labels ?? []).map(e => [e.component, e]));
  const out = new Map<number, Compound>();
  let main = 0;
  let agent = 0;
  const letters = 'abcdefghijklmnopqrstuvwxyz';
  for (const comp of report.components as MaybeNumbered[]) {
    let fallback: string;
    if (comp.role === 'agent') {
      fallback = letters[agent % 26].repeat(1 + Math.floor(agent / 26));
      agent++;
    } else {
      main++;
      fallback = String(main);
    }
    const e = extra.get(comp.index);
    const number = String(comp.number ?? e?.number ?? fallback);
    const label = e?.label || (comp.name ? `${comp.name} (${number})` : `${noun(comp)} ${number}`);
    out.set(comp.index, {
      index: comp.index,
      number,
      label,
      role: comp.role,
      smiles: comp.smiles || comp.text,
      elements: e?.elements ?? []
    });
  }
  return out;
}

export function roleOf(c: Component): string {
  return (c as MaybeNumbered).role_in_reaction || c.kind || c.role;
}

/** The flagged atoms in words: "N of benzylamine (1); Cl of acid chloride 2". */
export function where(f: Finding, comps: Map<number, Compound>): string {
  const byComp = new Map<number, number[]>();
  for (const [ci, ai] of f.atoms) {
    byComp.set(ci, [...(byComp.get(ci) ?? []), ai]);
  }
  const parts: string[] = [];
  for (const [ci, atoms] of byComp) {
    const c = comps.get(ci);
    if (!c) {
      continue;
    }
    const symbols = atoms.map(a => c.elements[a] ?? `atom ${a + 1}`);
    const names = new Set(symbols).size < symbols.length ? [...new Set(symbols)] : symbols;
    parts.push(`${names.join(', ')} of ${c.label}`);
  }
  return parts.join('; ');
}

const norm = (s: string): string =>
  s
    .replace(/[^\p{L}\p{N}]+/gu, ' ')
    .trim()
    .toLowerCase();

/** The fix, unless the message already says it. */
export function fixText(f: Finding): string | null {
  if (!f.fix) {
    return null;
  }
  const fx = norm(f.fix);
  return fx && norm(f.message).includes(fx) ? null : f.fix;
}

function stripSentence(message: string, sentence: string): string {
  const m = message.trimEnd();
  const s = sentence.trim();
  return s && m.endsWith(s) ? m.slice(0, m.length - s.length).trimEnd() : m;
}

export interface Sorted {
  shown: Finding[];
  safety: string[];
  safetySentence: string | null;
  byProducts: Array<{ name: string; count: number }>;
  balanceNotes: Finding[];
}

export function sortFindings(report: Report): Sorted {
  const missing = (report.balance?.missing ?? []).filter(m => m.side === 'product');
  const out: Sorted = { shown: [], safety: [], safetySentence: null, byProducts: missing, balanceNotes: [] };
  for (const sev of SEVERITY_ORDER) {
    for (const f of report.findings) {
      if (f.severity !== sev) {
        continue;
      }
      if (sev === 'info' && SAFETY_RULES.includes(f.rule)) {
        out.safety.push(stripSentence(f.message, f.fix ?? ''));
        out.safetySentence = out.safetySentence ?? (f.fix || null);
      } else if (sev === 'info' && f.rule === 'unbalanced-equation' && missing.length > 0) {
        out.balanceNotes.push(f); // the scheme shows the by-products ("+ HCl") instead
      } else {
        out.shown.push(f);
      }
    }
  }
  return out;
}

function className(report: Report): string | null {
  const understood = (report as Report & { understanding?: { class?: { name?: string } | null } | null }).understanding?.class?.name;
  if (understood) {
    return understood;
  }
  const rc = (report as Report & { reaction_class?: string | { name?: string } | null }).reaction_class;
  if (typeof rc === 'string' && rc) {
    return rc;
  }
  if (rc && typeof rc === 'object' && rc.name) {
    return rc.name;
  }
  return report.classes?.[0]?.name ?? null;
}

export function limitingLabel(report: Report): string | null {
  const t = report.table;
  if (!t?.limiting) {
    return null;
  }
  const comps = compounds(report);
  const row = t.rows.find(r => r.text === t.limiting);
  if (row && comps.has(row.component)) {
    return comps.get(row.component)!.label;
  }
  const c = report.components.find(x => x.text === t.limiting || x.smiles === t.limiting);
  return c ? comps.get(c.index)!.label : t.limiting;
}

export function verdict(report: Report, s: Sorted = sortFindings(report)): string {
  const n = { error: 0, warning: 0, info: 0 };
  for (const f of s.shown) {
    n[f.severity]++;
  }
  let head =
    n.error === 0 && n.warning === 0
      ? 'No errors or warnings'
      : [n.error ? plural(n.error, 'error') : '', n.warning ? plural(n.warning, 'warning') : '']
          .filter(Boolean)
          .join(', ');
  if (n.info) {
    head += `, ${plural(n.info, 'note')}`;
  }
  const parts = [head];
  if (s.safety.length) {
    parts.push(`safety: ${plural(s.safety.length, 'caution')}`);
  }
  const cls = className(report);
  if (cls) {
    parts.push(cls);
  }
  const lim = limitingLabel(report);
  if (lim) {
    parts.push(`limiting reagent ${lim}`);
  }
  return parts.join(' · ');
}

/** Sensible significant figures without exponents: 1.25, 10.99 → 11.0, 310.4 → 310. */
export function fmtNumber(v: number, sig = 3): string {
  if (!Number.isFinite(v)) {
    return '';
  }
  const a = Math.abs(v);
  if (a === 0) {
    return '0';
  }
  if (a >= 10 ** (sig - 1)) {
    return v.toFixed(0);
  }
  const digits = sig - 1 - Math.floor(Math.log10(a));
  return v.toFixed(Math.max(digits, 0));
}

type Family = Array<[string, number]>;
const MASS: Family = [['mg', 1e3], ['g', 1], ['kg', 1e-3]];
const VOLUME: Family = [['µL', 1e3], ['mL', 1], ['L', 1e-3]];
const AMOUNT: Family = [['µmol', 1e3], ['mmol', 1], ['mol', 1e-3]];

function fit(v: number, family: Family): [string, number] {
  let choice = family[0];
  for (const u of family) {
    if (Math.abs(v) * u[1] >= 1) {
      choice = u;
    }
  }
  return choice;
}

export interface Column {
  key: string;
  header: string;
  cells: string[];
  numeric: boolean;
}

export interface StoichTable {
  columns: Column[];
  compounds: Compound[];
  readAs: string[];
  limiting: string | null;
  concentration: string | null;
}

function scaled(key: string, quantity: string, family: Family, values: Array<number | null>, reference: boolean[]): Column {
  let ref = values.filter((v, i) => v !== null && reference[i]).map(v => Math.abs(v as number));
  if (ref.length === 0) {
    ref = values.filter(v => v !== null).map(v => Math.abs(v as number));
  }
  ref.sort((a, b) => a - b);
  const mid = ref.length ? ref[Math.floor(ref.length / 2)] : 1;
  const [unit, factor] = fit(mid, family);
  const cells = values.map(v => {
    if (v === null) {
      return '';
    }
    const x = v * factor;
    if (x !== 0 && (Math.abs(x) >= 10000 || Math.abs(x) < 0.1)) {
      const [own, f] = fit(v, family); // out of the column's scale: the cell says its unit
      return `${fmtNumber(v * f)} ${own}`;
    }
    return fmtNumber(x);
  });
  return { key, header: `${quantity} (${unit})`, cells, numeric: true };
}

function equiv(v: number): string {
  const s = v.toFixed(2).replace(/0+$/, '');
  return s.endsWith('.') ? s + '0' : s;
}

const num = (x: unknown): number | null => (typeof x === 'number' && Number.isFinite(x) ? x : null);

// what a chemist reads first: equivalents and amounts, then what goes on the balance
const ORDER = ['mw', 'equiv', 'mmol', 'mass_g', 'volume_ml', 'purity', 'theoretical_g', 'yield_pct'];
const NOT_SHOWN = ['formula', 'role', 'density_g_ml'];

export function stoichTable(report: Report): StoichTable | null {
  const t = report.table;
  if (!t || t.rows.length === 0) {
    return null;
  }
  const comps = compounds(report);
  const vals = t.rows.map(r => r.values ?? {});
  const reference = vals.map(v => num(v.equiv) !== null);
  const columns: Column[] = [];
  const known = ORDER.filter(k => t.columns.includes(k));
  for (const key of [...known, ...t.columns.filter(k => !known.includes(k))]) {
    const raw = vals.map(v => v[key] ?? null);
    if (raw.every(x => x === null || x === '') || NOT_SHOWN.includes(key)) {
      continue; // empty columns hidden; formula and density are in the components and read-as
    }
    const data = raw.map(num);
    const fixed = (digits: number, scale = 1): string[] => data.map(x => (x === null ? '' : (x * scale).toFixed(digits)));
    switch (key) {
      case 'mw':
        columns.push({ key, header: 'M (g/mol)', cells: fixed(2), numeric: true });
        break;
      case 'mass_g':
        columns.push(scaled(key, 'Mass', MASS, data, reference));
        break;
      case 'volume_ml':
        columns.push(scaled(key, 'Volume', VOLUME, data, reference));
        break;
      case 'mmol':
        columns.push(scaled(key, 'Amount', AMOUNT, data, reference));
        break;
      case 'theoretical_g':
        columns.push(scaled(key, 'Theoretical', MASS, data, data.map(x => x !== null)));
        break;
      case 'density_g_ml':
        columns.push({ key, header: 'Density (g/mL)', cells: fixed(3), numeric: true });
        break;
      case 'purity':
        columns.push({ key, header: 'Purity (%)', cells: data.map(x => (x === null ? '' : fmtNumber(100 * x))), numeric: true });
        break;
      case 'equiv':
        columns.push({ key, header: 'Equiv', cells: data.map(x => (x === null ? '' : equiv(x))), numeric: true });
        break;
      case 'yield_pct':
        columns.push({ key, header: 'Yield (%)', cells: fixed(1), numeric: true });
        break;
      default: {
        const numeric = raw.every(x => x === null || typeof x === 'number');
        const header = key.replace(/_/g, ' ');
        columns.push({
          key,
          header: header.charAt(0).toUpperCase() + header.slice(1),
          cells: raw.map(x => (x === null ? '' : typeof x === 'number' ? fmtNumber(x) : String(x))),
          numeric
        });
      }
    }
  }
  let concentration: string | null = null;
  if (t.concentration_m) {
    concentration = `${fmtNumber(t.concentration_m)} M`;
    if (t.total_volume_ml) {
      const [u, f] = fit(t.total_volume_ml, VOLUME);
      concentration += ` in ${fmtNumber(t.total_volume_ml * f)} ${u}`;
    }
  }
  return {
    columns,
    compounds: t.rows.map(
      r => comps.get(r.component) ?? { index: r.component, number: '?', label: r.text, role: '', smiles: r.text, elements: [] }
    ),
    readAs: t.rows.map(r => r.read_as ?? ''),
    limiting: limitingLabel(report),
    concentration
  };
}

/** An ISO time as the reader's local date and time ("4 Dec 2026, 19:40"). */
export function readableTime(iso: string): string {
  const t = new Date(iso);
  if (!iso || Number.isNaN(t.getTime())) {
    return iso;
  }
  return t.toLocaleString(undefined, { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' });
}
