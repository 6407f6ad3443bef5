// Package snapshot holds the one type both ways in produce: a chart as
// rendered, flattened into its elements with their resolved paint and
// transform (Snapshot), and its columnar JSON form, which carries it from
// the extension's read pass into the core (json.go documents the format).
// The limits and the geometry layouts both ways in share live here too;
// the extension's copies of them are generated from this package
// (extension/wire-constants.js).
//
// The static builder (package static) fills a Snapshot from markup; the
// extension's read pass fills it from the live page; the walk (package
// marks) reads it.
//
// # Security considerations
//
// A snapshot from a page is untrusted. The JSON decoder bounds every
// count and index it reads, refuses a page beyond MaxPageNodes elements,
// and never lets a value that is not a finite number into a Snapshot, which
// therefore always encodes as JSON again. Text from the page (labels, ids)
// is data: callers that display it must escape it.
package snapshot
