package main

import (
	"runtime"
	"runtime/debug"
	"testing"

	"github.com/stretchr/testify/assert"
)

func TestHeadroomWant(t *testing.T) {
	var h headroom
	const mb = 1 << 20
	for _, c := range []struct {
		name             string
		made, free, live uint64
		want             uint64
	}{
		{"the free memory holds the next request", 8 * mb, 10 * mb, 4 * mb, 0},
		{"it lacks some of what the last request made and a quarter", 8 * mb, 6 * mb, 4 * mb, 10 * mb},
		{"a fresh heap", 12 * mb, 0, 3 * mb, 15 * mb},
		{"nothing was made", 0, 0, 3 * mb, 0},
		{"the heap would pass its cap", 100 * mb, 0, 40 * mb, 0},
	} {
		assert.Equal(t, c.want, h.want(c.made, c.free, c.live), c.name)
	}
}

// After keep, the free heap that has been touched holds what was
// allocated since the last collection and a quarter more, and keep's own
// allocation is not counted as the next request's. The collector is off,
// as in the core (GOGC=off), which also keeps the native runtime from
// handing idle memory back to the system meanwhile.
func TestHeadroomKeep(t *testing.T) {
	defer debug.SetGCPercent(debug.SetGCPercent(-1))
	var h headroom
	runtime.GC()
	h.keep()
	garbage := make([][]byte, 0, 64)
	for range 64 {
		garbage = append(garbage, make([]byte, 64<<10))
	}
	runtime.KeepAlive(garbage)
	garbage = nil
	var m runtime.MemStats
	runtime.ReadMemStats(&m)
	made := m.TotalAlloc - h.total
	runtime.GC()
	h.keep()
	runtime.ReadMemStats(&m)
	// (The test's own goroutines may allocate a little meanwhile.)
	assert.Less(t, m.TotalAlloc-h.total, uint64(64<<10), "keep counts from its own end, after its own allocation")
	assert.GreaterOrEqual(t, m.HeapIdle-m.HeapReleased+m.HeapInuse-m.HeapAlloc, made+made/4, "the touched free heap holds the next request")
}
