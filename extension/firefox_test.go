package extension

import "testing"

// TestFirefoxE2E runs the end-to-end suite in Firefox (Debian's
// firefox-esr) through WebDriver BiDi, a fresh browser for each part, as
// the Chromium tests do. The toolbar button is pressed through
// Marionette (marionette_test.go), as a click would press it.
func TestFirefoxE2E(t *testing.T) {
	for _, s := range []struct {
		name string
		run  func(*testing.T, e2eBrowser)
	}{
		{"OverlayMatchesStaticPath", suiteOverlayMatchesStaticPath},
		{"StrictCSPFrameAndShadowRoot", suiteStrictCSPFrameAndShadowRoot},
		{"CVDPreviewAndPageRestored", suiteCVDPreviewAndPageRestored},
		{"PickingAndExport", suitePickingAndExport},
		{"ExportMarkdownAndPNG", suiteExportMarkdownAndPNG},
		{"ReRunsWhenTheChartChanges", suiteReRunsWhenTheChartChanges},
		{"ChartDrawnAsPixels", suiteChartDrawnAsPixels},
		{"BusyWhileChecking", suiteBusyWhileChecking},
		{"DarkCanvasUnderTheChart", suiteDarkCanvasUnderTheChart},
		{"ChartsBelowTheFold", suiteChartsBelowTheFold},
		{"PickOnPixels", suitePickOnPixels},
		// The test build may read loopback pages (builtForFirefoxTest), as
		// a reader who allowed the framed chart's origin.
		{"FrameOfAllowedOrigin", suiteFrameOfAllowedOrigin},
	} {
		t.Run(s.name, func(t *testing.T) { s.run(t, newFox(t)) })
	}
}
