package main

import (
	"os"
	"os/exec"
	"runtime"
	"runtime/debug"
	"strings"
	"syscall"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// After keep, a request that allocates up to a quarter more than the
// last one meets no pages new to the process. The oracle is the kernel's
// count of minor page faults, in a process of its own, whose heap no
// other test has grown; a control without keep shows the faults are there
// to be spared. The collector is off, as in the core (GOGC=off), so that
// only the test's collections free memory.
func TestHeadroomSparesTheNextRequestsPageFaults(t *testing.T) {
	if !inChild(t, "TestHeadroomSparesTheNextRequestsPageFaults") {
		return
	}
	// Without keep: 8 MB, then 10 MB, of which 2 MB are new.
	runtime.GC()
	request(t, 8)
	runtime.GC()
	control := request(t, 10)
	if control < 256 {
		t.Skipf("10 MB after 8 MB made %d page faults: this machine's pages are larger", control)
	}
	// With keep: 16 MB, then 20 MB. The headroom starts here, as the
	// core's starts with its process.
	var m runtime.MemStats
	runtime.GC()
	runtime.ReadMemStats(&m)
	h := headroom{total: m.TotalAlloc, inuse: m.HeapInuse, touched: m.HeapInuse}
	request(t, 16)
	runtime.GC()
	h.keep()
	assert.InDelta(t, 16<<20, float64(h.made), 1<<16, "keep did not count the request's allocations")
	spared := request(t, 20)
	t.Logf("faults: %d after keep, %d in the control", spared, control)
	assert.Less(t, spared, control/4, "the request after keep made %d page faults, against %d without", spared, control)
}

// A core that reserves, as it starts, the most a request of the last core
// allocated meets no new pages in a first request like it. The oracle is
// again the kernel's count of minor page faults, in a process of its
// own; the control is the same request in a fresh process's first use of
// its heap.
func TestReserveSparesTheFirstRequestsPageFaults(t *testing.T) {
	if !inChild(t, "TestReserveSparesTheFirstRequestsPageFaults") {
		return
	}
	control := request(t, 8)
	if control < 1024 {
		t.Skipf("8 MB made %d page faults: this machine's pages are larger", control)
	}
	runtime.GC()
	var h headroom
	// The last core's request allocated 16 MB; this one allocates 18 MB,
	// within the quarter more that reserve touches.
	h.reserve(16 << 20)
	spared := request(t, 18)
	t.Logf("faults: %d after reserve, %d in the control (8 MB)", spared, control)
	assert.Less(t, spared, control/4, "the first request after reserve made %d page faults, against %d for 8 MB without", spared, control)
	assert.GreaterOrEqual(t, h.touched, uint64(20<<20), "reserve did not count what it touched")
}

// inChild runs the test named in a process of its own and reports its
// outcome, returning false; in that process it turns the collector off,
// as in the core (GOGC=off), and returns true.
func inChild(t *testing.T, name string) bool {
	const child = "STANDOUT_HEADROOM_CHILD"
	if os.Getenv(child) == "" {
		cmd := exec.Command(os.Args[0], "-test.run=^"+name+"$", "-test.v", "-test.count=1")
		cmd.Env = append(os.Environ(), child+"=1")
		out, err := cmd.CombinedOutput()
		require.NoError(t, err, "%s", out)
		if strings.Contains(string(out), "--- SKIP") {
			t.Skipf("%s", out)
		}
		require.Contains(t, string(out), "--- PASS", "%s", out)
		return false
	}
	old := debug.SetGCPercent(-1)
	t.Cleanup(func() { debug.SetGCPercent(old) })
	return true
}

// request allocates mb megabytes in 64 KB pieces, writing every page, as
// a request of the core does, and returns the page faults it made.
func request(t *testing.T, mb int) int64 {
	var before, after syscall.Rusage
	require.NoError(t, syscall.Getrusage(syscall.RUSAGE_SELF, &before))
	held := make([][]byte, 0, 16*mb)
	for range 16 * mb {
		b := make([]byte, 64<<10)
		for i := 0; i < len(b); i += 4096 {
			b[i] = 1
		}
		held = append(held, b)
	}
	runtime.KeepAlive(held)
	require.NoError(t, syscall.Getrusage(syscall.RUSAGE_SELF, &after))
	return after.Minflt - before.Minflt
}
