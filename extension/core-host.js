// The offscreen document that runs the core in Chromium (core.html). The
// service worker that answers the toolbar button is stopped after half a
// minute idle, and took the loaded core with it: the next press started
// the extension's process again and loaded the core again, 450-700 ms of
// a press at 5,000 marks (DEVELOPERS.md). This document outlives the
// worker, so a press after a stop finds the core loaded and its memory
// of the last page kept. It closes when no request has come for a while
// (keep.js: ten minutes, one when the cores hold much memory), giving
// back the core's memory: the background closes it when asked
// (background.js: closeHost), since only the worker may.
//
// Requests come from the extension's own service worker only (a
// document receives no other worker's messages), each with a port for
// its answer: {op, args} → {value} or {error}.
import { heldBytes, requests, startTraining } from './core.js';
import { keepMs } from './keep.js';
import { ext } from './platform.js';

startTraining();

let idleTimer = 0;
function touch() {
  clearTimeout(idleTimer);
  idleTimer = setTimeout(() => {
    ext.runtime.sendMessage({ type: 'standout/host-idle' }).catch((e) => console.warn('Standout could not close its core:', e));
  }, keepMs(heldBytes()));
}

navigator.serviceWorker.addEventListener('message', async (ev) => {
  const port = ev.ports[0];
  const { op, args } = ev.data || {};
  if (!port) return;
  touch();
  try {
    if (!Object.hasOwn(requests, op) || !Array.isArray(args)) throw new Error(`the core has no request ${op}`);
    port.postMessage({ value: await requests[op](...args) });
  } catch (e) {
    port.postMessage({ error: String((e && e.message) || e) });
  }
});
navigator.serviceWorker.startMessages();
touch();
