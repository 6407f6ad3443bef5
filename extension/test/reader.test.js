// Unit tests of the read pass's pure parts, under Node's test runner:
// node --test test/ (CI runs it). The read pass is loaded as the command
// line loads it: constants.js, then reader.js, as classic scripts.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { runInThisContext } from 'node:vm';

const here = new URL('..', import.meta.url);
for (const f of ['constants.js', 'reader.js']) runInThisContext(readFileSync(new URL(f, here), 'utf8'), { filename: f });
const { pure } = globalThis.standoutReader;
// plain turns −0 into 0, which the algorithms do not tell apart.
const plain = (m) => m.map((v) => v + 0);

test('packColour packs rgb() and rgba() as 0xRRGGBBAA', () => {
  // CSS Color Module Level 4 §5.1: rgb() with commas or spaces, alpha as a
  // number or a percentage, channels clamped to 0–255.
  const cases = [
    ['rgb(15, 118, 110)', 0x0f766eff],
    ['rgba(15, 118, 110, 0.5)', 0x0f766e80],
    ['rgb(15 118 110 / 50%)', 0x0f766e80],
    ['rgb(300, 0, 0)', 0xff0000ff],
    ['rgba(0, 0, 0, 0)', 0x00000000],
  ];
  for (const [css, want] of cases) assert.equal(pure.packColour(css), want, css);
});

test('stopAt interpolates a gradient linearly between its stops', () => {
  // SVG 1.1 §13.2.4: between two stops the colour is interpolated
  // linearly in each channel; before the first and after the last stop it
  // is that stop's colour.
  const st = [[0, 0x000000ff], [1, 0xffffffff]];
  assert.equal(pure.stopAt(st, 0.5), 0x808080ff);
  assert.equal(pure.stopAt(st, -1), 0x000000ff);
  assert.equal(pure.stopAt(st, 2), 0xffffffff);
  assert.equal(pure.stopAt([[0.2, 0xff0000ff], [0.2, 0x0000ffff]], 0.2), 0xff0000ff, 'coincident stops: the first');
});

test('mul and invert are the affine product and inverse', () => {
  // SVG 1.1 §7.4: [a b c d e f] maps (x, y) to (ax + cy + e, bx + dy + f).
  const m = [2, 0.5, -1, 3, 10, -4];
  const id = pure.mul(m, pure.invert(m));
  const want = [1, 0, 0, 1, 0, 0];
  id.forEach((v, i) => assert.ok(Math.abs(v - want[i]) < 1e-12, `${id}`));
  assert.deepEqual(pure.mul([1, 0, 0, 1, 5, 6], [2, 0, 0, 2, 1, 1]), [2, 0, 0, 2, 6, 7], 'the second applies first');
  assert.equal(pure.invert([1, 2, 2, 4, 0, 0]), null, 'a singular matrix has no inverse');
});

test('viewBoxMatrix follows preserveAspectRatio', () => {
  // SVG 1.1 §7.8: a 100×50 viewBox in a 200×200 viewport scales by 2
  // (meet) and centres vertically; slice scales by 4 and centres
  // horizontally; none scales each axis apart.
  assert.deepEqual(plain(pure.viewBoxMatrix([0, 0, 100, 50], 200, 200, '')), [2, 0, 0, 2, 0, 50]);
  assert.deepEqual(plain(pure.viewBoxMatrix([0, 0, 100, 50], 200, 200, 'xMinYMin meet')), [2, 0, 0, 2, 0, 0]);
  assert.deepEqual(plain(pure.viewBoxMatrix([0, 0, 100, 50], 200, 200, 'xMidYMid slice')), [4, 0, 0, 4, -100, 0]);
  assert.deepEqual(plain(pure.viewBoxMatrix([10, 20, 100, 50], 200, 200, 'none')), [2, 0, 0, 4, -20, -80]);
});

test('adoptedSheets lists adopted sheets, or says they are unknown', () => {
  // Chromium hands a content script the page's list as an array; Firefox
  // ESR 140.10 as an opaque list with neither an iterator nor a length
  // (seen in that browser; extension/firefox_test.go), whose page-side
  // list (wrappedJSObject) still has its length.
  const sheet = { cssRules: [] };
  assert.deepEqual(pure.adoptedSheets({ adoptedStyleSheets: [sheet] }), [sheet]);
  assert.deepEqual(pure.adoptedSheets({}), [], 'no list: an old browser, nothing adopted');
  const opaque = Object.create(null);
  assert.deepEqual(pure.adoptedSheets({ adoptedStyleSheets: opaque, wrappedJSObject: { adoptedStyleSheets: [] } }), []);
  assert.equal(pure.adoptedSheets({ adoptedStyleSheets: opaque, wrappedJSObject: { adoptedStyleSheets: [sheet] } }), null, 'sheets it cannot read');
  assert.equal(pure.adoptedSheets({ adoptedStyleSheets: opaque }), null, 'no page-side list');
  const hostile = { adoptedStyleSheets: opaque, wrappedJSObject: { get adoptedStyleSheets() { throw new Error('no'); } } };
  assert.equal(pure.adoptedSheets(hostile), null, 'a page that throws');
});
