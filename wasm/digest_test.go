package main

import (
	"encoding/json"
	"flag"
	"os"
	"testing"

	"github.com/stretchr/testify/require"

	"standout/internal/testpages"
)

var update = flag.Bool("update", false, "rewrite testdata/digests.golden.json")

// goldenDigests are the overlay's digests of the repository's test pages,
// from whichever build of the core runs the test, with the core's timings
// left out. The whole core (go test ./wasm) and the overlay core (go test
// -tags overlaycore ./wasm) are held to the same file, so the extension's
// overlay core answers a press as the whole core does; the extension's
// tests hold the shipped module to it as well.
func goldenDigests(t *testing.T) []byte {
	t.Helper()
	all := map[string]any{}
	for name, page := range testpages.Requests(t) {
		var r map[string]any
		require.NoError(t, json.Unmarshal(HandlePage([]byte(`{"type":"analyse"}`), page), &r))
		require.Equal(t, true, r["ok"], "%s: %v", name, r["error"])
		delete(r, "timing")
		all[name] = r
	}
	out, err := json.MarshalIndent(all, "", " ")
	require.NoError(t, err)
	return append(out, '\n')
}

func TestDigestGolden(t *testing.T) {
	got := goldenDigests(t)
	path := testpages.DigestsGolden(t)
	if *update {
		require.NoError(t, os.WriteFile(path, got, 0o644))
	}
	want, err := os.ReadFile(path)
	require.NoError(t, err, "run go test ./wasm -run DigestGolden -update")
	require.JSONEq(t, string(want), string(got))
}
