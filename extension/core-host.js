// The offscreen document that runs the core in Chromium (core.html), in a
// dedicated worker of its own (core-worker.js). The service worker that
// answers the toolbar button is stopped after half a minute idle, and
// took the loaded core with it: the next press started the extension's
// process again and loaded the core again, 450-700 ms of a press at
// 5,000 marks (DEVELOPERS.md). This document outlives the service worker,
// so a press after a stop finds the core loaded and its memory of the
// last page kept. It closes when no request has come for a while
// (keep.js: ten minutes, one when the cores hold much memory), giving
// back the core's memory: the background closes it when asked
// (background.js: closeHost), since only the service worker may.
//
// Requests come from the extension's own service worker only (a
// document receives no other worker's messages), each with a port for
// its answer, which goes to the core's worker with the request; the
// answer goes back on it from there.
import { keepMs } from './keep.js';
import { ext } from './platform.js';

const core = new Worker('core-worker.js', { type: 'module' });

// standoutCore is the core's state as its worker last told it (core.js:
// state): its memory decides how long this document is kept; the tests
// read the rest.
globalThis.standoutCore = Object.freeze({ held: 0, loaded: false, training: null });
let idleTimer = 0;
function touch() {
  clearTimeout(idleTimer);
  idleTimer = setTimeout(() => {
    ext.runtime.sendMessage({ type: 'standout/host-idle' }).catch((e) => console.warn('Standout could not close its core:', e));
  }, keepMs(globalThis.standoutCore.held));
}

core.addEventListener('message', (ev) => {
  const d = ev.data;
  if (d && Number.isFinite(d.held)) globalThis.standoutCore = Object.freeze({ held: d.held, loaded: d.loaded === true, training: d.training || null });
  touch();
});
core.addEventListener('error', (e) => console.warn('Standout\u2019s core failed:', e.message));

navigator.serviceWorker.addEventListener('message', (ev) => {
  const port = ev.ports[0];
  if (!port) return;
  touch();
  core.postMessage(ev.data, [port]);
});
navigator.serviceWorker.startMessages();
touch();
