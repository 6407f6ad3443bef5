package perception

import (
	"math/rand"
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

// A point's position is its data: in a scatter, an outlier far from every
// other point draws the eye by where it lies, and that is the data
// speaking, a data extreme. A uniformly random scatter has none (see
// Params.IsolationRatio for how rarely one appears).
func TestOutlyingPointIsADataExtreme(t *testing.T) {
	marks := gridDisplay(100, 37, func(i int, m *Mark) {})
	res := Analyse(Input{Marks: marks, Background: colour.MustHex("#ffffff")}, DefaultParams)
	assert.Empty(t, res.Extremes, "a regular scatter has no outlier")

	rng := rand.New(rand.NewSource(41))
	for i := range marks {
		marks[i].X, marks[i].Y = rng.Float64()*200, rng.Float64()*200
	}
	res = Analyse(Input{Marks: marks, Background: colour.MustHex("#ffffff")}, DefaultParams)
	assert.Empty(t, res.Extremes, "a uniformly random scatter has none")

	marks = append(marks, Mark{ID: "far", Kind: "point", Type: colour.Point, Size: 78.5, MinPx: 10, MaxPx: 10, Shape: "circle",
		X: 600, Y: 600, Colour: colour.MustHex("#808080")})
	res = Analyse(Input{Marks: marks, Background: colour.MustHex("#ffffff")}, DefaultParams)
	far := len(marks) - 1
	assert.Equal(t, []int{far}, res.Extremes)
	assert.NotContains(t, res.Emphasis, far, "an outlier is not a highlight")
	assert.Contains(t, findingIDs(res.Findings), "data-extremes")
}

// Anscombe's quartet (Anscombe 1973, The American Statistician 27(1); the
// values from memory, and the corpus's anscombeQuartet chart draws them):
// in data set IV every point but one lies at x = 8, and (19, 12.5) lies
// far from them: the one data extreme by position. Data set I, a noisy
// line, has none.
func TestAnscombeOutlier(t *testing.T) {
	scatter := func(xs, ys []float64) []Mark {
		var marks []Mark
		for i := range xs {
			marks = append(marks, Mark{ID: "p", Kind: "point", Type: colour.Point, Size: 19.6, MinPx: 5, MaxPx: 5, Shape: "circle",
				X: xs[i] * 20, Y: 300 - ys[i]*20, Colour: colour.MustHex("#3a5f8f")})
		}
		return marks
	}
	four := scatter([]float64{8, 8, 8, 8, 8, 8, 8, 19, 8, 8, 8},
		[]float64{6.58, 5.76, 7.71, 8.84, 8.47, 7.04, 5.25, 12.50, 5.56, 7.91, 6.89})
	res := Analyse(Input{Marks: four, Background: colour.MustHex("#ffffff")}, DefaultParams)
	assert.Equal(t, []int{7}, res.Extremes)
	one := scatter([]float64{10, 8, 13, 9, 11, 14, 6, 4, 12, 7, 5},
		[]float64{8.04, 6.95, 7.58, 8.81, 8.33, 9.96, 7.24, 4.26, 10.84, 4.82, 5.68})
	res = Analyse(Input{Marks: one, Background: colour.MustHex("#ffffff")}, DefaultParams)
	assert.Empty(t, res.Extremes)
}
