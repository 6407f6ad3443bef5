package perception

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/perception/colour"
)

// A mute fix offers a quiet grey, never a near-black one: on a light
// emphasis the grey farthest from it would otherwise be almost black,
// making the rest louder than the emphasis (issue 15: "never near-black").
func TestMuteIsNeverNearBlack(t *testing.T) {
	marks := gridDisplay(30, 3, func(i int, m *Mark) {
		m.Colour = colour.MustHex("#c9c9c9")
		if i == 13 {
			m.Colour = colour.MustHex("#e9d36c")
		}
	})
	in := Input{Marks: marks, Background: colour.MustHex("#ffffff"), Emphasis: []int{13}}
	res := Analyse(in, DefaultParams)
	fs := newFixSearch(in, DefaultParams, []int{13})
	require.NotNil(t, fs)
	f := fs.mute(res)
	require.NotNil(t, f)
	assert.GreaterOrEqual(t, colour.SRGBToLab(f.Colour).L, float64(muteMinLightness)-0.5, f.CSS)
}

// The recolour search's margin stops early only below its floor: it
// equals worst's margin wherever that reaches the floor, and lies below
// the floor (as worst's does) wherever it stops.
func TestWorstBelowAgreesWithWorst(t *testing.T) {
	marks := gridDisplay(30, 3, func(i int, m *Mark) {
		m.Colour = []colour.SRGB{colour.MustHex("#4a7bb0"), colour.MustHex("#c8553d"), colour.MustHex("#6a9f58")}[i%3]
		if i == 13 {
			m.Colour = colour.MustHex("#8c6d3f")
		}
	})
	fs := newFixSearch(Input{Marks: marks, Background: colour.MustHex("#ffffff")}, DefaultParams, []int{13})
	require.NotNil(t, fs)
	stopped := 0
	for L := 10.0; L <= 90; L += 20 {
		for a := -80.0; a <= 80; a += 40 {
			for b := -80.0; b <= 80; b += 40 {
				c := colour.LabToSRGB(colour.Lab{L: L, A: a, B: b}).Clamped()
				want, _ := fs.worst(c)
				for _, floor := range []float64{math.Inf(-1), 0, 0.5 * want, want, 1, 2, 5} {
					got := fs.worstBelow(c, floor)
					if want >= floor {
						require.Equal(t, want, got, "%v at floor %v", c, floor)
						continue
					}
					stopped++
					require.Less(t, got, floor, "%v at floor %v", c, floor)
					require.GreaterOrEqual(t, got, want)
				}
			}
		}
	}
	require.Positive(t, stopped, "no case stopped early")
}
