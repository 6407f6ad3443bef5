// The extension's background: it runs the Go core (WebAssembly) under the
// extension's own CSP, so pages with strict CSPs are checked too. Nothing
// here is needed between events: if the service worker is stopped, the
// next event loads the core again.
import './wasm_exec.js';

let corePromise = null;

// loadCore instantiates standout.wasm once per service-worker lifetime
// and resolves to how long that took (0 when it was already running).
function loadCore() {
  if (globalThis.standoutHandle) return Promise.resolve(0);
  if (!corePromise) {
    const t0 = performance.now();
    corePromise = (async () => {
      const go = new Go();
      const url = chrome.runtime.getURL('standout.wasm');
      const { instance } = await WebAssembly.instantiateStreaming(fetch(url), go.importObject);
      go.run(instance); // returns only when Go exits; it never does
      for (let i = 0; i < 200 && !globalThis.standoutHandle; i++) {
        await new Promise((r) => setTimeout(r, 5));
      }
      if (!globalThis.standoutHandle) throw new Error('the Standout core did not start');
      return performance.now() - t0;
    })().catch((e) => {
      corePromise = null;
      throw e;
    });
  }
  return corePromise;
}

const SCRIPTS = ['cvd-filters.js', 'reader.js', 'overlay.js'];

// run executes one injection in the tab and returns its result. The tab's
// activeTab grant can land a moment after the action's click event (seen
// when the action is pressed through the DevTools protocol under load):
// a refused first access is retried briefly.
async function run(tabId, injection) {
  for (let attempt = 0; ; attempt++) {
    try {
      const [res] = await chrome.scripting.executeScript({ target: { tabId }, ...injection });
      return res && res.result;
    } catch (e) {
      if (attempt >= 4 || !/Cannot access|permission/i.test(String(e && e.message))) throw e;
      await new Promise((ok) => setTimeout(ok, 25 << attempt));
    }
  }
}

// readPage reads the page, or with toggle closes an open check, in one
// round trip. A press injects the scripts and press.js, whose value is the
// press's outcome (the scripts do nothing when they are there already); a
// re-run asks the overlay, which is there, to read again.
async function readPage(tabId, toggle) {
  let r;
  try {
    r = toggle
      ? await run(tabId, { files: [...SCRIPTS, 'press.js'] })
      : await run(tabId, { func: () => globalThis.standoutOverlay.read() });
  } catch (e) {
    throw new Error(`reading the page: ${(e && e.message) || e}`);
  }
  if (!r) throw new Error('reading the page: the read pass returned nothing');
  return r;
}

// analyse reads the page (unless read already holds its reading), runs
// the core and returns the core's response (a JSON string: {ok, overlay}
// or {ok, report, markdown}, or {ok: false, error}) with the timings of
// the steps, or {closed: true} when toggle closed an open check.
async function analyse(tabId, { toggle = false, emphasisNodes = [], severity, full = false } = {}) {
  const t0 = performance.now();
  const [read, loadMs] = await Promise.all([readPage(tabId, toggle), loadCore()]);
  if (read.closed) return read;
  const t1 = performance.now();
  // The options and the page go to the core as two strings: the page as
  // the read pass wrote it, for the core's fast snapshot decoder.
  const options = { type: 'analyse', emphasisNodes, full };
  if (typeof severity === 'number') options.severity = severity;
  const response = globalThis.standoutHandle(JSON.stringify(options), read.json);
  const t2 = performance.now();
  return {
    response,
    timing: {
      readMs: read.readMs,
      stringifyMs: read.stringifyMs,
      readTripMs: t1 - t0,
      coreLoadMs: loadMs,
      coreMs: t2 - t1,
      pageBytes: read.json.length,
      responseBytes: response.length,
    },
  };
}

// show hands the result to the overlay in the page.
async function show(tabId, result) {
  try {
    await chrome.scripting.executeScript({
      target: { tabId },
      func: (r) => globalThis.standoutOverlay.show(r),
      args: [result],
    });
  } catch (e) {
    throw new Error(`showing the result: ${(e && e.message) || e}`);
  }
}

// toggle closes an open check, or runs one.
async function toggle(tab) {
  if (!tab || tab.id === undefined) return;
  try {
    const r = await analyse(tab.id, { toggle: true });
    if (!r.closed) await show(tab.id, r);
  } catch (e) {
    await showError(tab.id, e);
  }
}

async function showError(tabId, e) {
  const msg = String((e && e.message) || e);
  try {
    await chrome.scripting.executeScript({ target: { tabId }, files: SCRIPTS });
    await chrome.scripting.executeScript({ target: { tabId }, func: (m) => globalThis.standoutOverlay.showError(m), args: [msg] });
  } catch (e2) {
    console.warn('Standout could not run on this page:', msg, e2);
  }
}

chrome.action.onClicked.addListener((tab) => {
  toggle(tab);
});

chrome.runtime.onMessage.addListener((msg, sender, sendResponse) => {
  const tabId = sender.tab && sender.tab.id;
  switch (msg && msg.type) {
    case 'standout/reanalyse':
    case 'standout/full-report':
      analyse(tabId, { emphasisNodes: msg.data.emphasisNodes, severity: msg.data.severity, full: msg.type === 'standout/full-report' })
        .then((r) => sendResponse({ ok: true, data: r }))
        .catch((e) => sendResponse({ ok: false, error: String((e && e.message) || e) }));
      return true;
    case 'standout/capture':
      chrome.tabs
        .captureVisibleTab(sender.tab.windowId, { format: 'png' })
        .then((url) => sendResponse({ ok: true, data: url }))
        .catch((e) => sendResponse({ ok: false, error: String((e && e.message) || e) }));
      return true;
    default:
      console.warn('Standout: unknown message', msg && msg.type);
  }
  return false;
});
