package main

import (
	"encoding/json"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The core's answer for a chart drawn as pixels: twelve bars, one in a
// colour of its own, as a canvas's RGBA; the strongest region for normal
// vision covers that bar, and every vision type has its regions. Bad
// input is an error, not a crash.
func TestSaliencyOfPixels(t *testing.T) {
	const w, h = 480, 300
	rgba := make([]byte, 4*w*h)
	for i := range rgba {
		rgba[i] = 255
	}
	for k := 0; k < 12; k++ {
		bh := 60 + (k*53)%200
		c := [3]byte{0x7d, 0x8a, 0x99}
		if k == 5 {
			c = [3]byte{0xd1, 0x49, 0x5b}
		}
		for y := 280 - bh; y < 280; y++ {
			for x := 20 + k*38; x < 46+k*38; x++ {
				copy(rgba[4*(y*w+x):], c[:])
			}
		}
	}
	var got struct {
		OK      bool
		Regions map[string][]struct {
			Box      [4]float64
			Salience float64
		}
	}
	require.NoError(t, json.Unmarshal(Saliency(rgba, w, h, 1), &got))
	require.True(t, got.OK)
	assert.Len(t, got.Regions, 5)
	n := got.Regions["normal"]
	require.NotEmpty(t, n)
	cx, cy := 210+13.0, 155+62.0
	assert.True(t, cx >= n[0].Box[0] && cx <= n[0].Box[0]+n[0].Box[2] && cy >= n[0].Box[1] && cy <= n[0].Box[1]+n[0].Box[3], "%v", n[0].Box)

	for _, bad := range [][3]int{{0, 10, 0}, {10, 10, 399}, {1 << 12, 1 << 12, 4 << 24}} {
		var r Response
		require.NoError(t, json.Unmarshal(Saliency(make([]byte, bad[2]), bad[0], bad[1], 1), &r))
		assert.False(t, r.OK, "%v", bad)
	}
}
