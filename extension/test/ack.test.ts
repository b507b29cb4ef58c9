import { test } from 'node:test';
import assert from 'node:assert/strict';

import { parseAcks, withAck } from '../src/ack';

test('acknowledgements are read defensively from cell metadata', () => {
  assert.deepEqual(parseAcks(undefined), []);
  assert.deepEqual(parseAcks({ acknowledgements: 'nope' }), []);
  const acks = parseAcks({ acknowledgements: [{ finding: 'a#1', rule: 'a', who: 'R', when: 't', note: 'n' }, { bogus: true }, 7] });
  assert.equal(acks.length, 1);
  assert.equal(acks[0].who, 'R');
});

test('adding an acknowledgement keeps other metadata and replaces one of the same finding', () => {
  const meta = { other: 1, acknowledgements: [{ finding: 'a#1', rule: 'a', who: 'R', when: 't', note: 'old' }] };
  const next = withAck(meta, { finding: 'a#1', rule: 'a', who: 'S', when: 'u', note: 'new' });
  assert.equal(next.other, 1);
  const acks = parseAcks(next);
  assert.equal(acks.length, 1);
  assert.equal(acks[0].note, 'new');
  assert.equal(meta.acknowledgements[0].note, 'old'); // the input is not changed
});
