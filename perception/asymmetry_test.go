package perception

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/perception/colour"
)

// lab is an in-gamut sRGB colour from CIELAB.
func lab(t *testing.T, l, a, b float64) colour.SRGB {
	t.Helper()
	c := colour.LabToSRGB(colour.Lab{L: l, A: a, B: b})
	require.True(t, c.InGamut(), "L*a*b* %v %v %v", l, a, b)
	return c
}

// Linear separability (REFERENCES §5.7: Bauer, Jolicœur & Cowan 1996 as
// summarised by the 1996 Perception follow-up, and D'Zmura 1991): a target
// whose colour lies between its two distractor colours is hard to find,
// one outside them at the same nearest distance is easier. Half the
// distractors are each colour; the nearest distance is 20 ΔE*ab in both.
func TestFlankedTargetIsHarder(t *testing.T) {
	target := func(c colour.SRGB) MarkResult { return analyseTarget(t, twoHues(c), 14) }
	flanked := target(lab(t, 60, 0, 0))
	separable := target(lab(t, 60, 0, 40))
	// At the same nearest distance the distance model alone scores them
	// alike (within the small difference of the distractors' spread); the
	// flanked target's salience is at most half the separable one's.
	assert.Less(t, flanked.Salience.Of(Hue), 0.5*separable.Salience.Of(Hue))
	assert.NotEqual(t, Pops, flanked.Verdict)
}

// Search asymmetry (Treisman & Gormican 1988, from memory): a saturated
// target among pale distractors is found more easily than a pale target
// among saturated ones, at the same colour distance.
func TestSaturationAsymmetry(t *testing.T) {
	pale, saturated := lab(t, 60, 10, 10), lab(t, 60, 40, 40)
	target := func(tc, dc colour.SRGB) float64 {
		return analyseTarget(t, singleton(19, tc, dc), 14).Salience.Of(Hue)
	}
	assert.Greater(t, target(saturated, pale), target(pale, saturated))
}

// singleton is 30 marks of the distractor colour with mark 14 in the
// target colour (gridDisplay's layout, from seed).
func singleton(seed int64, target, distractor colour.SRGB) []Mark {
	return gridDisplay(30, seed, func(i int, m *Mark) {
		m.Colour = distractor
		if i == 14 {
			m.Colour = target
		}
	})
}

func TestDistanceToHull(t *testing.T) {
	// Plane geometry, by hand: the unit square's hull.
	sq := [][2]float64{{0, 0}, {1, 0}, {1, 1}, {0, 1}, {0.5, 0.5}}
	assert.Equal(t, 0.0, distanceToHull([2]float64{0.5, 0.2}, sq))
	assert.InDelta(t, 1.0, distanceToHull([2]float64{2, 0.5}, sq), 1e-12)
	assert.InDelta(t, 0.0, distanceToHull([2]float64{0.5, 0}, [][2]float64{{0, 0}, {1, 0}}), 1e-12)
	assert.InDelta(t, 2.0, distanceToHull([2]float64{0.5, 2}, [][2]float64{{0, 0}, {1, 0}}), 1e-12)
}

// Search asymmetry in lightness (Treisman & Gormican 1988, from memory):
// on a white ground, a darker target among lighter distractors (more
// contrast among less) is found more easily than a lighter target among
// darker ones (less among more), at the same ΔL*.
func TestLightnessAsymmetry(t *testing.T) {
	dark, light := lab(t, 45, 0, 0), lab(t, 65, 0, 0)
	target := func(tc, dc colour.SRGB) float64 {
		return analyseTarget(t, singleton(23, tc, dc), 14).Salience.Of(Lightness)
	}
	more, less := target(dark, light), target(light, dark)
	assert.Greater(t, more, less)
	assert.InDelta(t, DefaultParams.LessFeatureFactor, less/more, 0.1, "the factor, and nothing else, separates them")
}

// Separability outweighs heterogeneity (D'Zmura 1991, J. Opt. Soc. Am. A
// 8(4), from memory; Bauer, Jolicœur & Cowan 1996, REFERENCES §5.7): a
// target whose colour lies outside the hull of two distractor colours is
// found efficiently however far apart the two are, while one between them
// is not. Distractors at b* = ±20, the target 40 along a*: its margin to
// the distractors' hull is 40 ΔE*ab, more than the model's three noticeable
// differences of a* at 10 px, and the spread of the distractors along b*
// does not take that away.
func TestSeparableTargetAmongTwoHues(t *testing.T) {
	target := func(c colour.SRGB) MarkResult { return analyseTarget(t, twoHues(c), 14) }
	assert.Equal(t, Pops, target(lab(t, 60, 40, 0)).Verdict, "separable: pops")
	assert.NotEqual(t, Pops, target(lab(t, 60, 0, 0)).Verdict, "flanked: does not")
}
