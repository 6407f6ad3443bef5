package marks

import (
	"math"
	"sort"
	"standout/snapshot"
)

// Text drawn as outlines. Some generators write each label as a row of
// <use> references to glyph outlines instead of a <text> element (a
// plotting library keeping its own fonts, a vector export of a PDF). Every
// glyph would otherwise be a data mark, and the labels would be missing
// from the legend and the axes. The walk tells glyphs from markers, the
// other common use of <use>, by where the instance's origin sits: a marker
// is drawn around its origin (the datum's position), a glyph on it (the
// text's baseline, at the glyph's left). Glyphs in a row on one baseline
// make one text.

// instance is one <use> instantiation of filled shapes.
type instance struct {
	cands     []*cand
	origin    Point // the instance's origin in page px
	dir       Point // the unit vector its x axis maps to: the run of type
	container int32 // the <use> element's parent
	box       [4]float64
}

// useInstances groups the candidate shapes by the <use> element that
// instantiates them (directly, or through a <symbol>).
func useInstances(s *snapshot.Snapshot, cands []*cand) []*instance {
	byUse := map[int32]*instance{}
	var order []*instance
	for _, c := range cands {
		if c.role != RoleMark {
			continue
		}
		root, use := instanceRoot(s, int32(c.node))
		if use < 0 {
			continue
		}
		in := byUse[use]
		if in == nil {
			m := snapshot.Matrix(s.Nodes[root].CTM)
			ox, oy := m.Apply(0, 0)
			l := math.Hypot(m[0], m[1])
			if !(l > 0) {
				continue
			}
			in = &instance{origin: Point{ox, oy}, dir: Point{m[0] / l, m[1] / l}, container: s.Nodes[use].Parent}
			byUse[use] = in
			order = append(order, in)
		}
		in.cands = append(in.cands, c)
	}
	for _, in := range order {
		in.box = unionBox(in.cands)
	}
	return order
}

// instanceRoot finds the <use> that instantiates node i, and the root of
// what it instantiates (i itself, or the <symbol>'s group above it); use
// is -1 when i is not drawn through a <use>.
func instanceRoot(s *snapshot.Snapshot, i int32) (root, use int32) {
	p := s.Nodes[i].Parent
	if p < 0 {
		return i, -1
	}
	if s.Nodes[p].Tag == "use" {
		return i, p
	}
	if gp := s.Nodes[p].Parent; gp >= 0 && s.Nodes[p].Tag == "g" && s.Nodes[gp].Tag == "use" {
		return p, gp
	}
	return i, -1
}

func unionBox(cs []*cand) [4]float64 {
	x0, y0, x1, y1 := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
	for _, c := range cs {
		b := c.g.BBox
		x0, y0 = min(x0, b[0]), min(y0, b[1])
		x1, y1 = max(x1, b[0]+b[2]), max(y1, b[1]+b[3])
	}
	return [4]float64{x0, y0, x1 - x0, y1 - y0}
}

// glyphPlaced says whether an instance sits on its origin as a glyph on
// its baseline: filled, text-sized, and with the origin behind its middle
// along the run of type and at or below it across, not at its centre as
// a marker's. Along and across follow the instance's own x axis, so
// rotated and mirrored type is read alike.
func glyphPlaced(h *Heuristics, in *instance) bool {
	b := in.box
	if b[2] > h.GlyphMaxSize || b[3] > h.GlyphMaxSize || !(b[2] > 0 || b[3] > 0) {
		return false
	}
	for _, c := range in.cands {
		if !(c.fillA > 0) || c.strokeA > 0 && c.strokeW > 0.2*max(b[2], b[3]) {
			return false
		}
	}
	dx, dy := b[0]+b[2]/2-in.origin.X, b[1]+b[3]/2-in.origin.Y
	if math.Abs(dx) <= 0.15*b[2]+0.5 && math.Abs(dy) <= 0.15*b[3]+0.5 {
		return false // centred: a marker
	}
	u := in.dir
	along := dx*u.X + dy*u.Y
	up := dx*u.Y - dy*u.X // towards the glyph's top: u turned a quarter against the clock
	return along >= 0 && up >= 0
}

// glyphRuns finds the texts drawn as glyph outlines: glyph instances of
// one container on one baseline, each starting within GlyphGap ems of the
// last one's end. Their shapes become RoleGlyph, and each run a text
// candidate for the text rules.
func glyphRuns(h *Heuristics, s *snapshot.Snapshot, cands []*cand) []*cand {
	var glyphs []*instance
	for _, in := range useInstances(s, cands) {
		if glyphPlaced(h, in) {
			glyphs = append(glyphs, in)
		}
	}
	// Runs form per container, in document order (uses keep it).
	sort.SliceStable(glyphs, func(i, j int) bool { return glyphs[i].container < glyphs[j].container })
	var texts []*cand
	for i := 0; i < len(glyphs); {
		j := i + 1
		for j < len(glyphs) && sameRun(h, glyphs[j-1], glyphs[j]) {
			j++
		}
		texts = append(texts, runText(glyphs[i:j]))
		i = j
	}
	return texts
}

// sameRun: b continues a's line of type.
func sameRun(h *Heuristics, a, b *instance) bool {
	if a.container != b.container {
		return false
	}
	em := max(a.box[3], b.box[3], 1)
	u := a.dir
	if math.Abs(u.X-b.dir.X) > 0.01 || math.Abs(u.Y-b.dir.Y) > 0.01 {
		return false
	}
	// b's origin measured from a's: ahead along the run, on its baseline,
	// and within the gap of a's far edge.
	dx, dy := b.origin.X-a.origin.X, b.origin.Y-a.origin.Y
	along, across := dx*u.X+dy*u.Y, dx*u.Y-dy*u.X
	reach := 0.0 // how far a's box reaches along the run
	for _, x := range []float64{a.box[0], a.box[0] + a.box[2]} {
		for _, y := range []float64{a.box[1], a.box[1] + a.box[3]} {
			reach = max(reach, (x-a.origin.X)*u.X+(y-a.origin.Y)*u.Y)
		}
	}
	em = max(em, a.box[2], b.box[2])
	return math.Abs(across) <= 0.1*em+0.5 && along >= 0 && along-reach <= h.GlyphGap*em
}

// runText makes a text candidate of a run of glyphs. Its font size comes
// from the tallest glyph, taken for a capital or an ascender (0.73 em in
// common sans-serif faces; common practice).
func runText(run []*instance) *cand {
	var all []*cand
	for _, in := range run {
		for _, c := range in.cands {
			c.role = RoleGlyph
			all = append(all, c)
		}
	}
	box := unionBox(all)
	tallest := 0.0
	for _, in := range run {
		tallest = max(tallest, in.box[3])
	}
	o := run[0].origin
	first := all[0]
	nd := &snapshot.Node{Parent: run[0].container, Tag: "text", Name: first.n.Name, Text: OutlinedText,
		Fill: first.n.Fill, FillOpacity: first.n.FillOpacity, Opacity: first.n.Opacity, CTM: snapshot.IdentityMatrix,
		Geom: []float64{o.X, o.Y, tallest / 0.73, 400}, BBox: box[:], Class: first.n.Class}
	return &cand{node: first.node, n: nd, opacity: first.opacity, fillA: first.fillA, label: first.label, textPos: o}
}

// OutlinedText stands for the content of a text drawn as glyph outlines,
// which the walk cannot read back.
const OutlinedText = "(text drawn as outlines)"
