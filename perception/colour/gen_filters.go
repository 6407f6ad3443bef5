//go:build ignore

// gen_filters writes the extension's CVD preview filter table from the Go
// matrices, so the preview and the analysis share one source of truth.
package main

import (
	"flag"
	"log"
	"os"

	"standout/perception/colour"
)

func main() {
	out := flag.String("o", "cvd-filters.js", "output file")
	flag.Parse()
	if err := os.WriteFile(*out, colour.FilterModule(), 0o644); err != nil {
		log.Fatal(err)
	}
}
