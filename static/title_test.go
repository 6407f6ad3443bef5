package static

import (
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// A chart is named as a reader would name it, from the places the page
// gives it a name (WAI-ARIA's aria-label; SVG 1.1's <title>; HTML's
// <figure> with <figcaption>; the nearest heading), in that order.
func TestChartTitles(t *testing.T) {
	page := `<html><body>
	<h1>Harbour report</h1>
	<h2>Crossings
	   by week</h2>
	<svg id="a" aria-label="  Crossings per week "><title>ignored</title><rect width="5" height="5"/></svg>
	<svg id="b"><title>Boats by pier</title><rect width="5" height="5"/></svg>
	<figure><div><svg id="c"><rect width="5" height="5"/></svg></div><figcaption>Waits, in minutes</figcaption></figure>
	<h3>Late sailings</h3>
	<svg id="d"><rect width="5" height="5"/></svg>
	</body></html>`
	p, err := Build(strings.NewReader(page), Options{Source: "t"})
	require.NoError(t, err)
	require.Len(t, p.Charts, 4)
	for i, want := range []string{"Crossings per week", "Boats by pier", "Waits, in minutes", "Late sailings"} {
		assert.Equal(t, want, p.Charts[i].Title, p.Charts[i].Path)
	}
	p, err = Build(strings.NewReader(`<svg xmlns="http://www.w3.org/2000/svg"><rect width="5" height="5"/></svg>`), Options{Source: "t"})
	require.NoError(t, err)
	assert.Empty(t, p.Charts[0].Title, "no name: the path names it")
	long := strings.Repeat("é", 200)
	p, err = Build(strings.NewReader(`<svg aria-label="`+long+`"><rect width="5" height="5"/></svg>`), Options{Source: "t"})
	require.NoError(t, err)
	assert.Equal(t, maxTitleRunes, len([]rune(p.Charts[0].Title)))
}
