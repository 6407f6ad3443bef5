//go:build !(js && wasm)

package main

import "time"

var start = time.Now()

// now is a time in milliseconds, for the response's timing.
func now() float64 { return float64(time.Since(start).Microseconds()) / 1000 }
