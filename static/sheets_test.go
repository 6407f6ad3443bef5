package static

import (
	"strings"
	"testing"
	"testing/fstest"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/snapshot"
)

// A style sheet linked by a path beside the page is read, in its place in
// the cascade (CSS Cascading 4: document order); anything else is named,
// with the advice to read the page in a browser, and nothing is fetched.
func TestLinkedStyleSheets(t *testing.T) {
	files := fstest.MapFS{
		"css/chart.css": {Data: []byte(`.hero { fill: #c23a2e } rect { fill: #2a6fa8 }`)},
		"big.css":       {Data: []byte(strings.Repeat(" ", MaxSheetBytes+1))},
	}
	page := `<html><head>
	<link rel="stylesheet" href="css/chart.css?v=3">
	<link rel="stylesheet" href="https://cdn.example/remote.css">
	<link rel="stylesheet" href="../outside.css">
	<link rel="stylesheet" href="missing.css">
	<link rel="stylesheet" href="big.css">
	<style>rect.late { fill: #3b9a3f }</style>
	</head><body><svg width="100" height="50"><rect width="5" height="5"/><rect class="hero" width="5" height="5"/><rect class="late" width="5" height="5"/></svg></body></html>`
	p, err := Build(strings.NewReader(page), Options{Source: "t", Sheets: files})
	require.NoError(t, err)
	fills := map[string]string{}
	for _, n := range p.Charts[0].Nodes {
		if n.Tag == "rect" {
			fills[n.Name] = snapshot.Hex(n.Fill.RGBA)
		}
	}
	assert.Equal(t, map[string]string{"svg0/rect0": "#2a6fa8", "svg0/rect1": "#c23a2e", "svg0/rect2": "#3b9a3f"}, fills)
	notes := strings.Join(p.Problems, "\n")
	for _, want := range []string{"remote.css", "outside.css", "missing.css", "big.css"} {
		assert.Contains(t, notes, want)
	}
	assert.NotContains(t, notes, "chart.css")
	assert.Contains(t, notes, "check --browser")
	// Without a folder, nothing is read and the link is named.
	p, err = Build(strings.NewReader(page), Options{Source: "t"})
	require.NoError(t, err)
	assert.Contains(t, strings.Join(p.Problems, "\n"), "chart.css")
}
