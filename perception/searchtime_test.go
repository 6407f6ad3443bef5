package perception

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/perception/colour"
)

// Search time by kind of search (REFERENCES §5.6): pop-out is nearly flat
// in the number of marks ("near … 0 ms/item", Wolfe 2021), efficient
// search grows with the logarithm of the set size, the more steeply the
// more alike target and distractors are (Buetti et al. 2016, as quoted by
// Wang, Buetti & Lleras 2017), and serial search grows linearly (20–50 ms
// per item, REFERENCES §5.1 and §5.6).
func TestSearchTimeBySetSize(t *testing.T) {
	singleton := func(n int) MarkResult {
		return analyseTarget(t, gridDisplay(n, 7, func(i int, m *Mark) {
			if i == n/2 {
				m.Colour = colour.MustHex("#c2441f")
			}
		}), n/2)
	}
	big := singleton(1000)
	require.Equal(t, Pops, big.Verdict)
	assert.Less(t, big.SearchMs[1], 1000.0, "a colour singleton among 1,000 marks is found in under a second")
	small := singleton(100)
	// Logarithmic: ten times the marks adds ln 10 / ln 100 = 1.5 times the
	// time, not ten times (for the same target salience, which a colour
	// singleton keeps).
	ratio := big.SearchMs[1] / small.SearchMs[1]
	assert.InDelta(t, math.Log(1000)/math.Log(100), ratio, 0.3)

	// A conjunction target (Treisman & Gelade 1980): linear, 20–50 ms per
	// mark, so about 20–50 s among 1,000.
	conj := func(n int) MarkResult {
		return analyseTarget(t, gridDisplay(n, 9, func(i int, m *Mark) {
			m.Colour, m.Shape = brown, "triangle"
			if i%2 == 1 {
				m.Colour, m.Shape = green, "square"
			}
			if i == n/2 {
				m.Colour, m.Shape = green, "triangle"
			}
		}), n/2)
	}
	c := conj(1000)
	require.NotEqual(t, Pops, c.Verdict)
	assert.Equal(t, [2]float64{20000, 50000}, c.SearchMs)
	// Stronger salience, flatter curve.
	weak := analyseTarget(t, gridDisplay(300, 7, func(i int, m *Mark) {
		if i == 150 {
			m.Colour = colour.MustHex("#b05050")
		}
	}), 150)
	strong := analyseTarget(t, gridDisplay(300, 7, func(i int, m *Mark) {
		if i == 150 {
			m.Colour = colour.MustHex("#c2441f")
		}
	}), 150)
	require.Equal(t, Pops, weak.Verdict)
	require.Equal(t, Pops, strong.Verdict)
	assert.Greater(t, weak.SearchMs[1], strong.SearchMs[1])
}
