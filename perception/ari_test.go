package perception

import (
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
		assert.InDelta(t, c.want, AdjustedRandIndex(c.a, c.b), 1e-12, "%v %v", c.a, c.b)
	}
}
