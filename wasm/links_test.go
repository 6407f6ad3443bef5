//go:build !js

package main

import (
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/require"

	"standout/internal/wasmmod"
)

// TestOverlayCoreLinks builds the overlay core as the extension does, but
// with its name section, and checks that none of the packages it was cut
// loose from came back: fmt, reflect, os and runtime/debug (which brings
// the other three), the report's formats, and time (which brings
// internal/godebug and internal/bisect).
func TestOverlayCoreLinks(t *testing.T) {
	if testing.Short() {
		t.Skip("builds the core for WebAssembly")
	}
	out := filepath.Join(t.TempDir(), "core.wasm")
	cmd := exec.Command("go", "build", "-trimpath", "-tags=overlaycore", "-o", out, ".")
	cmd.Env = append(os.Environ(), "GOOS=js", "GOARCH=wasm")
	b, err := cmd.CombinedOutput()
	require.NoError(t, err, "%s", b)
	mod, err := os.ReadFile(out)
	require.NoError(t, err)
	names, err := wasmmod.FunctionNames(mod)
	require.NoError(t, err)
	require.Greater(t, len(names), 1000, "the module's name section")
	// The names spell a package's path with '_' for '/' and '.'.
	for _, n := range names {
		for _, banned := range []string{"fmt.", "reflect.", "internal_fmtsort.", "os.", "runtime_debug.Stack", "runtime_debug.SetGCPercent", "standout_internal_report.WriteMarkdown", "standout_internal_report.AppendJSON",
			// package time brings Go's settings by environment with it
			// (clock_js.go); time.now is the runtime's own.
			"time.init", "time.Now", "internal_godebug.", "internal_bisect."} {
			require.False(t, strings.HasPrefix(n, banned), "the overlay core links %s", n)
		}
	}
	t.Logf("overlay core with its name section: %d bytes, %d functions", len(mod), len(names))
}
