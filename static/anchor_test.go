package static

import (
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// Each chart's anchor matches its <svg> and nothing else: an id used once,
// else an aria-label used once, else :nth-child steps from the nearest
// ancestor with an id used once, or from body. Chromium agrees on the
// corpus pages (cmd/standout TestBrowserPathMatchesStaticPath).
func TestAnchors(t *testing.T) {
	page := `<!doctype html><html><body>
	<svg id="ferries"><rect width="5" height="5"/></svg>
	<svg aria-label="Waits by pier"><rect width="5" height="5"/></svg>
	<div id="panel"><p>x</p><svg id="twice"><rect width="5" height="5"/></svg></div>
	<span id="twice"></span>
	<div><svg aria-label="Same"><rect width="5" height="5"/></svg><svg aria-label="Same"><rect width="5" height="5"/></svg></div>
	<svg id="has space" ><rect width="5" height="5"/></svg>
	</body></html>`
	p, err := Build(strings.NewReader(page), Options{Source: "t"})
	require.NoError(t, err)
	var got []string
	for _, c := range p.Charts {
		got = append(got, c.Anchor)
	}
	assert.Equal(t, []string{
		"#ferries",
		`svg[aria-label="Waits by pier"]`,
		"#panel > svg:nth-child(2)",
		"body > div:nth-child(5) > svg:nth-child(1)",
		"body > div:nth-child(5) > svg:nth-child(2)",
		"body > svg:nth-child(6)",
	}, got)

	p, err = Build(strings.NewReader(`<?xml version="1.0"?><!-- a chart --><svg xmlns="http://www.w3.org/2000/svg"><rect width="5" height="5"/></svg>`), Options{Source: "t"})
	require.NoError(t, err)
	require.Len(t, p.Charts, 1)
	assert.Equal(t, ":root", p.Charts[0].Anchor, "an SVG document's root")
}
