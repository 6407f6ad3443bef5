package perception

import (
	"testing"

	"github.com/stretchr/testify/assert"

	"standout/perception/colour"
)

// A mark must first be seen against its background. A #f6f6f6 dot on white
// (1.08:1, WCAG 2.x relative luminance) among blue dots differs from them
// in hue and lightness by far more than the pop-out margin, yet the reader
// cannot tell it from the page: its difference from the ground is below
// one noticeable difference at 10 px (Szafir 2018; Stone, Szafir & Setlur
// 2014), so it cannot pop. The same dot outlined in a dark stroke is seen,
// and pops.
func TestGroundBeforePopOut(t *testing.T) {
	pale := colour.MustHex("#f6f6f6")
	assert.Less(t, colour.ContrastRatio(pale, colour.MustHex("#ffffff")), 1.1)
	display := func(outlined bool) []Mark {
		return gridDisplay(30, 5, func(i int, m *Mark) {
			m.Colour = blue
			if i == 13 {
				m.Colour = pale
				if outlined {
					m.Outline, m.HasOutline = colour.MustHex("#333333"), true
				}
			}
		})
	}
	t.Run("near the background", func(t *testing.T) {
		r := analyseTarget(t, display(false), 13)
		assert.NotEqual(t, Pops, r.Verdict)
		assert.Empty(t, r.Channels)
	})
	t.Run("outlined", func(t *testing.T) {
		assert.Equal(t, Pops, analyseTarget(t, display(true), 13).Verdict)
	})
	t.Run("the same colour on a dark ground", func(t *testing.T) {
		r := Analyse(Input{Marks: display(false), Background: colour.MustHex("#202020"), Emphasis: []int{13}}, DefaultParams)
		assert.Equal(t, Pops, r.Marks[13][0].Verdict)
	})
}
