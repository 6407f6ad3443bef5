//go:build js && wasm

package main

import "syscall/js"

// main registers globalThis.standoutHandle(requestJSON) → responseJSON and
// keeps the instance alive. The handler computes and returns; it never
// waits on JavaScript, so calling it synchronously cannot deadlock.
func main() {
	handle := js.FuncOf(func(this js.Value, args []js.Value) any {
		if len(args) != 1 || args[0].Type() != js.TypeString {
			return string(errorResponse("standoutHandle takes one JSON string"))
		}
		return string(Handle([]byte(args[0].String())))
	})
	defer handle.Release()
	js.Global().Set("standoutHandle", handle)
	js.Global().Set("standoutReady", true)
	select {}
}
