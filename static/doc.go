// Package static is the static reader: it parses an HTML page or an SVG
// file with golang.org/x/net/html, applies the CSS cascade (tdewolff/parse's
// CSS parser and cascadia's selectors, matched in bounded time by
// selector.go) and flattens transforms, viewports, <use> and paint servers
// into a snapshot.Snapshot per chart. It is the only package that reads
// markup or CSS.
//
// # Security considerations
//
// Pages are untrusted. Build reads at most MaxInputBytes, expands <use> at
// most MaxUseDepth deep and refuses reference cycles, caps the elements of
// a chart at snapshot.MaxNodes, of a page at snapshot.MaxPageNodes, those
// instantiated through <use> at snapshot.MaxUseNodes per chart, and the
// flattened points of a path; it matches selectors in bounded time and
// stops at Options.Deadline. It never fetches anything from the network:
// style sheets linked by a path beside the page are read from
// Options.Sheets (at most MaxSheetBytes each and MaxPageSheetBytes in all;
// the command line roots it at the page's folder with os.Root), and every
// other linked sheet or image is reported, not loaded. Nesting
// deeper than x/net/html accepts (512 open elements) is an error. Values
// that are not finite numbers never reach a Snapshot.
package static
