package perception

import (
	"fmt"
	"math"
	"math/rand"
	"sort"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/perception/colour"
)

// A set of marks in a distinct colour segregates from the rest at a
// glance: colour-defined regions are seen before search (Julesz 1981;
// Treisman 1982), and a coloured group's share is estimated at a glance
// over a wide range of shares (Healey, Booth & Enns 1996). All three from
// memory (REFERENCES §11). So highlighting a set (the 11 or 20 districts
// that missed a target) works: every member pops and the emphasis holds.
// Halves do not: with no "rest" to stand out from, nothing is the
// emphasis.
func TestGroupsStandOut(t *testing.T) {
	red := colour.MustHex("#c2441f")
	display := func(n, k int) []Mark {
		return gridDisplay(n, 13, func(i int, m *Mark) {
			if i%(n/k) == 0 && i/(n/k) < k {
				m.Colour = red
			}
		})
	}
	for _, share := range []int{11, 20} {
		t.Run(fmt.Sprintf("%d of 100", share), func(t *testing.T) {
			marks := display(100, share)
			var group []int
			for i, m := range marks {
				if m.Colour == red {
					group = append(group, i)
				}
			}
			require.Len(t, group, share)
			res := Analyse(Input{Marks: marks, Background: colour.MustHex("#ffffff")}, DefaultParams)
			for _, i := range group {
				assert.Equal(t, Pops, res.Marks[i][0].Verdict, "mark %d", i)
			}
			assert.Equal(t, group, res.Emphasis, "the red set is the inferred emphasis")
			assert.True(t, res.Holds[0])
			assert.NotContains(t, findingIDs(res.Findings), "emphasis-lost")
			declared := Analyse(Input{Marks: marks, Background: colour.MustHex("#ffffff"), Emphasis: group}, DefaultParams)
			assert.True(t, declared.Holds[0], "declared as the emphasis, it holds")
			assert.NotContains(t, findingIDs(declared.Findings), "emphasis-lost")
		})
	}
	t.Run("50 of 100", func(t *testing.T) {
		res := Analyse(Input{Marks: display(100, 50), Background: colour.MustHex("#ffffff")}, DefaultParams)
		for i := range res.Marks {
			assert.NotEqual(t, Pops, res.Marks[i][0].Verdict, "mark %d", i)
		}
		assert.Empty(t, res.Emphasis)
	})
}

// Categories are not highlights: in a grouped bar chart of three colours
// with three bars each, every colour group is as large as the largest,
// so none is the "rest" another stands out from. Each group faces
// distractors as unlike one another as they are unlike it (Duncan &
// Humphreys 1989: search is hard when distractor heterogeneity rivals
// target–distractor difference); the model's rule is that a highlight is
// smaller than the display's largest group (provisional).
func TestEqualCategoriesDoNotPop(t *testing.T) {
	cols := []colour.SRGB{colour.MustHex("#2f5d8a"), colour.MustHex("#d9622b"), colour.MustHex("#e8a33d")}
	marks := gridDisplay(9, 29, func(i int, m *Mark) { m.Colour = cols[i%3] })
	res := Analyse(Input{Marks: marks, Background: colour.MustHex("#ffffff")}, DefaultParams)
	for i := range res.Marks {
		assert.NotEqual(t, Pops, res.Marks[i][0].Verdict, "mark %d", i)
	}
	assert.Empty(t, res.Emphasis)
	// A single dark bar among four and four of two other colours is a
	// feature singleton, smaller than the largest group, and pops
	// (Treisman & Gelade 1980).
	marks = gridDisplay(9, 29, func(i int, m *Mark) {
		m.Colour = cols[1+i%2]
		if i == 4 {
			m.Colour = cols[0]
		}
	})
	res = Analyse(Input{Marks: marks, Background: colour.MustHex("#ffffff")}, DefaultParams)
	assert.Equal(t, Pops, res.Marks[4][0].Verdict)
}

// Groups defined by orientation or size segregate from a uniform surround
// too: a region of tilted lines among vertical ones is seen at a glance
// (texture segregation: Julesz 1981; Nothdurft 1991; both from memory),
// so a highlighted set of 11 or 20 in 100, tilted 45° or drawn at four
// times the area, pops whole; halves still do not.
func TestGroupsInOtherChannels(t *testing.T) {
	channels := map[string]func(m *Mark){
		"orientation": func(m *Mark) { m.Angle = 45 },
		"size":        func(m *Mark) { m.Size, m.MinPx, m.MaxPx = 78.5*4, 20, 20 },
	}
	base := func(m *Mark) {
		m.Kind, m.Type, m.Shape = "point", colour.Point, "bar"
		m.Fold, m.Angle = 2, 90
	}
	for name, set := range channels {
		for _, share := range []int{11, 20, 50} {
			t.Run(fmt.Sprintf("%s %d of 100", name, share), func(t *testing.T) {
				var group []int
				marks := gridDisplay(100, 31, func(i int, m *Mark) {
					base(m)
					if i%(100/share) == 0 && i/(100/share) < share {
						set(m)
						group = append(group, i)
					}
				})
				require.Len(t, group, share)
				res := Analyse(Input{Marks: marks, Background: colour.MustHex("#ffffff")}, DefaultParams)
				if share == 50 {
					assert.Empty(t, res.Emphasis, "halves: no rest to stand out from")
					return
				}
				for _, i := range group {
					assert.Equal(t, Pops, res.Marks[i][0].Verdict, "mark %d", i)
				}
				assert.Equal(t, group, res.Emphasis)
			})
		}
	}
}

// linearRestSpread reads the rest's spread from the sorted values without
// copying them: it must equal spread1 over the rest built explicitly.
func TestLinearRestSpreadMatchesSpread1(t *testing.T) {
	rng := rand.New(rand.NewSource(5))
	for trial := 0; trial < 200; trial++ {
		n := 2 + rng.Intn(60)
		vals := make([]float64, n)
		for i := range vals {
			vals[i] = math.Round(rng.NormFloat64()*3*4) / 4
		}
		sorted := append([]float64(nil), vals...)
		sort.Float64s(sorted)
		v := vals[rng.Intn(n)]
		var rest []float64
		for _, x := range vals {
			if x < v-1+1e-9 || x > v+1-1e-9 {
				rest = append(rest, x)
			}
		}
		want := -1.0
		if len(rest) > 0 {
			want = spread1(rest, 0)
			if len(rest) == 1 {
				want = 0
			}
		}
		require.Equal(t, want, linearRestSpread(sorted, v), "trial %d", trial)
	}
}
