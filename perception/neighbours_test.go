package perception

import (
	"math"
	"math/rand"
	"slices"
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

// upperMedian picks what sorting with the standard library picks, on
// random values with many ties, NaNs and infinities, and on the orders
// that defeat naive pivots (sorted, reversed, organ pipe, all equal).
func TestUpperMedianMatchesSort(t *testing.T) {
	rng := rand.New(rand.NewSource(7))
	pools := [][]float64{{0, 1, 2}, {math.NaN(), math.Inf(-1), math.Inf(1), 0, math.Copysign(0, -1), 3}, nil}
	for trial := 0; trial < 4000; trial++ {
		n := 1 + rng.Intn(300)
		v := make([]float64, n)
		pool := pools[trial%len(pools)]
		for i := range v {
			switch {
			case trial%7 == 1:
				v[i] = float64(i)
			case trial%7 == 2:
				v[i] = float64(n - i)
			case trial%7 == 3:
				v[i] = float64(min(i, n-i))
			case trial%7 == 4:
				v[i] = 5
			case pool != nil:
				v[i] = pool[rng.Intn(len(pool))]
			default:
				v[i] = rng.NormFloat64()
			}
		}
		want := slices.Clone(v)
		slices.Sort(want)
		got, w := upperMedian(slices.Clone(v)), want[n/2]
		// 0 and -0 are equal to both, so either may stand there.
		if got != w && !(math.IsNaN(got) && math.IsNaN(w)) {
			t.Fatalf("trial %d: upperMedian(%v) = %v, slices.Sort gives %v", trial, v, got, w)
		}
	}
}

// A neighbour search of many points is kept for the next one on the same
// points given the same Kept: the lists are those a new search finds, for
// the same points and after a point has moved, and the same points ask
// for no search again; without a Kept every call searches.
func TestNeighboursKeptForTheSamePoints(t *testing.T) {
	rng := rand.New(rand.NewSource(9))
	n := keepNeighboursFrom + 200
	xs, ys := make([]float64, n), make([]float64, n)
	for i := range xs {
		xs[i], ys[i] = rng.Float64()*600, rng.Float64()*400
	}
	moved := slices.Clone(xs)
	moved[7] += 40
	kept := &Kept{}
	first := neighboursXY(slices.Clone(xs), slices.Clone(ys), 8, kept)
	assert.Equal(t, searchNeighbours(xs, ys, 8), first)
	again := neighboursXY(slices.Clone(xs), slices.Clone(ys), 8, kept)
	assert.Same(t, &first[0][0], &again[0][0], "the same points were searched again")
	assert.NotSame(t, &first[0][0], &neighboursXY(xs, ys, 8, nil)[0][0], "kept without a Kept")
	assert.NotSame(t, &first[0][0], &neighboursXY(xs, ys, 8, &Kept{})[0][0], "kept in another Kept")
	assert.Equal(t, searchNeighbours(xs, ys, 5), neighboursXY(xs, ys, 5, kept), "another k")
	assert.Equal(t, searchNeighbours(moved, ys, 5), neighboursXY(moved, ys, 5, kept))
	// The kept coordinates are a copy: a caller that changes its own
	// afterwards does not change what is kept.
	mine := slices.Clone(xs)
	neighboursXY(mine, ys, 8, kept)
	mine[3] += 25
	assert.Equal(t, searchNeighbours(mine, ys, 8), neighboursXY(mine, ys, 8, kept))
}

// A Kept holds the keptSearches most recently used searches: a chart's
// two searches (its points, and the grouping's marks when they are not
// one kind's) and a page's several charts alternate without searching
// again, and a further search drops the one least recently used.
func TestNeighboursKeptForAFewPointSets(t *testing.T) {
	rng := rand.New(rand.NewSource(11))
	sets := make([][2][]float64, keptSearches+1)
	for s := range sets {
		n := keepNeighboursFrom + 10*s
		sets[s] = [2][]float64{make([]float64, n), make([]float64, n)}
		for i := 0; i < n; i++ {
			sets[s][0][i], sets[s][1][i] = rng.Float64()*600, rng.Float64()*400
		}
	}
	kept := &Kept{}
	search := func(s int) [][]int { return neighboursXY(slices.Clone(sets[s][0]), slices.Clone(sets[s][1]), 6, kept) }
	a, b := search(0), search(1)
	assert.Same(t, &a[0][0], &search(0)[0][0], "the first set was searched again after a second")
	assert.Same(t, &b[0][0], &search(1)[0][0], "the second set was searched again after the first")
	assert.Equal(t, len(sets[1][0]), kept.Points(), "the most recently used")
	// Now 1, 0 by use; three more sets fill the Kept and drop set 0.
	for s := 2; s <= keptSearches; s++ {
		search(s)
	}
	again := search(0)
	assert.NotSame(t, &a[0][0], &again[0][0], "the least recently used search was kept")
	assert.Equal(t, searchNeighbours(sets[0][0], sets[0][1], 6), again)
	assert.Len(t, kept.searches, keptSearches)
}
