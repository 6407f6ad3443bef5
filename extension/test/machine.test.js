// Unit tests of the overlay's state machine (machine.js) under Node's
// test runner. Each sequence of events is one a reader or a slow worker
// can produce; the four named ones are the overlay's bugs from issue 11.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { runInThisContext } from 'node:vm';

runInThisContext(readFileSync(new URL('../machine.js', import.meta.url), 'utf8'), { filename: 'machine.js' });
const M = globalThis.standoutMachine;

// run feeds events to a fresh machine; an event's seq may be a function
// of the machine so far, as a check captures the seq it was started with.
function run(events) {
  let m = M.initial();
  const trace = [];
  for (const ev of events) {
    const e = typeof ev.seq === 'function' ? { ...ev, seq: ev.seq(trace) } : ev;
    const r = M.next(m, e);
    m = r.machine;
    trace.push({ phase: m.phase, seq: m.seq, effects: r.effects });
  }
  return trace;
}

const seqOf = (k) => (trace) => trace[k].seq;

test('a press reads, its answer shows, a second press closes', () => {
  const t = run([{ type: 'press' }, { type: 'answer', seq: seqOf(0) }, { type: 'press' }]);
  assert.deepEqual(t.map((s) => s.phase), ['reading', 'shown', 'closed']);
  assert.deepEqual(t.map((s) => s.effects), [['read'], ['render', 'watch'], ['teardown']]);
});

test('bug 1: closing during a re-check stays closed when the answer arrives', () => {
  const t = run([{ type: 'press' }, { type: 'answer', seq: seqOf(0) }, { type: 'recheck' }, { type: 'close' }, { type: 'answer', seq: seqOf(2) }]);
  assert.equal(t.at(-1).phase, 'closed');
  assert.deepEqual(t.at(-1).effects, []);
});

test('bug 2: of overlapping re-checks, only the last answer is shown', () => {
  const t = run([
    { type: 'press' }, { type: 'answer', seq: seqOf(0) },
    { type: 'recheck' }, { type: 'change' }, // two checks in flight
    { type: 'answer', seq: seqOf(2) }, // the first, stale
    { type: 'answer', seq: seqOf(3) }, // the second
  ]);
  assert.equal(t[4].phase, 'rechecking', 'the stale answer is dropped');
  assert.deepEqual(t[4].effects, []);
  assert.equal(t[5].phase, 'shown');
  assert.deepEqual(t[5].effects, ['render', 'watch']);
});

test('bug 3: after an error the charts are no longer watched, and a change does nothing', () => {
  const t = run([{ type: 'press' }, { type: 'answer', seq: seqOf(0) }, { type: 'recheck' }, { type: 'fail', seq: seqOf(2) }, { type: 'change' }]);
  assert.equal(t[3].phase, 'error');
  assert.deepEqual(t[3].effects, ['unwatch', 'error']);
  assert.equal(t[4].phase, 'error');
  assert.deepEqual(t[4].effects, []);
});

test('bug 4: a re-check renders into the open overlay, without a teardown that would reset the view', () => {
  // The view (preview vision, severity, scope) lives in overlay.js and is
  // reset only by teardown; a re-check's answer renders without one.
  const t = run([{ type: 'press' }, { type: 'answer', seq: seqOf(0) }, { type: 'recheck' }, { type: 'answer', seq: seqOf(2) }]);
  assert.ok(t.slice(1).every((s) => !s.effects.includes('teardown')));
  assert.equal(t.at(-1).phase, 'shown');
});

test('a failure of an earlier check, or after a close, is dropped', () => {
  let t = run([{ type: 'press' }, { type: 'answer', seq: seqOf(0) }, { type: 'recheck' }, { type: 'fail', seq: seqOf(0) }]);
  assert.equal(t.at(-1).phase, 'rechecking');
  t = run([{ type: 'press' }, { type: 'press' }, { type: 'fail', seq: seqOf(0) }]);
  assert.equal(t.at(-1).phase, 'closed');
});

test('a press that fails before any read shows its error', () => {
  const t = run([{ type: 'fail' }]);
  assert.equal(t[0].phase, 'error');
  assert.ok(M.isOpen({ phase: 'error' }));
});

test('an answer while nothing is awaited is dropped', () => {
  const t = run([{ type: 'answer', seq: 0 }, { type: 'press' }, { type: 'answer', seq: seqOf(1) }, { type: 'answer', seq: seqOf(1) }]);
  assert.deepEqual(t.map((s) => s.phase), ['closed', 'reading', 'shown', 'shown']);
  assert.deepEqual(t[3].effects, [], 'the same answer twice renders once');
});

test('every phase is one of PHASES, and unknown events are refused', () => {
  assert.throws(() => M.next(M.initial(), { type: 'dance' }), /unknown event/);
  for (const s of run([{ type: 'press' }, { type: 'fail', seq: seqOf(0) }, { type: 'close' }])) assert.ok(M.PHASES.includes(s.phase));
});
