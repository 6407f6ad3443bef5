// How long the offscreen document that runs the core (core-host.js) is
// kept without a request. A WebAssembly memory cannot shrink, so the
// document holds the most its cores have needed until it closes: 11.5 MB
// after presses on a chart of 1,000 marks, 34 MB at 5,000 and 121 MB at
// 20,000 (measured in Chromium 156, December 2026). It is kept ten
// minutes, so that a reader's next press finds the core loaded, but one
// minute only once the cores hold more than LARGE_BYTES: a chart that
// large takes a second or more to check anyway, and the next press loads
// the core again in a few hundred milliseconds.
export const KEEP_MS = 10 * 60 * 1000;
export const KEEP_LARGE_MS = 60 * 1000;
export const LARGE_BYTES = 64 * 1024 * 1024;

// keepMs is how long to keep the document when its cores hold heldBytes.
export function keepMs(heldBytes) {
  return heldBytes > LARGE_BYTES ? KEEP_LARGE_MS : KEEP_MS;
}
