import { test } from 'node:test';
import assert from 'node:assert/strict';

import { installDom } from './setup';

installDom();

// eslint-disable-next-line @typescript-eslint/no-var-requires
import { findingKey, isReport, renderReport, ringRadius } from '../src/render';
import type { Report } from '../src/payload';

const HOSTILE = '<img src=x onerror="globalThis.__pwned=1"><script>globalThis.__pwned=2</script>';

function report(overrides: Partial<Report> = {}): Report {
  return {
    schema: 'chemcheck.report',
    version: '1',
    chemcheck_version: '0.0.0',
    input: { reaction: 'CCN.CC(=O)Cl>>CCNC(C)=O', amounts: {} },
    components: [
      {
        index: 0, role: 'reactant', text: 'CCN', smiles: 'CCN', formula: 'C2H7N', mw: 45.08,
        inchikey: '', name: null, source: 'smiles', kind: null, charge: 0, sanitization: 'full',
        fragments: ['CCN'], nitrogens: [], groups: []
      }
    ],
    findings: [
      { rule: 'acid-scavenger-short', severity: 'error', title: 't', message: 'no base', atoms: [[0, 2]], fix: 'add base', references: [] },
      { rule: 'unbalanced-equation', severity: 'info', title: 't', message: 'HCl is not drawn', atoms: [], fix: null, references: [] }
    ],
    counts: { error: 1, warning: 0, info: 1 },
    ...overrides
  };
}

test('findings are grouped by severity, errors first, with their messages as text', () => {
  const node = renderReport(report());
  const items = [...node.querySelectorAll('.cc-finding')];
  assert.equal(items.length, 2);
  assert.ok(items[0].classList.contains('cc-error'));
  assert.ok(items[1].classList.contains('cc-info'));
  assert.match(items[0].textContent ?? '', /no base/);
  assert.match(items[0].textContent ?? '', /At atom 3 of compound 1/);
});

test('markup in names, SMILES, notes and messages stays text', () => {
  const r = report({
    input: { reaction: HOSTILE, amounts: {} },
    findings: [{ rule: 'x-y', severity: 'warning', title: HOSTILE, message: HOSTILE, atoms: [], fix: HOSTILE, references: [] }]
  });
  r.components[0].text = HOSTILE;
  r.components[0].name = HOSTILE;
  const node = renderReport(r, {
    acknowledgements: [{ finding: findingKey(r.findings[0]), rule: 'x-y', who: HOSTILE, when: 'now', note: HOSTILE }]
  });
  document.body.appendChild(node);
  assert.equal(node.querySelectorAll('script').length, 0);
  assert.equal(node.querySelectorAll('img[onerror]').length, 0);
  assert.ok((node.textContent ?? '').includes('<script>'));
  assert.equal((globalThis as Record<string, unknown>).__pwned, undefined);
});

test('an acknowledged finding is shown as such and offers no button', () => {
  const r = report();
  const key = findingKey(r.findings[0]);
  const node = renderReport(r, {
    acknowledgements: [{ finding: key, rule: r.findings[0].rule, who: 'A. Reviewer', when: '2026-12-01', note: '3 equiv used' }],
    onAcknowledge: () => undefined
  });
  const first = node.querySelector('.cc-finding') as HTMLElement;
  assert.ok(first.classList.contains('cc-acknowledged'));
  assert.match(first.textContent ?? '', /Acknowledged by A\. Reviewer/);
  assert.equal(first.querySelector('button'), null);
  // notes are information: never asked to be acknowledged
  const second = node.querySelectorAll('.cc-finding')[1];
  assert.ok(second.classList.contains('cc-info'));
  assert.equal(second.querySelector('button'), null);
});

test('warnings offer the acknowledgement button', () => {
  const r = report();
  r.findings[0] = { ...r.findings[0], severity: 'warning' };
  const node = renderReport(r, { acknowledgements: [], onAcknowledge: () => undefined });
  assert.ok(node.querySelector('.cc-finding.cc-warning button.cc-ack-button'));
});

test('hovering a finding draws circles at its atoms on the overlay', () => {
  const r = report({
    drawing: {
      scheme_svg: '<svg xmlns="http://www.w3.org/2000/svg"/>', width: 200, height: 100,
      components: [{ component: 0, svg: '', x: 0, y: 0, width: 100, height: 80, atoms: [[10, 10], [20, 20], [30, 40]] }]
    }
  });
  const node = renderReport(r);
  const overlay = node.querySelector('.cc-scheme-overlay') as SVGElement;
  const first = node.querySelector('.cc-finding') as HTMLElement;
  first.dispatchEvent(new window.Event('mouseenter'));
  const circles = overlay.querySelectorAll('circle');
  assert.equal(circles.length, 1);
  assert.equal(circles[0].getAttribute('cx'), '30');
  first.dispatchEvent(new window.Event('mouseleave'));
  assert.equal(overlay.querySelectorAll('circle').length, 0);
});

test('the finding key is stable and depends on rule, message and atoms', () => {
  const f = report().findings[0];
  assert.equal(findingKey(f), findingKey({ ...f }));
  assert.notEqual(findingKey(f), findingKey({ ...f, atoms: [[0, 1]] }));
  assert.notEqual(findingKey(f), findingKey({ ...f, message: 'other' }));
});

test('payloads of another format are recognised as such', () => {
  assert.equal(isReport({ foo: 1 }), false);
  assert.equal(isReport(null), false);
  assert.equal(isReport(report()), true);
});

test('finding keys agree with the Python side (chemcheck.review.finding_key)', () => {
  // the same literal is asserted in tests/test_review.py
  const f = { rule: 'x-y', severity: 'info' as const, title: '', message: 'At most about 50 % conversion – K ≈ 10^5 😀', atoms: [] as [number, number][], fix: null, references: [] };
  assert.equal(findingKey(f), 'x-y#82dd598e');
});

test('predicted products show their drawing as an image, the SMILES as text', () => {
  const svg = '<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"></svg>';
  const r = report({
    predictions: [
      {
        reaction_class: 'Friedel-Crafts acylation',
        candidates: [
          { smiles: 'COc1ccc(C(C)=O)cc1', rank: 1, label: 'major', reason: 'para to OMe', svg },
          { smiles: HOSTILE, rank: 2, label: 'minor', reason: HOSTILE, svg: null }
        ]
      }
    ]
  });
  const node = renderReport(r);
  const items = [...node.querySelectorAll('.cc-candidate')];
  assert.equal(items.length, 2);
  const img = items[0].querySelector('img') as HTMLImageElement;
  assert.ok(img.src.startsWith('data:image/svg+xml'));
  assert.equal(img.alt, 'COc1ccc(C(C)=O)cc1');
  assert.equal(items[1].querySelectorAll('img').length, 0);
  assert.ok((items[1].textContent ?? '').includes('<script>'));
});

test('compounds are named by number and label, never by SMILES, in findings and tables', () => {
  const r = report({
    labels: [{ component: 0, number: '1', label: 'ethylamine (1)', elements: ['C', 'C', 'N'] }],
    table: {
      columns: ['formula', 'mw', 'mass_g', 'volume_ml', 'mmol', 'equiv', 'yield_pct'],
      reference: null,
      limiting: 'CCN',
      rows: [
        { component: 0, text: 'CCN', values: { formula: 'C2H7N', mw: 45.085, mass_g: 0.0451, volume_ml: null, mmol: 1.0, equiv: 1, yield_pct: null }, read_as: '1 mmol' }
      ]
    }
  });
  const node = renderReport(r);
  const first = node.querySelector('.cc-finding') as HTMLElement;
  assert.match(first.textContent ?? '', /At N of ethylamine \(1\)/);
  const headers = [...node.querySelectorAll('.cc-stoich th')].map(th => th.textContent);
  // empty columns (volume, yield) hidden; units in the headers; mass in mg at this scale
  assert.deepEqual(headers, ['Compound', 'M (g/mol)', 'Equiv', 'Amount (mmol)', 'Mass (mg)']);
  const cells = [...node.querySelectorAll('.cc-stoich td')].map(td => td.textContent);
  assert.deepEqual(cells, ['ethylamine (1)', '45.09', '1.0', '1.00', '45.1']);
  assert.match(node.querySelector('.cc-verdict')?.textContent ?? '', /limiting reagent ethylamine \(1\)/);
  // collapsible sections are closed by default
  const components = node.querySelector('details.cc-components') as HTMLDetailsElement;
  assert.equal(components.open, false);
});

test('hazard cautions are gathered in one Safety section with the deferral sentence once', () => {
  const sds = 'Check the SDS of each reagent, local regulations and your institution\'s safety review before running it.';
  const r = report({
    findings: [
      { rule: 'hazard-caution', severity: 'info', title: 'h', message: `Acid chloride (2): corrosive. ${sds}`, atoms: [], fix: sds, references: [] },
      { rule: 'hazard-caution', severity: 'info', title: 'h', message: `Lewis acid (a): reacts with water. ${sds}`, atoms: [], fix: sds, references: [] }
    ]
  });
  const node = renderReport(r);
  assert.equal(node.querySelectorAll('.cc-finding').length, 0);
  assert.equal(node.querySelectorAll('.cc-safety li').length, 2);
  assert.equal((node.textContent ?? '').split('institution').length - 1, 1);
});

test('the ring round a highlighted atom clears its label box', () => {
  // label box 20 x 12 px whose centre is the atom: the ring goes round its corners
  assert.ok(ringRadius([50, 50], [40, 44, 20, 12]) >= Math.hypot(10, 6) + 1);
  assert.equal(ringRadius([50, 50], null), 14);
});
