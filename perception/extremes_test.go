package perception

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/perception/colour"
)

// In a bar chart the bars' lengths are the data. One orange bar among
// grey ones is the highlight; the shortest grey bar differs from the
// others by length alone, which is the data speaking: a data extreme,
// reported apart and never taken for emphasis (issue 12's bar chart).
func TestDataExtremesAreNotEmphasis(t *testing.T) {
	grey, orange := colour.MustHex("#9a9a9a"), colour.MustHex("#d0641c")
	lengths := []float64{80, 84, 78, 82, 20, 81, 79, 83}
	var marks []Mark
	for i, h := range lengths {
		c := grey
		if i == 6 {
			c = orange
		}
		marks = append(marks, Mark{ID: "bar", Kind: "bar", Type: colour.Bar, Colour: c, Size: h, Length: true,
			MinPx: 20, MaxPx: h, X: float64(i) * 30, Y: 100 - h/2, Shape: "square", Box: [4]float64{float64(i) * 30, 100 - h, 20, h}})
	}
	res := Analyse(Input{Marks: marks, Background: colour.MustHex("#ffffff")}, DefaultParams)
	require.True(t, res.Inferred)
	assert.Equal(t, []int{6}, res.Emphasis, "the orange bar is the inferred emphasis, not the short one")
	assert.Equal(t, Pops, res.Marks[6][0].Verdict)
	assert.NotEqual(t, Pops, res.Marks[4][0].Verdict, "the short bar does not pop")
	assert.True(t, res.Marks[4][0].Extreme)
	assert.Equal(t, []int{4}, res.Extremes)
	assert.Contains(t, findingIDs(res.Findings), "data-extremes")
}

// Size is a guiding attribute (Wolfe & Horowitz 2017): in a scatter of
// points of one size, one larger point is a highlight by size and pops;
// only where sizes encode data (more than two sizes) is a size singleton
// a data extreme.
func TestSizeHighlightAmongEqualPoints(t *testing.T) {
	marks := gridDisplay(30, 3, func(i int, m *Mark) {
		if i == 13 {
			m.Size, m.MinPx, m.MaxPx = 78.5*4, 20, 20
		}
	})
	r := analyseTarget(t, marks, 13)
	assert.Equal(t, Pops, r.Verdict)
	assert.False(t, r.Extreme)
}
