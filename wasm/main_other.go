//go:build !(js && wasm)

package main

import (
	"fmt"
	"os"
)

// main outside WebAssembly explains how the core is meant to be built.
func main() {
	fmt.Fprintln(os.Stderr, "the Standout core runs as WebAssembly: GOOS=js GOARCH=wasm go build -o standout.wasm ./wasm (or: standout extension DIR)")
	os.Exit(2)
}
