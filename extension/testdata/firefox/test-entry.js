// Test builds only (extension/firefox_test.go copies this file in; it
// never ships). Firefox offers automation no way to press the toolbar
// button, so the test build's background starts here: it loads the real
// background and runs the toolbar action's own handler when the test
// page's content script asks for a press.
import { toggle } from './background.js';

chrome.runtime.onMessage.addListener((msg, sender) => {
  if (msg && msg.type === 'standout/test-press' && sender.id === chrome.runtime.id && sender.tab) toggle(sender.tab);
  return false;
});
