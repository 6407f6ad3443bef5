package perception

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/perception/colour"
)

// Redundant cues add up: a target that differs from its distractors a
// little in lightness and a little in hue, each short of the pop-out
// margin on its own, is guided to by the sum of the two contrasts (Guided
// Search: Wolfe 1994, from memory; Wolfe 2021). Three targets among grey
// dots at 10 px: lightness alone (0.75 of its margin), hue alone (0.75
// of its margin), and both.
func TestRedundantCuesCombine(t *testing.T) {
	grey := colour.SRGBToLab(colour.MustHex("#808080"))
	nd := DefaultParams.ND.For(colour.Point, 10, 10)
	dl := 0.75 * DefaultParams.LightnessMargin * nd[0]
	da := 0.75 * DefaultParams.ColourMargin * nd[1]
	target := func(l, a float64) MarkResult {
		c := colour.LabToSRGB(colour.Lab{L: grey.L + l, A: grey.A + a, B: grey.B})
		require.True(t, c.InGamut())
		return analyseTarget(t, gridDisplay(30, 23, func(i int, m *Mark) {
			if i == 13 {
				m.Colour = c
			}
		}), 13)
	}
	light, hue, both := target(-dl, 0), target(0, da), target(-dl, da)
	assert.NotEqual(t, Pops, light.Verdict, "lightness alone: %v", light.Salience)
	assert.NotEqual(t, Pops, hue.Verdict, "hue alone: %v", hue.Salience)
	assert.Equal(t, Pops, both.Verdict, "both: %v", both.Salience)
	assert.ElementsMatch(t, []Channel{Hue, Lightness}, both.Channels)
}
