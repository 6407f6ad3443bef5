package perception

import (
	"math"
	"sort"
)

// judge computes every mark's verdict in one display.
func (d *display) judge() []MarkResult {
	n := len(d.marks)
	res := make([]MarkResult, n)
	if n == 0 {
		return res
	}
	stats := map[Channel]channelStats{}
	for _, c := range Channels {
		stats[c] = d.stats(c)
	}
	// Local surround: the nearest marks in space.
	var nb [][]int
	if n > 1 && d.p.Neighbours > 0 {
		xs, ys := make([]float64, n), make([]float64, n)
		for k, m := range d.marks {
			xs[k], ys[k] = m.X, m.Y
		}
		g := newGrid(xs, ys)
		nb = make([][]int, n)
		for k := range d.marks {
			nb[k] = g.knn(k, d.p.Neighbours)
		}
	}
	for k := range d.marks {
		r := MarkResult{Salience: map[Channel]float64{}}
		for _, c := range Channels {
			st := stats[c]
			m := d.margin(c)
			h := st.spread / m
			global := st.global[k] / m / (1 + h)
			local := 0.0
			if nb != nil {
				// Local contrast: the most similar neighbour, leaving out
				// the mark's own small group.
				ld := math.Inf(1)
				own := st.group[k] <= d.small
				for _, j := range nb[k] {
					dj := d.dist(c, k, j)
					if own && dj < 1 {
						continue
					}
					ld = math.Min(ld, dj)
				}
				if !math.IsInf(ld, 1) {
					local = ld / m / (1 + h)
				}
				// A lone mark differs locally only if it differs from the
				// display as a whole in the same channel too, or its
				// surround is uniform: otherwise random mixing would make
				// every mark locally unique.
				if st.group[k] > d.small {
					local = math.Min(local, global+0.5/(1+h))
				}
			}
			s := math.Max(global, local)
			r.Salience[c] = s
			if s >= 1 {
				r.Channels = append(r.Channels, c)
			}
		}
		sort.SliceStable(r.Channels, func(a, b int) bool { return r.Salience[r.Channels[a]] > r.Salience[r.Channels[b]] })
		if len(r.Channels) > 0 {
			r.Verdict = Pops
		}
		res[k] = r
	}
	d.conjunctions(res, stats)
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

// conjunctions marks as conjunction targets the marks that do not pop but
// whose combination of features is shared by few marks while each of its
// feature values is shared by many (Treisman & Gelade 1980), and that
// differ noticeably from every other mark in some channel.
func (d *display) conjunctions(res []MarkResult, stats map[Channel]channelStats) {
	type sig [6]int64
	n := len(d.marks)
	sigOf := func(k int) sig {
		l := d.lab[k]
		nd := d.nd[k]
		var o int64
		if d.oriP > 0 {
			o = int64(math.Round(math.Mod(d.ori[k], d.oriP)))
		}
		var sh int64
		for _, ch := range d.marks[k].Shape {
			sh = sh*31 + int64(ch)
		}
		return sig{int64(math.Round(l.L / nd[0])), int64(math.Round(l.A / nd[1])), int64(math.Round(l.B / nd[2])),
			int64(math.Round(d.size[k])), o, sh}
	}
	groups := map[sig][]int{}
	for k := range d.marks {
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
		for _, c := range Channels {
			if stats[c].group[k] <= len(g) && channelMatters(d, c) {
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
			max := 0.0
			for _, c := range Channels {
				max = math.Max(max, d.dist(c, k, j))
			}
			if max < 1 {
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
