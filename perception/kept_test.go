package perception

import (
	"math/rand"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/perception/colour"
)

// keptScatter is a scatter large enough for its judging to be kept
// (keepNeighboursFrom), whose channels that are not colour all have
// something to judge: points in three sizes with a few much larger,
// circles with a few squares, the squares at angles with one turned apart.
func keptScatter() Input {
	rng := rand.New(rand.NewSource(14))
	pal := []colour.SRGB{colour.MustHex("#2f6a4f"), colour.MustHex("#b5553a"), colour.MustHex("#6b5aa8")}
	n := keepNeighboursFrom + 300
	marks := make([]Mark, n)
	for i := range marks {
		marks[i] = Mark{Kind: "point", Type: colour.Point, Colour: pal[rng.Intn(len(pal))], Size: []float64{30, 40, 50}[rng.Intn(3)],
			MinPx: 6, MaxPx: 6, Shape: "circle", X: rng.Float64() * 900, Y: rng.Float64() * 600}
		switch {
		case i%97 == 0:
			marks[i].Size = 400
		case i%61 == 0:
			marks[i].Shape, marks[i].Fold, marks[i].Angle = "square", 4, 10
		}
	}
	marks[61*7].Angle = 55
	return Input{Marks: marks, Background: colour.MustHex("#ffffff"), Emphasis: []int{97 * 3}}
}

// visible is what an analysis reports.
func visible(r *Result) []any {
	return []any{r.Marks, r.Emphasis, r.Inferred, r.Extremes, r.Rivals, r.Holds, r.Groups, r.Findings}
}

// An analysis given a Kept that judged the same marks in other colours
// takes the channels that are not colour from it, and reports what an
// analysis without a Kept reports: after a recolour, after a recolour that
// makes an unseen mark seen (a mark the first judging did not judge), and
// after a mark changed size, which the kept judging must not serve.
func TestChannelsKeptAcrossAnalyses(t *testing.T) {
	for _, findingsOnly := range []bool{true, false} {
		p := DefaultParams
		p.FindingsOnly = findingsOnly
		kept := &Kept{}
		withKept := func(in Input) *Result {
			q := p
			q.Kept = kept
			return Analyse(in, q)
		}
		in := keptScatter()
		in.Marks[5].Colour, in.Marks[5].Size = in.Background, 400 // not seen: not judged
		assert.Equal(t, visible(Analyse(in, p)), visible(withKept(in)), "first analysis, findings only %v", findingsOnly)
		require.Len(t, kept.channels, 1)
		first := kept.channels[0]
		assert.NotZero(t, first.sal[5][sizeAt], "the unseen mark's size salience")

		in.Marks[5].Colour = colour.MustHex("#1d1d1d")
		in.Marks[300].Colour = colour.MustHex("#d2a02c")
		assert.Equal(t, visible(Analyse(in, p)), visible(withKept(in)), "recoloured, findings only %v", findingsOnly)
		assert.Len(t, kept.channels, 1, "a recolour judged the channels again")

		in.Marks[20].Size = 90
		assert.Equal(t, visible(Analyse(in, p)), visible(withKept(in)), "resized, findings only %v", findingsOnly)
		require.Len(t, kept.channels, 2, "a resize was served the kept channels")
		assert.NotSame(t, first, kept.channels[0])
	}
}

// The kept judging is what the analysis reports: a kept salience changed
// behind its back shows in the next analysis of the same marks.
func TestChannelsKeptServeTheNextAnalysis(t *testing.T) {
	in := keptScatter()
	p := DefaultParams
	p.Kept = &Kept{}
	before := Analyse(in, p)
	require.Len(t, p.Kept.channels, 1)
	k := 97 * 5
	assert.Less(t, before.Marks[k][0].Salience[shapeAt], 1.0)
	p.Kept.channels[0].sal[k][shapeAt] = 7
	after := Analyse(in, p)
	assert.Equal(t, 7.0, after.Marks[k][0].Salience[shapeAt])
	assert.Contains(t, after.Marks[k][0].Channels, Shape)
}

// The proximity grouping of a large display is kept with its neighbour
// lists and ratio: an analysis of the same places takes it, one with
// another ratio groups again, and both report what an analysis without a
// Kept reports.
func TestProximityGroupingKept(t *testing.T) {
	in := keptScatter()
	kept := &Kept{}
	for _, ratio := range []float64{2, 2, 0.5} {
		p := DefaultParams
		p.ProximityRatio = ratio
		want := Analyse(in, p)
		p.Kept = kept
		assert.Equal(t, visible(want), visible(Analyse(in, p)), "ratio %v", ratio)
	}
	require.Len(t, kept.groupings, 2, "the second analysis grouped again, or the third did not")
	assert.Equal(t, 0.5, kept.groupings[0].ratio)
}
