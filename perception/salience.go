package perception

import (
	"math"
	"slices"
	"sort"

	"standout/perception/colour"
)

// Channel names a feature channel.
type Channel string

// The channels, in report order.
const (
	Hue         Channel = "hue"
	Lightness   Channel = "lightness"
	Size        Channel = "size"
	Orientation Channel = "orientation"
	Shape       Channel = "shape"
)

// The channels' positions in Channels and Saliences.
const (
	hueAt = iota
	lightnessAt
	sizeAt
	orientationAt
	shapeAt
	nChannels
)

// Channels lists every channel, each at its position.
var Channels = []Channel{hueAt: Hue, lightnessAt: Lightness, sizeAt: Size, orientationAt: Orientation, shapeAt: Shape}

// Saliences holds one salience per channel, in the order of Channels.
type Saliences [nChannels]float64

// channelAt is the position of channel c, or −1.
func channelAt(c Channel) int {
	for i, x := range Channels {
		if x == c {
			return i
		}
	}
	return -1
}

// Of returns the salience of channel c.
func (s Saliences) Of(c Channel) float64 {
	if i := channelAt(c); i >= 0 {
		return s[i]
	}
	return 0
}

// Verdict is the prediction for one mark.
type Verdict string

// Verdicts.
const (
	Pops        Verdict = "pops"
	Conjunction Verdict = "conjunction"
	Blends      Verdict = "blends"
)

// MarkResult is the prediction for one mark under one vision type.
type MarkResult struct {
	Verdict Verdict
	// Channels carry the pop-out, strongest first.
	Channels []Channel
	// Salience per channel: contrast over the pop-out margin, allowing for
	// distractor spread; 1 is the threshold.
	Salience Saliences
	// SlopeMs and SearchMs are estimates: the search slope (ms per item)
	// and the added search time for this display (slope × number of
	// marks), from published slope conventions, not measurements.
	SlopeMs  [2]float64
	SearchMs [2]float64
	// Extreme says the mark stands out through the channel that encodes
	// its data (the length of a bar, the angle of a pie slice, the area of
	// a bubble): a data extreme, the data speaking, which is kept out of
	// the pop-out verdict and of emphasis.
	Extreme bool
}

// display is one group of comparable marks (one kind) under one vision.
type display struct {
	p     *Params
	all   []Mark       // the Input's marks
	idx   []int        // the display's marks, as indices into all
	shape []int32      // per mark, its shape's number
	lab   []colour.Lab // per mark, under the display's vision
	cols  *palette     // the marks' distinct colours
	clab  []colour.Lab // per distinct colour, under the display's vision
	nd    [][3]float64
	size  []float64 // size in steps (log perceived magnitude / log step)
	ori   []float64 // orientation in steps
	oriP  float64   // circular period in steps; 0 = no orientation channel
	// valueSize says the size channel encodes the data (valueChannelSize).
	valueSize bool
	small     int
	// group bounds the larger candidate sets of colour channels, judged
	// against a uniform rest (Params.GroupShareMax).
	group int
	bg    colour.Lab // the background, under the display's vision
	v     colour.Deficiency
	sev   float64
	nb    [][]int // spatial neighbours, shared across vision types
	reuse *reuseData
	bins  []colourBin // colourBins' bins, once computed
	binOf []int32     // per distinct colour, its bin
}

// palette is the distinct colours of a display's marks, in the order of
// their first marks: the colour conversions and the colour bins work per
// colour, not per mark.
type palette struct {
	colours []colour.SRGB
	of      []int32 // per mark, its colour's index
	first   []int   // per colour, its first mark
	count   []int   // per colour, its marks
}

func newPalette(all []Mark, idx []int) *palette {
	p := &palette{of: make([]int32, len(idx))}
	colours := newIndexer[colour.SRGB]()
	for k, i := range idx {
		c := colours.of(all[i].Colour)
		if c == len(p.first) {
			p.first = append(p.first, k)
			p.count = append(p.count, 0)
		}
		p.of[k] = int32(c)
		p.count[c]++
	}
	p.colours = colours.keys
	return p
}

// shared holds what does not depend on the vision type, computed for the
// first vision and reused by the others.
type shared struct {
	valueSize bool
	cols      *palette
	shape     []int32
	nd        [][3]float64
	size      []float64
	ori       []float64
	oriP      float64
	ready     bool
}

// newDisplayShared prepares the marks idx of all (the marks of one kind)
// under vision v, taking what does not depend on the vision type from sh
// when an earlier vision type computed it.
func newDisplayShared(p *Params, all []Mark, idx []int, bg colour.SRGB, v colour.Deficiency, severity float64, sh *shared) *display {
	d := &display{p: p, idx: idx, all: all, v: v, sev: severity,
		bg: colour.SRGBToLab(colour.Simulate(v, severity, bg))}
	n := len(idx)
	if sh != nil && sh.cols != nil {
		d.cols = sh.cols
	} else {
		d.cols = newPalette(all, idx)
		if sh != nil {
			sh.cols = d.cols
		}
	}
	d.clab = make([]colour.Lab, len(d.cols.colours))
	for i, c := range d.cols.colours {
		d.clab[i] = colour.SRGBToLab(colour.Simulate(v, severity, c))
	}
	d.lab = make([]colour.Lab, n)
	for k, i := range d.cols.of {
		d.lab[k] = d.clab[i]
	}
	if sh != nil && sh.ready {
		d.nd, d.size, d.ori, d.oriP, d.shape, d.valueSize = sh.nd, sh.size, sh.ori, sh.oriP, sh.shape, sh.valueSize
	} else {
		d.shape = make([]int32, n)
		shapes := newIndexer[string]()
		d.nd = make([][3]float64, n)
		d.size = make([]float64, n)
		d.ori = make([]float64, n)
		ndIx := newIndexer[[3]float64]()
		var nds [][3]float64
		fold := -1
		var lastSize, lastSteps float64
		var lastLength bool
		for k, i := range idx {
			m := &all[i]
			d.shape[k] = int32(shapes.of(m.Shape))
			key := [3]float64{float64(m.Type), math.Round(m.MinPx*4) / 4, math.Round(m.MaxPx)}
			i := ndIx.of(key)
			if i == len(nds) {
				nds = append(nds, p.ND.For(m.Type, key[1], key[2]))
			}
			d.nd[k] = nds[i]
			exp := p.StevensArea
			if m.Length {
				exp = p.StevensLength
			}
			// Marks repeat their neighbours' sizes: a logarithm is dear.
			if k == 0 || m.Size != lastSize || m.Length != lastLength {
				lastSize, lastLength = m.Size, m.Length
				lastSteps = exp * math.Log(max(m.Size, 1e-9)) / math.Log(p.SizeStepRatio)
			}
			d.size[k] = lastSteps
			if fold == -1 {
				fold = m.Fold
			} else if fold != m.Fold {
				fold = 0
			}
			d.ori[k] = m.Angle / p.OrientationStepDeg
		}
		// A bar's aspect follows from its length, the data, and a slice's
		// direction from its place in the pie: neither is an orientation
		// the author chose to set a mark apart.
		if k := all[idx[0]].Kind; fold > 0 && k != "bar" && k != "arc" {
			d.oriP = 360 / float64(fold) / p.OrientationStepDeg
		}
		d.valueSize = valueChannelSize(all, idx, d.size)
		if sh != nil {
			sh.nd, sh.size, sh.ori, sh.oriP, sh.shape, sh.ready = d.nd, d.size, d.ori, d.oriP, d.shape, true
			sh.valueSize = d.valueSize
		}
	}
	// A target group is a minority: in three marks, two alike are the
	// majority, whatever the fraction says.
	d.small = min(int(max(float64(p.SmallGroupMin), math.Ceil(p.SmallGroupFraction*float64(n)))), (n-1)/2)
	d.group = max(d.small, min(int(math.Floor(p.GroupShareMax*float64(n))), (n-1)/2))
	return d
}

// valueChannelSize says whether the size channel encodes the data of the
// marks idx (one kind): the length of bars and rules, the angle and area of
// pie slices, the area of map regions, always; the area of points when
// they take more than two sizes (a bubble chart; one or two sizes are a
// plain scatter and perhaps a highlight by size). A line's width and a
// text's size are chosen, not data.
func valueChannelSize(all []Mark, idx []int, size []float64) bool {
	if len(idx) == 0 {
		return false
	}
	switch all[idx[0]].Kind {
	case "bar", "rule", "arc", "area":
		return true
	case "point":
		var steps []int64 // the distinct steps, up to three
		for _, s := range size {
			if v := int64(math.Round(s)); !slices.Contains(steps, v) {
				if steps = append(steps, v); len(steps) > 2 {
					return true
				}
			}
		}
	}
	return false
}

// seen says whether mark k stands from the background by GroundMargin
// noticeable differences, by its fill or, when it has one, its outline.
func (d *display) seen(k int) bool {
	if colour.NDUnits(d.lab[k], d.bg, d.nd[k]) >= d.p.GroundMargin {
		return true
	}
	m := &d.all[d.idx[k]]
	if !m.HasOutline {
		return false
	}
	return colour.NDUnits(colour.SRGBToLab(colour.Simulate(d.v, d.sev, m.Outline)), d.bg, d.nd[k]) >= d.p.GroundMargin
}

// dist is the distance between marks a and b in channel c, in steps, using
// a's noticeable differences (the target's size governs).
func (d *display) dist(c Channel, a, b int) float64 {
	switch c {
	case Hue:
		nd := d.nd[a]
		x, y := (d.lab[a].A-d.lab[b].A)/nd[1], (d.lab[a].B-d.lab[b].B)/nd[2]
		return math.Sqrt(x*x + y*y)
	case Lightness:
		return math.Abs(d.lab[a].L-d.lab[b].L) / d.nd[a][0]
	case Size:
		return math.Abs(d.size[a] - d.size[b])
	case Orientation:
		return d.oriDist(a, b)
	case Shape:
		if d.shape[a] != d.shape[b] {
			return 1
		}
	}
	return 0
}

// oriDist is the circular distance between marks a and b in orientation,
// in steps; 0 when the display has no orientation channel.
func (d *display) oriDist(a, b int) float64 {
	if d.oriP == 0 {
		return 0
	}
	x := math.Mod(math.Abs(d.ori[a]-d.ori[b]), d.oriP)
	return min(x, d.oriP-x)
}

func (d *display) margin(c Channel) float64 {
	switch c {
	case Hue:
		return d.p.ColourMargin
	case Lightness:
		return d.p.LightnessMargin
	case Size:
		return d.p.SizeMargin
	case Orientation:
		return d.p.OrientationMargin
	}
	return d.p.ShapeMargin
}

// channelStats are, per channel, each mark's own-group size, its contrast
// with the nearest distractor (global), and the distractors' spread.
type channelStats struct {
	group  []int     // marks within one step of the mark (itself included)
	global []float64 // steps to the most similar distractor
	spread float64   // distractor heterogeneity, steps
	// rest, when set, is per mark the heterogeneity of the marks outside
	// its group, for the marks of a candidate group (colour channels):
	// a group is judged against the rest of the display, whatever size
	// the rest's own groups have.
	rest []float64
	// largest is the display's largest group: a mark of a group as large
	// is never a candidate target.
	largest int
	// hull, in the hue channel, is per candidate the distance of its
	// chromaticity from the hull of the rest's, in steps (−1 for marks
	// that are no candidate): under one, it is flanked, not linearly
	// separable from them.
	hull []float64
}

// own says whether mark k belongs to a small group that can be a target:
// its own group is then left out of its local surround.
func (st *channelStats) own(k, small int) bool {
	return st.group[k] <= small && st.group[k] < st.largest
}

// flanked says whether candidate k lies within one step of the rest's
// colour hull; separable, whether it lies beyond.
func (st *channelStats) flanked(k int) bool {
	return st.hull != nil && st.hull[k] >= 0 && st.hull[k] < 1
}
func (st *channelStats) separable(k int) bool {
	return st.hull != nil && st.hull[k] >= 1 && !math.IsInf(st.hull[k], 1)
}

// spreadFor is the distractor heterogeneity mark k is judged against.
func (st *channelStats) spreadFor(k int) float64 {
	if st.rest != nil && st.rest[k] >= 0 {
		return st.rest[k]
	}
	return st.spread
}

// stats computes a channel's statistics in O(n log n) for the scalar
// channels and O(n·B) for colour, with B distinct colours (capped by
// quantising).
func (d *display) stats(c Channel) channelStats {
	n := len(d.idx)
	st := channelStats{group: make([]int, n), global: make([]float64, n)}
	if n < 2 {
		return st
	}
	switch c {
	case Size, Orientation:
		vals := d.size
		period := 0.0
		if c == Orientation {
			if d.oriP == 0 {
				return st
			}
			vals, period = d.ori, d.oriP
		}
		d.scalarStats(vals, period, &st)
	case Hue, Lightness:
		d.colourStats(c, &st)
	case Shape:
		var count []int
		for _, i := range d.shape {
			for int(i) >= len(count) {
				count = append(count, 0)
			}
			count[i]++
		}
		distractor := make([]bool, len(count))
		distractors := 0
		largest := slices.Max(count)
		st.largest = largest
		for k, i := range d.shape {
			st.group[k] = count[i]
			if count[i] <= d.small && count[i] < largest {
				st.global[k] = 1
			} else if !distractor[i] {
				distractor[i] = true
				distractors++
			}
		}
		st.spread = max(0, float64(distractors-1))
	}
	return st
}

// scalarStats fills stats for a scalar channel (circular when period > 0).
func (d *display) scalarStats(vals []float64, period float64, st *channelStats) {
	n := len(vals)
	sorted := append([]float64(nil), vals...)
	sort.Float64s(sorted)
	// count of values in [lo, hi], with wrap for circular channels.
	count := func(lo, hi float64) int {
		c := sort.SearchFloat64s(sorted, math.Nextafter(hi, math.Inf(1))) - sort.SearchFloat64s(sorted, lo)
		if period > 0 {
			if lo < 0 {
				c += sort.SearchFloat64s(sorted, math.Nextafter(period, math.Inf(1))) - sort.SearchFloat64s(sorted, lo+period)
			}
			if hi >= period {
				c += sort.SearchFloat64s(sorted, math.Nextafter(hi-period, math.Inf(1))) - sort.SearchFloat64s(sorted, 0)
			}
		}
		return c
	}
	// nearest value at distance ≥ minD from v (circular aware).
	nearest := func(v, minD float64) float64 {
		best := math.Inf(1)
		try := func(x float64) {
			// Values ≥ x + minD and ≤ x − minD.
			i := sort.SearchFloat64s(sorted, x+minD)
			if i < n {
				best = min(best, sorted[i]-x)
			}
			j := sort.SearchFloat64s(sorted, math.Nextafter(x-minD, math.Inf(1))) - 1
			if j >= 0 {
				best = min(best, x-sorted[j])
			}
		}
		try(v)
		if period > 0 {
			try(v + period)
			try(v - period)
			best = min(best, period/2)
		}
		return best
	}
	largest := 0
	for k, v := range vals {
		st.group[k] = count(v-1+1e-9, v+1-1e-9)
		largest = max(largest, st.group[k])
	}
	st.largest = largest
	uniform := d.uniformRest(vals, sorted, period, st.group)
	var distractors []float64
	for k, v := range vals {
		g := st.group[k]
		restSpread := uniform(k)
		if g < largest && (g <= d.small || restSpread >= 0) {
			st.global[k] = nearest(v, 1)
			if g > d.small {
				if st.rest == nil {
					st.rest = make([]float64, n)
					for i := range st.rest {
						st.rest[i] = -1
					}
				}
				st.rest[k] = restSpread
			}
		} else {
			// Shares its value with many, or is one of equal groups: no
			// contrast of its own (see colourStats).
			st.global[k] = 0
			distractors = append(distractors, v)
		}
	}
	st.spread = spread1(distractors, period)
}

// uniformRest gives, for a mark whose group is beyond the small groups
// but within GroupShareMax of the display, the spread of the marks outside
// its group when they are uniform in the channel (under one step), and −1
// otherwise: a set that differs in orientation or size from a uniform
// surround segregates from it as a colour set does (texture segregation:
// Julesz 1981; Nothdurft 1991 for orientation; both from memory). The
// rest's spread is computed once per distinct value, for at most 16 of
// them: a display with more candidate values has no uniform rest.
func (d *display) uniformRest(vals, sorted []float64, period float64, group []int) func(int) float64 {
	memo := map[float64]float64{}
	return func(k int) float64 {
		g, v := group[k], vals[k]
		if g <= d.small || g > d.group {
			return -1
		}
		if u, ok := memo[v]; ok {
			return u
		}
		if len(memo) >= 16 {
			return -1
		}
		sp := -1.0
		if period == 0 {
			sp = linearRestSpread(sorted, v)
		} else {
			var rest []float64
			for _, x := range vals {
				dx := math.Mod(math.Abs(x-v), period)
				if min(dx, period-dx) >= 1 {
					rest = append(rest, x)
				}
			}
			if len(rest) > 0 {
				sp = spread1(rest, period)
			}
		}
		memo[v] = -1
		if sp >= 0 && sp < 1 {
			memo[v] = sp
		}
		return memo[v]
	}
}

// linearRestSpread is spread1 of the sorted values outside (v−1, v+1),
// read from the two runs either side of the group without copying them;
// −1 when there are none.
func linearRestSpread(sorted []float64, v float64) float64 {
	lo := sort.SearchFloat64s(sorted, v-1+1e-9)
	hi := sort.SearchFloat64s(sorted, math.Nextafter(v+1-1e-9, math.Inf(1)))
	m := lo + len(sorted) - hi
	if m == 0 {
		return -1
	}
	at := func(r int) float64 {
		if r < lo {
			return sorted[r]
		}
		return sorted[hi+r-lo]
	}
	q := func(p float64) float64 { return at(int(math.Round(p * float64(m-1)))) }
	return (q(0.9) - q(0.1)) / 2
}

// spread1 is half the interdecile range of the distractor values (for a
// circular channel, of their deviations from the circular mean).
func spread1(v []float64, period float64) float64 {
	if len(v) < 2 {
		return 0
	}
	x := append([]float64(nil), v...)
	if period > 0 {
		var sx, sy float64
		for _, a := range x {
			s, c := math.Sincos(2 * math.Pi * a / period)
			sx += c
			sy += s
		}
		mean := math.Atan2(sy, sx) * period / (2 * math.Pi)
		for i, a := range x {
			dv := math.Mod(a-mean+1.5*period, period) - period/2
			x[i] = dv
		}
	}
	sort.Float64s(x)
	q := func(p float64) float64 { return x[int(math.Round(p*float64(len(x)-1)))] }
	return (q(0.9) - q(0.1)) / 2
}

// hullDistance is how far mark k's chromaticity (a* and b*, CIELAB's
// red–green and yellow–blue opponent axes, each in k's noticeable
// differences) lies from the convex hull of the rest's: 0 within it.
// Under one noticeable difference the target lies between its distractors
// in colour, is not linearly separable from them and is searched
// inefficiently (Bauer, Jolicœur & Cowan 1996 as summarised in Perception
// 25(11), 1996; REFERENCES §5.7, whose computable test this is); beyond
// it, the distance to the hull is the margin that separates it.
func (d *display) hullDistance(k int, rest []colourBin) float64 {
	nd := d.nd[k]
	at := func(m int) [2]float64 { return [2]float64{d.lab[m].A / nd[1], d.lab[m].B / nd[2]} }
	pts := make([][2]float64, 0, len(rest))
	for _, b := range rest {
		pts = append(pts, at(b.rep))
	}
	return distanceToHull(at(k), pts)
}

// hullVertices marks the bins whose colours are vertices of the convex
// hull of all the bins' chromaticities. Being a vertex does not depend on
// how the axes are scaled, so one hull serves every mark's noticeable
// differences.
func (d *display) hullVertices(list []colourBin) []bool {
	pts := make([][2]float64, len(list))
	at := map[[2]float64][]int{}
	for i, b := range list {
		pts[i] = [2]float64{d.lab[b.rep].A, d.lab[b.rep].B}
		at[pts[i]] = append(at[pts[i]], i)
	}
	v := make([]bool, len(list))
	for _, p := range convexHull(pts) {
		for _, i := range at[p] {
			v[i] = true
		}
	}
	return v
}

// hullBin is candidate bin i's distance to the rest's hull. When neither
// it nor any bin of its group is a vertex of the hull of all the bins, the
// rest's hull is that hull, and i lies within it; otherwise the rest's
// hull is built.
func (d *display) hullBin(i int, list []colourBin, dm []float64, vertex []bool, rest []colourBin) float64 {
	B := len(list)
	if len(rest) == 0 {
		return math.Inf(1)
	}
	onHull := vertex[i]
	for j := 0; j < B && !onHull; j++ {
		onHull = j != i && dm[i*B+j] < 1 && vertex[j]
	}
	if !onHull && len(rest) >= 2 {
		return 0
	}
	return d.hullDistance(list[i].rep, rest)
}

// distanceToHull is the distance from p to the convex hull of pts (0
// inside it), in the plane.
func distanceToHull(p [2]float64, pts [][2]float64) float64 {
	hull := convexHull(pts)
	if len(hull) == 1 {
		return math.Hypot(p[0]-hull[0][0], p[1]-hull[0][1])
	}
	inside := len(hull) >= 3
	best := math.Inf(1)
	for i := range hull {
		a, b := hull[i], hull[(i+1)%len(hull)]
		if cross(a, b, p) < 0 {
			inside = false
		}
		best = min(best, segmentDistance(p, a, b))
	}
	if inside {
		return 0
	}
	return best
}

func cross(o, a, b [2]float64) float64 {
	return (a[0]-o[0])*(b[1]-o[1]) - (a[1]-o[1])*(b[0]-o[0])
}

func segmentDistance(p, a, b [2]float64) float64 {
	dx, dy := b[0]-a[0], b[1]-a[1]
	l2 := dx*dx + dy*dy
	t := 0.0
	if l2 > 0 {
		t = max(0, min(1, ((p[0]-a[0])*dx+(p[1]-a[1])*dy)/l2))
	}
	return math.Hypot(p[0]-a[0]-t*dx, p[1]-a[1]-t*dy)
}

// convexHull is the counter-clockwise hull of pts (Andrew's monotone
// chain); collinear points collapse to a segment's two ends.
func convexHull(pts [][2]float64) [][2]float64 {
	ps := append([][2]float64(nil), pts...)
	sort.Slice(ps, func(i, j int) bool { return ps[i][0] < ps[j][0] || ps[i][0] == ps[j][0] && ps[i][1] < ps[j][1] })
	if len(ps) < 3 {
		return ps
	}
	var h [][2]float64
	for pass := 0; pass < 2; pass++ {
		start := len(h)
		for _, p := range ps {
			for len(h) >= start+2 && cross(h[len(h)-2], h[len(h)-1], p) <= 0 {
				h = h[:len(h)-1]
			}
			h = append(h, p)
		}
		h = h[:len(h)-1]
		slices.Reverse(ps)
	}
	return h
}

// colourBin is a set of marks whose colours quantise together.
type colourBin struct {
	rep   int // a representative mark: the bin's first
	count int
}

// colourBins quantises the display's distinct Lab colours so that at most
// 512 bins remain, in the order of their first marks; computed once per
// display, shared by the hue and lightness channels.
func (d *display) colourBins() ([]colourBin, []int32) {
	if d.bins != nil {
		return d.bins, d.binOf
	}
	q := 0.5
	var bins []colourBin
	binOf := make([]int32, len(d.clab))
	for {
		index := map[[3]int64]int32{}
		bins = bins[:0]
		for ci, l := range d.clab {
			key := [3]int64{int64(math.Round(l.L / q)), int64(math.Round(l.A / q)), int64(math.Round(l.B / q))}
			b, ok := index[key]
			if !ok {
				b = int32(len(bins))
				index[key] = b
				bins = append(bins, colourBin{rep: d.cols.first[ci]})
			}
			bins[b].count += d.cols.count[ci]
			binOf[ci] = b
		}
		if len(bins) <= 512 {
			break
		}
		q *= 2
	}
	d.bins, d.binOf = bins, binOf
	return bins, binOf
}

// colourStats fills stats for hue or lightness over the colour bins.
func (d *display) colourStats(c Channel, st *channelStats) {
	n := len(d.idx)
	list, binOf := d.colourBins()
	B := len(list)
	dm := make([]float64, B*B)
	for i := 0; i < B; i++ {
		for j := 0; j < B; j++ {
			if i != j {
				dm[i*B+j] = d.dist(c, list[i].rep, list[j].rep)
			}
		}
	}
	var distractorBins []colourBin
	groupOf, globalOf, restOf := make([]int, B), make([]float64, B), make([]float64, B)
	var hullOf []float64
	var vertex []bool
	if c == Hue {
		hullOf = make([]float64, B)
		vertex = d.hullVertices(list)
	}
	largest := binGroups(list, dm, groupOf)
	st.largest = largest
	var rest []colourBin
	for i, bi := range list {
		restOf[i] = -1
		g := groupOf[i]
		global := math.Inf(1)
		candidate := g <= d.group && g < largest
		if candidate {
			rest = rest[:0]
			for j, bj := range list {
				if i != j && dm[i*B+j] >= 1 {
					global = min(global, dm[i*B+j])
					rest = append(rest, bj)
				}
			}
			restOf[i] = d.colourSpread(c, rest)
			if hullOf != nil {
				hullOf[i] = d.hullBin(i, list, dm, vertex, rest)
				if hullOf[i] >= 1 && len(rest) > d.p.SeparableColours {
					hullOf[i] = math.Inf(1) // separable, but among many colours
				}
			}
			// A set beyond the small groups stands out only from a
			// uniform rest.
			candidate = g <= d.small || restOf[i] < 1
		}
		if !candidate {
			// A mark of a majority or of one of several equal categories
			// has no contrast of its own to stand out by: distinct from its
			// neighbours, it still only belongs to the display's variety.
			restOf[i], global = -1, 0
			distractorBins = append(distractorBins, bi)
		}
		if math.IsInf(global, 1) {
			global = 0
		}
		groupOf[i], globalOf[i] = g, global
	}
	st.rest = make([]float64, n)
	if hullOf != nil {
		st.hull = make([]float64, n)
	}
	for k, ci := range d.cols.of {
		b := binOf[ci]
		st.group[k], st.global[k], st.rest[k] = groupOf[b], globalOf[b], restOf[b]
		if hullOf != nil {
			st.hull[k] = -1
			if restOf[b] >= 0 {
				st.hull[k] = hullOf[b]
			}
		}
	}
	st.spread = d.colourSpread(c, distractorBins)
}

// binGroups fills groupOf with each bin's group, the marks within one
// step of it (itself included), and returns the largest. A highlight is
// smaller than the display's largest group: where every group is as large
// as the largest (three colours of three bars each), the groups are
// categories and none of them stands out.
func binGroups(list []colourBin, dm []float64, groupOf []int) int {
	B, largest := len(list), 0
	for i, bi := range list {
		g := bi.count
		for j, bj := range list {
			if i != j && dm[i*B+j] < 1 {
				g += bj.count
			}
		}
		groupOf[i] = g
		largest = max(largest, g)
	}
	return largest
}

// colourSpread is the 90th percentile of the distractors' distances from
// their mean colour, which, like spread1's half interdecile range,
// measures half the distractors' extent. Computed per colour bin, weighted
// by its marks.
func (d *display) colourSpread(c Channel, distractorBins []colourBin) float64 {
	if len(distractorBins) == 0 {
		return 0
	}
	var mL, mA, mB, f float64
	for _, b := range distractorBins {
		w := float64(b.count)
		l := d.lab[b.rep]
		mL += w * l.L
		mA += w * l.A
		mB += w * l.B
		f += w
	}
	if f <= 1 {
		return 0
	}
	mean := colour.Lab{L: mL / f, A: mA / f, B: mB / f}
	type wd struct{ v, w float64 }
	ds := make([]wd, 0, len(distractorBins))
	for _, b := range distractorBins {
		l, nd := d.lab[b.rep], d.nd[b.rep]
		var v float64
		if c == Hue {
			v = math.Hypot((l.A-mean.A)/nd[1], (l.B-mean.B)/nd[2])
		} else {
			v = math.Abs(l.L-mean.L) / nd[0]
		}
		ds = append(ds, wd{v, float64(b.count)})
	}
	sort.Slice(ds, func(i, j int) bool { return ds[i].v < ds[j].v })
	// The value at rank round(0.9·(f−1)) of the expanded list.
	target := math.Round(0.9 * (f - 1))
	acc := 0.0
	for _, x := range ds {
		acc += x.w
		if acc > target {
			return x.v
		}
	}
	return 0
}
