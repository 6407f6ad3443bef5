//go:build !js

package main

import (
	"encoding/binary"
	"errors"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/require"
)

// TestOverlayCoreLinks builds the overlay core as the extension does, but
// with its name section, and checks that none of the packages it was cut
// loose from came back: fmt, reflect, os and runtime/debug (which brings
// the other three), and the report's formats.
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
	names, err := functionNames(mod)
	require.NoError(t, err)
	require.Greater(t, len(names), 1000, "the module's name section")
	// The names spell a package's path with '_' for '/' and '.'.
	for _, n := range names {
		for _, banned := range []string{"fmt.", "reflect.", "internal_fmtsort.", "os.", "runtime_debug.Stack", "runtime_debug.SetGCPercent", "standout_internal_report.WriteMarkdown", "standout_internal_report.AppendJSON"} {
			require.False(t, strings.HasPrefix(n, banned), "the overlay core links %s", n)
		}
	}
	t.Logf("overlay core with its name section: %d bytes, %d functions", len(mod), len(names))
}

// functionNames reads the function names of a WebAssembly module's
// "name" custom section (WebAssembly Core Specification 2.0, §7.4.1).
func functionNames(mod []byte) ([]string, error) {
	if len(mod) < 8 || string(mod[:4]) != "\x00asm" {
		return nil, errors.New("not a WebAssembly module")
	}
	var out []string
	i := 8
	for i < len(mod) {
		id := mod[i]
		size, n := binary.Uvarint(mod[i+1:])
		if n <= 0 || uint64(len(mod)-i-1-n) < size {
			return nil, errors.New("a section runs past the module")
		}
		body := mod[i+1+n : i+1+n+int(size)]
		i += 1 + n + int(size)
		if id != 0 {
			continue
		}
		l, n := binary.Uvarint(body)
		if n <= 0 || uint64(len(body)-n) < l || string(body[n:n+int(l)]) != "name" {
			continue
		}
		for s := body[n+int(l):]; len(s) > 0; {
			sub := s[0]
			sz, n := binary.Uvarint(s[1:])
			if n <= 0 || uint64(len(s)-1-n) < sz {
				return nil, errors.New("a name subsection runs past its section")
			}
			data := s[1+n : 1+n+int(sz)]
			s = s[1+n+int(sz):]
			if sub != 1 {
				continue
			}
			count, n := binary.Uvarint(data)
			data = data[n:]
			for range count {
				_, n := binary.Uvarint(data) // function index
				data = data[n:]
				l, m := binary.Uvarint(data)
				if n <= 0 || m <= 0 || uint64(len(data)-m) < l {
					return nil, errors.New("a function name runs past its subsection")
				}
				out = append(out, string(data[m:m+int(l)]))
				data = data[m+int(l):]
			}
		}
	}
	return out, nil
}
