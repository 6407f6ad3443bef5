// Package dom turns charts as rendered into marks. It has two parts:
//
//   - the static builder (Build), which parses an HTML page or an SVG file
//     with golang.org/x/net/html, applies the CSS cascade (tdewolff/parse's
//     CSS parser and cascadia's selectors) and flattens transforms,
//     viewports, <use> and paint servers into a Snapshot per chart;
//   - the walk (Walk), which decides from geometry, structure and
//     repetition alone what each element of a Snapshot is: a data mark (of
//     which kind and shape), a legend swatch, or chart furniture.
//
// The extension's read pass fills the same Snapshot from the live DOM, so
// both ways in share the walk.
//
// # Security considerations
//
// Pages are untrusted. Build reads at most MaxInputBytes, expands <use> at
// most MaxUseDepth deep and refuses reference cycles, caps the elements of
// a chart at MaxNodes, of a page at MaxPageNodes, those instantiated
// through <use> at MaxUseNodes per chart, and the flattened points of a
// path; it matches selectors in bounded time (selector.go) and stops at
// Options.Deadline. It never
// fetches anything a page refers to (external style sheets and images are
// reported, not loaded). Nesting deeper than x/net/html accepts (512 open
// elements) is an error. Values that are not finite numbers never reach a
// Snapshot, which therefore always encodes as JSON. Text from the page
// (labels, ids) is data: callers that display it must escape it.
package dom
