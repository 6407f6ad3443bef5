package main

import (
	"fmt"
	"io"

	"standout/extension"
)

// runExtension writes a ready-to-load extension folder: the embedded
// extension files, the Go core built for WebAssembly, and the wasm_exec.js
// of the Go toolchain that built it.
func runExtension(args []string, stdout, stderr io.Writer) int {
	fl := newFlags("extension", "standout extension [--firefox] DIR   (run from the Standout repository: it builds the WebAssembly core with the go tool)",
		"0 written; 2 bad usage or a build that failed", stdout, stderr)
	firefox := fl.Bool("firefox", false, "write the Firefox manifest (event page) instead of Chromium's")
	if code, ok := fl.parse(args); !ok {
		return code
	}
	if fl.NArg() != 1 {
		fl.Usage()
		return 2
	}
	if err := extension.Build(fl.Arg(0), *firefox); err != nil {
		fmt.Fprintln(stderr, "standout extension:", err)
		return 2
	}
	load := "Load it unpacked: chrome://extensions → Developer mode → Load unpacked."
	if *firefox {
		load = "Load it as a temporary add-on: about:debugging → This Firefox → Load Temporary Add-on… → its manifest.json."
	}
	fmt.Fprintf(stdout, "Wrote the extension to %s. %s\n", fl.Arg(0), load)
	return 0
}
