package perception

import (
	"fmt"
	"math/rand"
	"testing"

	"github.com/stretchr/testify/assert"
)

func TestAdjustedRandIndexPublished(t *testing.T) {
	// The worked examples of scikit-learn's adjusted_rand_score docstring
	// (REFERENCES §7.1, each re-derived by hand there).
	for _, c := range []struct {
		a, b []int
		want float64
	}{
		{[]int{0, 0, 1, 1}, []int{0, 0, 1, 1}, 1},
		{[]int{0, 0, 1, 1}, []int{1, 1, 0, 0}, 1},
		{[]int{0, 0, 1, 2}, []int{0, 0, 1, 1}, 4.0 / 7},
		{[]int{0, 0, 1, 1}, []int{0, 0, 1, 2}, 4.0 / 7},
		{[]int{0, 0, 0, 0}, []int{0, 1, 2, 3}, 0},
		{[]int{0, 0, 1, 1}, []int{0, 1, 0, 1}, -0.5},
	} {
		t.Run(fmt.Sprint(c.a, c.b), func(t *testing.T) {
			assert.InDelta(t, c.want, AdjustedRandIndex(c.a, c.b), 1e-12, "%v %v", c.a, c.b)
		})
	}
}

func TestAdjustedRandIndexAgainstPairCounting(t *testing.T) {
	// A slow, obviously correct reference: count the pairs of items that
	// each partition puts together (Hubert & Arabie 1985's pair-counting
	// form), on partitions with few and with very many groups, so that
	// both the flat contingency table and the sorted one are used.
	rng := rand.New(rand.NewSource(3))
	for _, c := range []struct{ n, ka, kb int }{{40, 3, 4}, {300, 7, 290}, {500, 400, 450}, {200, 1, 200}} {
		t.Run(fmt.Sprint(c.n, c.ka, c.kb), func(t *testing.T) {
			a, b := make([]int, c.n), make([]int, c.n)
			for i := range a {
				a[i], b[i] = rng.Intn(c.ka), rng.Intn(c.kb)
			}
			var sij, sa, sb float64
			for i := 0; i < c.n; i++ {
				for j := i + 1; j < c.n; j++ {
					ea, eb := a[i] == a[j], b[i] == b[j]
					if ea {
						sa++
					}
					if eb {
						sb++
					}
					if ea && eb {
						sij++
					}
				}
			}
			pairs := float64(c.n*(c.n-1)) / 2
			e := sa * sb / pairs
			want := 1.0
			if den := (sa+sb)/2 - e; den != 0 {
				want = (sij - e) / den
			}
			assert.InDelta(t, want, AdjustedRandIndex(a, b), 1e-12, "%+v", c)
		})
	}
}
