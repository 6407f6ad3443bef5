package perception

import (
	"math/rand"
	"slices"
	"testing"
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
