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
	const child = "STANDOUT_HEADROOM_CHILD"
	if os.Getenv(child) == "" {
		cmd := exec.Command(os.Args[0], "-test.run=^TestHeadroomSparesTheNextRequestsPageFaults$", "-test.v", "-test.count=1")
		cmd.Env = append(os.Environ(), child+"=1")
		out, err := cmd.CombinedOutput()
		require.NoError(t, err, "%s", out)
		if strings.Contains(string(out), "--- SKIP") {
			t.Skipf("%s", out)
		}
		require.Contains(t, string(out), "--- PASS", "%s", out)
		return
	}
	defer debug.SetGCPercent(debug.SetGCPercent(-1))
	request := func(mb int) int64 {
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
	// Without keep: 8 MB, then 10 MB, of which 2 MB are new.
	runtime.GC()
	request(8)
	runtime.GC()
	control := request(10)
	if control < 256 {
		t.Skipf("10 MB after 8 MB made %d page faults: this machine's pages are larger", control)
	}
	// With keep: 16 MB, then 20 MB. The headroom starts here, as the
	// core's starts with its process.
	var m runtime.MemStats
	runtime.GC()
	runtime.ReadMemStats(&m)
	h := headroom{total: m.TotalAlloc, inuse: m.HeapInuse, touched: m.HeapInuse}
	request(16)
	runtime.GC()
	h.keep()
	spared := request(20)
	t.Logf("faults: %d after keep, %d in the control", spared, control)
	assert.Less(t, spared, control/4, "the request after keep made %d page faults, against %d without", spared, control)
}
