package perception

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/perception/colour"
)

func relation(g Grouping, a, b Cue) (string, bool) {
	for _, x := range g.Agreements {
		if x.A == a && x.B == b || x.A == b && x.B == a {
			return x.Relation, true
		}
	}
	return "", false
}

func TestGridColourVersusLines(t *testing.T) {
	// A 4×4 grid coloured by column and joined by lines along its rows:
	// colour groups the columns, connectedness the rows, so the cues
	// conflict (Palmer & Rock 1994: connectedness groups; ARI from Hubert &
	// Arabie 1985 measures the disagreement).
	cols := []colour.SRGB{colour.MustHex("#1f8a6a"), colour.MustHex("#c9611a"), colour.MustHex("#6f64a8"), colour.MustHex("#cc3a86")}
	var marks []Mark
	for r := 0; r < 4; r++ {
		for c := 0; c < 4; c++ {
			marks = append(marks, Mark{Kind: "point", Type: colour.Point, Colour: cols[c], Size: 50, MinPx: 8, MaxPx: 8, Shape: "circle",
				X: float64(c) * 40, Y: float64(r) * 40})
		}
	}
	for r := 0; r < 4; r++ {
		marks = append(marks, Mark{Kind: "line", Type: colour.Line, Colour: colour.MustHex("#555555"), MinPx: 1.5, MaxPx: 120, Shape: "other",
			Vertices: [][2]float64{{0, float64(r) * 40}, {120, float64(r) * 40}}})
	}
	g := Analyse(Input{Marks: marks, Background: colour.MustHex("#ffffff")}, DefaultParams).Groups
	rel, ok := relation(g, CueColour, CueConnected)
	require.True(t, ok, "%+v", g.Agreements)
	assert.Equal(t, "conflict", rel)
}

func TestGridColourAndSpacingAgree(t *testing.T) {
	// Three clusters of 3×3 points, far apart, each one colour: proximity
	// and colour partition the marks identically (ARI 1).
	cols := []colour.SRGB{colour.MustHex("#1f8a6a"), colour.MustHex("#c9611a"), colour.MustHex("#6f64a8")}
	var marks []Mark
	for k := 0; k < 3; k++ {
		for i := 0; i < 9; i++ {
			marks = append(marks, Mark{Kind: "point", Type: colour.Point, Colour: cols[k], Size: 50, MinPx: 8, MaxPx: 8, Shape: "circle",
				X: float64(k)*200 + float64(i%3)*12, Y: float64(i/3) * 12})
		}
	}
	g := Analyse(Input{Marks: marks, Background: colour.MustHex("#ffffff")}, DefaultParams).Groups
	rel, ok := relation(g, CueProximity, CueColour)
	require.True(t, ok, "%+v", g.Agreements)
	assert.Equal(t, "agree", rel)
}
