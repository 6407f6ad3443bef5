// Package extension holds the browser extension's files, so that
// `standout extension DIR` can write a ready-to-load folder and the
// command line's browser mode can use the extension's own read pass.
package extension

import "embed"

// Files are the extension's source files (manifests, scripts and icons). The
// WebAssembly core and wasm_exec.js are added at build time.
//
//go:embed manifest.json manifest.firefox.json background.js reader.js overlay.js machine.js patch.js constants.js cvd-filters.js press.js platform.js findfunc.js core.js core.html core-host.js core-worker.js keep.js export.html export.js grant.html grant.js icons/*.png
var Files embed.FS

// Reader is the read pass (reader.js, after the constants it reads from
// constants.js), shared with the browser mode of the command-line tool.
func Reader() string {
	c, err := Files.ReadFile(ConstantsFile)
	if err != nil {
		panic("extension: constants.js missing from the embedded files")
	}
	b, err := Files.ReadFile("reader.js")
	if err != nil {
		panic("extension: reader.js missing from the embedded files")
	}
	return string(c) + "\n" + string(b)
}
