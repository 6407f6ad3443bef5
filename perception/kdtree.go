package perception

import "math"

// kdTree is a k-d tree of points (Bentley 1975, "Multidimensional binary
// search trees used for associative searching", CACM 18(9)) with the
// nearest-neighbour search of Friedman, Bentley & Finkel (1977, ACM TOMS
// 3(3)): nearer subtree first, a subtree left out once its box lies
// beyond the k-th distance found. Unlike the grid, whose cells are sized
// from the bounding box, it adapts to how the points crowd, so that
// points packed into a few pixels beside a few far ones cost a search
// O(log n) rather than a scan of the crowd.
//
// Each node splits its points at the median of its box's longer side, in
// the order (coordinate, index): equal coordinates split by index, so
// every split halves its points however many share a coordinate (all of
// them, on a crafted page). A node's points lie contiguous in order,
// sorted by x.
type kdTree struct {
	nodes  []kdNode
	order  []int32   // point indices, node by node
	px, py []float64 // the coordinates of order's points
	x, y   []float64 // the coordinates by point index
}

// kdNode is a node of kdTree: its points are order[lo:hi], within the
// box [minX, maxX] × [minY, maxY]; minIdx is the lowest index among
// them, which bounds the search's ties. A leaf has left < 0.
type kdNode struct {
	minX, minY, maxX, maxY float64
	lo, hi                 int32
	left, right            int32
	minIdx                 int32
}

// kdLeaf is the most points a leaf holds. The search's time hardly
// depends on it: 20,000 points searched for their 8 nearest took about
// the same, within this machine's noise, with leaves of 4 to 32.
const kdLeaf = 8

// newKDTree builds the tree of the points (x[i], y[i]) in O(n log n): the
// points sorted once by x and once by y (in linear time), and each split
// partitioning the other order stably.
func newKDTree(x, y []float64) *kdTree {
	n := len(x)
	t := &kdTree{x: x, y: y}
	if n == 0 {
		return t
	}
	bx, by := orderBy(x), orderBy(y)
	t.nodes = make([]kdNode, 0, 2*n/kdLeaf+1)
	b := kdBuild{t: t, bx: bx, by: by, left: make([]bool, n), tmp: make([]int32, n)}
	b.build(0, int32(n))
	t.order = bx
	t.px, t.py = make([]float64, n), make([]float64, n)
	for p, i := range bx {
		t.px[p], t.py[p] = x[i], y[i]
	}
	return t
}

// orderBy lists the indices of v in the order (v[i], i), -0 before 0:
// a stable radix sort of the values' bits, with the sign bit turned so
// that the bits order as the numbers do (the analysis's coordinates are
// finite; a NaN would sort beyond the infinity of its sign). Unlike
// slices.SortFunc, it adds no copy of a generic sort to the module.
func orderBy(v []float64) []int32 {
	n := len(v)
	keys, idx := make([]uint64, n), make([]int32, n)
	for i, f := range v {
		b := math.Float64bits(f)
		if b>>63 == 1 {
			b = ^b
		} else {
			b |= 1 << 63
		}
		keys[i], idx[i] = b, int32(i)
	}
	_, idx = radixSort(keys, idx, 0)
	return idx
}

// kdBuild holds newKDTree's working orders: bx[lo:hi] and by[lo:hi] are
// the same node's points, sorted by x and by y.
type kdBuild struct {
	t      *kdTree
	bx, by []int32
	left   []bool
	tmp    []int32
}

func (b *kdBuild) build(lo, hi int32) int32 {
	t := b.t
	nd := kdNode{
		minX: t.x[b.bx[lo]], maxX: t.x[b.bx[hi-1]],
		minY: t.y[b.by[lo]], maxY: t.y[b.by[hi-1]],
		lo: lo, hi: hi, left: -1, right: -1,
	}
	at := int32(len(t.nodes))
	t.nodes = append(t.nodes, nd)
	if hi-lo <= kdLeaf {
		m := b.bx[lo]
		for _, i := range b.bx[lo+1 : hi] {
			m = min(m, i)
		}
		t.nodes[at].minIdx = m
		return at
	}
	mid := lo + (hi-lo)/2
	split, other := b.bx, b.by
	if nd.maxY-nd.minY > nd.maxX-nd.minX {
		split, other = b.by, b.bx
	}
	for _, i := range split[lo:mid] {
		b.left[i] = true
	}
	for _, i := range split[mid:hi] {
		b.left[i] = false
	}
	// Partition the other order stably: the left half's points first.
	l, r := lo, mid
	for _, i := range other[lo:hi] {
		if b.left[i] {
			b.tmp[l] = i
			l++
		} else {
			b.tmp[r] = i
			r++
		}
	}
	copy(other[lo:hi], b.tmp[lo:hi])
	left := b.build(lo, mid)
	right := b.build(mid, hi)
	t.nodes[at].left, t.nodes[at].right = left, right
	t.nodes[at].minIdx = min(t.nodes[left].minIdx, t.nodes[right].minIdx)
	return at
}

// box2 is the squared distance from (x, y) to node n's box: no more than
// that of any of its points, as computed by knnInto (rounding is
// monotone).
func (t *kdTree) box2(n int32, x, y float64) float64 {
	nd := &t.nodes[n]
	dx := max(nd.minX-x, 0, x-nd.maxX)
	dy := max(nd.minY-y, 0, y-nd.maxY)
	return dx*dx + dy*dy
}

// kdQuery is a k-nearest search in progress: js and ds are the best
// found so far, nearest first, at most k.
type kdQuery struct {
	x, y    float64
	self, k int
	js      []int
	ds      []float64
}

// beyond says whether nothing at squared distance d or more, with index
// minIdx or more, can join the k found.
func (q *kdQuery) beyond(d float64, minIdx int32) bool {
	k := q.k
	return len(q.js) == k && (d > q.ds[k-1] || d == q.ds[k-1] && int(minIdx) > q.js[k-1])
}

// knnInto returns up to k nearest other points of point i, nearest first
// and, at equal distances, lowest index first, written into the
// caller's buffers (length 0, capacity ≥ k): the grid's knnInto, and the
// same lists.
func (t *kdTree) knnInto(i, k int, js []int, ds []float64) []int {
	if k <= 0 || len(t.nodes) == 0 {
		return nil
	}
	q := kdQuery{x: t.x[i], y: t.y[i], self: i, k: k, js: js, ds: ds}
	t.search(&q, 0)
	return q.js
}

func (t *kdTree) search(q *kdQuery, n int32) {
	nd := &t.nodes[n]
	if nd.left < 0 {
		for p := nd.lo; p < nd.hi; p++ {
			j := int(t.order[p])
			if j == q.self {
				continue
			}
			ex, ey := t.px[p]-q.x, t.py[p]-q.y
			if d := ex*ex + ey*ey; !q.beyond(d, int32(j)) {
				q.js, q.ds = insertNearest(q.js, q.ds, q.k, j, d)
			}
		}
		return
	}
	a, b := nd.left, nd.right
	da, db := t.box2(a, q.x, q.y), t.box2(b, q.x, q.y)
	if db < da || db == da && t.nodes[b].minIdx < t.nodes[a].minIdx {
		a, b, da, db = b, a, db, da
	}
	if !q.beyond(da, t.nodes[a].minIdx) {
		t.search(q, a)
	}
	if !q.beyond(db, t.nodes[b].minIdx) {
		t.search(q, b)
	}
}

// insertNearest puts point j at squared distance d into js and ds (the
// nearest found, at most k, ordered by distance and then index). The
// caller has made sure that j belongs there: that fewer than k are
// found, or that j comes before the k-th (the searches test that in
// their loops, where most points end, rather than in a call).
func insertNearest(js []int, ds []float64, k, j int, d float64) ([]int, []float64) {
	if len(js) < k {
		js, ds = append(js, j), append(ds, d)
	}
	p := len(js) - 1
	for p > 0 && (ds[p-1] > d || ds[p-1] == d && js[p-1] > j) {
		js[p], ds[p] = js[p-1], ds[p-1]
		p--
	}
	js[p], ds[p] = j, d
	return js, ds
}

// near calls f with every point of the leaves whose box a disc of radius
// r about (x, y) reaches: the points within r and some beyond, as the
// grid's near.
func (t *kdTree) near(x, y, r float64, f func(j int)) {
	if len(t.nodes) == 0 {
		return
	}
	t.nearFrom(0, x, y, r*r, f)
}

func (t *kdTree) nearFrom(n int32, x, y, r2 float64, f func(j int)) {
	if t.box2(n, x, y) > r2 {
		return
	}
	nd := &t.nodes[n]
	if nd.left < 0 {
		for _, j := range t.order[nd.lo:nd.hi] {
			f(int(j))
		}
		return
	}
	t.nearFrom(nd.left, x, y, r2, f)
	t.nearFrom(nd.right, x, y, r2, f)
}

// mixedWithin lists the points that may have a point of another group
// (as groupOf says) within radius r, as the grid's mixedWithin does with
// cells: the points of the leaves that hold several groups, or whose box
// lies within r of a node holding another group.
func (t *kdTree) mixedWithin(r float64, groupOf func(int) int) []int {
	// Nodes come before their children: label them from the last.
	label := make([]int, len(t.nodes))
	for n := len(t.nodes) - 1; n >= 0; n-- {
		nd := &t.nodes[n]
		if nd.left >= 0 {
			if label[nd.left] == label[nd.right] {
				label[n] = label[nd.left]
			} else {
				label[n] = cellMixed
			}
			continue
		}
		label[n] = groupOf(int(t.order[nd.lo]))
		for _, j := range t.order[nd.lo+1 : nd.hi] {
			if groupOf(int(j)) != label[n] {
				label[n] = cellMixed
				break
			}
		}
	}
	var out []int
	for n := range t.nodes {
		nd := &t.nodes[n]
		if nd.left < 0 && (label[n] == cellMixed || t.othersNear(label, int32(n), 0, r*r)) {
			for _, j := range t.order[nd.lo:nd.hi] {
				out = append(out, int(j))
			}
		}
	}
	return out
}

// othersNear says whether node m, or a node under it, lies within
// squared distance r2 of leaf n's box and holds a group other than n's.
func (t *kdTree) othersNear(label []int, n, m int32, r2 float64) bool {
	if label[m] == label[n] || t.boxes2(n, m) > r2 {
		return false
	}
	mm := &t.nodes[m]
	if label[m] != cellMixed || mm.left < 0 {
		return true
	}
	return t.othersNear(label, n, mm.left, r2) || t.othersNear(label, n, mm.right, r2)
}

// boxes2 is the squared distance between the boxes of nodes a and b.
func (t *kdTree) boxes2(a, b int32) float64 {
	p, q := &t.nodes[a], &t.nodes[b]
	dx := max(p.minX-q.maxX, 0, q.minX-p.maxX)
	dy := max(p.minY-q.maxY, 0, q.minY-p.maxY)
	return dx*dx + dy*dy
}

// lineSearch finds the points near polylines (alongPolyline), marking
// the points found and the subtrees whose points all are, a line at a
// time (gen tells the lines apart, so that nothing is cleared between
// them).
type lineSearch struct {
	t          *kdTree
	seen, done []int32 // by point and by node: the last line that found it or all of its points
	gen        int32
	a, b       [2]float64
	tol        float64
	f          func(j int)
}

func (t *kdTree) lineSearch() *lineSearch {
	return &lineSearch{t: t, seen: make([]int32, len(t.x)), done: make([]int32, len(t.nodes))}
}

// alongPolyline calls f once with each point within tol of the polyline
// through v (as segDist measures), however many of its segments pass
// near the point: a line drawn back and forth over a crowd of points
// costs about what one pass over it does.
func (s *lineSearch) alongPolyline(v [][2]float64, tol float64, f func(j int)) {
	if len(s.t.nodes) == 0 {
		return
	}
	s.gen++
	s.tol, s.f = tol, f
	for i := 0; i+1 < len(v); i++ {
		s.a, s.b = v[i], v[i+1]
		s.visit(0)
	}
}

// visit reports the points of node n within tol of segment a–b that no
// earlier segment of the line found, and says whether all of n's
// points are now found.
func (s *lineSearch) visit(n int32) bool {
	if s.done[n] == s.gen {
		return true
	}
	t := s.t
	nd := &t.nodes[n]
	// The box lies beyond tol of the segment when the segment's box,
	// widened by tol, misses it, or when its centre lies farther than tol
	// and its half diagonal (with a margin for rounding).
	if max(s.a[0], s.b[0])+s.tol < nd.minX || min(s.a[0], s.b[0])-s.tol > nd.maxX ||
		max(s.a[1], s.b[1])+s.tol < nd.minY || min(s.a[1], s.b[1])-s.tol > nd.maxY {
		return false
	}
	half := math.Hypot(nd.maxX-nd.minX, nd.maxY-nd.minY) / 2
	if segDist((nd.minX+nd.maxX)/2, (nd.minY+nd.maxY)/2, s.a, s.b) > (s.tol+half)*(1+1e-9)+1e-9 {
		return false
	}
	all := true
	if nd.left < 0 {
		for p := nd.lo; p < nd.hi; p++ {
			j := t.order[p]
			if s.seen[j] == s.gen {
				continue
			}
			if segDist(t.px[p], t.py[p], s.a, s.b) <= s.tol {
				s.seen[j] = s.gen
				s.f(int(j))
			} else {
				all = false
			}
		}
	} else {
		l, r := s.visit(nd.left), s.visit(nd.right)
		all = l && r
	}
	if all {
		s.done[n] = s.gen
	}
	return all
}
