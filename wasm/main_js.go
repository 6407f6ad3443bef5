//go:build js && wasm

package main

import "syscall/js"

// main registers globalThis.standoutHandle(requestJSON) → responseJSON
// (or standoutHandle(optionsJSON, pageJSON), the extension's form) and
// keeps the instance alive. The handler computes and returns; it never
// waits on JavaScript, so calling it synchronously cannot deadlock.
func main() {
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
