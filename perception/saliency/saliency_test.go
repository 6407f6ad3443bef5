package saliency

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/perception/colour"
)

// fill paints a box of img in an 8-bit colour.
func fill(img *Image, b [4]int, hex string) {
	c := colour.MustHex(hex)
	for y := b[1]; y < b[1]+b[3]; y++ {
		for x := b[0]; x < b[0]+b[2]; x++ {
			i := y*img.W + x
			img.R[i], img.G[i], img.B[i] = float32(c.R), float32(c.G), float32(c.B)
		}
	}
}

func field(w, h int, bg string) *Image {
	img := NewImage(w, h)
	fill(img, [4]int{0, 0, w, h}, bg)
	return img
}

func box(b [4]int) [4]float64 {
	return [4]float64{float64(b[0]), float64(b[1]), float64(b[2]), float64(b[3])}
}

// The published model's behaviour on the displays it was built for (Itti,
// Koch & Niebur 1998, Fig. 3 and §3: a colour singleton and an
// orientation singleton among distractors are found first, "popping out"
// whatever the number of distractors): the strongest region covers the
// singleton.
func TestSingletonsAreFoundFirst(t *testing.T) {
	for name, c := range map[string]struct {
		distractor, target [4]int // a distractor's box at the grid's origin, and the target's
		dColour, tColour   string
	}{
		"colour singleton":      {[4]int{0, 0, 16, 16}, [4]int{0, 0, 16, 16}, "#5b7fa6", "#d1495b"},
		"orientation singleton": {[4]int{0, 0, 4, 24}, [4]int{-10, 10, 24, 4}, "#222222", "#222222"},
	} {
		t.Run(name, func(t *testing.T) {
			img := field(480, 400, "#ffffff")
			var target [4]int
			for gy := 0; gy < 6; gy++ {
				for gx := 0; gx < 7; gx++ {
					x, y := 40+gx*60, 40+gy*60
					if gx == 4 && gy == 2 {
						target = [4]int{x + c.target[0], y + c.target[1], c.target[2], c.target[3]}
						fill(img, target, c.tColour)
						continue
					}
					fill(img, [4]int{x + c.distractor[0], y + c.distractor[1], c.distractor[2], c.distractor[3]}, c.dColour)
				}
			}
			rs := Regions(Compute(img), img.W, img.H)
			require.NotEmpty(t, rs)
			assert.True(t, rs[0].Covers(box(target)), "strongest region %v, target %v (all: %v)", rs[0].Box, target, rs)
		})
	}
}

// A uniform field has no salient region: every feature map is flat, and
// N(·) leaves a flat map at zero (IKN 1998 §2).
func TestUniformFieldHasNoRegion(t *testing.T) {
	for _, bg := range []string{"#ffffff", "#7f7f7f", "#3b6e8f"} {
		assert.Empty(t, Regions(Compute(field(320, 240, bg)), 320, 240), bg)
	}
	assert.Equal(t, Map{}, Compute(field(MinSize-1, 100, "#ffffff")), "too small for the pyramid")
}

// A highlight whose difference lies along a deutan confusion line pops
// for normal vision and not for a deutan reader: re-run on the simulated
// pixels (Machado et al. 2009 at full severity, colour.Simulate), every
// square is alike and the target does not stand apart. The target is the
// colour farthest from the distractor (CIEDE2000) among those that a
// deutan dichromat sees within ΔE 1 of it.
func TestHighlightLostForDeutanReaders(t *testing.T) {
	const distractor = "#6a994e"
	d := colour.MustHex(distractor)
	dSim := colour.SRGBToLab(colour.Simulate(colour.Deutan, 1, d))
	var target colour.SRGB
	best := 0.0
	for r := 0; r < 256; r += 3 {
		for g := 0; g < 256; g += 3 {
			for b := 0; b < 256; b += 3 {
				c := colour.SRGB8(uint8(r), uint8(g), uint8(b))
				if colour.DeltaE2000(colour.SRGBToLab(colour.Simulate(colour.Deutan, 1, c)), dSim) > 1 {
					continue
				}
				if e := colour.DeltaE2000(colour.SRGBToLab(c), colour.SRGBToLab(d)); e > best {
					best, target = e, c
				}
			}
		}
	}
	require.Greater(t, best, 20.0, "a confusion pair far apart for normal vision")
	img := field(480, 400, "#ffffff")
	var tb [4]int
	for gy := 0; gy < 6; gy++ {
		for gx := 0; gx < 7; gx++ {
			b := [4]int{40 + gx*60, 40 + gy*60, 18, 18}
			if gx == 2 && gy == 3 {
				tb = b
				fill(img, b, target.Hex())
				continue
			}
			fill(img, b, distractor)
		}
	}
	normal := Regions(Compute(img), img.W, img.H)
	require.NotEmpty(t, normal)
	assert.True(t, normal[0].Covers(box(tb)), "normal vision: %v first, target %v (%s)", normal[0].Box, tb, target.Hex())
	assert.Zero(t, rivals(normal, tb), "normal vision: the target stands apart")
	deutan := Regions(Compute(Simulated(img, colour.Deutan, 1)), img.W, img.H)
	assert.GreaterOrEqual(t, rivals(deutan, tb), 3, "deutan: the target stands apart: %v", deutan)
}

// rivals counts the regions elsewhere than the target with at least 0.8
// of the salience of the target's own region.
func rivals(rs []Region, target [4]int) int {
	own := 0.0
	for _, r := range rs {
		if r.Covers(box(target)) {
			own = r.Salience
		}
	}
	n := 0
	for _, r := range rs {
		if !r.Covers(box(target)) && r.Salience >= 0.8*own {
			n++
		}
	}
	return n
}

// Search displays of several sizes (Itti & Koch 2000, Vision Research 40,
// §3.2, from memory: the model finds a feature singleton first whatever
// the number of distractors, while a conjunction target, which differs
// from each distractor in one feature only, is found after a search
// whose length grows with their number). A red vertical bar among green
// vertical bars is found first on grids of 9 to 42 items; a red vertical
// bar among red horizontal and green vertical bars is not.
func TestFeatureAndConjunctionSearch(t *testing.T) {
	vertical, horizontal := [4]int{0, 0, 4, 24}, [4]int{-10, 10, 24, 4}
	const red, green = "#c8553d", "#3f8f5a"
	for _, grid := range [][2]int{{3, 3}, {5, 4}, {7, 6}} {
		for _, conjunction := range []bool{false, true} {
			img := field(480, 400, "#ffffff")
			var target [4]int
			k := 0
			for gy := 0; gy < grid[1]; gy++ {
				for gx := 0; gx < grid[0]; gx++ {
					x, y := 40+gx*60, 40+gy*60
					shape, col := vertical, green
					switch {
					case gx == grid[0]/2 && gy == grid[1]/2:
						target = [4]int{x + vertical[0], y + vertical[1], vertical[2], vertical[3]}
						fill(img, target, red)
						continue
					case conjunction && k%2 == 0:
						shape, col = horizontal, red
					}
					k++
					fill(img, [4]int{x + shape[0], y + shape[1], shape[2], shape[3]}, col)
				}
			}
			rs := Regions(Compute(img), img.W, img.H)
			require.NotEmpty(t, rs)
			cx, cy := float64(target[0])+2, float64(target[1])+12
			b := rs[0].Box
			first := cx >= b[0] && cx <= b[0]+b[2] && cy >= b[1] && cy <= b[1]+b[3]
			assert.Equal(t, !conjunction, first, "%d×%d grid, conjunction %v: first region %v, target %v", grid[0], grid[1], conjunction, b, target)
		}
	}
}
