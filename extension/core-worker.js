// The dedicated worker that runs the core in Chromium's offscreen
// document (core-host.js). Each request comes with the port the
// background's service worker made for its answer: {op, args} → {value}
// or {error}. After each answer, and whenever the training's state
// changes, the worker tells the document the core's state (core.js:
// state), whose memory decides how long the document is kept (keep.js)
// and which the document shows as standoutCore.
import { onReport, requests, startTraining, state } from './core.js';

const tell = () => self.postMessage(state());

startTraining();
onReport(tell);

self.addEventListener('message', async (ev) => {
  const port = ev.ports[0];
  const { op, args } = ev.data || {};
  if (!port) return;
  try {
    if (!Object.hasOwn(requests, op) || !Array.isArray(args)) throw new Error(`the core has no request ${op}`);
    port.postMessage({ value: await requests[op](...args) });
  } catch (e) {
    port.postMessage({ error: String((e && e.message) || e) });
  }
  tell();
});
