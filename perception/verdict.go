package perception

import (
	"cmp"
	"math"
	"slices"
	"sort"
)

// judge computes every mark's verdict in one display.
func (d *display) judge() []MarkResult { return d.judgeSome(nil) }

// colourChannel reports whether a channel depends on the vision type.
func colourChannel(ci int) bool { return Channels[ci] == Hue || Channels[ci] == Lightness }

// judgeSome computes every mark's verdict or, with only non-nil, just the
// salience and pop-out of those marks, returned in the order of only.
// Channels that do not depend on colour are taken from d.reuse when a
// previous vision type computed them.
func (d *display) judgeSome(only []int) []MarkResult {
	n := len(d.idx)
	if n == 0 {
		return make([]MarkResult, len(only))
	}
	var statList [5]channelStats
	for ci, c := range Channels {
		if d.reuse != nil && d.reuse.have && !colourChannel(ci) {
			statList[ci] = d.reuse.stats[ci]
			continue
		}
		statList[ci] = d.stats(c)
	}
	nb := d.nb
	if nb == nil && n > 1 && d.p.Neighbours > 0 {
		nb = neighbours(d.all, d.idx, d.p.Neighbours)
	}
	reuse := d.reuse != nil && d.reuse.have
	// One backing array for every mark's channel list: fewer allocations.
	chBuf := make([]Channel, 0, n/4+8)
	hueCI, lightCI := 0, 1 // positions of Hue and Lightness in Channels
	one := func(k int) MarkResult {
		r := MarkResult{}
		for ci, c := range Channels {
			if reuse && !colourChannel(ci) {
				r.Salience[ci] = d.reuse.sal[k][ci]
				continue
			}
			if ci == lightCI {
				continue // computed with hue below
			}
			st := &statList[ci]
			m := d.margin(c)
			h := st.spread / m
			global := st.global[k] / m / (1 + h)
			if ci == hueCI {
				// Hue and lightness share one pass over the neighbours:
				// the hot loop on large charts.
				st2 := &statList[lightCI]
				m2 := d.margin(Lightness)
				h2 := st2.spread / m2
				global2 := st2.global[k] / m2 / (1 + h2)
				local, local2 := 0.0, 0.0
				if nb != nil {
					ld, ld2 := math.Inf(1), math.Inf(1)
					own, own2 := st.group[k] <= d.small, st2.group[k] <= d.small
					lk, nd := d.lab[k], d.nd[k]
					for _, j := range nb[k] {
						lj := d.lab[j]
						x, y := (lk.A-lj.A)/nd[1], (lk.B-lj.B)/nd[2]
						dh := math.Sqrt(x*x + y*y)
						dl := math.Abs(lk.L-lj.L) / nd[0]
						if (!own || dh >= 1) && dh < ld {
							ld = dh
						}
						if (!own2 || dl >= 1) && dl < ld2 {
							ld2 = dl
						}
					}
					local = localSalience(ld, m, h, global, st.group[k] > d.small)
					local2 = localSalience(ld2, m2, h2, global2, st2.group[k] > d.small)
				}
				r.Salience[hueCI] = max(global, local)
				r.Salience[lightCI] = max(global2, local2)
				continue
			}
			local := 0.0
			if nb != nil {
				ld := math.Inf(1)
				own := st.group[k] <= d.small
				for _, j := range nb[k] {
					dj := d.dist(c, k, j)
					if (!own || dj >= 1) && dj < ld {
						ld = dj
					}
				}
				local = localSalience(ld, m, h, global, st.group[k] > d.small)
			}
			r.Salience[ci] = max(global, local)
		}
		start := len(chBuf)
		for ci, c := range Channels {
			if r.Salience[ci] >= 1 {
				chBuf = append(chBuf, c)
			}
		}
		if len(chBuf) > start {
			r.Channels = chBuf[start:len(chBuf):len(chBuf)]
		}
		if len(r.Channels) > 1 {
			slices.SortStableFunc(r.Channels, func(a, b Channel) int { return cmp.Compare(r.Salience.Of(b), r.Salience.Of(a)) })
		}
		if len(r.Channels) > 0 {
			r.Verdict = Pops
		}
		return r
	}
	if only != nil {
		res := make([]MarkResult, len(only))
		for t, k := range only {
			res[t] = one(k)
		}
		return res
	}
	res := make([]MarkResult, n)
	for k := range d.idx {
		res[k] = one(k)
	}
	if d.reuse != nil && !d.reuse.have {
		d.reuse.have = true
		d.reuse.stats = statList
		d.reuse.sal = make([]Saliences, n)
		for k := range res {
			d.reuse.sal[k] = res[k].Salience
		}
	}
	d.conjunctions(res, &statList)
	for k := range res {
		slope := d.p.SerialSlope
		if res[k].Verdict == Pops {
			slope = d.p.EfficientSlope
		}
		res[k].SlopeMs = slope
		res[k].SearchMs = [2]float64{slope[0] * float64(n), slope[1] * float64(n)}
	}
	return res
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
	stats [5]channelStats
	sal   []Saliences
}

// neighbours lists, for each of the marks idx of all, its k nearest
// among them in space, as positions in idx.
func neighbours(all []Mark, idx []int, k int) [][]int {
	n := len(idx)
	if n < 2 || k <= 0 {
		return nil
	}
	xs, ys := make([]float64, n), make([]float64, n)
	for p, i := range idx {
		xs[p], ys[p] = all[i].X, all[i].Y
	}
	return neighboursXY(xs, ys, k)
}

// neighboursXY lists each point's k nearest points, nearest first.
func neighboursXY(xs, ys []float64, k int) [][]int {
	n := len(xs)
	if n < 2 || k <= 0 {
		return nil
	}
	// About k/2 points a cell: the k nearest then usually lie within the
	// first ring of cells.
	g := newGrid(xs, ys, max(2, float64(k)/2))
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
func (d *display) conjunctions(res []MarkResult, stats *[5]channelStats) {
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
		return sig{int64(math.Round(l.L / nd[0])), int64(math.Round(l.A / nd[1])), int64(math.Round(l.B / nd[2])),
			int64(math.Round(d.size[k])), o, sh}
	}
	groups := map[sig][]int{}
	for k := range d.idx {
		s := sigOf(k)
		groups[s] = append(groups[s], k)
	}
	reps := make([]int, 0, len(groups))
	for _, g := range groups {
		reps = append(reps, g[0])
	}
	sort.Ints(reps)
	for _, g := range groups {
		if len(g) > d.small || len(g) >= n || res[g[0]].Verdict == Pops {
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
				most = max(most, d.dist(c, k, j))
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
	if c == Orientation && d.oriP == 0 {
		return false
	}
	return true
}
