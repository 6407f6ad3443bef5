// The extension's background: it runs the Go core (WebAssembly) under the
// extension's own CSP, so pages with strict CSPs are checked too. Nothing
// here is needed between events: if the service worker is stopped, the
// next event loads the core again.
import './wasm_exec.js';

let corePromise = null;

// loadCore instantiates standout.wasm once per service-worker lifetime.
function loadCore() {
  if (globalThis.standoutHandle) return Promise.resolve();
  if (!corePromise) {
    corePromise = (async () => {
      const go = new Go();
      const url = chrome.runtime.getURL('standout.wasm');
      const { instance } = await WebAssembly.instantiateStreaming(fetch(url), go.importObject);
      go.run(instance); // returns only when Go exits; it never does
      for (let i = 0; i < 200 && !globalThis.standoutHandle; i++) {
        await new Promise((r) => setTimeout(r, 5));
      }
      if (!globalThis.standoutHandle) throw new Error('the Standout core did not start');
    })().catch((e) => {
      corePromise = null;
      throw e;
    });
  }
  return corePromise;
}

async function inject(tabId, files) {
  await chrome.scripting.executeScript({ target: { tabId }, files });
}

// readPage runs the read pass in the page and returns its result as a
// JSON string: one string crosses the messaging layer far faster than a
// large object, and it goes to the core as it is.
async function readPage(tabId) {
  // One injection brings the reader and the overlay (both idempotent), so
  // showing the result needs no second round trip.
  await inject(tabId, ['cvd-filters.js', 'reader.js', 'overlay.js']);
  const [res] = await chrome.scripting.executeScript({
    target: { tabId },
    func: () => JSON.stringify(globalThis.standoutReader.readPage(document)),
  });
  return res.result;
}

// analyse reads the page, runs the core and returns the core's response
// (a JSON string: {ok, report, markdown} or {ok: false, error}) with the
// timings of the steps.
async function analyse(tabId, emphasis, severity, full) {
  const t0 = performance.now();
  const [pageJSON] = await Promise.all([readPage(tabId), loadCore()]);
  const t1 = performance.now();
  // The options and the page go to the core as two strings: the page as
  // the read pass wrote it, for the core's fast snapshot decoder.
  const options = { type: 'analyse', emphasis: emphasis || [], full: !!full };
  if (typeof severity === 'number') options.severity = severity;
  const response = globalThis.standoutHandle(JSON.stringify(options), pageJSON);
  const t2 = performance.now();
  return { response, timing: { readMs: t1 - t0, analyseMs: t2 - t1 } };
}

async function show(tabId, result) {
  await chrome.tabs.sendMessage(tabId, { type: 'standout/show', target: 'overlay', data: result });
}

// toggle closes an open check, or runs one.
async function toggle(tab) {
  if (!tab || tab.id === undefined) return;
  try {
    const r = await chrome.tabs.sendMessage(tab.id, { type: 'standout/close', target: 'overlay' });
    if (r && r.closed) return;
  } catch (e) {
    // No overlay in this tab yet.
  }
  try {
    await show(tab.id, await analyse(tab.id, [], undefined));
  } catch (e) {
    await showError(tab.id, e);
  }
}

async function showError(tabId, e) {
  try {
    await inject(tabId, ['cvd-filters.js', 'reader.js', 'overlay.js']);
    await chrome.tabs.sendMessage(tabId, { type: 'standout/error', target: 'overlay', data: String((e && e.message) || e) });
  } catch (e2) {
    console.warn('Standout could not run on this page:', e, e2);
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
      analyse(tabId, msg.data.emphasis, msg.data.severity, msg.type === 'standout/full-report')
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
