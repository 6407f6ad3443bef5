// Package testkit holds what tests of several packages share: finding the
// project's shared/ folder and the repository's own test pages, Chromium
// for the browser tests, and generated pages. Only tests import it.
package testkit

import (
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// SharedEnv names the environment variable that points at the project's
// shared/ folder (REFERENCES.md and the corpus of real charts).
const SharedEnv = "STANDOUT_SHARED"

// Root is the repository's root: the nearest folder above the working
// directory that holds go.mod.
func Root(t testing.TB) string {
	t.Helper()
	dir, err := os.Getwd()
	if err != nil {
		t.Fatal(err)
	}
	for {
		if _, err := os.Stat(filepath.Join(dir, "go.mod")); err == nil {
			return dir
		}
		up := filepath.Dir(dir)
		if up == dir {
			t.Fatal("testkit: no go.mod above the working directory")
		}
		dir = up
	}
}

// Shared finds the project's shared/ folder: $STANDOUT_SHARED, then the
// folder shared/ beside the repository. A developer machine without it
// skips the test; under CI=true its absence fails the test.
func Shared(t testing.TB) string {
	t.Helper()
	dir := os.Getenv(SharedEnv)
	if dir == "" {
		dir = filepath.Join(filepath.Dir(Root(t)), "shared")
	}
	if _, err := os.Stat(filepath.Join(dir, "REFERENCES.md")); err != nil {
		msg := fmt.Sprintf("testkit: shared/REFERENCES.md not found in %s (set %s)", dir, SharedEnv)
		if os.Getenv("CI") == "true" {
			t.Fatal(msg)
		}
		t.Skip(msg)
	}
	return dir
}

// Corpus is shared/corpus, the real charts with their truth.json.
func Corpus(t testing.TB) string {
	t.Helper()
	dir := filepath.Join(Shared(t), "corpus")
	if _, err := os.Stat(filepath.Join(dir, "truth.json")); err != nil {
		t.Fatalf("testkit: %v", err)
	}
	return dir
}

// Pages lists the repository's own test pages (testdata/*.html and *.svg),
// without their golden files.
func Pages(t testing.TB) []string {
	t.Helper()
	files, err := filepath.Glob(filepath.Join(Root(t), "testdata", "*.*"))
	if err != nil || len(files) == 0 {
		t.Fatalf("testkit: no test pages in testdata/: %v", err)
	}
	var out []string
	for _, f := range files {
		if !strings.HasSuffix(f, ".golden") {
			out = append(out, f)
		}
	}
	return out
}

// ManyCircles is an HTML page with one chart of n small circles in one
// colour, laid out on a 1,000 px grid.
func ManyCircles(n int) string {
	var b strings.Builder
	b.WriteString(`<html><body><svg width="1000" height="1000"><g fill="steelblue">`)
	for i := 0; i < n; i++ {
		fmt.Fprintf(&b, `<circle cx="%d" cy="%d" r="2"/>`, i%1000, (i/1000)%1000)
	}
	b.WriteString(`</g></svg></body></html>`)
	return b.String()
}

// QuayBars is an HTML page to be framed by another origin: one bar chart
// of 8 bars at x = 20 + 34k (24 px wide), the fourth highlighted in its
// own colour, with no margin, so that the chart's box is the frame's
// content box.
func QuayBars() string {
	var b strings.Builder
	b.WriteString(`<!doctype html><html><body style="margin:0"><svg width="300" height="200" aria-label="Ferry crossings by quay">`)
	for k := 0; k < 8; k++ {
		fill := "#7d8a99"
		if k == 3 {
			fill = "#d1495b"
		}
		h := 40 + k*17%120
		fmt.Fprintf(&b, `<rect x="%d" y="%d" width="24" height="%d" fill="%s"/>`, 20+k*34, 180-h, h, fill)
	}
	b.WriteString(`</svg></body></html>`)
	return b.String()
}

// EncodingJSON is v as the standard library's encoding/json writes it
// with HTML escaping off, without the trailing newline: the reference the
// hand-written JSON writers are held to.
func EncodingJSON(t testing.TB, v any) string {
	t.Helper()
	var buf bytes.Buffer
	enc := json.NewEncoder(&buf)
	enc.SetEscapeHTML(false)
	if err := enc.Encode(v); err != nil {
		t.Fatalf("testkit: encoding/json: %v", err)
	}
	return strings.TrimSuffix(buf.String(), "\n")
}
