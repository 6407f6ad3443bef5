//go:build js && wasm

package main

import "syscall/js"

// performance is the JavaScript clock. The core takes its timings from it
// rather than from package time, which would bring Go's settings by
// environment (internal/godebug, internal/bisect) into the module: 35 KB
// of the extension's budgeted core.
var performance = js.Global().Get("performance")

// now is a time in milliseconds, for the response's timing.
func now() float64 { return performance.Call("now").Float() }
