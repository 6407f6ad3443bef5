// Test builds only: the content script that turns the test's page event
// into a press (see test-entry.js).
document.addEventListener('standout-test-press', () => {
  chrome.runtime.sendMessage({ type: 'standout/test-press' });
});
