package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/internal/report"
)

// withStyle is a copy of the page with css in a <style> at the end of its
// head, where it moves no element of the body (the fixes' selectors count
// children); in an SVG document, last in the root, after every element
// the selectors count.
func withStyle(t *testing.T, page, css string) string {
	t.Helper()
	b, err := os.ReadFile(page)
	require.NoError(t, err)
	src := string(b)
	tag := "<style>" + css + "</style>"
	if strings.HasSuffix(page, ".svg") {
		i := strings.LastIndex(src, "</svg>")
		require.GreaterOrEqual(t, i, 0, page)
		src = src[:i] + "<style><![CDATA[" + css + "]]></style>" + src[i:]
	} else if i := strings.Index(strings.ToLower(src), "</head>"); i >= 0 {
		src = src[:i] + tag + src[i:]
	} else {
		src = "<!doctype html><html><head>" + tag + "</head>" + strings.TrimPrefix(src, "<!doctype html>")
	}
	out := filepath.Join(t.TempDir(), filepath.Base(page))
	require.NoError(t, os.WriteFile(out, []byte(src), 0o644))
	return out
}

// Every verified fix, pasted into the page as its rule says, must make the
// emphasis pop for every vision type when the page is checked again, by
// Chromium and by the static reader: the selectors reach the marks the fix
// is for, and the model's own re-check of the fix holds for the page as a
// browser styles it.
func TestFixesHoldWhenApplied(t *testing.T) {
	needBrowser(t)
	pages := parityPages(t)
	code, out, errs := runCmd(append([]string{"check", "--browser", "--json"}, pages...)...)
	require.Equal(t, 0, code, errs)
	var rep report.Report
	require.NoError(t, json.Unmarshal([]byte(out), &rep))
	tried := 0
	for pi, p := range rep.Pages {
		for _, c := range p.Charts {
			for _, f := range c.Findings {
				if f.Fix == nil || !f.Fix.Verified {
					continue
				}
				require.NotEmpty(t, f.Fix.Rule, "%s %s: a verified fix has a rule", pages[pi], c.Path)
				if filepath.Base(pages[pi]) == "classed-fixes.html" {
					// The page's own classes are preferred to a path.
					assert.Regexp(t, `\.pick \{|\.trip:not\(\.stormy\) \{`, f.Fix.Rule)
				}
				tried++
				fixed := withStyle(t, pages[pi], f.Fix.Rule)
				emphasis := strings.Join(c.Emphasis.Marks, ",")
				for _, mode := range [][]string{{"--browser"}, nil} {
					args := append(append([]string{"check", "--json", "--emphasis", emphasis}, mode...), fixed)
					code, out, errs := runCmd(args...)
					require.Equal(t, 0, code, errs)
					var again report.Report
					require.NoError(t, json.Unmarshal([]byte(out), &again))
					var got *report.Chart
					for i := range again.Pages[0].Charts {
						if again.Pages[0].Charts[i].Path == c.Path {
							got = &again.Pages[0].Charts[i]
						}
					}
					require.NotNil(t, got)
					for v, holds := range got.Emphasis.Holds {
						assert.True(t, holds, "%s %s %s (%v): with the fix applied, the emphasis does not stand out for %s", filepath.Base(pages[pi]), c.Path, f.ID, mode, v)
					}
				}
			}
		}
	}
	assert.GreaterOrEqual(t, tried, 2, "the demo pages hold at least two fixes")
}
