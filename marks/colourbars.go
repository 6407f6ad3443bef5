package marks

import (
	"math"
	"slices"
	"sort"
	"standout/snapshot"
)

// Colour bars: the legend of a continuous colour scale. Generators draw
// the ramp as one gradient-filled rectangle, as a strip of small
// rectangles in graded colours, or as a raster image, and often add an
// outline, a background and handles for the range. None of it is data.

// colourBars sets aside the ramps, then the outlines, backgrounds and
// handles that belong to them.
func colourBars(h *Heuristics, ch *Chart, cands []*cand) {
	var ramps [][4]float64
	ramps = append(ramps, colourRamps(h, cands)...)
	ramps = append(ramps, colourStrips(h, cands)...)
	for _, b := range ch.images {
		if max(b[2], b[3]) >= h.RampMinAspect*min(b[2], b[3]) {
			ramps = append(ramps, b)
		}
	}
	for _, r := range ramps {
		rampParts(h, cands, r)
	}
}

// colourRamps: a gradient-filled rectangle whose paint no other shape
// shares, much longer than wide, is a colour ramp in a legend.
func colourRamps(h *Heuristics, cands []*cand) [][4]float64 {
	paintCount := map[uint32]int{}
	for _, c := range cands {
		if c.role == RoleMark && c.n.Fill.Kind == snapshot.PaintServer {
			paintCount[c.n.Fill.RGBA]++
		}
	}
	var out [][4]float64
	for _, c := range cands {
		if c.role != RoleMark || c.n.Fill.Kind != snapshot.PaintServer || c.g.Shape != ShapeSquare || paintCount[c.n.Fill.RGBA] != 1 {
			continue
		}
		b := c.g.BBox
		if max(b[2], b[3]) >= h.RampMinAspect*min(b[2], b[3]) {
			c.role = RoleLegend
			out = append(out, b)
		}
	}
	return out
}

// colourStrips: at least RampMinCells equal rectangles of one parent,
// abutting end to end in a strip RampMinAspect times longer than thick,
// their colours running monotonically from light to dark (or back), and
// no other rectangle of their size beside them (a heat map's column has
// other columns), are a colour ramp drawn in steps.
func colourStrips(h *Heuristics, cands []*cand) [][4]float64 {
	type size struct {
		parent int32
		w, h   int64
	}
	groups := map[size][]*cand{}
	for _, c := range cands {
		if c.role == RoleMark && c.g.Shape == ShapeSquare && c.n.Fill.Kind == snapshot.PaintColour {
			k := size{c.n.Parent, int64(math.Round(c.g.BBox[2] * 2)), int64(math.Round(c.g.BBox[3] * 2))}
			groups[k] = append(groups[k], c)
		}
	}
	var out [][4]float64
	for _, grp := range groups {
		if len(grp) < h.RampMinCells {
			continue
		}
		if b, ok := strip(h, grp); ok {
			for _, c := range grp {
				c.role = RoleLegend
			}
			out = append(out, b)
		}
	}
	return out
}

// strip reports whether equal rectangles abut in one row or column with
// graded colours, and gives the strip's box.
func strip(h *Heuristics, grp []*cand) ([4]float64, bool) {
	b0 := grp[0].g.BBox
	vertical := true
	for _, c := range grp {
		b := c.g.BBox
		if math.Abs(b[0]-b0[0]) > 0.5 {
			vertical = false
		}
	}
	horizontal := true
	for _, c := range grp {
		if math.Abs(c.g.BBox[1]-b0[1]) > 0.5 {
			horizontal = false
		}
	}
	if vertical == horizontal {
		return [4]float64{}, false
	}
	at := func(c *cand) float64 { return c.g.BBox[1] }
	step, thick := b0[3], b0[2]
	if horizontal {
		at, step, thick = func(c *cand) float64 { return c.g.BBox[0] }, b0[2], b0[3]
	}
	order := slices.Clone(grp)
	sort.Slice(order, func(i, j int) bool { return at(order[i]) < at(order[j]) })
	for i := 1; i < len(order); i++ {
		if gap := at(order[i]) - at(order[i-1]) - step; math.Abs(gap) > 1 {
			return [4]float64{}, false
		}
	}
	length := at(order[len(order)-1]) + step - at(order[0])
	if length < h.RampMinAspect*thick || !graded(order) {
		return [4]float64{}, false
	}
	return unionBox(order), true
}

// graded: the colours' luma runs one way along the strip, never back by
// more than 2 of 255.
func graded(order []*cand) bool {
	luma := func(c *cand) float64 {
		v := c.n.Fill.RGBA
		return 0.2126*float64(uint8(v>>24)) + 0.7152*float64(uint8(v>>16)) + 0.0722*float64(uint8(v>>8))
	}
	up, down := true, true
	for i := 1; i < len(order); i++ {
		d := luma(order[i]) - luma(order[i-1])
		up = up && d >= -2
		down = down && d <= 2
	}
	return (up || down) && luma(order[0]) != luma(order[len(order)-1])
}

// rampParts: a closed shape on the ramp's box (its outline or background)
// and small closed shapes touching it (range handles, at most twice the
// ramp's thickness) are parts of the colour bar.
func rampParts(h *Heuristics, cands []*cand, r [4]float64) {
	thick := min(r[2], r[3])
	near := func(b [4]float64, tol float64) bool {
		return b[0] <= r[0]+r[2]+tol && b[0]+b[2] >= r[0]-tol && b[1] <= r[1]+r[3]+tol && b[1]+b[3] >= r[1]-tol
	}
	for _, c := range cands {
		if c.role != RoleMark || !c.g.Closed {
			continue
		}
		b := c.g.BBox
		on := math.Abs(b[0]-r[0]) <= 1.5 && math.Abs(b[1]-r[1]) <= 1.5 && math.Abs(b[2]-r[2]) <= 3 && math.Abs(b[3]-r[3]) <= 3
		handle := max(b[2], b[3]) <= 2*thick && near(b, h.AlignTol+1)
		if on || handle {
			c.role = coverRole(c)
		}
	}
}
