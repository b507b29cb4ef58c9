import { test } from 'node:test';
import assert from 'node:assert/strict';

import { installDom } from './setup';

installDom();

import { ackBlock } from '../src/ackhtml';
import { findingKey } from '../src/render';
import type { Report } from '../src/payload';

const HOSTILE = '<img src=x onerror="globalThis.__pwned=1"><script>globalThis.__pwned=2</script>';

test('the static acknowledgement block escapes every string and lists only acknowledged findings', () => {
  const f = { rule: 'acid-scavenger-short', severity: 'warning' as const, title: 'Too little base', message: 'm', atoms: [] as [number, number][], fix: null, references: [] };
  const g = { ...f, rule: 'other-rule', message: 'n' };
  const report = {
    schema: 'chemcheck.report', version: '1', chemcheck_version: '0', input: { reaction: 'CCN', amounts: {} },
    components: [], findings: [f, g], counts: { error: 0, warning: 2, info: 0 }
  } as unknown as Report;
  const html = ackBlock(report, [{ finding: findingKey(f), rule: f.rule, who: HOSTILE, when: '2026-12-04T18:40:00.000Z', note: HOSTILE }]);
  assert.ok(html.includes('Warning (Too little base): acknowledged by &lt;img'));
  assert.ok(html.includes('Fri, 04 Dec 2026 18:40 UTC'));
  assert.ok(!html.includes('<script>') && !html.includes('<img'));
  assert.ok(!html.includes('other-rule'));
  assert.equal(ackBlock(report, []), '');
});
