// Where Chromium and Firefox differ, in one place. The extension is one
// set of scripts for both; these are the differences it meets.
//
// - The background. Chromium runs background.js as a module service
//   worker (manifest.json: background.service_worker); Firefox as a module
//   event page (manifest.firefox.json: background.scripts). Both stop it
//   when idle, so nothing is kept between events but the loaded core,
//   which loadCore loads again when it is gone.
// - The namespace. Firefox names the API browser.*, Chromium chrome.*;
//   Firefox also answers to chrome.* with promises in Manifest V3. The
//   background takes `ext`; the scripts injected into pages use chrome.*,
//   which both give content scripts.
// - captureVisibleTab. Both grant it through activeTab after a press of the
//   toolbar button (Firefox also through the <all_urls> host permission,
//   which Standout does not ask for). A capture holds every frame the tab
//   shows, so it stays in extension pages.
// - Pressing the button in tests. Chromium's DevTools protocol presses it
//   (Extensions.triggerAction); Firefox gives automation no way to, so its
//   test build adds an entry that calls the same handler
//   (testdata/firefox/test-entry.js, never shipped).
// - Optimised code across loads. Chromium keeps the WebAssembly code V8
//   has optimised and loads it with the module next time, in a service
//   worker too (measured; DEVELOPERS.md); the background trains the core
//   for it there (background.js: train). Firefox's event page is not
//   trained: that was not measured there.
export const ext = globalThis.browser ?? globalThis.chrome;

// keepsOptimisedCode says whether the background runs as Chromium's
// service worker.
export const keepsOptimisedCode = typeof globalThis.ServiceWorkerGlobalScope === 'function' && globalThis instanceof globalThis.ServiceWorkerGlobalScope;

// captureTab captures what the tab shows as a PNG data URL.
export function captureTab(windowId) {
  return ext.tabs.captureVisibleTab(windowId, { format: 'png' });
}
