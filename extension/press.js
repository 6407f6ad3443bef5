// The toolbar action's step in the page, injected after the reader and the
// overlay: its value, the last expression, is what the background gets
// back — the page's reading, or {closed: true} when a check was open.
globalThis.standoutOverlay.press();
