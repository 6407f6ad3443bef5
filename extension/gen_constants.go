//go:build ignore

// gen_constants writes extension/constants.js from Go's constants.
package main

import (
	"log"
	"os"

	"standout/extension"
)

func main() {
	if err := os.WriteFile(extension.ConstantsFile, extension.Constants(), 0o644); err != nil {
		log.Fatal(err)
	}
}
