import { test } from 'node:test';
import assert from 'node:assert/strict';

import { type MetadataHolder, acksOf, parseAcks, reviewerFromSettings, storeAck, withAck } from '../src/ack';

test('acknowledgements are read defensively from cell metadata', () => {
  assert.deepEqual(parseAcks(undefined), []);
  assert.deepEqual(parseAcks({ acknowledgements: 'nope' }), []);
  const acks = parseAcks({ acknowledgements: [{ finding: 'a#1', rule: 'a', who: 'R', when: 't', note: 'n' }, { bogus: true }, 7] });
  assert.equal(acks.length, 1);
  assert.equal(acks[0].who, 'R');
});

test('adding an acknowledgement keeps other metadata and appends (the newest is the one read)', () => {
  const meta = { other: 1, acknowledgements: [{ finding: 'a#1', rule: 'a', who: 'R', when: 't', note: 'old' }] };
  const next = withAck(meta, { finding: 'a#1', rule: 'a', who: 'S', when: 'u', note: 'new' });
  assert.ok(next);
  assert.equal(next.other, 1);
  const acks = parseAcks(next);
  assert.deepEqual(acks.map(a => a.note), ['old', 'new']);
  assert.equal(meta.acknowledgements.length, 1); // the input is not changed
  const cell = holder({ chemcheck: next });
  assert.deepEqual(acksOf(cell).map(a => a.note), ['new']);
});

function holder(initial: Record<string, unknown>): MetadataHolder & { data: Record<string, unknown> } {
  const data: Record<string, unknown> = JSON.parse(JSON.stringify(initial));
  return {
    data,
    getMetadata: (key: string) => data[key],
    setMetadata: (key: string, value: unknown) => {
      data[key] = value;
    }
  };
}

const ACK = { finding: 'acid-scavenger-short#1', rule: 'acid-scavenger-short', who: 'A. Reviewer', when: '2026-12-04', note: 'n' };

// odd metadata as found in real notebooks: other tools' keys, entries of a future version,
// `who` as an object, a `chemcheck` value of another shape
const ODD: Array<[string, Record<string, unknown>]> = [
  ['empty', {}],
  ['other keys', { tags: ['x'], 'other-tool': { a: [1, { b: null }] } }],
  [
    'odd entries',
    {
      chemcheck: {
        version: 7,
        future: { k: null },
        acknowledgements: [
          { finding: 'x#1', rule: 'x', who: { name: 'B', email: 'b@example.org' }, when: 't', note: '', signature: 'abc' },
          { not: 'an acknowledgement' },
          'text',
          null
        ]
      }
    }
  ],
  ['chemcheck is a list', { chemcheck: ['another', 'shape'] }],
  ['chemcheck is a string', { chemcheck: 'a string' }],
  ['acknowledgements not a list', { chemcheck: { acknowledgements: 'nope' } }]
];

for (const [name, initial] of ODD) {
  test(`acknowledging keeps odd metadata unchanged: ${name}`, () => {
    const cell = holder(initial);
    assert.ok(storeAck(cell, ACK));
    for (const [key, value] of Object.entries(initial)) {
      const now = cell.data[key] as Record<string, unknown>;
      if (JSON.stringify(now) === JSON.stringify(value)) {
        continue; // untouched
      }
      // the one list that grew: everything else in that object, and every older entry, as it was
      const before = value as Record<string, unknown>;
      const { acknowledgements: grown, ...rest } = now;
      const { acknowledgements: was, ...restBefore } = before;
      assert.deepEqual(rest, restBefore);
      assert.deepEqual((grown as unknown[]).slice(0, -1), was);
    }
    assert.deepEqual(acksOf(cell).at(-1), ACK);
    // and it survives being saved and read again
    assert.deepEqual(JSON.parse(JSON.stringify(cell.data)), cell.data);
  });
}

test('an acknowledgement by someone with a structured identity is read by name', () => {
  const acks = parseAcks({ acknowledgements: [{ finding: 'x#1', rule: 'x', who: { name: 'B. Chemist', email: 'b@example.org' } }] });
  assert.equal(acks[0].who, 'B. Chemist');
});

test('the reviewer comes from the settings only', () => {
  assert.equal(reviewerFromSettings({ reviewerName: '' }), null);
  assert.equal(reviewerFromSettings({ reviewerName: '   ' }), null);
  assert.equal(reviewerFromSettings({ reviewerName: ' A. Reviewer ' }), 'A. Reviewer');
});
