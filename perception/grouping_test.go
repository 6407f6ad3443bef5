package perception

import (
	"math/rand"
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

// lattice is a rows × cols lattice of points dx apart along the rows and
// dy apart across them, coloured by colourOf(row, col).
func lattice(rows, cols int, dx, dy float64, colourOf func(r, c int) colour.SRGB) []Mark {
	var marks []Mark
	for r := 0; r < rows; r++ {
		for c := 0; c < cols; c++ {
			marks = append(marks, Mark{Kind: "point", Type: colour.Point, Colour: colourOf(r, c), Size: 50, MinPx: 8, MaxPx: 8, Shape: "circle",
				X: float64(c) * dx, Y: float64(r) * dy})
		}
	}
	return marks
}

func TestRowsByProximityAgainstColumnsByColour(t *testing.T) {
	// The proximity-against-similarity display of the grouping literature
	// (Wertheimer 1923, as Kubovy & Wagemans 1995 quantify it with dot
	// lattices; from memory): points three times closer along the rows
	// than across them are seen in rows (the pure distance law, Kubovy,
	// Holcombe & Wagemans 1998: grouping follows the ratio of the
	// distances). Colour by column cuts across the rows; colour by row
	// agrees with them.
	cols := []colour.SRGB{colour.MustHex("#1f8a6a"), colour.MustHex("#c9611a"), colour.MustHex("#6f64a8"), colour.MustHex("#cc3a86"), colour.MustHex("#3d6fb0")}
	bg := colour.MustHex("#ffffff")
	across := Analyse(Input{Marks: lattice(4, 5, 20, 60, func(r, c int) colour.SRGB { return cols[c] }), Background: bg}, DefaultParams).Groups
	rel, ok := relation(across, CueProximity, CueColour)
	require.True(t, ok, "%+v", across.Agreements)
	assert.Equal(t, "conflict", rel)
	along := Analyse(Input{Marks: lattice(4, 5, 20, 60, func(r, c int) colour.SRGB { return cols[r] }), Background: bg}, DefaultParams).Groups
	rel, ok = relation(along, CueProximity, CueColour)
	require.True(t, ok, "%+v", along.Agreements)
	assert.Equal(t, "agree", rel)
}

func TestScatterWithoutGapsGroupsByNoProximity(t *testing.T) {
	// A uniform random scatter has no gaps wider than its spacing, so by
	// the ratio law (above) it falls into no groups by proximity, however
	// single linkage cuts it; its colours, drawn at random, fight no
	// grouping. The same points moved into three clusters far apart are
	// seen as three groups again, which the colours then cut across.
	cols := []colour.SRGB{colour.MustHex("#1f8a6a"), colour.MustHex("#c9611a"), colour.MustHex("#6f64a8"), colour.MustHex("#cc3a86")}
	bg := colour.MustHex("#ffffff")
	rng := rand.New(rand.NewSource(7))
	var cloud, clusters []Mark
	for i := 0; i < 300; i++ {
		m := Mark{Kind: "point", Type: colour.Point, Colour: cols[rng.Intn(len(cols))], Size: 30, MinPx: 6, MaxPx: 6, Shape: "circle",
			X: rng.Float64() * 600, Y: rng.Float64() * 400}
		cloud = append(cloud, m)
		m.X, m.Y = float64(i%3)*900+m.X/6, m.Y/6
		clusters = append(clusters, m)
	}
	g := Analyse(Input{Marks: cloud, Background: bg}, DefaultParams).Groups
	for _, p := range g.Partitions {
		assert.NotEqual(t, CueProximity, p.Cue, "a uniform scatter grouped by proximity into %d groups", p.Groups)
	}
	_, ok := relation(g, CueProximity, CueColour)
	assert.False(t, ok, "%+v", g.Agreements)
	g = Analyse(Input{Marks: clusters, Background: bg}, DefaultParams).Groups
	rel, ok := relation(g, CueProximity, CueColour)
	require.True(t, ok, "the three clusters were not seen: %+v", g.Partitions)
	assert.Equal(t, "conflict", rel)
}

func TestOneHighlightedMarkIsNoGrouping(t *testing.T) {
	// Three clusters of grey points, one point in red: the red point is an
	// emphasis, not a second structure beside the clusters, so colour
	// makes no grouping to compare with proximity.
	grey, red := colour.MustHex("#8a8a8a"), colour.MustHex("#c8102e")
	var marks []Mark
	for k := 0; k < 3; k++ {
		for i := 0; i < 9; i++ {
			c := grey
			if k == 1 && i == 4 {
				c = red
			}
			marks = append(marks, Mark{Kind: "point", Type: colour.Point, Colour: c, Size: 50, MinPx: 8, MaxPx: 8, Shape: "circle",
				X: float64(k)*200 + float64(i%3)*12, Y: float64(i/3) * 12})
		}
	}
	g := Analyse(Input{Marks: marks, Background: colour.MustHex("#ffffff")}, DefaultParams).Groups
	for _, p := range g.Partitions {
		assert.NotEqual(t, CueColour, p.Cue, "one red mark made a grouping by colour")
	}
	_, ok := relation(g, CueProximity, CueColour)
	assert.False(t, ok, "%+v", g.Agreements)
}

func TestProximityGroupsJoinWhatTheListsLeftOut(t *testing.T) {
	// Neighbour lists that name each mark's partner only: the pairs are
	// joined at 10 px, and the search of the grid finds what the lists
	// left out, another pair within 1.5 × 10 px (one group), or none (two).
	nb := [][]int{{1}, {0}, {3}, {2}}
	for _, c := range []struct {
		at     float64
		groups int
	}{{20, 1}, {500, 2}} {
		xs := []float64{0, 10, c.at, c.at + 10}
		_, k := proximityGroups(xs, make([]float64, 4), nb, DefaultParams.ProximityRatio, DefaultParams.ProximityGap).labels()
		assert.Equal(t, c.groups, k, "the second pair at %.0f px", c.at)
	}
}
