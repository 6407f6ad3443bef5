package perception

import (
	"fmt"
	"math"
	"math/rand"
	"slices"
	"sort"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// bruteNearest is the slow, obviously correct reference for the
// k-nearest searches: all other points sorted by distance, stably, so
// that equal distances keep the lowest index first.
func bruteNearest(x, y []float64, i, k int) []int {
	want := []int{}
	for j := range x {
		if j != i {
			want = append(want, j)
		}
	}
	d2 := func(j int) float64 { return (x[j]-x[i])*(x[j]-x[i]) + (y[j]-y[i])*(y[j]-y[i]) }
	sort.SliceStable(want, func(a, b int) bool { return d2(want[a]) < d2(want[b]) })
	return want[:min(k, len(want))]
}

// nearestSearchers are the indexes the analysis may search: the grid at
// several cell sizes, and the k-d tree.
func nearestSearchers(x, y []float64) map[string]func(i, k int) []int {
	out := map[string]func(i, k int) []int{}
	for _, perCell := range []float64{0.5, 2, 4, 50} {
		g := newGrid(x, y, perCell)
		out[fmt.Sprintf("grid %v a cell", perCell)] = g.knn
	}
	tr := newKDTree(x, y)
	out["tree"] = func(i, k int) []int { return tr.knnInto(i, k, make([]int, 0, k), make([]float64, 0, k)) }
	return out
}

// pointLayouts are layouts of n points that stress a spatial index:
// spread with duplicates, packed into a few pixels beside far outliers,
// all at one place, on one line, and on a lattice (equal distances).
func pointLayouts(rng *rand.Rand, n int) map[string][2][]float64 {
	out := map[string][2][]float64{}
	add := func(name string, f func(i int) (float64, float64)) {
		x, y := make([]float64, n), make([]float64, n)
		for i := range x {
			x[i], y[i] = f(i)
		}
		out[name] = [2][]float64{x, y}
	}
	var px, py float64
	add("spread", func(i int) (float64, float64) {
		if i%7 != 0 || i == 0 {
			px, py = rng.Float64()*300, rng.Float64()*80
		}
		return px, py // every seventh a duplicate
	})
	add("crowded", func(i int) (float64, float64) {
		if i < 2 {
			return float64(1-2*i) * 1e4, float64(1-2*i) * 1e4
		}
		return rng.Float64() * 3, rng.Float64() * 3
	})
	add("one place", func(int) (float64, float64) { return 7, 7 })
	add("one line", func(i int) (float64, float64) { return float64(i % 37), 0 })
	add("lattice", func(i int) (float64, float64) { return float64(i % 9), float64(i / 9) })
	return out
}

func TestKNNAgainstBruteForce(t *testing.T) {
	rng := rand.New(rand.NewSource(8))
	for _, n := range []int{1, 2, 5, 50, 500} {
		for layout, pts := range pointLayouts(rng, n) {
			x, y := pts[0], pts[1]
			searchers := nearestSearchers(x, y)
			for i := 0; i < n; i++ {
				want := bruteNearest(x, y, i, 8)
				for name, knn := range searchers {
					require.Equal(t, want, knn(i, 8), "%s, n=%d i=%d, %s", layout, n, i, name)
				}
			}
		}
	}
}

// connectedGroups joins the points within the tolerance of each line,
// as a scan of every point against every segment does: for lines across
// each layout, back and forth over it, and through a few of its points.
func TestConnectedGroupsAgainstAScan(t *testing.T) {
	rng := rand.New(rand.NewSource(13))
	for _, n := range []int{3, 40, 400} {
		for layout, pts := range pointLayouts(rng, n) {
			x, y := pts[0], pts[1]
			minX, maxX := slices.Min(x), slices.Max(x)
			midY := (slices.Min(y) + slices.Max(y)) / 2
			back := &Mark{MinPx: 2}
			for s := 0; s < 50; s++ {
				back.Vertices = append(back.Vertices, [2]float64{[2]float64{minX, maxX}[s%2], midY + float64(s%3)})
			}
			through := &Mark{MinPx: 1}
			for s := 0; s < 5; s++ {
				j := rng.Intn(n)
				through.Vertices = append(through.Vertices, [2]float64{x[j] + 0.3, y[j]})
			}
			lines := []*Mark{back, through}
			const tol = 0.5
			want := newUF(n)
			for _, l := range lines {
				first := -1
				for k := range x {
					for s := 0; s+1 < len(l.Vertices); s++ {
						if segDist(x[k], y[k], l.Vertices[s], l.Vertices[s+1]) <= l.MinPx/2+tol {
							if first < 0 {
								first = k
							} else {
								want.union(first, k)
							}
							break
						}
					}
				}
			}
			wantLabels, wantGroups := want.labels()
			gotLabels, gotGroups := connectedGroups(lines, x, y, tol).labels()
			require.Equal(t, wantGroups, gotGroups, "%s, n=%d", layout, n)
			require.Equal(t, wantLabels, gotLabels, "%s, n=%d", layout, n)
		}
	}
}

// orderBy orders as a stable sort by value does (the standard
// library's, with -0 before 0 as orderBy documents), on values of both
// signs, many magnitudes and many ties.
func TestOrderByMatchesAStableSort(t *testing.T) {
	rng := rand.New(rand.NewSource(14))
	pool := []float64{0, math.Copysign(0, -1), 1, -1, 1e-300, -1e300, math.MaxFloat64, -math.SmallestNonzeroFloat64, math.Inf(1), math.Inf(-1)}
	for trial := 0; trial < 300; trial++ {
		v := make([]float64, rng.Intn(400))
		for i := range v {
			switch trial % 3 {
			case 0:
				v[i] = pool[rng.Intn(len(pool))]
			case 1:
				v[i] = float64(rng.Intn(20) - 10)
			default:
				v[i] = rng.NormFloat64() * math.Pow(10, float64(rng.Intn(40)-20))
			}
		}
		want := make([]int32, len(v))
		for i := range want {
			want[i] = int32(i)
		}
		sort.SliceStable(want, func(a, b int) bool {
			va, vb := v[want[a]], v[want[b]]
			return va < vb || va == vb && math.Signbit(va) && !math.Signbit(vb)
		})
		require.Equal(t, want, orderBy(v), "trial %d: %v", trial, v)
	}
}

// The index turns to the tree where the points crowd the grid's cells,
// and keeps the grid where they spread: a search then scans about what
// kdCrowd allows.
func TestIndexTurnsToTheTreeWhereThePointsCrowd(t *testing.T) {
	rng := rand.New(rand.NewSource(12))
	layouts := pointLayouts(rng, 2000)
	for layout, tree := range map[string]bool{"spread": false, "lattice": false, "crowded": true, "one place": true} {
		pts := layouts[layout]
		ix := newIndex(pts[0], pts[1], 4)
		assert.Equal(t, tree, ix.tree != nil, "%s: %.0f points scanned a search", layout, ix.scanned()/2000)
	}
}

// A search of points packed into 3 px beside two points 20,000 px away
// scans the crowd through the grid, and a few leaves through the tree.
func BenchmarkNeighboursCrowded(b *testing.B) {
	layout := pointLayouts(rand.New(rand.NewSource(4)), 20000)["crowded"]
	x, y := layout[0], layout[1]
	b.Run("grid", func(b *testing.B) {
		js, ds := make([]int, 0, 8), make([]float64, 0, 8)
		for b.Loop() {
			g := newGrid(x, y, 4)
			for i := range x {
				g.knnInto(i, 8, js, ds)
			}
		}
	})
	b.Run("index", func(b *testing.B) {
		for b.Loop() {
			searchNeighbours(x, y, 8)
		}
	})
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
