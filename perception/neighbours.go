package perception

import (
	"cmp"
	"math"
	"math/bits"
	"slices"
)

// pointIndex is the analysis's spatial index of points: the grid, or,
// where the points crowd a few of its cells (a dense cluster beside far
// outliers, a crafted page), a k-d tree. Both give the same answers; the
// grid is the faster where the points spread, the tree where they crowd.
type pointIndex struct {
	*grid
	tree *kdTree // nil: the grid answers
}

// newIndex indexes the points (x[i], y[i]) with a grid of about perCell
// points a cell, and a tree as well when a search of the grid would scan
// more than kdCrowd points a query on average.
func newIndex(x, y []float64, perCell float64) pointIndex {
	g := newGrid(x, y, perCell)
	ix := pointIndex{grid: g}
	if g.scanned() > kdCrowd*float64(len(x)) {
		ix.tree = newKDTree(x, y)
	}
	return ix
}

// kdCrowd is the mean number of points a grid search may scan before
// the tree answers instead. Measured here, searching 1,000 to 20,000
// points for their 8 nearest: a search of the tree costs about what a
// search of the grid scanning 150–250 points does. Points spread evenly,
// or along a line, scan 35–50; a Gaussian blob 120–180; a dense blob
// over an even scatter 250–700; a crafted crowd (BenchmarkNeighboursCrowded)
// thousands.
const kdCrowd = 192

func (ix pointIndex) knnInto(i, k int, js []int, ds []float64) []int {
	if ix.tree != nil {
		return ix.tree.knnInto(i, k, js, ds)
	}
	return ix.grid.knnInto(i, k, js, ds)
}

func (ix pointIndex) near(x, y, r float64, f func(j int)) {
	if ix.tree != nil {
		ix.tree.near(x, y, r, f)
		return
	}
	ix.grid.near(x, y, r, f)
}

func (ix pointIndex) mixedWithin(r float64, groupOf func(int) int) []int {
	if ix.tree != nil {
		return ix.tree.mixedWithin(r, groupOf)
	}
	return ix.grid.mixedWithin(r, groupOf)
}

// grid is a uniform spatial index of points (a dense bucket grid in
// compressed rows) for neighbour queries in O(1) expected time per point.
type grid struct {
	cell   float64
	x0, y0 float64
	nx, ny int
	start  []int32 // start[c] .. start[c+1] index items of cell c
	items  []int32
	x, y   []float64
}

// newGrid indexes the points (x[i], y[i]) with cells that hold about
// perCell points on average.
func newGrid(x, y []float64, perCell float64) *grid {
	n := len(x)
	g := &grid{x: x, y: y, cell: 1, nx: 1, ny: 1}
	if n == 0 {
		g.start = []int32{0, 0}
		return g
	}
	minX, minY, maxX, maxY := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
	for i := range x {
		minX, maxX = min(minX, x[i]), max(maxX, x[i])
		minY, maxY = min(minY, y[i]), max(maxY, y[i])
	}
	w, h := max(maxX-minX, 1e-6), max(maxY-minY, 1e-6)
	// About perCell points per cell on average, and at most 4n cells.
	g.cell = max(math.Sqrt(perCell*w*h/float64(n)), 1e-6)
	for float64(int(w/g.cell)+1)*float64(int(h/g.cell)+1) > float64(4*n+16) {
		g.cell *= 2
	}
	g.x0, g.y0 = minX, minY
	g.nx, g.ny = int(w/g.cell)+1, int(h/g.cell)+1
	counts := make([]int32, g.nx*g.ny+1)
	cellOf := make([]int32, n)
	for i := range x {
		c := g.cellIndex(g.cx(x[i]), g.cy(y[i]))
		cellOf[i] = int32(c)
		counts[c+1]++
	}
	for c := 1; c < len(counts); c++ {
		counts[c] += counts[c-1]
	}
	g.start = counts
	g.items = make([]int32, n)
	fill := make([]int32, g.nx*g.ny)
	for i := range x {
		c := cellOf[i]
		g.items[g.start[c]+fill[c]] = int32(i)
		fill[c]++
	}
	return g
}

func (g *grid) cx(x float64) int {
	c := int(math.Floor((x - g.x0) / g.cell))
	return min(max(c, 0), g.nx-1)
}

func (g *grid) cy(y float64) int {
	c := int(math.Floor((y - g.y0) / g.cell))
	return min(max(c, 0), g.ny-1)
}

func (g *grid) cellIndex(cx, cy int) int { return cy*g.nx + cx }

// knn returns up to k nearest other points of point i, nearest first and,
// at equal distances, lowest index first. It searches rings of cells
// outwards and stops once the ring's inner radius exceeds the k-th
// distance found.
func (g *grid) knn(i, k int) []int {
	return g.knnInto(i, k, make([]int, 0, k), make([]float64, 0, k))
}

// knnInto is knn writing into caller-supplied buffers (length 0,
// capacity ≥ k), which it returns filled. It compares squared distances:
// the hot loop of the analysis on large charts.
func (g *grid) knnInto(i, k int, js []int, ds []float64) []int {
	if k <= 0 {
		return nil
	}
	px, py := g.x[i], g.y[i]
	cx, cy := g.cx(px), g.cy(py)
	maxR := max(g.nx, g.ny)
	for r := 0; r <= maxR; r++ {
		for dy := -r; dy <= r; dy++ {
			yy := cy + dy
			if yy < 0 || yy >= g.ny {
				continue
			}
			step := 2 * r
			if dy == -r || dy == r || r == 0 {
				step = 1
			}
			for dx := -r; dx <= r; dx += step {
				xx := cx + dx
				if xx < 0 || xx >= g.nx {
					continue
				}
				c := yy*g.nx + xx
				for _, j32 := range g.items[g.start[c]:g.start[c+1]] {
					j := int(j32)
					if j == i {
						continue
					}
					ex, ey := g.x[j]-px, g.y[j]-py
					d := ex*ex + ey*ey
					if len(js) == k && (d > ds[k-1] || d == ds[k-1] && j > js[k-1]) {
						continue // not among the k nearest (insertNearest)
					}
					js, ds = insertNearest(js, ds, k, j, d)
				}
			}
		}
		if len(js) == k {
			// Cells beyond ring r lie at least r cells from the point.
			if reach := float64(r) * g.cell; ds[k-1] < reach*reach {
				break
			}
		}
	}
	return js
}

// scanned is how many points the searches of all points scan in their
// cell and the eight around it: the sum over cells of the cell's points
// times those of its 3 × 3 block, about 9n times the points a cell for
// points spread evenly, and up to n² for points crowded into one cell.
func (g *grid) scanned() float64 {
	var s float64
	for cy := 0; cy < g.ny; cy++ {
		for cx := 0; cx < g.nx; cx++ {
			c := g.cellIndex(cx, cy)
			m := g.start[c+1] - g.start[c]
			if m == 0 {
				continue
			}
			var block int32
			for yy := max(cy-1, 0); yy <= min(cy+1, g.ny-1); yy++ {
				c0 := g.cellIndex(max(cx-1, 0), yy)
				c1 := g.cellIndex(min(cx+1, g.nx-1), yy)
				block += g.start[c1+1] - g.start[c0]
			}
			s += float64(m) * float64(block)
		}
	}
	return s
}

// near calls f with every point of the cells that a disc of radius r
// about (x, y) reaches: the points within r and some beyond, which f
// tells apart as it needs.
func (g *grid) near(x, y, r float64, f func(j int)) {
	x0, x1 := g.cx(x-r), g.cx(x+r)
	y0, y1 := g.cy(y-r), g.cy(y+r)
	for yy := y0; yy <= y1; yy++ {
		for xx := x0; xx <= x1; xx++ {
			c := g.cellIndex(xx, yy)
			for _, j := range g.items[g.start[c]:g.start[c+1]] {
				f(int(j))
			}
		}
	}
}

// mixedWithin lists the points that may have a point of another group
// (as groupOf says) within radius r: those of the cells with another
// group's point in a cell within r's reach. The points of a cell whose
// reach holds its own group alone are left out, so that a search over
// groups far apart looks at their edges only.
func (g *grid) mixedWithin(r float64, groupOf func(int) int) []int {
	label := make([]int, g.nx*g.ny)
	for c := range label {
		label[c] = cellEmpty
		for _, j := range g.items[g.start[c]:g.start[c+1]] {
			if l := groupOf(int(j)); label[c] == cellEmpty {
				label[c] = l
			} else if label[c] != l {
				label[c] = cellMixed
				break
			}
		}
	}
	reach := int(math.Ceil(r / g.cell))
	var out []int
	for cy := 0; cy < g.ny; cy++ {
		for cx := 0; cx < g.nx; cx++ {
			c := g.cellIndex(cx, cy)
			if label[c] == cellEmpty || !g.othersNear(label, c, cx, cy, reach) {
				continue
			}
			for _, j := range g.items[g.start[c]:g.start[c+1]] {
				out = append(out, int(j))
			}
		}
	}
	return out
}

// A cell's label in mixedWithin: its points' group, or one of these.
const cellEmpty, cellMixed = -1, -2

// othersNear says whether a cell within reach cells of cell c (at cx,
// cy) holds a group other than c's, or c holds several.
func (g *grid) othersNear(label []int, c, cx, cy, reach int) bool {
	if label[c] == cellMixed {
		return true
	}
	for yy := max(cy-reach, 0); yy <= min(cy+reach, g.ny-1); yy++ {
		for xx := max(cx-reach, 0); xx <= min(cx+reach, g.nx-1); xx++ {
			if l := label[g.cellIndex(xx, yy)]; l != cellEmpty && l != label[c] {
				return true
			}
		}
	}
	return false
}

// upperMedian is the element at position len(v)/2 of v in ascending order
// (slices.Sort's order: NaN first), found by selection in expected linear
// time rather than by a sort; it reorders v, which must not be empty.
// Middle-of-three pivots, and a sort once the selection has taken too
// many rounds, keep crafted input from making it quadratic.
func upperMedian(v []float64) float64 {
	want := len(v) / 2
	lo, hi := 0, len(v)-1
	for rounds := 2 * bits.Len(uint(len(v))); lo < hi; rounds-- {
		if rounds == 0 {
			slices.Sort(v[lo : hi+1])
			break
		}
		mid := lo + (hi-lo)/2
		// Order v[lo], v[mid], v[hi]: the middle one is the pivot, and the
		// outer two stop the scans below.
		if cmp.Less(v[mid], v[lo]) {
			v[mid], v[lo] = v[lo], v[mid]
		}
		if cmp.Less(v[hi], v[lo]) {
			v[hi], v[lo] = v[lo], v[hi]
		}
		if cmp.Less(v[hi], v[mid]) {
			v[hi], v[mid] = v[mid], v[hi]
		}
		pivot := v[mid]
		i, j := lo, hi
		for i <= j {
			for cmp.Less(v[i], pivot) {
				i++
			}
			for cmp.Less(pivot, v[j]) {
				j--
			}
			if i <= j {
				v[i], v[j] = v[j], v[i]
				i++
				j--
			}
		}
		// Now v[lo..j] ≤ pivot ≤ v[i..hi], and v[j+1..i-1] equal it.
		switch {
		case want <= j:
			hi = j
		case want >= i:
			lo = i
		default:
			return v[want]
		}
	}
	return v[want]
}
