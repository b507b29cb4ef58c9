import { test } from 'node:test';
import assert from 'node:assert/strict';
import { execFileSync } from 'node:child_process';
import * as path from 'node:path';

import { installDom } from './setup';

installDom();

import type { Report } from '../src/payload';
import { REPORT_SCHEMA } from '../src/payload';
import { KNOWN_KEYWORDS, UNREADABLE, isValidReport, readReport, schemaErrors, unreadableNotice } from '../src/validate';

// A report written out by hand in the payload's shape (a scenario of our own).
function report(): Report {
  return {
    schema: 'chemcheck.report',
    version: '1',
    chemcheck_version: '0.0.0',
    input: { reaction: 'CCN.CC(=O)Cl>>CCNC(C)=O', amounts: {} },
    components: [
      {
        index: 0, role: 'reactant', text: 'CCN', smiles: 'CCN', formula: 'C2H7N', mw: 45.08,
        inchikey: '', name: null, source: 'smiles', kind: null, charge: 0, sanitization: 'full',
        fragments: ['CCN'], nitrogens: [{ atom: 2, kind: 'primary_amine', basic: true, hydrogens: 2 }], groups: []
      }
    ],
    findings: [
      { rule: 'acid-scavenger-short', severity: 'warning', title: 't', message: 'no base', atoms: [[0, 2]], fix: 'add base', references: [] }
    ],
    counts: { error: 0, warning: 1, info: 0 }
  };
}

type Damage = (r: Record<string, any>) => void;

// the malformed payloads that hid notebooks (issue: reliability under hostile input), and more
const MALFORMED: Array<[string, Damage, string]> = [
  ['atoms null', r => { r.findings[0].atoms = null; }, '$.findings[0].atoms: expected array, found null'],
  ['counts missing', r => { delete r.counts; }, "$: 'counts' is missing"],
  ['a null finding', r => { r.findings.push(null); }, '$.findings[1]: expected object, found null'],
  ['pka as text', r => { r.basicity = [{ component: 0, atom: 2, kind: 'primary_amine', pka: '10.6' }]; }, '$.basicity[0]'],
  ['negative atom', r => { r.findings[0].atoms = [[-1, 0]]; }, '$.findings[0].atoms[0][0]: expected at least 0, found -1'],
  ['atom pair of three', r => { r.findings[0].atoms = [[0, 1, 2]]; }, 'expected at most 2 item(s)'],
  ['unknown severity', r => { r.findings[0].severity = 'fine'; }, '$.findings[0].severity: expected one of'],
  ['findings not a list', r => { r.findings = {}; }, '$.findings: expected array, found object'],
  ['counts as text', r => { r.counts.error = '1'; }, '$.counts.error: expected integer, found string'],
  ['input as text', r => { r.input = 'CCN>>C'; }, '$.input: expected object, found string'],
  ['amount not text', r => { r.input.amounts = { CCN: 1 }; }, '$.input.amounts["CCN"]: expected string'],
  ['wrong schema name', r => { r.schema = 'other'; }, '$.schema: expected "chemcheck.report"'],
  ['infinite mass', r => { r.components[0].mw = Infinity; }, '$.components[0].mw']
];

test('the schema uses only keywords this check applies', () => {
  const seen = new Set<string>();
  const walk = (node: unknown, inNames = false): void => {
    if (Array.isArray(node)) {
      node.forEach(n => walk(n));
    } else if (node && typeof node === 'object') {
      for (const [k, v] of Object.entries(node)) {
        if (!inNames) {
          seen.add(k);
        }
        // under properties and $defs the keys are names, their values schemas
        walk(v, !inNames && (k === 'properties' || k === '$defs'));
        if (inNames) {
          walk(v);
        }
      }
    }
  };
  walk(REPORT_SCHEMA);
  const unknown = [...seen].filter(k => !KNOWN_KEYWORDS.includes(k));
  assert.deepEqual(unknown, [], 'teach validate.ts these keywords');
});

test('bounds, lengths, patterns and one-of are applied', () => {
  const schema = {
    type: 'object',
    properties: {
      n: { type: 'number', maximum: 1, exclusiveMinimum: 0 },
      s: { type: 'string', minLength: 2, maxLength: 3, pattern: '^[a-z]+$' },
      o: { oneOf: [{ type: 'integer' }, { type: 'number', minimum: 5 }] }
    }
  };
  assert.deepEqual(schemaErrors({ n: 0.5, s: 'ab', o: 2 }, schema), []);
  assert.ok(schemaErrors({ n: 2 }, schema)[0].includes('at most 1'));
  assert.ok(schemaErrors({ n: 0 }, schema)[0].includes('more than 0'));
  assert.ok(schemaErrors({ s: 'a' }, schema)[0].includes('at least 2'));
  assert.ok(schemaErrors({ s: 'abcd' }, schema)[0].includes('at most 3'));
  assert.ok(schemaErrors({ s: 'A1' }, schema)[0].includes('does not match'));
  assert.ok(schemaErrors({ o: 6 }, schema)[0].includes('more than one')); // 6 is both an integer and >= 5
});

test('a well-formed report passes', () => {
  assert.deepEqual(schemaErrors(report()), []);
  assert.ok(isValidReport(report()));
  // its JSON text, as some writers store JSON MIME data, reads too
  assert.ok(readReport(JSON.stringify(report())).report);
});

for (const [name, damage, expected] of MALFORMED) {
  test(`a malformed report is refused with the place named: ${name}`, () => {
    const r = report() as unknown as Record<string, any>;
    damage(r);
    const { report: read, errors } = readReport(r);
    assert.equal(read, null);
    assert.ok(errors.some(e => e.includes(expected)), errors.join(' | '));
  });
}

test('fields this version does not know are ignored, not refused', () => {
  const r = { ...report(), added_in_a_later_version: { x: 1 } };
  assert.ok(isValidReport(r));
});

test('anything at all is answered, never thrown', () => {
  let deep: unknown = [];
  for (let i = 0; i < 100_000; i++) {
    deep = [deep];
  }
  const odd: unknown[] = [undefined, null, 0, NaN, '', '{', 'null', [], {}, Object.create(null), deep, { findings: deep }, new Date()];
  for (const value of odd) {
    assert.equal(readReport(value).report, null);
  }
  const r = report() as unknown as Record<string, any>;
  r.findings = Array.from({ length: 1000 }, () => null);
  assert.ok(readReport(r).errors.length <= 8); // problems are capped
});

test('the notice is text only', () => {
  const node = unreadableNotice(['$.input.reaction: <img src=x onerror=alert(1)>']);
  assert.equal(node.querySelector('img'), null);
  assert.ok(node.textContent?.includes(UNREADABLE));
  assert.ok(node.textContent?.includes('<img src=x'));
});

// Payloads the Python package writes must pass this check, or the renderer would refuse real
// output. Needs the Python package (PYTHON, else the project's .venv); skipped without it.
test('payloads written by the Python package pass', t => {
  const root = path.resolve(__dirname, '..', '..', '..');
  const python = process.env.PYTHON ?? path.join(root, '.venv', 'bin', 'python');
  const code = [
    'import json, chemcheck',
    "rx = ['CCCCN.CC(=O)Cl>>CCCCNC(C)=O', 'Nc1ccccc1.CC(=O)Cl>AlCl3>CC(=O)c1ccc(N)cc1', 'NCc1ccccc1.CC(=O)Cl>Et3N.DCM>CC(=O)NCc1ccccc1']",
    "out = [chemcheck.check(r).to_dict() for r in rx]",
    "out.append(chemcheck.check(rx[2], {'NCc1ccccc1': '1.07 g', 'CC(=O)Cl': '0.78 mL', 'Et3N': '2.09 mL', 'DCM': '10 mL'}).to_dict())",
    'print(json.dumps(out))'
  ].join('\n');
  let text: string;
  try {
    text = execFileSync(python, ['-c', code], { cwd: root, env: { ...process.env, PYTHONPATH: root }, encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'], timeout: 300_000 });
  } catch {
    t.skip(`no Python with chemcheck at ${python}`);
    return;
  }
  const payloads = JSON.parse(text) as unknown[];
  assert.equal(payloads.length, 4);
  for (const p of payloads) {
    assert.deepEqual(schemaErrors(p), []);
  }
});
