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
  /** the component alone, no highlights (older reports only: the scheme now carries every component) */
  svg?: string;
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

/** The schema itself, without its prose, for the runtime check in validate.ts. */
export const REPORT_SCHEMA: unknown = {"type":"object","required":["schema","version","chemcheck_version","input","components","findings","counts"],"additionalProperties":false,"properties":{"schema":{"const":"chemcheck.report"},"version":{"const":"1"},"chemcheck_version":{"type":"string"},"input":{"$ref":"#/$defs/Input"},"components":{"type":"array","items":{"$ref":"#/$defs/Component"}},"findings":{"type":"array","items":{"$ref":"#/$defs/Finding"}},"counts":{"$ref":"#/$defs/Counts"},"balance":{"anyOf":[{"$ref":"#/$defs/Balance"},{"type":"null"}]},"basicity":{"type":"array","items":{"$ref":"#/$defs/BasicSite"}},"workup":{"type":"array","items":{"$ref":"#/$defs/WorkupAdvice"}},"table":{"anyOf":[{"$ref":"#/$defs/Table"},{"type":"null"}]},"metrics":{"anyOf":[{"$ref":"#/$defs/Metrics"},{"type":"null"}]},"predictions":{"type":"array","items":{"$ref":"#/$defs/Prediction"}},"classes":{"type":"array","items":{"$ref":"#/$defs/ReactionClass"}},"scale":{"anyOf":[{"$ref":"#/$defs/Scale"},{"type":"null"}]},"drawing":{"anyOf":[{"$ref":"#/$defs/Drawing"},{"type":"null"}]},"separations":{"type":"array","items":{"type":"string"}},"understanding":{"$ref":"#/$defs/Understanding"},"labels":{"type":"array","items":{"$ref":"#/$defs/CompoundLabel"}}},"$defs":{"Input":{"type":"object","required":["reaction","amounts"],"additionalProperties":false,"properties":{"reaction":{"type":"string"},"amounts":{"type":"object","additionalProperties":{"type":"string"}},"scale":{"type":"object","additionalProperties":{"type":["number","null"]}}}},"Component":{"type":"object","required":["index","role","text","smiles","formula","mw","inchikey","name","source","kind","charge","sanitization","fragments","nitrogens","groups"],"additionalProperties":false,"properties":{"index":{"type":"integer","minimum":0},"role":{"enum":["reactant","agent","product"]},"text":{"type":"string"},"smiles":{"type":"string"},"formula":{"type":"string"},"mw":{"type":["number","null"]},"inchikey":{"type":"string"},"name":{"type":["string","null"]},"source":{"type":"string"},"kind":{"type":["string","null"]},"charge":{"type":"integer"},"sanitization":{"enum":["full","partial"]},"fragments":{"type":"array","items":{"type":"string"}},"nitrogens":{"type":"array","items":{"$ref":"#/$defs/Nitrogen"}},"groups":{"type":"array","items":{"$ref":"#/$defs/Group"}},"number":{"type":"string"},"role_in_reaction":{"type":["string","null"]}}},"Nitrogen":{"type":"object","required":["atom","kind","basic","hydrogens"],"additionalProperties":false,"properties":{"atom":{"type":"integer","minimum":0},"kind":{"type":"string"},"basic":{"type":"boolean"},"hydrogens":{"type":"integer","minimum":0}}},"Group":{"type":"object","required":["name","atoms","detail"],"additionalProperties":false,"properties":{"name":{"type":"string"},"atoms":{"type":"array","items":{"type":"integer","minimum":0}},"detail":{"type":"string"}}},"Finding":{"type":"object","required":["rule","severity","title","message","atoms","fix","references"],"additionalProperties":false,"properties":{"rule":{"type":"string"},"severity":{"enum":["error","warning","info"]},"title":{"type":"string"},"message":{"type":"string"},"atoms":{"type":"array","items":{"type":"array","items":{"type":"integer","minimum":0},"minItems":2,"maxItems":2}},"fix":{"type":["string","null"]},"references":{"type":"array","items":{"type":"string"}}}},"Counts":{"type":"object","required":["error","warning","info"],"additionalProperties":false,"properties":{"error":{"type":"integer","minimum":0},"warning":{"type":"integer","minimum":0},"info":{"type":"integer","minimum":0}}},"Missing":{"type":"object","required":["name","formula","count","side"],"additionalProperties":false,"properties":{"name":{"type":"string"},"formula":{"type":"string"},"count":{"type":"integer","minimum":1},"side":{"enum":["reactant","product"]}}},"Balance":{"type":"object","required":["checked","drawn_balanced","balanced","coefficients","missing","residual","charge_difference"],"additionalProperties":false,"properties":{"checked":{"type":"boolean"},"drawn_balanced":{"type":"boolean"},"balanced":{"type":"boolean"},"coefficients":{"type":"object","additionalProperties":{"type":"integer"}},"missing":{"type":"array","items":{"$ref":"#/$defs/Missing"}},"residual":{"type":"object","additionalProperties":{"type":"integer"}},"charge_difference":{"type":"integer"}}},"BasicSite":{"type":"object","required":["component","atom","kind","pka","method","source","uncertainty","protonation_order"],"additionalProperties":false,"properties":{"component":{"type":"integer","minimum":0},"atom":{"type":"integer","minimum":0},"kind":{"type":"string"},"pka":{"type":["number","null"]},"method":{"type":"string"},"source":{"type":"string"},"uncertainty":{"type":["number","null"]},"protonation_order":{"type":["integer","null"]}}},"WorkupAdvice":{"type":"object","required":["component","pka","extract_above_ph","keep_in_water_below_ph","protonated_at","message"],"additionalProperties":false,"properties":{"component":{"type":"integer","minimum":0},"pka":{"type":"number"},"extract_above_ph":{"type":"number"},"keep_in_water_below_ph":{"type":"number"},"protonated_at":{"type":"object","additionalProperties":{"type":"number"}},"message":{"type":"string"}}},"Table":{"type":"object","required":["columns","rows","reference"],"additionalProperties":false,"properties":{"columns":{"type":"array","items":{"type":"string"}},"rows":{"type":"array","items":{"$ref":"#/$defs/TableRow"}},"reference":{"type":["string","null"]},"limiting":{"type":["string","null"]},"concentration_m":{"type":["number","null"]},"total_volume_ml":{"type":["number","null"]}}},"TableRow":{"type":"object","required":["component","text","values","read_as"],"additionalProperties":false,"properties":{"component":{"type":"integer","minimum":0},"text":{"type":"string"},"values":{"type":"object","additionalProperties":{"type":["number","string","null"]}},"read_as":{"type":["string","null"]}}},"Metrics":{"type":"object","additionalProperties":false,"properties":{"atom_economy_pct":{"type":["number","null"]},"pmi":{"type":["number","null"]},"e_factor":{"type":["number","null"]}}},"Prediction":{"type":"object","required":["reaction_class","candidates"],"additionalProperties":false,"properties":{"reaction_class":{"type":"string"},"candidates":{"type":"array","items":{"$ref":"#/$defs/Candidate"}}}},"Candidate":{"type":"object","required":["smiles","rank","label","reason"],"additionalProperties":false,"properties":{"smiles":{"type":"string"},"rank":{"type":"integer","minimum":1},"label":{"enum":["major","minor","none"]},"reason":{"type":"string"},"svg":{"type":["string","null"]},"drawn":{"type":"boolean"}}},"ReactionClass":{"type":"object","required":["name","evidence"],"additionalProperties":false,"properties":{"name":{"type":"string"},"evidence":{"type":"string"}}},"Scale":{"type":"object","required":["factor","cautions"],"additionalProperties":false,"properties":{"factor":{"type":"number"},"vessel_ml":{"type":["number","null"]},"fill_fraction":{"type":["number","null"]},"thermal":{"type":["object","null"],"additionalProperties":{"type":["number","string","null"]}},"cautions":{"type":"array","items":{"type":"string"}}}},"Drawing":{"type":"object","required":["scheme_svg","width","height","components"],"additionalProperties":false,"properties":{"scheme_svg":{"type":"string"},"width":{"type":"number"},"height":{"type":"number"},"components":{"type":"array","items":{"$ref":"#/$defs/ComponentDrawing"}},"by_products":{"type":"array","items":{"type":"string"}},"centre":{"type":"array","items":{"type":"array","items":{"type":"array","items":{"type":"number"},"minItems":2,"maxItems":2},"minItems":2,"maxItems":2}}}},"ComponentDrawing":{"type":"object","required":["component","x","y","width","height","atoms"],"additionalProperties":false,"properties":{"component":{"type":"integer","minimum":0},"svg":{"type":"string"},"x":{"type":"number"},"y":{"type":"number"},"width":{"type":"number"},"height":{"type":"number"},"atoms":{"type":"array","items":{"type":"array","items":{"type":"number"},"minItems":2,"maxItems":2}},"molblock":{"type":["string","null"]},"number":{"type":"string"},"label_box":{"type":"array","items":{"anyOf":[{"type":"array","items":{"type":"number"},"minItems":4,"maxItems":4},{"type":"null"}]}}}},"AtomRef":{"type":"array","items":{"type":"integer","minimum":0},"minItems":2,"maxItems":2},"AtomPair":{"type":"array","items":{"$ref":"#/$defs/AtomRef"},"minItems":2,"maxItems":2},"Understanding":{"type":"object","additionalProperties":false,"required":["class","also_fits","mapping","centre","roles"],"properties":{"class":{"type":"object","additionalProperties":false,"required":["id","name","family","expects","formed","broken"],"properties":{"id":{"type":"string"},"name":{"type":"string"},"family":{"type":"string"},"expects":{"type":"array","items":{"type":"string"}},"formed":{"type":"array","items":{"$ref":"#/$defs/AtomPair"}},"broken":{"type":"array","items":{"$ref":"#/$defs/AtomPair"}}}},"also_fits":{"type":"array","items":{"type":"string"}},"mapping":{"type":"object","additionalProperties":false,"required":["source","coverage","note"],"properties":{"source":{"type":"string"},"coverage":{"type":"number","minimum":0,"maximum":1},"note":{"type":["string","null"]}}},"centre":{"type":"object","additionalProperties":false,"required":["formed","broken","formed_in_products"],"properties":{"formed":{"type":"array","items":{"$ref":"#/$defs/AtomPair"}},"broken":{"type":"array","items":{"$ref":"#/$defs/AtomPair"}},"formed_in_products":{"type":"array","items":{"$ref":"#/$defs/AtomPair"}}}},"roles":{"type":"array","items":{"type":"object","additionalProperties":false,"required":["component","role"],"properties":{"component":{"type":"integer","minimum":0},"role":{"type":"string"}}}}}},"CompoundLabel":{"type":"object","required":["component","number","label","elements"],"additionalProperties":false,"properties":{"component":{"type":"integer","minimum":0},"number":{"type":"string"},"label":{"type":"string"},"elements":{"type":"array","items":{"type":"string"}}}}}};
