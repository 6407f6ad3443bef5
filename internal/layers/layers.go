// Package layers states how Standout's packages depend on each other: each
// package has a layer, and a package imports only packages of lower
// layers. Its test checks the real graph (from go list) against it and
// against the graph DEVELOPERS.md prints.
package layers

// Layer is each package's layer, counted from the bottom. Packages of one
// layer do not import each other.
var Layer = map[string]int{
	"perception/colour": 0, // colour science
	"internal/jsonio":   0, // JSON read and written in place
	"internal/svgnum":   0, // the SVG number grammar
	"internal/demo":     0, // the demo pages
	"internal/browser":  0, // headless Chromium through chromedp
	"internal/layers":   0, // this table
	"internal/wasmmod":  0, // a WebAssembly module's sections

	"snapshot":            1, // a chart as rendered and its JSON form
	"perception":          1, // the perception model
	"perception/saliency": 1, // the saliency map of charts drawn as pixels

	"static": 2, // markup and CSS into snapshots
	"marks":  2, // snapshots into marks: the walk

	"internal/report": 3, // the report model, its digest and Markdown

	"extension":        4, // the extension's files and its generated constants
	"internal/testkit": 4, // what tests share

	"internal/testpages": 5, // the test pages as the core receives them

	"wasm":         5, // the core in the extension
	"cmd/standout": 5, // the command line
}

// Only lists the external packages only one package may import: markup
// and CSS are read in one place, the browser is driven from one place.
var Only = map[string]string{
	"golang.org/x/net/html":            "static",
	"github.com/andybalholm/cascadia":  "static",
	"github.com/tdewolff/parse/v2":     "static",
	"github.com/tdewolff/parse/v2/css": "static",
	"github.com/chromedp/chromedp":     "internal/browser",
	// The PNG key's lettering: the command line's pictures only, never
	// the extension's core.
	"golang.org/x/image/font/basicfont": "cmd/standout",
}
