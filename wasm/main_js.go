//go:build js && wasm

package main

import (
	"runtime"
	"strconv"
	"sync"
	"syscall"
	"syscall/js"
)

// handleGlobal is the global the handler is registered as. The extension
// loads two cores into one background: the overlay core (built with the
// overlaycore tag) as standoutHandle, and for an export the report core,
// linked with -X main.handleGlobal=standoutReport.
var handleGlobal = "standoutHandle"

// main registers globalThis.standoutHandle(requestJSON) → responseJSON
// (or standoutHandle(optionsJSON, pageJSON), the extension's form) and
// keeps the instance alive. The handler computes and returns; it never
// waits on JavaScript, so calling it synchronously cannot deadlock. The
// core under its usual name also registers standoutSaliency.
func main() {
	// WebAssembly has one thread: the collector cannot run beside the
	// analysis, and while it marks, every pointer write pays a barrier (a
	// tenth of a warm request's time, more on the first, unoptimised one).
	// So it runs only between requests, once the answer is on its way, or
	// when the heap nears the memory limit within one (a very large chart).
	// The loader sets that through the environment, GOGC=off and
	// GOMEMLIMIT=256MiB (CORES in background.js; a 5,000-mark check
	// allocates about 20 MB, a 100,000-mark one reaches the limit and
	// collects as it goes): runtime/debug, which could set it here,
	// brings fmt and os into the module with it.
	if v, _ := syscall.Getenv("GOGC"); v != "off" {
		js.Global().Get("console").Call("warn", "Standout core: GOGC is "+strconv.Quote(v)+", not off; the collector will run within requests")
	}
	// The loader gives the heap the first request will need, in bytes,
	// as STANDOUT_ROOM: the most a request of the last core allocated,
	// which the collector tells it as <handleGlobal>Allocated (heap.go:
	// reserve and keep; core.js: roomToReserve).
	var room headroom
	if v, ok := syscall.Getenv("STANDOUT_ROOM"); ok {
		if n, err := strconv.ParseUint(v, 10, 64); err == nil {
			room.reserve(n)
		}
	}
	collectLater, stop := collector(&room)
	defer stop()
	handle := js.FuncOf(func(this js.Value, args []js.Value) any {
		for _, a := range args {
			if a.Type() != js.TypeString {
				return string(errorResponse(handleGlobal + " takes JSON strings"))
			}
		}
		defer collectLater()
		switch len(args) {
		case 0:
		case 1:
			return string(Handle([]byte(args[0].String())))
		default:
			// (options, page, frame readings…)
			frames := make([][]byte, len(args)-2)
			for i := range frames {
				frames[i] = []byte(args[i+2].String())
			}
			return string(HandlePage([]byte(args[0].String()), []byte(args[1].String()), frames...))
		}
		return string(errorResponse(handleGlobal + " takes (request) or (options, page, frame readings…)"))
	})
	defer handle.Release()
	// standoutSaliency(rgba Uint8Array | Uint8ClampedArray, w, h,
	// severity) judges a chart drawn as pixels (pixels.go).
	pixels := js.FuncOf(func(this js.Value, args []js.Value) any {
		if len(args) != 4 || args[0].Type() != js.TypeObject || args[1].Type() != js.TypeNumber || args[2].Type() != js.TypeNumber || args[3].Type() != js.TypeNumber {
			return string(errorResponse("standoutSaliency takes (rgba, width, height, severity)"))
		}
		w, h := args[1].Int(), args[2].Int()
		n := args[0].Get("length").Int()
		if w <= 0 || h <= 0 || w*h > MaxPixels || n != 4*w*h {
			return string(errorResponse("standoutSaliency: the pixels do not match the size"))
		}
		defer collectLater()
		rgba := make([]byte, n)
		src := args[0]
		if src.Get("constructor").Get("name").String() != "Uint8Array" {
			src = js.Global().Get("Uint8Array").New(src.Get("buffer"), src.Get("byteOffset"), n)
		}
		js.CopyBytesToGo(rgba, src)
		return string(Saliency(rgba, w, h, args[3].Float()))
	})
	defer pixels.Release()
	if handleGlobal == "standoutHandle" {
		js.Global().Set("standoutSaliency", pixels)
	}
	js.Global().Set(handleGlobal, handle)
	select {}
}

// collector returns collectLater, which collects garbage once the
// response on its way has been returned (a timer hands control back to
// JavaScript first; one collection pending at a time), then keeps the
// heap large enough for the next request (heap.go) and tells the loader
// what the request allocated; and the function that releases its timer
// callback.
func collector(room *headroom) (collectLater func(), release func()) {
	var collect sync.Mutex
	gc := js.FuncOf(func(js.Value, []js.Value) any {
		defer collect.Unlock()
		runtime.GC()
		room.keep()
		js.Global().Set(handleGlobal+"Allocated", float64(room.made))
		return nil
	})
	return func() {
		if !collect.TryLock() {
			return // one is pending
		}
		js.Global().Call("setTimeout", gc, 1)
	}, gc.Release
}
