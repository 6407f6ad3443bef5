package perception

import (
	"math/rand"
	"slices"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/perception/colour"
)

// categoryMarks gives what sorting and deduplicating every merged pair's
// marks gave (dedupe, which adjacentFindings still uses): categories of
// ascending marks, no mark in two, any of them flagged.
func TestCategoryMarksMatchesDedupe(t *testing.T) {
	rng := rand.New(rand.NewSource(9))
	for trial := 0; trial < 500; trial++ {
		k := 1 + rng.Intn(8)
		cols := make([]*category, k)
		for c := range cols {
			cols[c] = &category{}
		}
		for i := 0; i < rng.Intn(200); i++ {
			c := cols[rng.Intn(k)]
			c.marks = append(c.marks, i)
		}
		which := make([]bool, k)
		var pairs []int
		for a := 0; a < k; a++ {
			for b := a + 1; b < k; b++ {
				if rng.Intn(3) == 0 {
					which[a], which[b] = true, true
					pairs = append(pairs, cols[a].marks...)
					pairs = append(pairs, cols[b].marks...)
				}
			}
		}
		want := dedupe(pairs)
		got := categoryMarks(cols, which)
		if len(want) == 0 && len(got) == 0 {
			continue
		}
		if !slices.Equal(got, want) {
			t.Fatalf("trial %d: categoryMarks %v, dedupe %v", trial, got, want)
		}
	}
}

// When marks pop out but too many for one emphasis (more than a third of
// the chart: inferEmphasis), the finding says so, and names them; only a
// chart where no mark pops is told that nothing draws the eye. The two
// used to disagree: "4 marks pop out" beside "Nothing in this chart draws
// the eye".
func TestManyPopOutIsNotNothing(t *testing.T) {
	red, blue := colour.MustHex("#c0392b"), colour.MustHex("#1f4fb4")
	run := func(marks []Mark) ([]string, *Result) {
		r := Analyse(Input{Marks: marks, Background: colour.MustHex("#ffffff")}, DefaultParams)
		return findingIDs(r.Findings), r
	}
	ids, r := run(gridDisplay(10, 3, func(i int, m *Mark) {
		switch {
		case i == 2 || i == 7:
			m.Colour = red
		case i == 4 || i == 9:
			m.Colour = blue
		}
	}))
	var pops []int
	for i := range r.Marks {
		if r.Marks[i][0].Verdict == Pops {
			pops = append(pops, i)
		}
	}
	require.Len(t, pops, 4, "the four coloured marks pop among six grey ones")
	assert.Contains(t, ids, "too-many-pop-out")
	assert.NotContains(t, ids, "no-standout-mark")
	for _, f := range r.Findings {
		if f.ID == "too-many-pop-out" {
			assert.Equal(t, pops, f.Marks)
		}
	}
	ids, _ = run(gridDisplay(10, 3, func(int, *Mark) {}))
	assert.Contains(t, ids, "no-standout-mark")
	assert.NotContains(t, ids, "too-many-pop-out")
}
