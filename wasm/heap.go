package main

import "runtime"

// The core collects garbage between requests only (main_js.go), so a
// request's allocations come from the memory the last ones freed, and
// from memory new to the heap when that runs short. A page of new memory
// costs a page fault at its first touch, and on this project's test
// machines a costly one (about 2.7 ms per MB; DEVELOPERS.md): a
// 5,000-mark request allocates about 12 MB. So after each collection,
// headroom touches what the next request would need beyond the free
// memory, while the reader reads the answer; the next request then meets
// no new pages unless it is larger than the last. The first request
// after the core loads would meet them all, so a core loaded ahead of a
// press touches, as it starts, the heap the last core's requests needed
// (reserve; core.js: STANDOUT_ROOM).

// headroomCap is the most heap the headroom grows to, well under the
// core's memory limit (GOMEMLIMIT=256MiB).
const headroomCap = 128 << 20

// headroom tracks the heap's use between collections.
type headroom struct {
	// total is the runtime's cumulative allocation at the last collection.
	total uint64
	// touched is the most heap that has been in use at once: the wasm
	// runtime never hands memory back, so that much of the heap has been
	// touched. (The runtime's own count of memory handed back, which its
	// scavenger keeps, says nothing there: it hands back nothing.)
	touched uint64
	// inuse is the heap in use after the last collection.
	inuse uint64
	// made is what was allocated between the last two collections: the
	// last request's allocations (one collection follows each request).
	made uint64
}

// want is how many bytes of heap to hold at once so that the free memory
// that has been touched holds made bytes of allocation and a quarter more,
// with live bytes in use; zero when free bytes already do, or when the
// heap would pass headroomCap.
func (h *headroom) want(made, free, live uint64) uint64 {
	need := made + made/4
	if free >= need || live+need > headroomCap {
		return 0
	}
	return need
}

// keep runs after a collection: when the touched free memory would not
// hold the allocations since the last collection again, it holds that
// much at once, then collects it so that the next request finds it free.
// The allocator takes the lowest free pages first, which are the touched
// ones, the heap having grown upwards.
func (h *headroom) keep() {
	var m runtime.MemStats
	runtime.ReadMemStats(&m)
	made := m.TotalAlloc - h.total
	h.made = made
	// Without a collection in between, the heap held what was in use
	// after the last one and all that was made since.
	h.touched = max(h.touched, h.inuse+made, m.HeapInuse)
	if n := h.want(made, h.touched-m.HeapInuse, m.HeapAlloc); n > 0 {
		h.hold(n, &m)
	}
	h.total, h.inuse = m.TotalAlloc, m.HeapInuse
}

// reserve runs as the core starts, before any request, given made, the
// most a request of the last core allocated: it touches that and a
// quarter more, as keep would after such a request, and frees it, so that
// a first request like it meets no new pages. A heap that would pass
// headroomCap is left as it is.
func (h *headroom) reserve(made uint64) {
	var m runtime.MemStats
	runtime.ReadMemStats(&m)
	if n := h.want(made, 0, m.HeapAlloc); n > 0 {
		h.hold(n, &m)
	}
	h.touched = max(h.touched, m.HeapInuse)
	h.total, h.inuse = m.TotalAlloc, m.HeapInuse
}

// hold touches n bytes beyond the m.HeapInuse in use, counts them as
// touched, collects them and reads the heap's statistics into m again.
func (h *headroom) hold(n uint64, m *runtime.MemStats) {
	touch(n)
	h.touched = max(h.touched, m.HeapInuse+n)
	runtime.GC()
	runtime.ReadMemStats(m)
}

// touch holds n bytes at once, in pieces, and writes one byte in every
// page: the allocator takes free memory first and new memory for the
// rest, so that when the collector frees the pieces, n bytes of touched
// memory are free.
//
//go:noinline
func touch(n uint64) {
	const piece = 256 << 10
	held := make([][]byte, 0, n/piece+1)
	for got := uint64(0); got < n; got += piece {
		b := make([]byte, piece)
		for i := 0; i < len(b); i += 4096 {
			b[i] = 1
		}
		held = append(held, b)
	}
	runtime.KeepAlive(held)
}
