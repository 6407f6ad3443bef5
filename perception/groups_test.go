package perception

import (
	"fmt"
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
