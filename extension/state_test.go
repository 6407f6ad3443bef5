package extension

import (
	"strconv"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// After an error the overlay stops watching the charts: a change of the
// page neither re-checks nor throws (issue 11: the observers stayed on and
// the next change re-ran a check into the error panel). The machine's own
// transitions are unit-tested in test/machine.test.js.
func TestIssue11NoWatchAfterError(t *testing.T) {
	h := newHarness(t)
	h.showPage(`<!doctype html><html><body style="margin:0">` + chartSVG + `</body></html>`)
	// The core now answers every check with an error, and counts them.
	h.inWorker(`globalThis.testCalls = 0; globalThis.standoutHandle = () => { globalThis.testCalls++; return JSON.stringify({ ok: false, error: 'the core refused this check' }); }; 0`)
	h.eval(`document.querySelector('` + hostSelector + `').removeAttribute('data-state'), document.querySelectorAll('rect')[0].setAttribute('height', '70'), ''`)
	h.waitState("error")
	assert.Contains(t, h.overlayHTML(), "the core refused this check")
	calls := func() int {
		n, err := strconv.Atoi(h.workerValue(`String(globalThis.testCalls)`))
		require.NoError(t, err)
		return n
	}
	before := calls()
	require.Equal(t, 1, before)
	h.eval(`document.querySelectorAll('rect')[1].setAttribute('height', '40'), ''`)
	time.Sleep(1500 * time.Millisecond) // past the overlay's 600 ms debounce
	assert.Equal(t, before, calls(), "a change after the error ran another check")
	assert.Equal(t, "error", h.state())
	h.escape()
	h.waitState("")
}
