// Package testpages gives tests the repository's test pages as the core
// receives them. It is apart from testkit, which the packages below the
// static builder import in their own tests.
package testpages

import (
	"encoding/json"
	"os"
	"path/filepath"
	"testing"

	"standout/internal/testkit"
	"standout/static"
)

// Requests are the repository's test pages as the core receives them
// from the extension's read pass (the page's JSON: source, snapshots,
// problems), read here by the static builder, by file name.
func Requests(t testing.TB) map[string][]byte {
	t.Helper()
	out := map[string][]byte{}
	for _, file := range testkit.Pages(t) {
		f, err := os.Open(file)
		if err != nil {
			t.Fatal(err)
		}
		p, err := static.Build(f, static.Options{Source: filepath.Base(file)})
		f.Close()
		if err != nil {
			t.Fatalf("%s: %v", file, err)
		}
		b, err := json.Marshal(map[string]any{"source": p.Source, "snapshots": p.Charts, "problems": p.Problems})
		if err != nil {
			t.Fatal(err)
		}
		out[filepath.Base(file)] = b
	}
	return out
}

// DigestsGolden is the file that holds the core's digests of Requests.
func DigestsGolden(t testing.TB) string {
	return filepath.Join(testkit.Root(t), "wasm", "testdata", "digests.golden.json")
}
