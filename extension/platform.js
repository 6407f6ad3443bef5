// Where Chromium and Firefox differ, in one place. The extension is one
// set of scripts for both; these are the differences it meets.
//
// - The background. Chromium runs background.js as a module service
//   worker (manifest.json: background.service_worker); Firefox as a module
//   event page (manifest.firefox.json: background.scripts). Both stop it
//   when idle. Chromium's worker runs the core in an offscreen document
//   that outlives it (core-host.js) once the reader has granted
//   "offscreen" (hostsCore); Firefox's event page runs the core itself,
//   and loads it again after a stop.
// - The namespace. Firefox names the API browser.*, Chromium chrome.*;
//   Firefox also answers to chrome.* with promises in Manifest V3. The
//   background takes `ext`; the scripts injected into pages use chrome.*,
//   which both give content scripts.
// - captureVisibleTab. Both grant it through activeTab after a press of the
//   toolbar button (Firefox also through the <all_urls> host permission,
//   which Standout does not ask for). A capture holds every frame the tab
//   shows, so it stays in extension pages.
// - Pressing the button in tests. Chromium's DevTools protocol presses it
//   (Extensions.triggerAction); Firefox's WebDriver BiDi does not reach
//   the toolbar, so its tests press it through Marionette in the
//   browser's window (extension/marionette_test.go).
// - Optimised code across loads. Chromium keeps the WebAssembly code V8
//   has optimised and loads it with the module next time, in a service
//   worker and an extension page too (measured; DEVELOPERS.md; not
//   measured on its own in the offscreen document's worker); the core is
//   trained for it wherever it runs in Chromium (core.js: train).
//   Firefox's event page is not trained: that was not measured there.
export const ext = globalThis.browser ?? globalThis.chrome;

// keepsOptimisedCode says whether the background runs as Chromium's
// service worker.
export const keepsOptimisedCode = typeof globalThis.ServiceWorkerGlobalScope === 'function' && globalThis instanceof globalThis.ServiceWorkerGlobalScope;

// hostsCore says whether the core can run in an offscreen document
// (core-host.js): Chromium's service worker can make one once the reader
// has granted "offscreen", an optional permission without a warning that
// the first press asks for (background.js: toggle). Firefox's event page,
// itself a document, needs none.
export const hostsCore = () => keepsOptimisedCode && !!(ext.offscreen && ext.offscreen.createDocument);

// captureTab captures what the tab shows as a PNG data URL.
export function captureTab(windowId) {
  return ext.tabs.captureVisibleTab(windowId, { format: 'png' });
}
