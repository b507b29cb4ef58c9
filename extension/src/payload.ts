// Generated from chemcheck/schema/report.schema.json by `python -m chemcheck._schema_ts`.
// Do not edit by hand: change the schema and regenerate.

export const SCHEMA_VERSION = "1";

/** One chemcheck check of a reaction: its components, findings and tables. Shared by the Python package and the JupyterLab extension (MIME type application/vnd.chemcheck.report+json). */
export interface Report {
  schema: "chemcheck.report";
  version: "1";
  chemcheck_version: string;
  input: Input;
  components: Array<Component>;
  findings: Array<Finding>;
  counts: Counts;
  balance?: Balance | null;
  basicity?: Array<BasicSite>;
  workup?: Array<WorkupAdvice>;
  table?: Table | null;
  metrics?: Metrics | null;
  predictions?: Array<Prediction>;
  classes?: Array<ReactionClass>;
  scale?: Scale | null;
  drawing?: Drawing | null;
  /** pairs of amines that a pH window separates in the workup */
  separations?: Array<string>;
  understanding?: Understanding;
  /** display: each component's compound number (1, 2 … reactants and products; a, b … agents), its label in messages and tables, and its atoms' element symbols */
  labels?: Array<CompoundLabel>;
}

export interface Input {
  reaction: string;
  amounts: Record<string, string>;
  scale?: Record<string, number | null>;
}

export interface Component {
  index: number;
  role: "reactant" | "agent" | "product";
  text: string;
  smiles: string;
  formula: string;
  mw: number | null;
  inchikey: string;
  name: string | null;
  source: string;
  kind: string | null;
  charge: number;
  sanitization: "full" | "partial";
  fragments: Array<string>;
  nitrogens: Array<Nitrogen>;
  groups: Array<Group>;
  /** compound number shown under the structure: 1, 2, ... for reactants and products, a, b, ... for agents */
  number?: string;
  /** the component's role in this reaction (base, solvent, catalyst, ...) */
  role_in_reaction?: string | null;
}

export interface Nitrogen {
  atom: number;
  kind: string;
  basic: boolean;
  hydrogens: number;
}

export interface Group {
  name: string;
  atoms: Array<number>;
  detail: string;
}

export interface Finding {
  rule: string;
  severity: "error" | "warning" | "info";
  title: string;
  message: string;
  /** (component index, atom index) pairs, both 0-based */
  atoms: Array<[number, number]>;
  fix: string | null;
  references: Array<string>;
}

export interface Counts {
  error: number;
  warning: number;
  info: number;
}

export interface Missing {
  name: string;
  formula: string;
  count: number;
  side: "reactant" | "product";
}

export interface Balance {
  checked: boolean;
  drawn_balanced: boolean;
  balanced: boolean;
  coefficients: Record<string, number>;
  missing: Array<Missing>;
  residual: Record<string, number>;
  charge_difference: number;
}

export interface BasicSite {
  component: number;
  atom: number;
  kind: string;
  pka: number | null;
  method: string;
  source: string;
  uncertainty: number | null;
  protonation_order: number | null;
}

export interface WorkupAdvice {
  component: number;
  pka: number;
  extract_above_ph: number;
  keep_in_water_below_ph: number;
  protonated_at: Record<string, number>;
  message: string;
}

export interface Table {
  columns: Array<string>;
  rows: Array<TableRow>;
  reference: string | null;
  limiting?: string | null;
  concentration_m?: number | null;
  total_volume_ml?: number | null;
}

export interface TableRow {
  component: number;
  text: string;
  values: Record<string, number | string | null>;
  read_as: string | null;
}

export interface Metrics {
  atom_economy_pct?: number | null;
  pmi?: number | null;
  e_factor?: number | null;
}

export interface Prediction {
  reaction_class: string;
  candidates: Array<Candidate>;
}

export interface Candidate {
  smiles: string;
  rank: number;
  label: "major" | "minor" | "none";
  reason: string;
  svg?: string | null;
  drawn?: boolean;
}

export interface ReactionClass {
  name: string;
  evidence: string;
}

export interface Scale {
  factor: number;
  vessel_ml?: number | null;
  fill_fraction?: number | null;
  thermal?: Record<string, number | string | null> | null;
  cautions: Array<string>;
}

export interface Drawing {
  /** the reaction scheme as SVG, every finding's atoms highlighted */
  scheme_svg: string;
  width: number;
  height: number;
  components: Array<ComponentDrawing>;
  /** by-products missing from the equation, drawn greyed after the products */
  by_products?: Array<string>;
  /** bonds formed, marked in the scheme: pairs of atom centres in scheme coordinates */
  centre?: Array<[[number, number], [number, number]]>;
}

export interface ComponentDrawing {
  component: number;
  /** the component alone, no highlights */
  svg: string;
  x: number;
  y: number;
  width: number;
  height: number;
  /** each atom's centre in scheme coordinates */
  atoms: Array<[number, number]>;
  /** 3D coordinates (V2000 molfile with hydrogens), when embedded */
  molblock?: string | null;
  /** the bold compound number drawn under the structure */
  number?: string;
  /** each atom's element label box in scheme coordinates [x, y, width, height], or null for an unlabelled carbon */
  label_box?: Array<Array<number> | null>;
}

export type AtomRef = [number, number];

export type AtomPair = [AtomRef, AtomRef];

export interface Understanding {
  class: {
  id: string;
  name: string;
  family: string;
  expects: Array<string>;
  formed: Array<AtomPair>;
  broken: Array<AtomPair>;
};
  also_fits: Array<string>;
  mapping: {
  source: string;
  coverage: number;
  note: string | null;
};
  centre: {
  formed: Array<AtomPair>;
  broken: Array<AtomPair>;
  formed_in_products: Array<AtomPair>;
};
  roles: Array<{
  component: number;
  role: string;
}>;
}

export interface CompoundLabel {
  component: number;
  number: string;
  label: string;
  elements: Array<string>;
}
