//go:build !(js && wasm)

package testkit

import (
	"testing"

	"standout/internal/browser"
)

// Chromium finds the browser for a browser test. It skips the test under
// -short and on a developer machine without Chromium; under CI=true a
// missing browser fails the test.
func Chromium(t testing.TB) string {
	t.Helper()
	if testing.Short() {
		t.Skip("testkit: -short skips the browser tests")
	}
	exe, err := browser.Find("")
	Needs(t, "Chromium", err)
	return exe
}
