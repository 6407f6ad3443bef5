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
		for _, perCell := range []float64{0.5, 2, 4, 50} {
			g := newGrid(x, y, perCell)
			for i := 0; i < n; i++ {
				got := g.knn(i, 8)
				// Nearest first; at equal distances, lowest index first.
				want := []int{}
				for j := range x {
					if j != i {
						want = append(want, j)
					}
				}
				d2 := func(j int) float64 { return (x[j]-x[i])*(x[j]-x[i]) + (y[j]-y[i])*(y[j]-y[i]) }
				sort.SliceStable(want, func(a, b int) bool { return d2(want[a]) < d2(want[b]) })
				if len(want) > 8 {
					want = want[:8]
				}
				assert.Equal(t, want, got, "n=%d i=%d perCell=%v", n, i, perCell)
			}
		}
		g := newGrid(x, y, 2)
		for i := 0; i < n; i++ {
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

func TestKNNTiesOnALattice(t *testing.T) {
	// A lattice (a heatmap's cells) has many neighbours at equal
	// distances: which of them are the k nearest must not depend on the
	// grid's cell size.
	var x, y []float64
	for r := 0; r < 20; r++ {
		for c := 0; c < 20; c++ {
			x, y = append(x, float64(c)*10), append(y, float64(r)*10)
		}
	}
	ref := newGrid(x, y, 1)
	for _, perCell := range []float64{0.3, 3, 40} {
		g := newGrid(x, y, perCell)
		for i := range x {
			for _, k := range []int{3, 6, 8} {
				assert.Equal(t, ref.knn(i, k), g.knn(i, k), "i=%d k=%d perCell=%v", i, k, perCell)
			}
		}
	}
}
