// Runtime check of report payloads against the one schema (chemcheck/schema/report.schema.json,
// carried into payload.ts as REPORT_SCHEMA by `python -m chemcheck._schema_ts`).
//
// A saved notebook is input like any other: hand-edited, truncated, or written by another
// version. The renderer and the review panel read a payload only after it passes this check, so
// one malformed output shows a short notice and never breaks the notebook, the other outputs or
// the panel.
//
// The check covers the keywords in KNOWN_KEYWORDS ($ref: local references only;
// additionalProperties: as a schema for maps). `additionalProperties: false` is not enforced: a field this version
// does not know is never read, so a payload from a newer chemcheck with an added field still
// renders. Numbers must be finite.

import { el } from './dom';
import { REPORT_SCHEMA, type Report } from './payload';

type Schema = Record<string, unknown>;

/**
 * The schema keywords this check applies (and `additionalProperties: false`, read as allowed).
 * A unit test fails when report.schema.json starts using another one, so that the schema and
 * this check cannot drift apart silently.
 */
export const KNOWN_KEYWORDS = [
  '$defs', '$ref', 'type', 'properties', 'required', 'additionalProperties', 'items', 'minItems',
  'maxItems', 'enum', 'const', 'anyOf', 'allOf', 'oneOf', 'minimum', 'maximum', 'exclusiveMinimum',
  'exclusiveMaximum', 'minLength', 'maxLength', 'pattern'
];

/** At most this many problems are collected (the first ones are what a reader needs). */
const MAX_ERRORS = 8;

export interface ReadResult {
  report: Report | null;
  /** Where the payload departs from the schema, as `$.findings[0].atoms: expected array`. */
  errors: string[];
}

function typeOf(value: unknown): string {
  if (value === null) {
    return 'null';
  }
  if (Array.isArray(value)) {
    return 'array';
  }
  return typeof value;
}

function hasType(value: unknown, type: string): boolean {
  switch (type) {
    case 'null':
      return value === null;
    case 'array':
      return Array.isArray(value);
    case 'object':
      return value !== null && typeof value === 'object' && !Array.isArray(value);
    case 'string':
      return typeof value === 'string';
    case 'boolean':
      return typeof value === 'boolean';
    case 'number':
      return typeof value === 'number' && Number.isFinite(value);
    case 'integer':
      return typeof value === 'number' && Number.isInteger(value);
    default:
      return true; // a type this check does not know restricts nothing
  }
}

function same(a: unknown, b: unknown): boolean {
  if (a === b) {
    return true;
  }
  // the schema's constants are plain values; objects are compared only with objects
  return typeof a === 'object' && a !== null && typeof b === 'object' && b !== null && JSON.stringify(a) === JSON.stringify(b);
}

class Checker {
  readonly errors: string[] = [];

  constructor(private root: Schema) {}

  private fail(path: string, what: string): void {
    if (this.errors.length < MAX_ERRORS) {
      this.errors.push(`${path}: ${what}`);
    }
  }

  private resolve(ref: string): Schema | null {
    if (!ref.startsWith('#/')) {
      return null;
    }
    let node: unknown = this.root;
    for (const part of ref.slice(2).split('/')) {
      if (!node || typeof node !== 'object') {
        return null;
      }
      node = (node as Record<string, unknown>)[part.replace(/~1/g, '/').replace(/~0/g, '~')];
    }
    return node && typeof node === 'object' ? (node as Schema) : null;
  }

  /** True when `value` matches `schema`; problems are added to `errors` unless `quiet`. */
  check(value: unknown, schema: Schema, path: string, quiet = false): boolean {
    if (this.errors.length >= MAX_ERRORS && !quiet) {
      return false;
    }
    const fail = (what: string): false => {
      if (!quiet) {
        this.fail(path, what);
      }
      return false;
    };
    if (typeof schema.$ref === 'string') {
      const target = this.resolve(schema.$ref);
      if (!target) {
        return fail(`schema reference ${schema.$ref} not found`);
      }
      return this.check(value, target, path, quiet);
    }
    if ('const' in schema && !same(value, schema.const)) {
      return fail(`expected ${JSON.stringify(schema.const)}`);
    }
    if (Array.isArray(schema.enum) && !schema.enum.some(v => same(value, v))) {
      return fail(`expected one of ${schema.enum.map(v => JSON.stringify(v)).join(', ')}`);
    }
    if (Array.isArray(schema.anyOf)) {
      const options = schema.anyOf as Schema[];
      if (!options.some(option => this.check(value, option, path, true))) {
        return fail('matches none of the allowed forms');
      }
    }
    if (schema.type !== undefined) {
      const types = Array.isArray(schema.type) ? (schema.type as string[]) : [schema.type as string];
      if (!types.some(t => hasType(value, t))) {
        return fail(`expected ${types.join(' or ')}, found ${typeOf(value)}`);
      }
    }
    if (Array.isArray(schema.allOf) && !(schema.allOf as Schema[]).every(option => this.check(value, option, path, quiet))) {
      return false;
    }
    if (Array.isArray(schema.oneOf)) {
      const matching = (schema.oneOf as Schema[]).filter(option => this.check(value, option, path, true)).length;
      if (matching !== 1) {
        return fail(matching ? 'matches more than one of the allowed forms' : 'matches none of the allowed forms');
      }
    }
    let ok = true;
    if (typeof value === 'number') {
      if (typeof schema.minimum === 'number' && value < schema.minimum) {
        ok = fail(`expected at least ${schema.minimum}, found ${value}`);
      }
      if (typeof schema.maximum === 'number' && value > schema.maximum) {
        ok = fail(`expected at most ${schema.maximum}, found ${value}`);
      }
      if (typeof schema.exclusiveMinimum === 'number' && value <= schema.exclusiveMinimum) {
        ok = fail(`expected more than ${schema.exclusiveMinimum}, found ${value}`);
      }
      if (typeof schema.exclusiveMaximum === 'number' && value >= schema.exclusiveMaximum) {
        ok = fail(`expected less than ${schema.exclusiveMaximum}, found ${value}`);
      }
    }
    if (typeof value === 'string') {
      const length = [...value].length; // code points, as JSON Schema counts
      if (typeof schema.minLength === 'number' && length < schema.minLength) {
        ok = fail(`expected at least ${schema.minLength} character(s)`);
      }
      if (typeof schema.maxLength === 'number' && length > schema.maxLength) {
        ok = fail(`expected at most ${schema.maxLength} character(s)`);
      }
      if (typeof schema.pattern === 'string' && !new RegExp(schema.pattern, 'u').test(value)) {
        ok = fail(`does not match ${schema.pattern}`);
      }
    }
    if (Array.isArray(value)) {
      if (typeof schema.minItems === 'number' && value.length < schema.minItems) {
        ok = fail(`expected at least ${schema.minItems} item(s), found ${value.length}`);
      }
      if (typeof schema.maxItems === 'number' && value.length > schema.maxItems) {
        ok = fail(`expected at most ${schema.maxItems} item(s), found ${value.length}`);
      }
      const items = schema.items;
      if (items && typeof items === 'object' && !Array.isArray(items)) {
        for (let i = 0; i < value.length; i++) {
          if (!this.check(value[i], items as Schema, `${path}[${i}]`, quiet)) {
            ok = false;
            if (quiet) {
              return false;
            }
          }
        }
      }
    } else if (value !== null && typeof value === 'object') {
      const obj = value as Record<string, unknown>;
      const props = (schema.properties ?? {}) as Record<string, Schema>;
      for (const name of Array.isArray(schema.required) ? (schema.required as string[]) : []) {
        if (!Object.prototype.hasOwnProperty.call(obj, name)) {
          ok = fail(`'${name}' is missing`);
          if (quiet) {
            return false;
          }
        }
      }
      for (const [name, sub] of Object.entries(props)) {
        if (Object.prototype.hasOwnProperty.call(obj, name) && !this.check(obj[name], sub, `${path}.${name}`, quiet)) {
          ok = false;
          if (quiet) {
            return false;
          }
        }
      }
      const extra = schema.additionalProperties;
      if (extra && typeof extra === 'object') {
        for (const [name, v] of Object.entries(obj)) {
          if (!(name in props) && !this.check(v, extra as Schema, `${path}[${JSON.stringify(name)}]`, quiet)) {
            ok = false;
            if (quiet) {
              return false;
            }
          }
        }
      }
    }
    return ok;
  }
}

/** Check `data` against `schema` (the report schema by default); the problems found, if any. */
export function schemaErrors(data: unknown, schema: unknown = REPORT_SCHEMA): string[] {
  const root = schema as Schema;
  const checker = new Checker(root);
  try {
    checker.check(data, root, '$');
  } catch (err) {
    // a payload nested deeply enough to exhaust the stack is not a report
    return [`$: could not be checked (${err instanceof Error ? err.message : String(err)})`];
  }
  return checker.errors;
}

/**
 * The report in `data` if it matches the schema; otherwise null and the reasons.
 * `data` is the MIME bundle's value: the parsed object, or (from some writers) its JSON text.
 */
export function readReport(data: unknown): ReadResult {
  let value = data;
  if (typeof value === 'string') {
    try {
      value = JSON.parse(value);
    } catch {
      return { report: null, errors: ['$: not JSON'] };
    }
  }
  const errors = schemaErrors(value);
  return errors.length ? { report: null, errors } : { report: value as Report, errors: [] };
}

/** True when `data` is a report that matches the schema. */
export function isValidReport(data: unknown): data is Report {
  return readReport(data).report !== null;
}

/** The notice shown in place of an output that is not a readable report. */
export const UNREADABLE = 'This chemcheck output could not be read.';

/** The notice shown in place of an unreadable output, with the first reasons, as text only. */
export function unreadableNotice(errors: string[]): HTMLElement {
  const box = el('div', 'cc-unreadable');
  box.appendChild(el('p', 'cc-muted', UNREADABLE));
  if (errors.length) {
    box.appendChild(el('p', 'cc-muted cc-unreadable-detail', errors.slice(0, 3).join('; ')));
  }
  return box;
}
