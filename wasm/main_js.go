//go:build js && wasm

package main

import (
	"runtime/debug"
	"syscall/js"
)

// main registers globalThis.standoutHandle(requestJSON) → responseJSON
// (or standoutHandle(optionsJSON, pageJSON), the extension's form) and
// keeps the instance alive. The handler computes and returns; it never
// waits on JavaScript, so calling it synchronously cannot deadlock.
func main() {
	// WebAssembly has one thread: the collector cannot run beside the
	// analysis, and while it marks, every pointer write pays a barrier. A
	// request allocates several times the heap it keeps, so collect at
	// five times the live heap rather than twice (in Node, a 5,000-mark
	// request: about 20% faster; the memory stays within a few tens of
	// MB).
	debug.SetGCPercent(400)
	handle := js.FuncOf(func(this js.Value, args []js.Value) any {
		for _, a := range args {
			if a.Type() != js.TypeString {
				return string(errorResponse("standoutHandle takes JSON strings"))
			}
		}
		switch len(args) {
		case 1:
			return string(Handle([]byte(args[0].String())))
		case 2:
			return string(HandlePage([]byte(args[0].String()), []byte(args[1].String())))
		}
		return string(errorResponse("standoutHandle takes (request) or (options, page)"))
	})
	defer handle.Release()
	js.Global().Set("standoutHandle", handle)
	js.Global().Set("standoutReady", true)
	select {}
}
