// Unit tests of patch.js, the patches the page and the background send
// each other, under Node's test runner (node --test test/). The oracle is
// the string itself: a patch applied to the string it was made against
// must give the new string back, character for character.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { runInThisContext } from 'node:vm';

const here = new URL('..', import.meta.url);
runInThisContext(readFileSync(new URL('patch.js', here), 'utf8'), { filename: 'patch.js' });
const { diff, apply, sent, Keeper } = globalThis.standoutPatch;

// rng is a seeded generator (mulberry32), so that a failure repeats.
function rng(seed) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

// page is a reading shaped like the read pass's (snapshot/json.go): a
// columnar record of numbers per mark, as a 5,000-mark scatter gives.
function page(n, seed) {
  const r = rng(seed);
  const nodes = [];
  for (let i = 0; i < n; i++) {
    nodes.push(0, 2, i, i === 0 ? 4 : 512 + 4, Math.floor(r() * 4), +(10 + r() * 980).toFixed(1), +(10 + r() * 780).toFixed(1), 3);
  }
  return JSON.stringify({ source: 'http://localhost/', snapshots: [{ v: 2, path: 'svg0', tags: ['svg', 'g', 'circle'], paints: [1, 0x3b6e8fff, 0, 1, 0xd0842cff, 0], nodes }] });
}

// roundTrip checks that the patch from a to b gives b, and returns what
// it puts on the wire (b's length when no patch is worth sending).
function roundTrip(a, b, what) {
  const ops = diff(a, b);
  if (ops === null) return b.length;
  assert.equal(apply(a, ops, b.length), b, what);
  for (const op of ops) if (typeof op === 'string') assert.ok(op.isWellFormed(), `${what}: a literal cuts a surrogate pair`);
  return sent({ ops });
}

test('a small edit of a large reading crosses as a small patch', () => {
  const a = page(5000, 1);
  const edits = [
    ['one number early', a.replace('"paints":[1,', '"paints":[2,')],
    ['one number in the middle', a.slice(0, a.length / 2) + '7' + a.slice(a.length / 2 + 1)],
    ['one number at the end', a.slice(0, -5) + '9' + a.slice(-4)],
    ['a run inserted', a.slice(0, 70000) + '1,2,3,4,5,6,7,8,'.repeat(20) + a.slice(70000)],
    ['a run deleted', a.slice(0, 40000) + a.slice(41000)],
    ['two edits far apart', a.slice(0, 1000) + 'x' + a.slice(1001, 120000) + 'y' + a.slice(120001)],
    ['the same', a],
  ];
  for (const [what, b] of edits) {
    const n = roundTrip(a, b, what);
    assert.ok(n < b.length / 50, `${what}: ${n} characters of ${b.length} crossed`);
  }
});

test('a patch is whole strings when nothing is shared', () => {
  const a = page(1000, 2);
  const b = page(1000, 3);
  assert.equal(roundTrip(a, b, 'different readings'), b.length);
  assert.equal(roundTrip('', b, 'from nothing'), b.length);
  assert.deepEqual(diff(b, ''), [], 'to nothing');
  assert.equal(apply(b, [], 0), '');
});

test('an edit that renumbers what follows it crosses whole', () => {
  // As a new colour on a reading's first mark renumbers the paints and
  // styles after it (snapshot/json.go): every number after the edit moves.
  const a = page(3000, 7);
  const k = 200;
  const b = a.slice(0, k) + a.slice(k).replace(/\d+/g, (d) => String(Number(d) + 1));
  assert.equal(diff(a, b), null);
});

test('edits at a regular step, and a block replaced, still cross as patches', () => {
  const a = page(5000, 9);
  // One field changed in records at a regular step: samples of the middle
  // at a regular step would all fall on edits.
  let edits = 0;
  const b = a.replace(/,3\]|,3,/g, (m, off) => (off % 997 < 40 ? (edits++, m.replace('3', '4')) : m));
  assert.ok(edits > 100, `${edits} edits`);
  let n = roundTrip(a, b, 'edits at a regular step');
  assert.ok(n < b.length / 10, `edits at a regular step: ${n} characters of ${b.length} crossed`);
  // A third of the reading replaced by a reading of other marks: what
  // comes before and after it is copied.
  const k = Math.floor(a.length / 3);
  const other = page(5000, 10).slice(k, 2 * k);
  const c = a.slice(0, k) + other + a.slice(2 * k);
  n = roundTrip(a, c, 'a third replaced');
  assert.ok(n < other.length + 100, `a third replaced: ${n} characters of ${c.length} crossed`);
});

test('moved blocks are copied, not sent', () => {
  const a = page(3000, 4);
  const k = Math.floor(a.length / 3);
  const b = a.slice(k, 2 * k) + a.slice(0, k) + a.slice(2 * k);
  const n = roundTrip(a, b, 'two thirds swapped');
  assert.ok(n < b.length / 20, `${n} characters of ${b.length} crossed`);
});

test('random edits of random text round-trip, surrogate pairs whole', () => {
  // Characters from ASCII, the rest of the BMP and the astral planes (a
  // surrogate pair each), so that edits and chunk ends fall between the
  // halves of pairs.
  const r = rng(5);
  // U+1F600 and U+1F200 share their low surrogate, U+1F600 and U+1F601
  // their high one.
  const alphabet = ['a', 'b', ',', '1', '"', 'é', '\u2019', '\u{1F600}', '\u{1F601}', '\u{1F200}', '\u{20000}'];
  const text = (n) => Array.from({ length: n }, () => alphabet[Math.floor(r() * alphabet.length)]).join('');
  for (let trial = 0; trial < 300; trial++) {
    let a = text(Math.floor(r() * 12000));
    if (trial % 3 === 0) a = a.repeat(3); // repeated content: many equal chunks
    let b = a;
    const edits = 1 + Math.floor(r() * 4);
    for (let e = 0; e < edits; e++) {
      // Edits by code point, so that b stays well formed, as JSON is.
      const cps = Array.from(b);
      const at = Math.floor(r() * (cps.length + 1));
      const cut = Math.floor(r() * 40);
      b = cps.slice(0, at).join('') + text(Math.floor(r() * 40)) + cps.slice(at + cut).join('');
    }
    roundTrip(a, b, `trial ${trial}`);
  }
  // Pairs that differ in one half only, at the edit's either end.
  const long = text(5000);
  for (const [x, y] of [['\u{1F600}', '\u{1F200}'], ['\u{1F600}', '\u{1F601}']]) {
    roundTrip(long + x + long, long + y + long, `${x} to ${y}`);
  }
});

test('apply refuses a patch that does not fit its text', () => {
  const a = 'abcdefghij';
  assert.throws(() => apply(a, [0, 11], 11), /outside/);
  assert.throws(() => apply(a, [-1, 2], 2), /outside/);
  assert.throws(() => apply(a, [0.5, 2], 2), /outside/);
  assert.throws(() => apply(a, [2, 0], 0), /outside/);
  assert.throws(() => apply(a, [2], 2), /outside/);
  assert.throws(() => apply(a, [0, 3, 'x'], 3), /gave 4 characters, not 3/);
  assert.throws(() => apply(a, 'abc', 3), /not a list/);
  assert.equal(apply(a, [5, 5, 'X', 0, 2], 8), 'fghijXab');
});

test('keepers send a string whole, then as patches against what the other side holds', () => {
  const sender = new Keeper(2, 4);
  const receiver = new Keeper(2, 4);
  const a = page(2000, 6);
  const first = sender.give(7, a, receiver.held(7));
  assert.equal(first.text, a, 'nothing held yet: whole');
  assert.equal(receiver.take(7, first), a);
  assert.deepEqual(receiver.held(7), [first.id]);

  const b = a.replace('"paints":[1,', '"paints":[3,');
  const second = sender.give(7, b, receiver.held(7));
  assert.equal(second.text, undefined, 'a patch');
  assert.equal(second.base, first.id);
  assert.equal(receiver.take(7, second), b);
  assert.deepEqual(receiver.held(7), [second.id, first.id], 'newest first');

  // The receiver has dropped what the patch is against (here: a new
  // keeper, as after the background was stopped): take says so, and the
  // sender sends the string whole to what the receiver then holds.
  const third = sender.give(7, a, receiver.held(7));
  assert.equal(new Keeper().take(7, third), null);
  assert.equal(sender.give(7, a, []).text, a);
  assert.throws(() => receiver.take(7, { text: a }), /without an id/);
});

test('keepers hold perKey strings per line and drop the line used least recently', () => {
  const k = new Keeper(2, 2);
  const ids = [];
  for (const t of ['one', 'two', 'three']) ids.push(k.give('x', t, []).id);
  assert.deepEqual(k.held('x'), [ids[2], ids[1]], 'the oldest string of the line dropped');
  k.give('y', 'why', []);
  k.give('x', 'four', []);
  k.give('z', 'zed', []);
  assert.deepEqual(k.held('y'), [], 'line y, used least recently, dropped');
  assert.equal(k.held('x').length, 2);
  assert.equal(k.held('z').length, 1);
});

test('messages lost or taken out of order never give a wrong string', () => {
  // A page sends its readings to a background that keeps two per tab:
  // some messages are lost (the page closed, the worker stopped), some
  // arrive after later ones (two reads of a tab crossing). Every string
  // taken must be the one its message was made from, and a patch against
  // a string no longer held is refused, never misapplied.
  const r = rng(8);
  const page = new Keeper(2, 1);
  let background = new Keeper(2, 4);
  let text = page1();
  function page1() {
    return JSON.stringify({ nodes: Array.from({ length: 3000 }, (_, i) => i % 97) });
  }
  const inFlight = [];
  let refused = 0;
  let patched = 0;
  for (let step = 0; step < 400; step++) {
    // The page changes a little, or not at all.
    if (r() < 0.7) {
      const at = Math.floor(r() * text.length);
      text = text.slice(0, at) + String(Math.floor(r() * 100)) + text.slice(at + 1);
    }
    inFlight.push({ msg: page.give('page', text, background.held(1)), text });
    if (r() < 0.05) background = new Keeper(2, 4); // the worker stopped
    while (inFlight.length > 0 && r() < 0.6) {
      const k = r() < 0.2 ? Math.floor(r() * inFlight.length) : 0;
      const [{ msg, text: want }] = inFlight.splice(k, 1);
      if (r() < 0.1) continue; // lost
      const got = background.take(1, msg);
      if (got === null) {
        refused++;
        continue;
      }
      if (msg.ops) patched++;
      assert.equal(got, want, `step ${step}`);
    }
  }
  assert.ok(patched > 100, `only ${patched} patches were taken`);
  assert.ok(refused > 0, 'no patch was refused: the test did not lose or reorder enough');
});
