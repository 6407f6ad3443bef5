package perception

import (
	"math"
	"slices"
	"sort"
	"sync"

	"standout/perception/colour"
)

// judge computes every mark's verdict in one display.
func (d *display) judge() []MarkResult { return d.judgeSome(nil) }

// colourChannel reports whether a channel depends on the vision type.
func colourChannel(ci int) bool { return ci == hueAt || ci == lightnessAt }

// judgeSome computes every mark's verdict or, with only non-nil, just the
// salience and pop-out of those marks, returned in the order of only.
// Channels that do not depend on colour are taken from d.reuse when a
// previous vision type computed them.
func (d *display) judgeSome(only []int) []MarkResult {
	n := len(d.idx)
	if n == 0 {
		return make([]MarkResult, len(only))
	}
	j := judging{d: d, nb: d.nb, reuse: d.reuse != nil && d.reuse.have, chromaRef: medianChroma(d), contrastRef: medianContrast(d)}
	if j.nb == nil && n > 1 && d.p.Neighbours > 0 {
		j.nb = neighbours(d.all, d.idx, d.p.Neighbours, d.p.Kept)
	}
	// The channels that are not colour, judged of every mark: as an
	// analysis before left them, when its display had these marks' sizes,
	// angles, shapes and places (Kept.channelsOf).
	keep := only == nil && !j.reuse && d.p.Kept != nil && n >= keepNeighboursFrom && j.nb != nil
	if keep {
		j.kept = d.p.Kept.channelsOf(d, j.nb)
	}
	for ci, c := range Channels {
		switch {
		case j.reuse && !colourChannel(ci):
			j.stats[ci] = d.reuse.stats[ci]
		case j.kept != nil && !colourChannel(ci):
			j.stats[ci] = j.kept.stats[ci]
		default:
			j.stats[ci] = d.stats(c)
		}
	}
	// One backing array for every mark's channel list: fewer allocations.
	j.chBuf = make([]Channel, 0, n/4+8)
	if only != nil {
		res := make([]MarkResult, len(only))
		for t, k := range only {
			res[t] = j.one(k)
		}
		return res
	}
	res := make([]MarkResult, n)
	for k := range d.idx {
		res[k] = j.one(k)
	}
	if keep && j.kept == nil {
		d.p.Kept.keepChannels(j.channelsKept(res))
	}
	if d.reuse != nil && !d.reuse.have {
		d.reuse.have = true
		d.reuse.stats = j.stats
		d.reuse.sal = make([]Saliences, n)
		for k := range res {
			d.reuse.sal[k] = res[k].Salience
		}
	}
	d.conjunctions(res, &j.stats)
	for k := range res {
		res[k].SlopeMs, res[k].SearchMs = d.searchTime(&res[k], n)
	}
	return res
}

// judging is one judgeSome: the channels' statistics, the neighbours and
// whether the colour-free channels come from an earlier vision type.
type judging struct {
	d         *display
	chromaRef float64 // the display's median chroma
	// contrastRef is the display's median lightness difference from the
	// background.
	contrastRef float64
	stats       [nChannels]channelStats
	nb          [][]int
	reuse       bool
	// kept, when set, holds the channels that are not colour as an
	// earlier analysis judged them of these marks.
	kept  *keptChannels
	chBuf []Channel
}

// one is mark k's saliences, the channels that carry it and its verdict
// (pop-out or not; conjunctions come after).
func (j *judging) one(k int) MarkResult {
	d := j.d
	r := MarkResult{}
	if !d.seen(k) {
		return r // a mark the reader cannot tell from its ground cannot pop
	}
	for ci, c := range Channels {
		switch {
		case j.reuse && !colourChannel(ci):
			r.Salience[ci] = d.reuse.sal[k][ci]
		case j.kept != nil && !colourChannel(ci):
			r.Salience[ci] = j.kept.sal[k][ci]
		case ci == lightnessAt:
			// computed with hue
		case ci == hueAt:
			r.Salience[hueAt], r.Salience[lightnessAt] = j.hueAndLightness(k)
		default:
			r.Salience[ci] = j.channel(k, ci, c)
		}
	}
	start := len(j.chBuf)
	for ci, c := range Channels {
		switch {
		case r.Salience[ci] < 1:
		case ci == sizeAt && d.valueSize:
			r.Extreme = true
		default:
			j.chBuf = append(j.chBuf, c)
		}
	}
	if len(j.chBuf) == start {
		j.chBuf = j.combined(&r, j.chBuf)
	}
	if len(j.chBuf) > start {
		r.Channels = j.chBuf[start:len(j.chBuf):len(j.chBuf)]
	}
	if len(r.Channels) > 1 {
		sort.SliceStable(r.Channels, func(i, j int) bool { return r.Salience.Of(r.Channels[i]) > r.Salience.Of(r.Channels[j]) })
	}
	if len(r.Channels) > 0 {
		r.Verdict = Pops
	}
	return r
}

// combined lets redundant cues add up: when no channel alone reaches the
// margin, the channels' saliences pool (Minkowski summation with exponent
// Params.CombineExponent) into one guidance signal, as Guided Search sums
// feature contrasts (Wolfe 1994, 2021); when the pool reaches 1, the mark
// pops through the channels that each carry at least Params.CombineShare
// of the margin. A channel that encodes the data takes no part.
func (j *judging) combined(r *MarkResult, buf []Channel) []Channel {
	p := j.d.p
	pool := 0.0
	for ci := range Channels {
		if s := r.Salience[ci]; s >= p.CombineShare && !(ci == sizeAt && j.d.valueSize) {
			pool += math.Pow(s, p.CombineExponent)
		}
	}
	if math.Pow(pool, 1/p.CombineExponent) < 1 {
		return buf
	}
	for ci, c := range Channels {
		if r.Salience[ci] >= p.CombineShare && !(ci == sizeAt && j.d.valueSize) {
			buf = append(buf, c)
		}
	}
	return buf
}

// channel is mark k's salience in one channel that is not colour: the
// larger of its global and its local contrast.
func (j *judging) channel(k, ci int, c Channel) float64 {
	d := j.d
	st := &j.stats[ci]
	m := d.margin(c)
	h := st.spreadFor(k) / m
	global := st.global[k] / m / (1 + h)
	if j.nb == nil {
		return global
	}
	own := st.own(k, d.small)
	ld := d.nearest(ci, k, j.nb[k], own)
	return max(global, localSalience(ld, m, h, global, !own))
}

// nearest is the least distance (dist) from mark k to the marks nb in
// the channel at ci, which is not colour, counting, when own, only the
// distances of a step or more: the hot loop of the channels on large
// charts, choosing the channel by its position rather than by its name.
func (d *display) nearest(ci, k int, nb []int, own bool) float64 {
	ld := math.Inf(1)
	for _, n := range nb {
		dj := 0.0
		switch ci {
		case sizeAt:
			dj = math.Abs(d.size[k] - d.size[n])
		case orientationAt:
			dj = d.oriDist(k, n)
		case shapeAt:
			if d.shape[n] != d.shape[k] {
				dj = 1
			}
		}
		if (!own || dj >= 1) && dj < ld {
			ld = dj
		}
	}
	return ld
}

// hueAndLightness are mark k's hue and lightness saliences. They share one
// pass over the neighbours: the hot loop on large charts.
func (j *judging) hueAndLightness(k int) (float64, float64) {
	d := j.d
	st, st2 := &j.stats[hueAt], &j.stats[lightnessAt]
	m, m2 := d.margin(Hue), d.margin(Lightness)
	h, h2 := st.spreadFor(k)/m, st2.spreadFor(k)/m2
	global := st.global[k] / m / (1 + h)
	if st.separable(k) {
		// Linearly separable from a rest of a few colours: the margin to
		// the rest's colour hull decides, however far apart those colours
		// are (D'Zmura 1991; Bauer, Jolicœur & Cowan 1996).
		h = 0
		global = min(st.global[k], st.hull[k]) / m
	}
	global2 := st2.global[k] / m2 / (1 + h2)
	if j.nb == nil {
		return global, global2
	}
	ld, ld2 := math.Inf(1), math.Inf(1)
	own, own2 := st.own(k, d.small), st2.own(k, d.small)
	lk, nd := d.lab[k], d.nd[k]
	for _, n := range j.nb[k] {
		ln := d.lab[n]
		x, y := (lk.A-ln.A)/nd[1], (lk.B-ln.B)/nd[2]
		dh := math.Sqrt(x*x + y*y)
		dl := math.Abs(lk.L-ln.L) / nd[0]
		if (!own || dh >= 1) && dh < ld {
			ld = dh
		}
		if (!own2 || dl >= 1) && dl < ld2 {
			ld2 = dl
		}
	}
	local := localSalience(ld, m, h, global, !own)
	local2 := localSalience(ld2, m2, h2, global2, !own2)
	return j.hueAsymmetries(k, max(global, local)), j.lightnessAsymmetry(k, max(global2, local2))
}

// lightnessAsymmetry scales mark k's lightness salience when it stands
// less far from the background than the display's marks do: a target of
// lower contrast among higher-contrast distractors is the "less" of a
// feature, found less easily than the reverse (Treisman & Gormican 1988,
// from memory; LessFeatureFactor, provisional).
func (j *judging) lightnessAsymmetry(k int, s float64) float64 {
	d := j.d
	if math.Abs(d.lab[k].L-d.bg.L) < j.contrastRef-d.nd[k][0] {
		s *= d.p.LessFeatureFactor
	}
	return s
}

// searchTime estimates the search slope and the added search time for a
// mark among n: for a mark that pops, guided search whose time grows with
// ln(n) the more gently the more salient the mark (flat in the limit of
// pop-out); otherwise serial search, linear in n (Params.LogSearchMs,
// EfficientSlope, SerialSlope).
func (d *display) searchTime(r *MarkResult, n int) (slope, search [2]float64) {
	if r.Verdict != Pops {
		s := d.p.SerialSlope
		return s, [2]float64{s[0] * float64(n), s[1] * float64(n)}
	}
	top := 1.0
	for _, c := range r.Channels {
		top = max(top, r.Salience.Of(c))
	}
	return d.p.EfficientSlope, [2]float64{0, d.p.LogSearchMs * math.Log(float64(n)) / top}
}

// hueAsymmetries scales mark k's hue salience for what the distance
// alone misses: a target flanked by its distractors' colours (FlankedFactor)
// and a target less saturated than the display (LessFeatureFactor).
func (j *judging) hueAsymmetries(k int, s float64) float64 {
	d, st := j.d, &j.stats[hueAt]
	if st.flanked(k) {
		s *= d.p.FlankedFactor
	}
	if chroma(d.lab[k]) < j.chromaRef-d.nd[k][1] {
		s *= d.p.LessFeatureFactor
	}
	return s
}

func chroma(l colour.Lab) float64 { return math.Hypot(l.A, l.B) }

// medianChroma is the median chroma of a display's marks: the saturation
// a target is more or less of.
func medianChroma(d *display) float64 { return weightedMedian(d, chroma) }

// weightedMedian is the median of f over a display's marks, computed per
// distinct colour.
func weightedMedian(d *display, f func(colour.Lab) float64) float64 {
	type cw struct {
		c float64
		n int
	}
	cs := make([]cw, len(d.clab))
	for i, l := range d.clab {
		cs[i] = cw{f(l), d.cols.count[i]}
	}
	sort.Slice(cs, func(i, j int) bool { return cs[i].c < cs[j].c })
	half, acc := (len(d.idx)+1)/2, 0
	for _, x := range cs {
		if acc += x.n; acc >= half {
			return x.c
		}
	}
	return 0
}

// medianContrast is the median lightness difference between a display's
// marks and its background.
func medianContrast(d *display) float64 {
	return weightedMedian(d, func(l colour.Lab) float64 { return math.Abs(l.L - d.bg.L) })
}

// localSalience turns the distance to the most similar neighbour (leaving
// out the mark's own small group) into a salience. A mark of a large group
// differs locally only a little more than it differs globally: otherwise
// random mixing would make every mark locally unique.
func localSalience(ld, margin, h, global float64, large bool) float64 {
	if math.IsInf(ld, 1) {
		return 0
	}
	local := ld / margin / (1 + h)
	if large {
		local = min(local, global+0.5/(1+h))
	}
	return local
}

// reuseData carries the vision-independent channels (size, orientation,
// shape) from the first vision type to the others.
type reuseData struct {
	have  bool
	stats [nChannels]channelStats
	sal   []Saliences
}

// neighbours lists, for each of the marks idx of all, its k nearest
// among them in space, as positions in idx (neighboursXY).
func neighbours(all []Mark, idx []int, k int, kept *Kept) [][]int {
	n := len(idx)
	if n < 2 || k <= 0 {
		return nil
	}
	xs, ys := make([]float64, n), make([]float64, n)
	for p, i := range idx {
		xs[p], ys[p] = all[i].X, all[i].Y
	}
	return neighboursXY(xs, ys, k, kept)
}

// neighboursXY lists each point's k nearest points, nearest first, from
// kept when it holds the search of these points (nil: none kept). The
// lists may be kept's and must not be changed.
func neighboursXY(xs, ys []float64, k int, kept *Kept) [][]int {
	n := len(xs)
	if n < 2 || k <= 0 {
		return nil
	}
	if kept == nil || n < keepNeighboursFrom {
		return searchNeighbours(xs, ys, k)
	}
	kept.mu.Lock()
	defer kept.mu.Unlock()
	if s := kept.searches.find(func(s *keptSearch) bool { return s.k == k && slices.Equal(xs, s.xs) && slices.Equal(ys, s.ys) }); s != nil {
		return s.nb
	}
	s := &keptSearch{slices.Clone(xs), slices.Clone(ys), k, searchNeighbours(xs, ys, k)}
	kept.searches.push(s)
	return s.nb
}

// recent is what a Kept keeps of one sort, the most recently used first,
// at most keptSearches of it. P is a pointer type, so that every sort
// shares one compiled copy of the code (the core's size is budgeted).
type recent[P any] []P

// find moves the first element match accepts to the front and returns
// it, or returns the zero P when none does.
func (r recent[P]) find(match func(P) bool) (zero P) {
	for i, e := range r {
		if match(e) {
			copy(r[1:i+1], r[:i])
			r[0] = e
			return e
		}
	}
	return zero
}

// push puts e in front; when the list is full, the least recently used
// goes.
func (r *recent[P]) push(e P) {
	var zero P
	if len(*r) < keptSearches {
		*r = append(*r, zero)
	}
	copy((*r)[1:], *r)
	(*r)[0] = e
}

// Kept is what an analysis keeps for the next one given the same Kept
// (Params.Kept): its last k-nearest-neighbour searches of
// keepNeighboursFrom points or more, the keptSearches most recently used,
// and as many judgings of those displays' channels that are not colour
// and groupings of those points by proximity.
// A check again after a recolour, the edit the findings' fixes ask for,
// finds every mark where it was, and the search is about a tenth of a
// check of a 5,000-mark scatter. A page may have several large charts,
// and a chart searches once per kind of mark and once more for the
// grouping when its grouped marks are not one kind's, so one search kept
// would be replaced before its next use (a re-check of two charts edited
// in turn judges both).
// The zero value keeps nothing yet; it is safe for concurrent use.
type Kept struct {
	mu       sync.Mutex
	searches recent[*keptSearch]
	// channels are the last judgings of the channels that are not colour
	// in displays of keepNeighboursFrom marks or more, the most recently
	// used first: a recolour leaves them as they were too, and they are
	// about a third of judging such a display.
	channels recent[*keptChannels]
	// groupings holds the last proximity groupings of as many points:
	// they follow from the points' places alone.
	groupings recent[*keptProximity]
}

// keptProximity is one proximity grouping: the neighbour lists it joined
// (a kept search's, known by identity, which stands for the points), its
// ratio and gap, and its labels and number of groups.
type keptProximity struct {
	nb         [][]int
	ratio, gap float64
	labels     []int
	k          int
}

// proximity is the grouping by proximity of the points xs, ys over their
// neighbour lists nb (proximityGroups) as labels and a number of groups:
// as kept when nb is a kept search's lists, grouped with this ratio and
// gap before. The labels are the caller's to keep.
func (kept *Kept) proximity(xs, ys []float64, nb [][]int, ratio, gap float64) (labels []int, k int) {
	keep := kept != nil && len(xs) >= keepNeighboursFrom && len(nb) > 0
	if keep {
		kept.mu.Lock()
		defer kept.mu.Unlock()
		if c := kept.groupings.find(func(c *keptProximity) bool {
			return sameLists(c.nb, nb) && sameFloats(c.ratio, ratio) && sameFloats(c.gap, gap)
		}); c != nil {
			return slices.Clone(c.labels), c.k
		}
	}
	labels, k = proximityGroups(xs, ys, nb, ratio, gap).labels()
	if keep {
		kept.groupings.push(&keptProximity{nb, ratio, gap, slices.Clone(labels), k})
	}
	return labels, k
}

// keptChannels is what judging one display computed of the channels that
// do not depend on colour (size, orientation, shape), with all it was
// computed from: the marks' sizes, angles, shapes and neighbours, the
// size of their small groups and the parameters.
type keptChannels struct {
	p          Params // Kept left out
	size, ori  []float64
	oriP       float64
	shape      []int32
	small, grp int
	nb         [][]int // a kept search's lists, known by identity
	stats      [nChannels]channelStats
	sal        []Saliences // per mark, of every mark, seen or not
}

// channelsOf is the kept judging of d's channels that are not colour, nil
// when none was made of the same marks under the same parameters.
func (kept *Kept) channelsOf(d *display, nb [][]int) *keptChannels {
	p := *d.p
	p.Kept = nil
	kept.mu.Lock()
	defer kept.mu.Unlock()
	return kept.channels.find(func(c *keptChannels) bool {
		return sameLists(c.nb, nb) && c.small == d.small && c.grp == d.group && c.p == p &&
			sameFloats(c.oriP, d.oriP) && slices.Equal(c.shape, d.shape) && slices.EqualFunc(c.size, d.size, sameFloats) && slices.EqualFunc(c.ori, d.ori, sameFloats)
	})
}

// sameLists says whether a and b are the same neighbour lists, by
// identity: a kept search's lists, which whatever holds them keeps in
// memory, stand for the points searched.
func sameLists(a, b [][]int) bool { return len(a) == len(b) && len(a) > 0 && &a[0] == &b[0] }

// sameFloats compares bit for bit: a NaN is the same as itself.
func sameFloats(a, b float64) bool { return math.Float64bits(a) == math.Float64bits(b) }

// keepChannels keeps c in front; when full, the least recently used goes.
func (kept *Kept) keepChannels(c *keptChannels) {
	kept.mu.Lock()
	defer kept.mu.Unlock()
	kept.channels.push(c)
}

// channelsKept is what judging every mark of j's display, as res, computed
// of the channels that are not colour. A mark the reader cannot see was
// not judged (one); its saliences are computed here, as another analysis
// of these marks in other colours may see it.
func (j *judging) channelsKept(res []MarkResult) *keptChannels {
	d := j.d
	c := &keptChannels{p: *d.p, size: d.size, ori: d.ori, oriP: d.oriP, shape: d.shape, small: d.small, grp: d.group, nb: j.nb,
		sal: make([]Saliences, len(res))}
	c.p.Kept = nil
	for ci, ch := range Channels {
		if colourChannel(ci) {
			continue
		}
		c.stats[ci] = j.stats[ci]
		for k := range res {
			if d.seen(k) {
				c.sal[k][ci] = res[k].Salience[ci]
			} else {
				c.sal[k][ci] = j.channel(k, ci, ch)
			}
		}
	}
	return c
}

// keptSearch is one search: its points, k and lists.
type keptSearch struct {
	xs, ys []float64
	k      int
	nb     [][]int
}

const (
	keepNeighboursFrom = 1000
	keptSearches       = 4
)

// Points is how many points the most recently used search is of, 0 when
// none is kept.
func (kept *Kept) Points() int {
	kept.mu.Lock()
	defer kept.mu.Unlock()
	if len(kept.searches) == 0 {
		return 0
	}
	return len(kept.searches[0].xs)
}

// searchNeighbours is neighboursXY's search.
func searchNeighbours(xs, ys []float64, k int) [][]int {
	n := len(xs)
	// About k/2 points a cell: the k nearest then usually lie within the
	// first ring of cells.
	g := newIndex(xs, ys, max(2, float64(k)/2))
	nb := make([][]int, n)
	flat := make([]int, n*k)
	ds := make([]float64, 0, k)
	for i := range xs {
		got := g.knnInto(i, k, flat[i*k:i*k:i*k+k], ds[:0])
		nb[i] = got[:len(got):len(got)]
	}
	return nb
}

// conjunctions marks as conjunction targets the marks that do not pop but
// whose combination of features is shared by few marks while each of its
// feature values is shared by many (Treisman & Gelade 1980), and that
// differ noticeably from every other mark in some channel.
func (d *display) conjunctions(res []MarkResult, stats *[nChannels]channelStats) {
	type sig [6]int64
	n := len(d.idx)
	sigOf := func(k int) sig {
		l := d.lab[k]
		nd := d.nd[k]
		var o int64
		if d.oriP > 0 {
			o = int64(math.Round(math.Mod(d.ori[k], d.oriP)))
		}
		sh := int64(d.shape[k])
		var sz int64 // a size that encodes the data is no feature of a conjunction
		if !d.valueSize {
			sz = int64(math.Round(d.size[k]))
		}
		return sig{int64(math.Round(l.L / nd[0])), int64(math.Round(l.A / nd[1])), int64(math.Round(l.B / nd[2])), sz, o, sh}
	}
	sigs := newIndexer[sig]()
	var groups [][]int
	for k := range d.idx {
		s := sigs.of(sigOf(k))
		if s == len(groups) {
			groups = append(groups, nil)
		}
		groups[s] = append(groups[s], k)
	}
	// Numbered in the order of their first marks: the representatives
	// are in mark order.
	reps := make([]int, len(groups))
	for s, g := range groups {
		reps[s] = g[0]
	}
	for _, g := range groups {
		if len(g) > d.small || len(g) >= n || res[g[0]].Verdict == Pops || !d.seen(g[0]) {
			continue
		}
		k := g[0]
		// Every feature value must be shared with other marks.
		shared := true
		for ci, c := range Channels {
			if stats[ci].group[k] <= len(g) && channelMatters(d, c) {
				shared = false
			}
		}
		if !shared {
			continue
		}
		// And the combination must be unique: every other group differs
		// by at least one step in some channel.
		unique := true
		for _, j := range reps {
			if sigOf(j) == sigOf(k) {
				continue
			}
			most := 0.0
			for _, c := range Channels {
				if channelMatters(d, c) {
					most = max(most, d.dist(c, k, j))
				}
			}
			if most < 1 {
				unique = false
				break
			}
		}
		if unique {
			for _, m := range g {
				res[m].Verdict = Conjunction
			}
		}
	}
	for k := range res {
		if res[k].Verdict == "" {
			res[k].Verdict = Blends
		}
	}
}

// channelMatters: a channel with no variation at all in the display
// carries no feature value to share.
func channelMatters(d *display, c Channel) bool {
	if c == Orientation && d.oriP == 0 || c == Size && d.valueSize {
		return false
	}
	return true
}
