package perception

import (
	"math"
	"sort"
	"sync"

	"standout/perception/colour"
)

// Fix is a suggested change for a failed emphasis.
type Fix struct {
	// Kind is "recolour-emphasis" or "mute-others".
	Kind string
	// CSS is a ready-to-paste declaration, e.g. "fill: #1a5fb4": fill for
	// filled marks and text, stroke for lines, rules and unfilled points.
	CSS string
	// Marks are the marks the declaration is for.
	Marks []int
	// Alternative, when no colour makes the emphasis pop for every
	// reader, is a second cue to add instead: words, not verified by the
	// model, which judges colour, size, orientation and shape only.
	Alternative string
	// Colour is the suggested colour.
	Colour colour.SRGB
	// Margin is, per vision type, the smallest noticeable-difference
	// distance (in units of ND) between the emphasis and any other mark
	// after the change.
	Margin map[string]float64
	// Verified is true when the analysis, re-run with the change, finds
	// the emphasis popping out for every vision type.
	Verified bool
}

// suggestFix searches the sRGB gamut on a CIELAB grid for the emphasis
// colour that maximises the worst-case noticeable difference from the
// other marks across normal vision and every CVD type, keeping at least
// 3:1 against the background (WCAG SC 1.4.11). It also tries muting the
// other marks to one grey; the better of the two that verifies is
// returned.
func suggestFix(in Input, p Params, em []int, res *Result) *Fix {
	if len(em) == 0 {
		return nil
	}
	fs := newFixSearch(in, p, em)
	if fs == nil {
		return nil
	}
	var fixes []*Fix
	if f := fs.recolour(res); f != nil {
		fixes = append(fixes, f)
	}
	if f := fs.mute(res); f != nil {
		fixes = append(fixes, f)
	}
	// Prefer the change that touches fewest marks: recolouring the
	// emphasis, when it works for every reader; else muting the others;
	// else whichever gets closer.
	var pick *Fix
	for _, f := range fixes {
		if f.Verified && f.Kind == "recolour-emphasis" {
			return f
		}
	}
	for _, f := range fixes {
		if pick == nil || f.Verified && !pick.Verified || f.Verified == pick.Verified && minMargin(f) > minMargin(pick) {
			pick = f
		}
	}
	if pick != nil && !pick.Verified {
		pick.Alternative = "No colour found makes the emphasis stand out for every reader: add a second cue as well, such as a direct label beside it, a thick dark outline (stroke: #2b2b2b; stroke-width: 2px) or a different shape."
	}
	return pick
}

// property is the CSS property that paints a mark's colour.
func property(m *Mark) string {
	if m.Kind != "text" && (m.Kind == "line" || m.Kind == "rule" || m.Type == colour.Line) {
		return "stroke"
	}
	return "fill"
}

// fixSearch holds what both fixes search over: the emphasis, the other
// marks' colours simulated for each vision type, and the noticeable
// difference at the emphasis's size.
type fixSearch struct {
	in        Input
	p         Params
	em        []int
	isEm      map[int]bool
	kind      string
	target    Mark
	nd        [3]float64
	simOthers [][]colour.Lab
}

// newFixSearch prepares the search; nil when no other mark of the
// emphasis's kind has a colour to differ from.
func newFixSearch(in Input, p Params, em []int) *fixSearch {
	fs := &fixSearch{in: in, p: p, em: em, isEm: map[int]bool{}, kind: in.Marks[em[0]].Kind, target: in.Marks[em[0]]}
	for _, i := range em {
		fs.isEm[i] = true
	}
	var others []colour.SRGB
	seen := map[colour.SRGB]bool{}
	for i, m := range in.Marks {
		if m.Kind == fs.kind && !fs.isEm[i] && !seen[m.Colour] {
			seen[m.Colour] = true
			others = append(others, m.Colour)
		}
	}
	if len(others) == 0 {
		return nil
	}
	fs.nd = p.ND.For(fs.target.Type, fs.target.MinPx, fs.target.MaxPx)
	fs.simOthers = make([][]colour.Lab, len(Visions))
	for vi, v := range Visions {
		for _, o := range others {
			fs.simOthers[vi] = append(fs.simOthers[vi], fs.sim(v, o))
		}
	}
	return fs
}

// shown is the colour a reader sees when the page paints c at alpha over
// the background: a fix's rule changes the colour, not the opacity the
// author gave the mark or its groups.
func (fs *fixSearch) shown(c colour.SRGB, alpha float64) colour.SRGB {
	if alpha > 0 && alpha < 0.995 {
		return colour.Over(colour.RGBA{SRGB: c, A: 1}, alpha, fs.in.Background)
	}
	return c
}

func (fs *fixSearch) sim(v colour.Deficiency, c colour.SRGB) colour.Lab {
	return colour.SRGBToLab(colour.Simulate(v, fs.p.Severity, c))
}

// worst is the smallest margin, in noticeable differences, between c and
// the other marks' colours over every vision type, and the margin per type.
func (fs *fixSearch) worst(c colour.SRGB) (float64, map[string]float64) {
	w := math.Inf(1)
	m := map[string]float64{}
	for vi, v := range Visions {
		sc := fs.sim(v, c)
		mv := math.Inf(1)
		for _, o := range fs.simOthers[vi] {
			mv = min(mv, colour.NDUnits(sc, o, fs.nd))
		}
		m[v.String()] = mv
		w = min(w, mv)
	}
	return w, m
}

// worstBelow is worst's smallest margin alone, for a search that needs
// it only where it reaches floor: once the margin is known to lie below
// floor, it stops and returns a value below floor (the margin so far).
func (fs *fixSearch) worstBelow(c colour.SRGB, floor float64) float64 {
	w := math.Inf(1)
	for vi, v := range Visions {
		sc := fs.sim(v, c)
		for _, o := range fs.simOthers[vi] {
			if w = min(w, colour.NDUnits(sc, o, fs.nd)); w < floor {
				return w
			}
		}
	}
	return w
}

// recolour searches CIELAB on a grid for the in-gamut colour, at 3:1
// against the background, that is farthest from the other marks for the
// worst-off vision type.
func (fs *fixSearch) recolour(res *Result) *Fix {
	type cand struct {
		c    colour.SRGB
		w, d float64
	}
	var cands []cand
	best := -1
	// A candidate whose margin lies below the best one's and below the
	// colour margin can be neither chosen nor offered: it is not kept.
	floor := math.Inf(-1)
	own := colour.SRGBToLab(fs.target.Colour)
	for _, c := range recolourGrid() {
		seen := fs.shown(c, fs.target.Alpha)
		if colour.ContrastRatio(seen, fs.in.Background) < colour.NonTextContrast {
			continue
		}
		w := fs.worstBelow(seen, floor)
		if w < floor {
			continue
		}
		cands = append(cands, cand{c, w, colour.DeltaE2000(colour.SRGBToLab(seen), own)})
		if best < 0 || w > cands[best].w {
			best = len(cands) - 1
		}
		floor = min(cands[best].w, fs.p.ColourMargin)
	}
	if best < 0 || cands[best].w <= 0 {
		return nil
	}
	// Nearest the author's own colour first, among those that leave every
	// reader the colour margin: the highlight keeps its hue family where
	// that can work. Else the colour that does best for the worst-off.
	var near []cand
	for _, c := range cands {
		if c.w >= fs.p.ColourMargin {
			near = append(near, c)
		}
	}
	sort.Slice(near, func(i, j int) bool { return near[i].d < near[j].d })
	for _, c := range append(near[:min(len(near), 4)], cands[best]) {
		if f := fs.recolourWith(res, quantise(c.c)); f.Verified || c == cands[best] {
			return f
		}
	}
	return nil
}

// recolourColours is recolourGrid's grid, converted once (sync.Once
// rather than the generic OnceValue, which adds 5 KB to the .wasm).
var (
	recolourOnce    sync.Once
	recolourColours []colour.SRGB
)

// recolourGrid is the grid recolour searches: CIELAB from L* 20 to 90 in
// steps of 5 and a*, b* from -96 to 96 in steps of 8, the in-gamut
// points in sRGB, in that order. It is the same for every chart, so it is
// converted once.
func recolourGrid() []colour.SRGB {
	recolourOnce.Do(func() {
		for L := 20.0; L <= 90; L += 5 {
			for a := -96.0; a <= 96; a += 8 {
				for b := -96.0; b <= 96; b += 8 {
					if c := colour.LabToSRGB(colour.Lab{L: L, A: a, B: b}); c.InGamut() {
						recolourColours = append(recolourColours, c.Clamped())
					}
				}
			}
		}
	})
	return recolourColours
}

// recolourWith is the fix that paints the emphasis c, checked by
// re-running the analysis.
func (fs *fixSearch) recolourWith(res *Result, c colour.SRGB) *Fix {
	_, m := fs.worst(fs.shown(c, fs.target.Alpha))
	f := &Fix{Kind: "recolour-emphasis", CSS: property(&fs.target) + ": " + c.Hex(), Colour: c, Margin: m, Marks: fs.em}
	f.Verified = verify(fs.in, fs.p, fs.em, res, func(i int, mk *Mark) {
		if fs.isEm[i] {
			mk.Colour = fs.shown(c, mk.Alpha)
		}
	})
	return f
}

// muteMinLightness bounds the greys a mute fix offers from below (CIE
// L*): muted marks are quiet ones, never near-black, which would make the
// rest of the chart louder than the emphasis. Provisional.
const muteMinLightness = 40

// mute searches the greys that still meet 3:1 against the background for
// the one farthest from the emphasis for the worst-off vision type.
func (fs *fixSearch) mute(res *Result) *Fix {
	tc := fs.target.Colour
	// The others keep their opacity: judge each grey as it shows through
	// the first other mark's.
	oa := 1.0
	for i, m := range fs.in.Marks {
		if !fs.isEm[i] && m.Kind == fs.kind {
			oa = m.Alpha
			break
		}
	}
	var bestG colour.SRGB
	bestGW := -1.0
	for L := float64(muteMinLightness); L <= 95; L += 2.5 {
		g := colour.LabToSRGB(colour.Lab{L: L}).Clamped()
		seen := fs.shown(g, oa)
		if colour.ContrastRatio(seen, fs.in.Background) < colour.NonTextContrast {
			continue
		}
		w := math.Inf(1)
		for _, v := range Visions {
			w = min(w, colour.NDUnits(fs.sim(v, tc), fs.sim(v, seen), fs.nd))
		}
		if w > bestGW {
			bestG, bestGW = g, w
		}
	}
	if bestGW <= 0 {
		return nil
	}
	g := quantise(bestG)
	m := map[string]float64{}
	for _, v := range Visions {
		m[v.String()] = colour.NDUnits(fs.sim(v, tc), fs.sim(v, fs.shown(g, oa)), fs.nd)
	}
	var others []int
	for i := range fs.in.Marks {
		if !fs.isEm[i] && fs.in.Marks[i].Kind == fs.kind {
			others = append(others, i)
		}
	}
	f := &Fix{Kind: "mute-others", CSS: property(&fs.in.Marks[others[0]]) + ": " + g.Hex(), Colour: g, Margin: m, Marks: others}
	f.Verified = verify(fs.in, fs.p, fs.em, res, func(i int, mk *Mark) {
		if !fs.isEm[i] && mk.Kind == fs.kind {
			mk.Colour = fs.shown(g, mk.Alpha)
		}
	})
	return f
}

func minMargin(f *Fix) float64 {
	m := math.Inf(1)
	for _, v := range f.Margin {
		m = min(m, v)
	}
	return m
}

// quantise rounds a colour to 8 bits, as CSS will.
func quantise(c colour.SRGB) colour.SRGB {
	r, g, b := c.RGB8()
	return colour.SRGB8(r, g, b)
}

// verify re-runs salience with a change applied and reports whether every
// emphasised mark pops for every vision type.
func verify(in Input, p Params, em []int, res *Result, change func(int, *Mark)) bool {
	marks := append([]Mark(nil), in.Marks...)
	for i := range marks {
		change(i, &marks[i])
	}
	kind := in.Marks[em[0]].Kind
	// The marks of the kind in the analysis's order, which its
	// neighbour lists and shared channels index.
	idx := res.kinds[kind]
	// The emphasis's positions there (as before, 0 for a mark of
	// another kind).
	isEm := make(map[int]bool, len(em))
	for _, i := range em {
		isEm[i] = true
	}
	pos := make(map[int]int, len(em))
	for p, i := range idx {
		if isEm[i] {
			pos[i] = p
		}
	}
	// Positions, sizes, orientations and shapes do not change with a colour
	// fix: the analysis's neighbours and those channels are reused; the
	// colours are the fix's own.
	nb, reuse := res.nbs[kind], res.reuse[kind]
	var sh *shared
	if s := res.shares[kind]; s != nil {
		c := *s
		c.cols = nil
		sh = &c
	}
	if nb == nil {
		nb = neighbours(marks, idx, p.Neighbours, p.Kept)
	}
	if reuse == nil || !reuse.have {
		reuse = &reuseData{}
	}
	var targets []int
	for _, i := range em {
		targets = append(targets, pos[i])
	}
	for _, v := range Visions {
		d := newDisplayShared(&p, marks, idx, in.Background, v, p.Severity, sh)
		d.nb, d.reuse = nb, reuse
		if reuse.have {
			for _, r := range d.judgeSome(targets) {
				if r.Verdict != Pops {
					return false
				}
			}
			continue
		}
		r := d.judge()
		for _, i := range em {
			if r[pos[i]].Verdict != Pops {
				return false
			}
		}
	}
	return true
}
