package static

import (
	"bytes"
	"os"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/snapshot"
)

// Charts drawn as pixels are named, never passed over: a canvas (300 ×
// 150 when its attributes say nothing, as HTML specifies), an image or an
// object at least snapshot.RasterMin by its attributes, or of a size they
// do not give; an icon-sized image is not.
func TestRasters(t *testing.T) {
	page := `<!doctype html><body>
	<canvas></canvas>
	<canvas width="80" height="40"></canvas>
	<img src="a.png" width="400" height="200">
	<img src="icon.png" width="16" height="16">
	<img src="b.png">
	<object data="c.svg" width="320" height="160"></object>
	<svg><image href="d.png" width="400" height="200"/></svg>
	</body>`
	p, err := Build(strings.NewReader(page), Options{Source: "t"})
	require.NoError(t, err)
	assert.Equal(t, []snapshot.Raster{
		{Tag: "canvas", Name: "canvas0", Box: [4]float64{0, 0, 300, 150}},
		{Tag: "img", Name: "img0", Box: [4]float64{0, 0, 400, 200}},
		{Tag: "img", Name: "img1", Box: [4]float64{0, 0, 0, 0}},
		{Tag: "object", Name: "object0", Box: [4]float64{0, 0, 320, 160}},
	}, p.Rasters)
}

// A chart drawn as a CSS background image is named as the read pass names
// it: an element with no element inside, whose background is a url()
// image, of chart size by its CSS width and height (testdata/
// backgrounds.html, which the browser parity test reads in Chromium too).
// The page's own background, an icon, a gradient, a card with text over a
// picture and a hidden element are not charts.
func TestBackgroundRasters(t *testing.T) {
	b, err := os.ReadFile("../testdata/backgrounds.html")
	require.NoError(t, err)
	p, err := Build(bytes.NewReader(b), Options{Source: "t"})
	require.NoError(t, err)
	assert.Equal(t, []snapshot.Raster{
		{Tag: "background", Name: "background0", Box: [4]float64{0, 0, 400, 200}},
		{Tag: "background", Name: "background1", Box: [4]float64{0, 0, 400, 200}},
	}, p.Rasters)
}
