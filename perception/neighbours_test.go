package perception

import (
	"math"
	"math/rand"
	"sort"
	"testing"

	"github.com/stretchr/testify/assert"
)

func TestKNNAgainstBruteForce(t *testing.T) {
	// A slow, obviously correct reference: sort all distances.
	rng := rand.New(rand.NewSource(8))
	for _, n := range []int{1, 2, 5, 50, 500} {
		x, y := make([]float64, n), make([]float64, n)
		for i := range x {
			x[i], y[i] = rng.Float64()*300, rng.Float64()*80
			if i%7 == 0 && i > 0 {
				x[i], y[i] = x[i-1], y[i-1] // duplicates
			}
		}
		g := newGrid(x, y)
		for i := 0; i < n; i++ {
			got := g.knn(i, 8)
			var want []float64
			for j := range x {
				if j != i {
					want = append(want, math.Hypot(x[j]-x[i], y[j]-y[i]))
				}
			}
			sort.Float64s(want)
			if len(want) > 8 {
				want = want[:8]
			}
			var gd []float64
			for _, j := range got {
				gd = append(gd, math.Hypot(x[j]-x[i], y[j]-y[i]))
			}
			assert.InDeltaSlice(t, want, gd, 1e-9, "n=%d i=%d", n, i)
			// within agrees with a scan.
			r := 20.0
			cnt := 0
			for j := range x {
				if math.Hypot(x[j]-x[i], y[j]-y[i]) <= r {
					cnt++
				}
			}
			assert.Len(t, g.within(x[i], y[i], r), cnt)
		}
	}
}
