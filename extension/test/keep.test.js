// Unit tests of keep.js, how long the offscreen document that runs the
// core is kept without a request, under Node's test runner. The sizes are
// the WebAssembly memory measured in Chromium after presses on the
// benchmark's scatter charts (keep.js).
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { KEEP_LARGE_MS, KEEP_MS, keepMs } from '../keep.js';

test('charts of 1,000 and 5,000 marks keep the core ten minutes', () => {
  assert.equal(KEEP_MS, 600000);
  assert.equal(keepMs(0), KEEP_MS);
  assert.equal(keepMs(11534336), KEEP_MS);
  assert.equal(keepMs(34078720), KEEP_MS);
});

test('a chart of 20,000 marks keeps it one minute', () => {
  assert.equal(KEEP_LARGE_MS, 60000);
  assert.equal(keepMs(121110528), KEEP_LARGE_MS);
});

test('64 MiB is the bound, and a size that is no number keeps the default', () => {
  assert.equal(keepMs(64 * 1024 * 1024), KEEP_MS);
  assert.equal(keepMs(64 * 1024 * 1024 + 65536), KEEP_LARGE_MS);
  assert.equal(keepMs(NaN), KEEP_MS);
  assert.equal(keepMs(undefined), KEEP_MS);
});
