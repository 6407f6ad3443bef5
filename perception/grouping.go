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
	labels, k := p.Kept.proximity(xs, ys, nb, p.ProximityRatio)
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

// proximityGroups is single linkage at ratio × the median nearest-
// neighbour distance, over each mark's nearest neighbours nb (a
// k-nearest-neighbour graph, which joins the same groups wherever groups
// are denser than one mark per neighbourhood, and keeps the step
// O(n log n)).
func proximityGroups(xs, ys []float64, nb [][]int, ratio float64) unionFind {
	n := len(xs)
	nn := make([]float64, n)
	for k := range nn {
		if len(nb[k]) > 0 {
			j := nb[k][0]
			nn[k] = math.Hypot(xs[j]-xs[k], ys[j]-ys[k])
		}
	}
	thr := ratio * upperMedian(nn)
	uf := newUF(n)
	if thr > 0 {
		thr2 := thr * thr
		for k := range nb {
			for _, j := range nb[k] {
				if dx, dy := xs[j]-xs[k], ys[j]-ys[k]; dx*dx+dy*dy <= thr2 {
					uf.union(k, j)
				}
			}
		}
	}
	return uf
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
	grd := newGrid(xs, ys, 2)
	uf := newUF(len(xs))
	for _, l := range lines {
		t := l.MinPx/2 + tol
		prev := -1
		for s := 0; s+1 < len(l.Vertices); s++ {
			a, b := l.Vertices[s], l.Vertices[s+1]
			cx, cy := (a[0]+b[0])/2, (a[1]+b[1])/2
			r := math.Hypot(b[0]-a[0], b[1]-a[1])/2 + t
			for _, k := range grd.within(cx, cy, r) {
				if segDist(xs[k], ys[k], a, b) <= t {
					if prev >= 0 {
						uf.union(prev, k)
					}
					prev = k
				}
			}
		}
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

// add keeps a partition only when it structures the marks: more than one
// group, and some group with more than one mark.
func (g *Grouping) add(c Cue, uf unionFind) {
	labels, k := uf.labels()
	g.addLabels(c, labels, k)
}

// addLabels adds the partition of labels into k groups.
func (g *Grouping) addLabels(c Cue, labels []int, k int) {
	if k <= 1 || k >= len(labels) {
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
