// Package demo holds Standout's built-in example pages: an invented
// newsroom scenario with invented data, embedded in the binary so the demo
// needs no network.
package demo

import "embed"

// Pages are the demo pages, under pages/.
//
//go:embed pages/*.html
var Pages embed.FS
