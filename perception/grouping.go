package perception

import (
	"cmp"
	"math"
	"slices"

	"standout/perception/colour"
)

// Cue names a grouping cue.
type Cue string

// Grouping cues.
const (
	CueProximity Cue = "proximity"
	CueColour    Cue = "colour"
	CueShape     Cue = "shape"
	CueConnected Cue = "connectedness"
	CueRows      Cue = "rows"
	CueColumns   Cue = "columns"
)

// Partition is one cue's grouping of the point-like marks.
type Partition struct {
	Cue    Cue
	Labels []int // per analysed mark, a group number
	Groups int
}

// Agreement compares two partitions.
type Agreement struct {
	A, B Cue
	ARI  float64
	// Relation is "agree", "conflict" or "partial".
	Relation string
}

// Grouping is the partitions of the marks by each cue and their pairwise
// agreement. Marks lists the indices of the marks that were grouped
// (discrete marks; lines are the connectors).
type Grouping struct {
	Marks      []int
	Partitions []Partition
	Agreements []Agreement
}

type unionFind []int

func newUF(n int) unionFind {
	u := make(unionFind, n)
	for i := range u {
		u[i] = i
	}
	return u
}

func (u unionFind) find(i int) int {
	for u[i] != i {
		u[i] = u[u[i]]
		i = u[i]
	}
	return i
}

func (u unionFind) union(a, b int) { u[u.find(a)] = u.find(b) }

// labels numbers the sets 0, 1, … in the order of their first members.
func (u unionFind) labels() ([]int, int) {
	byRoot := make([]int32, len(u))
	for i := range byRoot {
		byRoot[i] = -1
	}
	out := make([]int, len(u))
	k := 0
	for i := range u {
		r := u.find(i)
		if byRoot[r] < 0 {
			byRoot[r] = int32(k)
			k++
		}
		out[i] = int(byRoot[r])
	}
	return out, k
}

// group partitions the point-like marks by each cue and compares the
// partitions. Each cue has a function of its own: besides reading better,
// small functions keep a WebAssembly engine from spending the first
// check compiling one large function optimised that runs only once.
func group(in Input, p Params, kinds map[string][]int, kindNbs map[string][][]int) Grouping {
	var g Grouping
	var lines []*Mark
	for i := range in.Marks {
		m := &in.Marks[i]
		if len(m.Vertices) >= 2 {
			lines = append(lines, m)
			continue
		}
		if m.Kind == "text" {
			continue
		}
		g.Marks = append(g.Marks, i)
	}
	n := len(g.Marks)
	if n < 3 {
		return g
	}
	xs, ys := make([]float64, n), make([]float64, n)
	for k, i := range g.Marks {
		xs[k], ys[k] = in.Marks[i].X, in.Marks[i].Y
	}
	nb := reuseNeighbours(in, g.Marks, kinds, kindNbs)
	if nb == nil {
		nb = neighboursXY(xs, ys, max(p.Neighbours, 1), p.Kept)
	}
	labels, k := p.Kept.proximity(xs, ys, nb, p.ProximityRatio, p.ProximityGap)
	g.addLabels(CueProximity, labels, k)
	g.add(CueColour, colourGroups(in, p, g.Marks))
	g.add(CueShape, shapeGroups(in, g.Marks))
	if len(lines) > 0 {
		g.add(CueConnected, connectedGroups(lines, xs, ys, p.ConnectTolerancePx))
	}
	if !p.FindingsOnly {
		g.add(CueRows, alignedGroups(ys))
		g.add(CueColumns, alignedGroups(xs))
	}
	g.compare(p)
	return g
}

// proximityGroups groups the marks by proximity as a reader sees them:
// into groups whose gaps are clearly wider than the spacing within them.
// Grouping by proximity follows the ratio of distances (Kubovy, Holcombe
// & Wagemans 1998), so a cut of single linkage at ratio × the median
// nearest-neighbour distance, which cuts any cloud somewhere, makes groups
// a reader sees only where no mark of another group is within gap times
// the widest link that joined a group. From that cut, the next links are
// joined, shortest first, until that holds (Kruskal over the neighbour
// lists nb, a k-nearest-neighbour graph, then a search of the grid for
// pairs the lists left out). A scatter whose density merely varies has
// no such gap and ends as one group, with at most a few outliers, which
// make no second structure (addLabels); three clusters far apart stay
// three, their edges' stragglers joined to them.
func proximityGroups(xs, ys []float64, nb [][]int, ratio, gap float64) unionFind {
	n := len(xs)
	uf := newUF(n)
	nn := make([]float64, n)
	for k, l := range nb {
		if len(l) > 0 {
			nn[k] = math.Hypot(xs[l[0]]-xs[k], ys[l[0]]-ys[k])
		}
	}
	thr := ratio * upperMedian(nn)
	if !(thr > 0) {
		return uf
	}
	// The links, each once, as the squared length's float32 bits (which
	// order as the lengths do) over the link's index, sorted by the
	// length's bits alone: a radix sort of plain integers, several times
	// faster than a comparison sort.
	total := 0
	for _, l := range nb {
		total += len(l)
	}
	ends := make([][2]int32, 0, total)
	keys := make([]uint64, 0, total)
	for k, l := range nb {
		for _, j := range l {
			if j < k && slices.Contains(nb[j], k) {
				continue // listed from j's side too
			}
			d2 := float32(dist2(xs, ys, j, k))
			keys = append(keys, uint64(math.Float32bits(d2))<<32|uint64(len(ends)))
			ends = append(ends, [2]int32{int32(k), int32(j)})
		}
	}
	keys, _ = radixSort(keys, nil, 32)
	thr2, gap2 := float32(thr*thr), float32(gap*gap)
	widest2 := float32(0)
	for _, key := range keys {
		e, d2 := ends[uint32(key)], math.Float32frombits(uint32(key>>32))
		ra, rb := uf.find(int(e[0])), uf.find(int(e[1]))
		if ra == rb {
			continue
		}
		if d2 > thr2 && d2 >= gap2*widest2 {
			break
		}
		uf[ra] = rb
		widest2 = d2
	}
	// The lists hold each mark's nearest few only: pairs of groups within
	// reach that no list joined are joined from the grid, a pass at a
	// time, each reaching as far as the links joined so far allow. Groups
	// that have not settled after proximityPasses have no clear gaps:
	// they are one group.
	if widest2 > 0 && manyMembered(uf.labels()) >= 2 {
		grd := newIndex(xs, ys, 2)
		for pass, joined := 0, true; joined; pass++ {
			r := gap * math.Sqrt(float64(widest2))
			if pass == proximityPasses || r > proximityReach*grd.cell {
				for k := 1; k < n; k++ {
					uf.union(0, k)
				}
				break
			}
			joined = false
			for _, k := range grd.mixedWithin(r, uf.find) {
				grd.near(xs[k], ys[k], r, func(j int) {
					if d2 := dist2(xs, ys, j, k); d2 <= r*r {
						if ra, rb := uf.find(k), uf.find(j); ra != rb {
							uf[ra] = rb
							widest2 = max(widest2, float32(d2))
							joined = true
						}
					}
				})
			}
		}
	}
	return uf
}

// proximityPasses is how many passes over the grid proximityGroups makes
// at most: each joins every pair within its reach, so groups that need
// more are joined by gaps that grow little by little, which a crafted
// page could make many of. proximityReach is how many of the grid's
// cells (about two points each, spread over the chart) a pass may
// reach: groups whose own links span more than that, beside marks
// packed much closer elsewhere, would make each search cover much of
// the grid, and are taken as one group, as without clear gaps.
const (
	proximityPasses = 8
	proximityReach  = 7
)

// radixSort sorts keys by their bits from bit from up, a byte at a time
// (least significant first, each pass stable), moving idx with them
// when it is not nil, and skipping a byte that every key shares. It
// returns the sorted slices, which may be other than those given.
func radixSort(keys []uint64, idx []int32, from int) ([]uint64, []int32) {
	n := len(keys)
	tk := make([]uint64, n)
	var ti []int32
	if idx != nil {
		ti = make([]int32, n)
	}
	for shift := from; shift < 64; shift += 8 {
		var count [257]int
		for _, k := range keys {
			count[(k>>shift)&0xff+1]++
		}
		if slices.Contains(count[1:], n) {
			continue
		}
		for b := 1; b < len(count); b++ {
			count[b] += count[b-1]
		}
		for p, k := range keys {
			b := (k >> shift) & 0xff
			tk[count[b]] = k
			if idx != nil {
				ti[count[b]] = idx[p]
			}
			count[b]++
		}
		keys, tk = tk, keys
		idx, ti = ti, idx
	}
	return keys, idx
}

// dist2 is the squared distance of points j and k.
func dist2(xs, ys []float64, j, k int) float64 {
	dx, dy := xs[j]-xs[k], ys[j]-ys[k]
	return dx*dx + dy*dy
}

// manyMembered is how many of the k groups of labels hold more than one
// member.
func manyMembered(labels []int, k int) int {
	size := make([]int, k)
	many := 0
	for _, l := range labels {
		if size[l]++; size[l] == 2 {
			many++
		}
	}
	return many
}

// colourGroups joins the marks whose colours are not noticeably different
// (at the first mark's size).
func colourGroups(in Input, p Params, marks []int) unionFind {
	type cbin struct {
		lab colour.Lab
		nd  [3]float64
		ks  []int
	}
	colours := newIndexer[colour.SRGB]()
	var order []*cbin
	for k, i := range marks {
		m := &in.Marks[i]
		c := colours.of(m.Colour)
		if c == len(order) {
			order = append(order, &cbin{lab: colour.SRGBToLab(m.Colour), nd: p.ND.For(m.Type, m.MinPx, m.MaxPx)})
		}
		order[c].ks = append(order[c].ks, k)
	}
	uf := newUF(len(marks))
	if len(order) <= 2048 {
		for a := range order {
			for _, k := range order[a].ks[1:] {
				uf.union(order[a].ks[0], k)
			}
			for b := a + 1; b < len(order); b++ {
				if !colour.Noticeable(order[a].lab, order[b].lab, order[a].nd) {
					uf.union(order[a].ks[0], order[b].ks[0])
				}
			}
		}
	}
	return uf
}

// shapeGroups joins the marks of each shape class.
func shapeGroups(in Input, marks []int) unionFind {
	uf := newUF(len(marks))
	shapes := newIndexer[string]()
	var first []int
	for k, i := range marks {
		s := shapes.of(in.Marks[i].Shape)
		if s == len(first) {
			first = append(first, k)
		} else {
			uf.union(first[s], k)
		}
	}
	return uf
}

// connectedGroups joins the marks whose centres lie on the same line,
// within half its stroke and tol px.
func connectedGroups(lines []*Mark, xs, ys []float64, tol float64) unionFind {
	search := newKDTree(xs, ys).lineSearch()
	uf := newUF(len(xs))
	for _, l := range lines {
		first := -1
		search.alongPolyline(l.Vertices, l.MinPx/2+tol, func(k int) {
			if first < 0 {
				first = k
			} else {
				uf.union(first, k)
			}
		})
	}
	return uf
}

// alignedGroups joins marks whose coordinate (the centres' y for rows, x
// for columns) is within 1 px of the next one's.
func alignedGroups(coord []float64) unionFind {
	type keyed struct {
		v float64
		k int
	}
	n := len(coord)
	sorted := make([]keyed, n)
	for k, v := range coord {
		sorted[k] = keyed{v, k}
	}
	// A generic sort: this one runs on every mark, where sort.Slice's
	// reflection costs (the others, on few elements, use sort.Slice, one
	// body for every type in the WebAssembly module).
	slices.SortFunc(sorted, func(a, b keyed) int {
		if c := cmp.Compare(a.v, b.v); c != 0 {
			return c
		}
		return cmp.Compare(a.k, b.k)
	})
	uf := newUF(n)
	for a := 1; a < n; a++ {
		if sorted[a].v-sorted[a-1].v <= 1 {
			uf.union(sorted[a].k, sorted[a-1].k)
		}
	}
	return uf
}

// compare sets the Adjusted Rand Index of every pair of partitions and
// classifies it.
func (g *Grouping) compare(p Params) {
	for a := 0; a < len(g.Partitions); a++ {
		for b := a + 1; b < len(g.Partitions); b++ {
			pa, pb := g.Partitions[a], g.Partitions[b]
			ari := AdjustedRandIndex(pa.Labels, pb.Labels)
			rel := "partial"
			switch {
			case ari >= p.AgreeARI:
				rel = "agree"
			case ari <= p.ConflictARI:
				rel = "conflict"
			}
			g.Agreements = append(g.Agreements, Agreement{A: pa.Cue, B: pb.Cue, ARI: ari, Relation: rel})
		}
	}
}

// add keeps a partition only when it structures the marks (addLabels).
func (g *Grouping) add(c Cue, uf unionFind) {
	labels, k := uf.labels()
	g.addLabels(c, labels, k)
}

// addLabels adds the partition of labels into k groups when it structures
// the marks: when at least two of its groups hold more than one mark. A
// mark alone in its group is an emphasis or an outlier, which the pop-out
// analysis judges; beside one large group it makes no second structure.
func (g *Grouping) addLabels(c Cue, labels []int, k int) {
	if k <= 1 || k >= len(labels) {
		return
	}
	if manyMembered(labels, k) < 2 {
		return
	}
	g.Partitions = append(g.Partitions, Partition{Cue: c, Labels: labels, Groups: k})
}

func segDist(x, y float64, a, b [2]float64) float64 {
	dx, dy := b[0]-a[0], b[1]-a[1]
	l2 := dx*dx + dy*dy
	t := 0.0
	if l2 > 0 {
		t = max(0, min(1, ((x-a[0])*dx+(y-a[1])*dy)/l2))
	}
	return math.Hypot(x-(a[0]+t*dx), y-(a[1]+t*dy))
}

// reuseNeighbours returns the neighbour lists the salience step already
// computed when the grouped marks are exactly the marks of one kind (the
// usual chart), re-indexed to positions in marks (the very lists when
// marks are the kind's marks in order, as they usually are: they may be
// a kept search's and must not be changed); else nil.
func reuseNeighbours(in Input, marks []int, kinds map[string][]int, kindNbs map[string][][]int) [][]int {
	if len(marks) == 0 {
		return nil
	}
	k := in.Marks[marks[0]].Kind
	idx, nbs := kinds[k], kindNbs[k]
	if len(idx) != len(marks) || len(nbs) != len(idx) {
		return nil
	}
	if slices.Equal(idx, marks) {
		return nbs // the same marks in the same order: the same lists
	}
	pos := make([]int, len(in.Marks))
	for p, i := range marks {
		if in.Marks[i].Kind != k {
			return nil
		}
		pos[i] = p
	}
	total := 0
	for _, l := range nbs {
		total += len(l)
	}
	flat := make([]int, 0, total)
	out := make([][]int, len(marks))
	for j, i := range idx {
		start := len(flat)
		for _, o := range nbs[j] {
			flat = append(flat, pos[idx[o]])
		}
		out[pos[i]] = flat[start:len(flat):len(flat)]
	}
	return out
}
