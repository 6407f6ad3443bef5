package marks

import (
	"errors"
	"math"
	"slices"
	"sort"
	"standout/snapshot"
	"strconv"
	"strings"
)

// Kind is what a data mark is.
type Kind string

// Mark kinds.
const (
	KindPoint Kind = "point"
	KindBar   Kind = "bar"
	KindCell  Kind = "cell"
	KindArc   Kind = "arc"
	KindLine  Kind = "line"
	KindArea  Kind = "area"
	KindRule  Kind = "rule"
	KindText  Kind = "text"
)

// Discrete reports whether marks of this kind are counted one per datum
// (points, bars, cells, arcs).
func (k Kind) Discrete() bool {
	return k == KindPoint || k == KindBar || k == KindCell || k == KindArc
}

// Role is what an element the walk sets aside is; RoleMark is a data mark.
type Role string

// Roles.
const (
	RoleMark        Role = ""
	RoleBackground  Role = "background"   // a rectangle behind most of the drawing or of a facet, filled
	RoleFrame       Role = "frame"        // the same, unfilled
	RoleTick        Role = "tick"         // a short segment in a lined-up group
	RoleGridline    Role = "gridline"     // a long segment in a lined-up group
	RoleAxis        Role = "axis"         // a long line that ticks hang from
	RoleLabel       Role = "label"        // text that labels an axis, a title or an annotation
	RoleLegend      Role = "legend"       // a legend swatch (kept in Chart.Legend)
	RoleLegendLabel Role = "legend-label" // a legend swatch's text
	RoleHelper      Role = "helper"       // a shape that paints nothing
	RoleHidden      Role = "hidden"       // not rendered, invisible or fully transparent
	RoleImage       Role = "image"        // a raster image
	RoleGlyph       Role = "glyph"        // a letter's outline, part of a text drawn as outlines
)

// Mark is one data mark with its effective paint and geometry in page px.
type Mark struct {
	ID    string
	Node  int
	Kind  Kind
	Shape Shape
	// Fill and Stroke are the paints as declared (packed 0xRRGGBBAA), nil
	// for none. For a gradient or pattern they hold the central colour and
	// FillStops every colour it paints.
	Fill, Stroke *uint32
	FillStops    []uint32
	// FillOpacity and StrokeOpacity are the paint alphas (colour alpha ×
	// fill-opacity or stroke-opacity); Opacity is the product of the
	// element's and every ancestor's opacity.
	FillOpacity, StrokeOpacity, Opacity float64
	StrokeWidth                         float64 // page px
	BBox                                [4]float64
	Area                                float64
	Centroid                            Point
	// Size is the channel value for size: area for points, cells, arcs and
	// areas; length along the value axis for bars and rules; stroke width
	// for lines; font size for text.
	Size  float64
	Angle float64
	Fold  int
	// Text is the content of a text mark; Label the <title> or aria-label.
	Text, Label string
	// Class is the element's class attribute (snapshot.Node.Class).
	Class string
	// Weight is a text mark's font weight (1–1000; 400 is normal, 700
	// bold), 0 for other marks.
	Weight float64
	// Vertices of a line mark (page px), for connectedness.
	Vertices []Point
}

// Chart is what Walk makes of a snapshot.
type Chart struct {
	Path       string
	Title      string // the chart's name for people (snapshot.Snapshot.Title)
	Anchor     string // a selector for the root <svg> (snapshot.Snapshot.Anchor)
	Source     string
	Box        [4]float64
	Background uint32
	// IsChart is false for icons, logos and empty drawings; Reason says why.
	IsChart bool
	Reason  string
	Marks   []Mark
	// Legend holds the legend swatches, kept apart from the data marks.
	Legend []Mark
	// Furniture counts what was set aside, by role (legend swatches are
	// in Legend instead).
	Furniture map[Role]int
	Problems  []string
	// Selected lists the indices into Marks of the marks that matched the
	// caller's selector, or sit inside an element that did.
	Selected []int

	images [][4]float64 // the boxes of raster images, while walking
}

type cand struct {
	node    int
	n       *snapshot.Node
	g       Geometry
	opacity float64
	fillA   float64
	strokeA float64
	strokeW float64
	label   string
	role    Role
	kind    Kind
	textPos Point
	cloud   bool // a compound path drawing one point per subpath
}

// Walk decides what every element of a chart is: a data mark (and of which
// kind and shape), a legend swatch, or chart furniture. It uses geometry,
// structure and repetition only, never a generator's class names, so it
// works the same on any library's markup and on the static and browser
// snapshots alike.
func Walk(s *snapshot.Snapshot) (*Chart, error) {
	return WalkWith(s, &DefaultHeuristics)
}

// WalkWith is Walk with other thresholds.
func WalkWith(s *snapshot.Snapshot, h *Heuristics) (*Chart, error) {
	if s.Version != snapshot.SnapshotVersion {
		return nil, errors.New("marks: snapshot version " + strconv.Itoa(s.Version) + ", want " + strconv.Itoa(snapshot.SnapshotVersion))
	}
	ch := &Chart{Path: s.Path, Title: s.Title, Anchor: s.Anchor, Source: s.Source, Box: s.Box, Background: s.Background,
		Furniture: map[Role]int{}, Problems: append([]string(nil), s.Problems...)}
	n := len(s.Nodes)
	if n == 0 {
		ch.Reason = "empty drawing"
		return ch, nil
	}
	cands, texts, err := ch.candidates(s)
	if err != nil {
		return nil, err
	}
	texts = append(texts, glyphRuns(h, s, cands)...)
	classifyFurniture(h, ch, cands)
	classifyTexts(h, texts)
	leaderLines(h, cands, texts)
	legendSwatches(h, cands, texts)
	colourBars(h, ch, cands)
	assignKinds(h, cands)
	ch.collect(cands, texts)
	ch.selected(s)
	w, ht := s.Box[2], s.Box[3]
	switch {
	case w > 0 && ht > 0 && w <= h.IconMax && ht <= h.IconMax:
		ch.Reason = "icon-sized drawing (" + strconv.FormatFloat(w, 'f', 0, 64) + "×" + strconv.FormatFloat(ht, 'f', 0, 64) + " px)"
	case ht > 0 && s.Box[1]+ht <= 0:
		// A drawing put above the page's top, as some libraries put the
		// one they measure text in: no reader can scroll to it. (Left of
		// the page is another matter: a right-to-left page scrolls there.)
		ch.Reason = "drawn above the top of the page, where no reader can scroll"
	case len(ch.Marks) == 0:
		ch.Reason = "no data marks"
	default:
		ch.IsChart = true
	}
	return ch, nil
}

// candidates lists the shapes and the texts of a snapshot that are drawn,
// each measured, counting what is hidden or an image as furniture.
func (ch *Chart) candidates(s *snapshot.Snapshot) (cands, texts []*cand, err error) {
	n := len(s.Nodes)
	hidden := make([]bool, n)
	opac := make([]float64, n)
	for i := range s.Nodes {
		nd := &s.Nodes[i]
		p := int(nd.Parent)
		if p >= i || p < -1 {
			return nil, nil, errors.New("marks: snapshot " + s.Path + ": node " + strconv.Itoa(i) + " has parent " + strconv.Itoa(p) + ", which does not precede it")
		}
		hidden[i] = nd.Flags&snapshot.Hidden != 0
		opac[i] = clamp01(nd.Opacity)
		if p >= 0 {
			hidden[i] = hidden[i] || hidden[p]
			opac[i] *= opac[p]
		}
	}
	// <title> children label their parent.
	labels := map[int]string{}
	for i := range s.Nodes {
		nd := &s.Nodes[i]
		if nd.Tag == "title" && nd.Parent >= 0 && labels[int(nd.Parent)] == "" {
			labels[int(nd.Parent)] = nd.Text
		}
	}
	// One slab for all candidates, and room for them in the lists: the
	// walk allocates per chart, not per mark.
	slab := make([]cand, 0, n)
	cands = make([]*cand, 0, n)
	clips, clipped := clipBoxes(s)
	for i := range s.Nodes {
		nd := &s.Nodes[i]
		switch nd.Tag {
		case "circle", "ellipse", "rect", "line", "polyline", "polygon", "path", "text", "image":
		default:
			continue
		}
		if hidden[i] || nd.Flags&snapshot.Invisible != 0 || opac[i] <= 0 {
			ch.Furniture[RoleHidden]++
			continue
		}
		slab = append(slab, cand{node: i, n: nd, opacity: opac[i], label: labels[i]})
		c := &slab[len(slab)-1]
		what := ch.sortOut(c)
		if what != notDrawn && clipped != nil && clipped[i] && outside(clips[i], c) {
			ch.Furniture[RoleHidden]++
			continue
		}
		switch what {
		case isText:
			texts = append(texts, c)
		case isShape:
			cands = append(cands, c)
		}
	}
	return cands, texts, nil
}

// clipBoxes gives each node the page box (x0 y0 x1 y1) that the clip
// regions of it and its ancestors leave (snapshot.ClipTag nodes), and
// whether any clips it; both are nil when nothing in the chart is
// clipped. A region is taken by its bounds in page px, so under a
// rotation it clips less than it does on screen, never more; one that
// is empty or not finite is left out, as if the group were unclipped.
func clipBoxes(s *snapshot.Snapshot) ([][4]float64, []bool) {
	var own map[int32][4]float64
	for i := range s.Nodes {
		nd := &s.Nodes[i]
		if nd.Tag != snapshot.ClipTag || nd.Parent < 0 || len(nd.Geom) != 4 || !(nd.Geom[2] > 0 && nd.Geom[3] > 0) {
			continue
		}
		x, y, w, h := nd.Geom[0], nd.Geom[1], nd.Geom[2], nd.Geom[3]
		m := snapshot.Matrix(nd.CTM)
		b := [4]float64{math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)}
		for _, p := range [4][2]float64{{x, y}, {x + w, y}, {x, y + h}, {x + w, y + h}} {
			px, py := m.Apply(p[0], p[1])
			b = [4]float64{min(b[0], px), min(b[1], py), max(b[2], px), max(b[3], py)}
		}
		if !finiteBox(b) {
			continue
		}
		if own == nil {
			own = map[int32][4]float64{}
		}
		if o, ok := own[nd.Parent]; ok {
			b = meet(o, b)
		}
		own[nd.Parent] = b
	}
	if own == nil {
		return nil, nil
	}
	boxes, clipped := make([][4]float64, len(s.Nodes)), make([]bool, len(s.Nodes))
	for i := range s.Nodes {
		if p := s.Nodes[i].Parent; p >= 0 && clipped[p] {
			boxes[i], clipped[i] = boxes[p], true
		}
		if o, ok := own[int32(i)]; ok {
			if clipped[i] {
				o = meet(boxes[i], o)
			}
			boxes[i], clipped[i] = o, true
		}
	}
	return boxes, clipped
}

// meet is the overlap of two boxes (x0 y0 x1 y1), which may be empty
// (x0 > x1 or y0 > y1).
func meet(a, b [4]float64) [4]float64 {
	return [4]float64{max(a[0], b[0]), max(a[1], b[1]), min(a[2], b[2]), min(a[3], b[3])}
}

// outside reports whether a measured candidate lies wholly outside the
// clip box, its stroke included: nothing of it is drawn. A text is
// taken by its box where the browser measured one, else by its anchor.
func outside(clip [4]float64, c *cand) bool {
	b := c.g.BBox
	if c.n.Tag == "text" {
		b = [4]float64{c.textPos.X, c.textPos.Y, 0, 0}
		if len(c.n.BBox) == 4 {
			b = [4]float64{c.n.BBox[0], c.n.BBox[1], c.n.BBox[2], c.n.BBox[3]}
		}
	}
	pad := c.strokeW / 2
	return b[0]+b[2]+pad < clip[0] || b[0]-pad > clip[2] || b[1]+b[3]+pad < clip[1] || b[1]-pad > clip[3]
}

// collect makes the marks, the legend and the furniture counts of the
// classified candidates, the marks in document order.
func (ch *Chart) collect(cands, texts []*cand) {
	ch.Marks = make([]Mark, 0, len(cands)+len(texts))
	var paints paintSlab
	for _, c := range cands {
		if c.role != RoleMark {
			if c.role != RoleLegend {
				ch.Furniture[c.role]++
			}
			continue
		}
		if c.cloud {
			ch.Marks = cloudMarks(ch.Marks, c, &paints)
			continue
		}
		makeMark(next(&ch.Marks), c, &paints)
	}
	for _, c := range cands {
		if c.role == RoleLegend {
			makeMark(next(&ch.Legend), c, &paints)
		}
	}
	for _, t := range texts {
		if t.role != RoleMark {
			ch.Furniture[t.role]++
			continue
		}
		makeMark(next(&ch.Marks), t, &paints)
	}
	// Usually in order already; a Mark is large to move.
	byNode := func(i, j int) bool { return ch.Marks[i].Node < ch.Marks[j].Node }
	if !sort.SliceIsSorted(ch.Marks, byNode) {
		sort.SliceStable(ch.Marks, byNode)
	}
}

// next appends a zero Mark to *ms and returns it, to be made in place: a
// Mark is 288 bytes, which a Mark returned by value would copy once more.
func next(ms *[]Mark) *Mark {
	*ms = append(*ms, Mark{})
	return &(*ms)[len(*ms)-1]
}

// paintSlab hands out the addresses that marks hold their paints at
// (Mark.Fill and Stroke) from chunks, so that a chart of 5,000 marks
// allocates a few chunks for them rather than one word per paint.
type paintSlab struct{ free []uint32 }

func (s *paintSlab) of(v uint32) *uint32 {
	if len(s.free) == 0 {
		s.free = make([]uint32, 1024)
	}
	p := &s.free[0]
	s.free = s.free[1:]
	*p = v
	return p
}

// selected lists the marks that the snapshot's selection names, or that
// sit inside an element it names.
func (ch *Chart) selected(s *snapshot.Snapshot) {
	if len(s.Selected) == 0 {
		return
	}
	n := len(s.Nodes)
	sel := make([]bool, n)
	for _, k := range s.Selected {
		if k >= 0 && int(k) < n {
			sel[k] = true
		}
	}
	for i := range s.Nodes {
		if p := s.Nodes[i].Parent; p >= 0 && sel[p] {
			sel[i] = true
		}
	}
	for i, m := range ch.Marks {
		if sel[m.Node] {
			ch.Selected = append(ch.Selected, i)
		}
	}
}

// What a visible node's candidate is.
const (
	notDrawn = iota // nothing drawn, an image, or geometry that is not finite
	isText
	isShape
)

// sortOut measures a visible node's candidate and says what it is,
// counting images and reporting bad geometry on ch. It is a function of
// its own because it runs per node: a WebAssembly engine optimises a
// function that is called often, not a loop inside one that runs once.
func (ch *Chart) sortOut(c *cand) int {
	nd := c.n
	if c.label == "" {
		c.label = nd.Label
	}
	scale := math.Sqrt(math.Abs(snapshot.Matrix(nd.CTM).Det()))
	c.strokeW = nd.StrokeWidth * scale
	if nd.Fill.Kind != snapshot.PaintNone {
		c.fillA = float64(uint8(nd.Fill.RGBA)) / 255 * clamp01(nd.FillOpacity)
	}
	if nd.Stroke.Kind != snapshot.PaintNone && c.strokeW > 0 {
		c.strokeA = float64(uint8(nd.Stroke.RGBA)) / 255 * clamp01(nd.StrokeOpacity)
	}
	if nd.Tag == "text" {
		if strings.TrimSpace(nd.Text) == "" {
			return notDrawn
		}
		x, y := 0.0, 0.0
		if len(nd.Geom) >= 2 {
			x, y = nd.Geom[0], nd.Geom[1]
		}
		px, py := snapshot.Matrix(nd.CTM).Apply(x, y)
		c.textPos = Point{px, py}
		return isText
	}
	if nd.Tag == "image" {
		ch.Furniture[RoleImage]++
		if g, ok, _ := Measure(nd); ok && finiteBox(g.BBox) {
			ch.images = append(ch.images, g.BBox)
		}
		return notDrawn
	}
	g, ok, err := Measure(nd)
	if err != nil {
		ch.Problems = append(ch.Problems, nd.Name+": "+err.Error()+"; drawn up to the error")
	}
	if !ok {
		return notDrawn
	}
	if c.fillA > 0 && !g.Closed && nearlyClosed(&g) {
		// A fill closes every subpath (SVG 1.1 §11.3): a circle drawn as
		// one open arc is a filled disc, not a line.
		for i := range g.Subpaths {
			g.Subpaths[i].Closed = true
		}
		g.measurePolys()
	}
	if len(nd.BBox) == 4 {
		g.BBox = [4]float64{nd.BBox[0], nd.BBox[1], nd.BBox[2], nd.BBox[3]}
	}
	c.g = g
	if !finiteBox(g.BBox) || !finiteBox([4]float64{g.Area, g.Angle, g.Centroid.X, g.Centroid.Y}) || math.IsInf(nd.StrokeWidth*scale, 0) {
		ch.Problems = append(ch.Problems, nd.Name+": geometry is not finite; skipped")
		return notDrawn
	}
	if !(c.fillA > 0 && g.Area > 0) && !(c.strokeA > 0) {
		c.role = RoleHelper
	}
	return isShape
}

// nearlyClosed: every open subpath ends within 5% of its size of where it
// started.
func nearlyClosed(g *Geometry) bool {
	for _, s := range g.Subpaths {
		if s.Closed {
			continue
		}
		x0, y0, x1, y1 := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
		for _, p := range s.Pts {
			x0, y0, x1, y1 = min(x0, p.X), min(y0, p.Y), max(x1, p.X), max(y1, p.Y)
		}
		a, b := s.Pts[0], s.Pts[len(s.Pts)-1]
		if len(s.Pts) < 3 || math.Hypot(b.X-a.X, b.Y-a.Y) > 0.05*max(x1-x0, y1-y0) {
			return false
		}
	}
	return true
}

func clamp01(v float64) float64 {
	if !(v > 0) {
		return 0
	}
	if v > 1 {
		return 1
	}
	return v
}

func finiteBox(b [4]float64) bool {
	for _, v := range b {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return false
		}
	}
	return true
}

// straight reports whether an outline is a single open straight segment
// (possibly with collinear interior points), returning its ends.
func straight(g *Geometry) (Point, Point, bool) {
	if g.Closed || len(g.Subpaths) != 1 || g.Info.Curves > 0 {
		return Point{}, Point{}, false
	}
	pts := g.Subpaths[0].Pts
	a, b := pts[0], pts[len(pts)-1]
	if a == b {
		return a, b, false
	}
	for _, p := range pts[1 : len(pts)-1] {
		if !collinear(a, b, p) {
			return a, b, false
		}
	}
	return a, b, true
}

// classifyFurniture sets aside backgrounds, frames, ticks, gridlines and
// axis lines among the shapes, one rule after another.
func classifyFurniture(h *Heuristics, ch *Chart, cands []*cand) {
	backgrounds(h, ch, cands)
	panels(h, ch, cands)
	brackets(h, cands)
	segs := alignedSegments(h, cands)
	grid, tickEnds := ticksAndGridlines(h, cands, segs, gridGroups(h, segs))
	axisLines(h, segs, grid, tickEnds)
	baselines(h, cands, segs)
	spines(h, cands, segs)
	gridEdges(h, segs)
}

// brackets: a long axis-aligned line with a short stub at each end, both
// square to it and on the same side, is an axis line: the path D3's axes
// draw along the axis, with the outer ticks at its ends ("M0,6V0H559V6").
// A data line does not turn back on itself at both ends within a tick's
// length.
func brackets(h *Heuristics, cands []*cand) {
	for _, c := range cands {
		if c.role == RoleMark && isBracket(h, &c.g) {
			c.role = RoleAxis
		}
	}
}

// isBracket reports whether an outline is such a bracket: one open
// subpath of four points (collinear points aside) without curves.
func isBracket(h *Heuristics, g *Geometry) bool {
	if g.Closed || len(g.Subpaths) != 1 || g.Info.Curves > 0 {
		return false
	}
	var pts []Point
	for _, p := range g.Subpaths[0].Pts {
		if n := len(pts); n >= 2 && collinear(pts[n-2], pts[n-1], p) {
			pts[n-1] = p
			continue
		}
		if n := len(pts); n == 0 || pts[n-1] != p {
			pts = append(pts, p)
		}
	}
	if len(pts) != 4 {
		return false
	}
	a, b, c, d := pts[0], pts[1], pts[2], pts[3]
	slack := h.AxisAlignSlack
	level := math.Abs(c.Y-b.Y) <= slack // the long side runs across
	if !level && math.Abs(c.X-b.X) > slack {
		return false
	}
	long := math.Hypot(c.X-b.X, c.Y-b.Y)
	stub := func(from, to Point) (float64, bool) {
		dx, dy := to.X-from.X, to.Y-from.Y
		if level {
			dx, dy = dy, dx
		}
		// Square to the long side: along it by no more than the slack.
		return dx, math.Abs(dy) <= slack && math.Abs(dx) > slack && math.Abs(dx) <= h.TickMaxLen
	}
	s1, ok1 := stub(b, a)
	s2, ok2 := stub(c, d)
	return ok1 && ok2 && s1*s2 > 0 && long >= 2*h.TickMaxLen
}

// collinear reports whether q lies on the line through a and b, within
// half a pixel.
func collinear(a, b, q Point) bool {
	L := math.Hypot(b.X-a.X, b.Y-a.Y)
	return L > 0 && math.Abs((b.X-a.X)*(a.Y-q.Y)-(a.X-q.X)*(b.Y-a.Y))/L <= 0.5
}

// coverRole is the role of a rectangle that covers others: a background
// when filled, else a frame.
func coverRole(c *cand) Role {
	if c.fillA > 0 {
		return RoleBackground
	}
	return RoleFrame
}

// backgrounds: rectangles covering most of the drawing (or of the union of
// the shapes' boxes) are its background or frame.
func backgrounds(h *Heuristics, ch *Chart, cands []*cand) {
	chartArea := ch.Box[2] * ch.Box[3]
	ux0, uy0, ux1, uy1 := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
	nShapes := 0
	for _, c := range cands {
		if c.role != RoleMark {
			continue
		}
		nShapes++
		b := c.g.BBox
		ux0, uy0 = min(ux0, b[0]), min(uy0, b[1])
		ux1, uy1 = max(ux1, b[0]+b[2]), max(uy1, b[1]+b[3])
	}
	unionArea := (ux1 - ux0) * (uy1 - uy0)
	if nShapes < 2 {
		return
	}
	for _, c := range cands {
		if c.role != RoleMark || c.g.Shape != ShapeSquare {
			continue
		}
		a := c.g.BBox[2] * c.g.BBox[3]
		if (chartArea > 0 && a >= h.BackgroundChart*chartArea) || (unionArea > 0 && a >= h.BackgroundUnion*unionArea) {
			c.role = coverRole(c)
		}
	}
}

// panels: rectangles that hold several smaller shapes drawn after them are
// a facet's background or frame.
func panels(h *Heuristics, ch *Chart, cands []*cand) {
	chartArea := ch.Box[2] * ch.Box[3]
	for _, c := range cands {
		if c.role != RoleMark || c.g.Shape != ShapeSquare || c.g.Fold == 0 {
			continue
		}
		b := c.g.BBox
		if b[2]*b[3] < h.PanelMinShare*chartArea {
			continue
		}
		inside := 0
		for _, o := range cands {
			if o == c || o.node < c.node {
				continue
			}
			ob := o.g.BBox
			if ob[2]*ob[3] > h.PanelInnerShare*b[2]*b[3] {
				continue
			}
			if ob[0] >= b[0]-0.5 && ob[1] >= b[1]-0.5 && ob[0]+ob[2] <= b[0]+b[2]+0.5 && ob[1]+ob[3] <= b[1]+b[3]+0.5 {
				if inside++; inside >= h.PanelMinInside {
					break
				}
			}
		}
		if inside >= h.PanelMinInside {
			c.role = coverRole(c)
		}
	}
}

// seg is a straight axis-aligned segment, a the top or left end.
type seg struct {
	c    *cand
	a, b Point
	vert bool
	L    float64
}

// alignedSegments lists the straight, axis-aligned segments among the
// shapes not yet set aside.
func alignedSegments(h *Heuristics, cands []*cand) []seg {
	var segs []seg
	for _, c := range cands {
		if c.role != RoleMark {
			continue
		}
		a, b, ok := straight(&c.g)
		if !ok {
			continue
		}
		dx, dy := math.Abs(b.X-a.X), math.Abs(b.Y-a.Y)
		if dx > h.AxisAlignSlack && dy > h.AxisAlignSlack {
			continue
		}
		vert := dy > dx
		if vert && a.Y > b.Y || !vert && a.X > b.X {
			a, b = b, a
		}
		segs = append(segs, seg{c, a, b, vert, max(dx, dy)})
	}
	return segs
}

// gridGroups finds the segments that come in parallel groups of equal
// length and stroke whose starts or ends line up: ticks and gridlines.
// Groups are formed per parent, then pooled across parents (some
// generators wrap each tick in a <g> of its own). It gives each segment
// its group's number, or -1 outside any group.
func gridGroups(h *Heuristics, segs []seg) []int {
	group := make([]int, len(segs))
	for i := range group {
		group[i] = -1
	}
	groups := 0
	lineUp := func(idx []int) {
		if len(idx) < 2 {
			return
		}
		s0 := segs[idx[0]]
		for _, i := range idx[1:] {
			s := segs[i]
			if s0.vert && math.Abs(s.a.Y-s0.a.Y) > h.AlignTol && math.Abs(s.b.Y-s0.b.Y) > h.AlignTol ||
				!s0.vert && math.Abs(s.a.X-s0.a.X) > h.AlignTol && math.Abs(s.b.X-s0.b.X) > h.AlignTol {
				return
			}
		}
		for _, i := range idx {
			group[i] = groups
		}
		groups++
	}
	type key struct {
		vert   bool
		parent int32
		L      int64
		stroke uint32
	}
	byParent := map[key][]int{}
	for i, s := range segs {
		k := key{s.vert, s.c.n.Parent, int64(math.Round(s.L * 2)), s.c.n.Stroke.RGBA}
		byParent[k] = append(byParent[k], i)
	}
	for _, idx := range byParent {
		lineUp(idx)
	}
	// Pooled across parents, by where they start and then by where they
	// end: two axes' ticks of one length form two groups.
	for _, end := range []bool{false, true} {
		pooled := map[key][]int{}
		for i, s := range segs {
			if group[i] >= 0 {
				continue
			}
			p := s.a
			if end {
				p = s.b
			}
			at := p.X
			if s.vert {
				at = p.Y
			}
			k := key{s.vert, int32(math.Round(at)), int64(math.Round(s.L * 2)), s.c.n.Stroke.RGBA}
			pooled[k] = append(pooled[k], i)
		}
		for _, idx := range pooled {
			if len(idx) >= h.PooledGroupMin && len(idx) <= h.PooledGroupMax {
				lineUp(idx)
			}
		}
	}
	return group
}

// throughCentres counts (up to two) the closed shapes centred on the
// segment at one of its ends, as a connector joins two dots; a gridline
// that happens to cross the centres of scattered points does not count.
func throughCentres(h *Heuristics, s seg, cands []*cand) int {
	n := 0
	tol := s.c.strokeW/2 + h.ThroughTol
	for _, o := range cands {
		if o == s.c || o.role != RoleMark || !o.g.Closed {
			continue
		}
		c := o.g.Centroid
		reach := tol + max(o.g.BBox[2], o.g.BBox[3])/2
		onLine := s.vert && math.Abs(c.X-s.a.X) <= tol || !s.vert && math.Abs(c.Y-s.a.Y) <= tol
		atEnd := math.Hypot(c.X-s.a.X, c.Y-s.a.Y) <= reach || math.Hypot(c.X-s.b.X, c.Y-s.b.Y) <= reach
		if onLine && atEnd {
			if n++; n >= 2 {
				break
			}
		}
	}
	return n
}

// ticksAndGridlines gives the grouped segments their roles: short ones are
// ticks, long ones gridlines, unless most of a group's long segments pass
// through the centres of two data shapes each, which the group then
// connects (a dumbbell chart's connectors). A group decides as one: a
// gridline among lined-up siblings whose ends happen to meet two
// scattered points stays a gridline. It reports which segments are ticks
// or gridlines, and the ticks' ends.
func ticksAndGridlines(h *Heuristics, cands []*cand, segs []seg, group []int) (grid []bool, tickEnds []Point) {
	long, through := map[int]int{}, map[int]int{}
	for i, s := range segs {
		if g := group[i]; g >= 0 && s.L >= h.TickMaxLen {
			long[g]++
			if throughCentres(h, s, cands) >= 2 {
				through[g]++
			}
		}
	}
	grid = make([]bool, len(segs))
	for i, s := range segs {
		g := group[i]
		switch {
		case g < 0:
		case s.L >= h.TickMaxLen && 2*through[g] > long[g]:
		case s.L < h.TickMaxLen:
			grid[i] = true
			s.c.role = RoleTick
			tickEnds = append(tickEnds, s.a, s.b)
		default:
			grid[i] = true
			s.c.role = RoleGridline
		}
	}
	return grid, tickEnds
}

// axisLines: a long line that ticks hang from is an axis line.
func axisLines(h *Heuristics, segs []seg, grid []bool, tickEnds []Point) {
	for i, s := range segs {
		if grid[i] || s.c.role != RoleMark {
			continue
		}
		touching := 0
		for _, p := range tickEnds {
			if s.vert && math.Abs(p.X-s.a.X) <= h.AlignTol && p.Y >= s.a.Y-h.AlignTol && p.Y <= s.b.Y+h.AlignTol ||
				!s.vert && math.Abs(p.Y-s.a.Y) <= h.AlignTol && p.X >= s.a.X-h.AlignTol && p.X <= s.b.X+h.AlignTol {
				touching++
			}
		}
		if touching >= h.AxisTickTouches {
			s.c.role = RoleAxis
		}
	}
}

// baselines: a line that bars stand on (or hang from, or start at, for
// horizontal bars) is the value axis's baseline.
func baselines(h *Heuristics, cands []*cand, segs []seg) {
	for _, s := range segs {
		if s.c.role != RoleMark {
			continue
		}
		tol := h.AlignTol + s.c.strokeW/2
		on := 0
		for _, o := range cands {
			if o == s.c || o.role != RoleMark || o.g.Shape != ShapeSquare || !o.g.Closed {
				continue
			}
			b := o.g.BBox
			if s.vert {
				if (math.Abs(b[0]-s.a.X) <= tol || math.Abs(b[0]+b[2]-s.a.X) <= tol) && b[1] >= s.a.Y-tol && b[1]+b[3] <= s.b.Y+tol {
					on++
				}
			} else if (math.Abs(b[1]-s.a.Y) <= tol || math.Abs(b[1]+b[3]-s.a.Y) <= tol) && b[0] >= s.a.X-tol && b[0]+b[2] <= s.b.X+tol {
				on++
			}
			if on >= h.BaselineBars {
				s.c.role = RoleAxis
				break
			}
		}
	}
}

// spines: a long line along an edge of the data, with every data mark on
// one side of it, that meets another such line or an axis line at a
// corner is an axis line or a side of the plot's frame (a spine) drawn
// without ticks. A rule among the data has marks on both sides, and a
// lone line beyond them (a target, a threshold) meets no other. It must
// span SpineMinSpan of the marks' extent along it.
func spines(h *Heuristics, cands []*cand, segs []seg) {
	isSeg := map[*cand]bool{}
	for _, s := range segs {
		isSeg[s.c] = true
	}
	var data []*cand
	for _, c := range cands {
		if c.role == RoleMark && !isSeg[c] {
			data = append(data, c)
		}
	}
	if len(data) < 2 {
		return
	}
	extent := unionBox(data)
	var edges, axes []seg
	for _, s := range segs {
		switch {
		case s.c.role == RoleAxis || s.c.role == RoleFrame:
			axes = append(axes, s)
		case s.c.role == RoleMark && alongEdge(h, s, data, extent):
			edges = append(edges, s)
		}
	}
	for _, s := range edges {
		for _, o := range append(axes, edges...) {
			if o.vert != s.vert && cornerMeet(h, s, o) {
				s.c.role = RoleAxis
				break
			}
		}
	}
}

// gridEdges: a line on the outermost gridline of its direction, end to
// end with it, is an axis line (gridEdge).
func gridEdges(h *Heuristics, segs []seg) {
	var grid []seg
	for _, s := range segs {
		if s.c.role == RoleGridline {
			grid = append(grid, s)
		}
	}
	for _, s := range segs {
		if s.c.role == RoleMark && gridEdge(h, s, grid) {
			s.c.role = RoleAxis
		}
	}
}

// gridEdge: s lies on a gridline of its own direction, end to end, and no
// parallel gridline lies beyond it: it is the axis line drawn over the
// grid's outermost line, as libraries draw an axis without ticks (a
// legend below the plot may keep it from being an edge of the marks). A
// rule drawn there, end to end with the grid, would look the same.
func gridEdge(h *Heuristics, s seg, grid []seg) bool {
	tol := h.AlignTol + s.c.strokeW/2
	pos := func(g seg) (at, a, b float64) {
		if g.vert {
			return g.a.X, g.a.Y, g.b.Y
		}
		return g.a.Y, g.a.X, g.b.X
	}
	at, a, b := pos(s)
	on, before, after := false, 0, 0
	for _, g := range grid {
		if g.vert != s.vert {
			continue
		}
		gat, ga, gb := pos(g)
		switch d := gat - at; {
		case math.Abs(d) <= tol && math.Abs(ga-a) <= tol && math.Abs(gb-b) <= tol:
			on = true
		case d < -tol:
			before++
		case d > tol:
			after++
		}
	}
	return on && (before == 0 || after == 0)
}

// alongEdge: s spans SpineMinSpan of the data's extent and has every
// data mark's centre on one side.
func alongEdge(h *Heuristics, s seg, data []*cand, extent [4]float64) bool {
	tol := h.AlignTol + s.c.strokeW/2
	at, span := s.a.Y, extent[2]
	if s.vert {
		at, span = s.a.X, extent[3]
	}
	if s.L < h.SpineMinSpan*span {
		return false
	}
	before, after := 0, 0
	for _, c := range data {
		v := c.g.Centroid.Y
		if s.vert {
			v = c.g.Centroid.X
		}
		if v < at-tol {
			before++
		} else if v > at+tol {
			after++
		}
	}
	return before == 0 || after == 0
}

// cornerMeet: an end of s touches an end of the perpendicular o.
func cornerMeet(h *Heuristics, s, o seg) bool {
	tol := h.AlignTol + max(s.c.strokeW, o.c.strokeW)
	for _, p := range []Point{s.a, s.b} {
		for _, q := range []Point{o.a, o.b} {
			if math.Abs(p.X-q.X) <= tol && math.Abs(p.Y-q.Y) <= tol {
				return true
			}
		}
	}
	return false
}

// classifyTexts sets aside labels and titles; what remains are text marks.
// Texts of one parent that line up evenly in a row or a column of at
// least LabelGroupMin are axis or legend labels: one parent may hold both
// axes' labels. Texts that share both a row and a column with others are
// a table of values, and a group with LabelGroupMin of those is one. A
// lone text is a title or annotation label; of the rest, groups of at
// least LabelGroupMin are direct labels of data.
func classifyTexts(h *Heuristics, texts []*cand) {
	byParent := map[int32][]*cand{}
	for _, t := range texts {
		byParent[t.n.Parent] = append(byParent[t.n.Parent], t)
	}
	x := func(t *cand) float64 { return t.textPos.X }
	y := func(t *cand) float64 { return t.textPos.Y }
	for _, ts := range byParent {
		if len(ts) < h.LabelGroupMin {
			for _, t := range ts {
				t.role = RoleLabel
			}
			continue
		}
		if lattice(ts) >= h.LabelGroupMin {
			continue
		}
		inCol, inRow := inRuns(h, ts, x, y), inRuns(h, ts, y, x)
		rest := 0
		for i, t := range ts {
			if inCol[i] || inRow[i] {
				t.role = RoleLabel
			} else {
				rest++
			}
		}
		if rest < h.LabelGroupMin {
			for _, t := range ts {
				t.role = RoleLabel
			}
		}
	}
}

// leaderLines: a short open line of two or three points that runs from a
// closed data shape to within a font size of a text's anchor ties that
// text to the shape as its label (a pie's outer labels, an annotation).
// Line and text are both labels.
func leaderLines(h *Heuristics, cands []*cand, texts []*cand) {
	if len(texts) == 0 {
		return
	}
	for _, c := range cands {
		if c.role != RoleMark || c.g.Closed || len(c.g.Subpaths) != 1 || len(c.g.Subpaths[0].Pts) > 3 || c.g.Info.Curves > 0 {
			continue
		}
		pts := c.g.Subpaths[0].Pts
		ends := [2]Point{pts[0], pts[len(pts)-1]}
		for k, end := range ends {
			t := nearestText(texts, end)
			if t == nil || !onClosedShape(h, cands, c, ends[1-k]) {
				continue
			}
			c.role, t.role = RoleLabel, RoleLabel
			break
		}
	}
}

// nearestText is the text whose anchor is within a font size (at least
// 10 px) of p, if any.
func nearestText(texts []*cand, p Point) *cand {
	var best *cand
	bestD := math.Inf(1)
	for _, t := range texts {
		fs := max(10, fontSize(t.n, 10))
		if d := math.Hypot(t.textPos.X-p.X, t.textPos.Y-p.Y); d <= fs && d < bestD {
			best, bestD = t, d
		}
	}
	return best
}

// onClosedShape: p lies within AlignTol of the box of a closed shape other
// than self that is not set aside.
func onClosedShape(h *Heuristics, cands []*cand, self *cand, p Point) bool {
	tol := h.AlignTol + 1
	for _, o := range cands {
		b := o.g.BBox
		if o != self && o.role == RoleMark && o.g.Closed && p.X >= b[0]-tol && p.X <= b[0]+b[2]+tol && p.Y >= b[1]-tol && p.Y <= b[1]+b[3]+tol {
			return true
		}
	}
	return false
}

// lattice counts the texts that share their row with another text and
// their column with another (within a pixel).
func lattice(ts []*cand) int {
	rows, cols := map[int64]int{}, map[int64]int{}
	for _, t := range ts {
		rows[int64(math.Round(t.textPos.Y))]++
		cols[int64(math.Round(t.textPos.X))]++
	}
	n := 0
	for _, t := range ts {
		if rows[int64(math.Round(t.textPos.Y))] > 1 && cols[int64(math.Round(t.textPos.X))] > 1 {
			n++
		}
	}
	return n
}

// inRuns says which texts share a coordinate (within a pixel) with at
// least LabelGroupMin-1 others, evenly spaced along the other coordinate
// as an axis's ticks and a legend's rows are (labels placed by data, as
// at the start of each line of a series, are not).
func inRuns(h *Heuristics, ts []*cand, coord, along func(*cand) float64) []bool {
	order := make([]int, len(ts))
	for i := range order {
		order[i] = i
	}
	sort.Slice(order, func(i, j int) bool { return coord(ts[order[i]]) < coord(ts[order[j]]) })
	in := make([]bool, len(ts))
	for i := 0; i < len(order); {
		j := i + 1
		for j < len(order) && coord(ts[order[j]])-coord(ts[order[j-1]]) <= 1 && coord(ts[order[j]])-coord(ts[order[i]]) <= 2 {
			j++
		}
		if j-i >= h.LabelGroupMin && evenlySpaced(h, ts, order[i:j], along) {
			for _, k := range order[i:j] {
				in[k] = true
			}
		}
		i = j
	}
	return in
}

// evenlySpaced: the texts' positions along the run are spaced alike,
// within LabelSpacingTol of the median gap.
func evenlySpaced(h *Heuristics, ts []*cand, run []int, along func(*cand) float64) bool {
	if len(run) < 2 {
		return false
	}
	pos := make([]float64, len(run))
	for i, k := range run {
		pos[i] = along(ts[k])
	}
	slices.Sort(pos)
	gaps := make([]float64, len(pos)-1)
	for i := range gaps {
		gaps[i] = pos[i+1] - pos[i]
	}
	slices.Sort(gaps)
	med := gaps[len(gaps)/2]
	return med > 0 && gaps[len(gaps)-1]-gaps[0] <= h.LabelSpacingTol*med
}

// legendSwatches finds legend entries: small marks each with its own label
// text just to the right, at the same offset for every entry, lined up in
// a column or a row. A series icon drawn as a short line with a dot on it
// is one swatch. Then the frame drawn behind the entries is set aside.
func legendSwatches(h *Heuristics, cands []*cand, texts []*cand) {
	pairs := swatchPairs(h, cands, texts)
	pairs, dots := seriesIcons(h, pairs)
	// Group pairs by their label offset; an entry needs a second entry
	// with the same offset lined up with it, and a label of its own.
	used := map[*cand]int{}
	for _, p := range pairs {
		used[p.t]++
	}
	var entries []swatchPair
	for i, a := range pairs {
		if used[a.t] != 1 {
			continue
		}
		for j, b := range pairs {
			if i == j || used[b.t] != 1 {
				continue
			}
			ca, cb := a.c.g.Centroid, b.c.g.Centroid
			column := math.Abs(ca.X-cb.X) <= 1.5 && math.Abs(a.t.textPos.X-b.t.textPos.X) <= 1
			row := math.Abs(ca.Y-cb.Y) <= 1.5 && math.Abs(a.dy-b.dy) <= 1 && math.Abs(a.dx-b.dx) <= 1
			if column || row {
				a.c.role = RoleLegend
				a.t.role = RoleLegendLabel
				if d := dots[a.c]; d != nil {
					d.role = RoleLegend
				}
				entries = append(entries, a)
				break
			}
		}
	}
	legendFrames(h, cands, entries)
}

// swatchPair is a possible legend entry: a small shape and the label to
// its right, at offset dx, dy.
type swatchPair struct {
	c, t   *cand
	dx, dy float64
}

// swatchPairs pairs each small shape with the nearest text to its right.
// Legend entries come in small groups: a swatch is never one of more than
// SwatchMaxSiblings siblings of the same shape and size (all of a flat
// drawing's shapes may share one parent).
func swatchPairs(h *Heuristics, cands []*cand, texts []*cand) []swatchPair {
	type sig struct {
		parent int32
		shape  Shape
		w, h   int64
	}
	sigOf := func(c *cand) sig {
		return sig{c.n.Parent, c.g.Shape, int64(math.Round(c.g.BBox[2])), int64(math.Round(c.g.BBox[3]))}
	}
	if !slices.ContainsFunc(texts, func(t *cand) bool { return t.role == RoleLabel || t.role == RoleMark }) {
		return nil // no text to pair with
	}
	// Each shape's signature, numbered: siblings usually come in runs of
	// one signature, which are numbered without a lookup.
	ids, alike := make([]int32, len(cands)), []int{}
	number := map[sig]int32{}
	var last sig
	for i, c := range cands {
		s := sigOf(c)
		if i == 0 || s != last {
			id, ok := number[s]
			if !ok {
				id = int32(len(alike))
				number[s] = id
				alike = append(alike, 0)
			}
			ids[i], last = id, s
		} else {
			ids[i] = ids[i-1]
		}
		alike[ids[i]]++
	}
	var pairs []swatchPair
	on := overShapes{}
	for i, c := range cands {
		if c.role != RoleMark || alike[ids[i]] > h.SwatchMaxSiblings {
			continue
		}
		b := c.g.BBox
		size := max(b[2], b[3])
		if size > h.SwatchMaxSize {
			continue
		}
		cy := b[1] + b[3]/2
		right := b[0] + b[2]
		var best *cand
		bestDx := math.Inf(1)
		for _, t := range texts {
			if t.role != RoleLabel && t.role != RoleMark {
				continue
			}
			fs := fontSize(t.n, 10)
			dx := t.textPos.X - right
			dy := math.Abs(t.textPos.Y - fs*0.35 - cy)
			if dx >= -1 && dx <= max(size, h.SwatchLabelGapMin)+h.SwatchLabelGapExtra && dy <= max(size, fs)*0.6 && dx < bestDx {
				if t.role == RoleMark && on.over(t, cands) {
					continue // a value written on a cell or a bar
				}
				best, bestDx = t, dx
			}
		}
		if best != nil {
			pairs = append(pairs, swatchPair{c, best, bestDx, best.textPos.Y - cy})
		}
	}
	return pairs
}

// overShapes remembers, per text, whether its anchor lies on a closed
// shape that is not set aside: a value written on a cell or a bar.
type overShapes map[*cand]bool

func (o overShapes) over(t *cand, cands []*cand) bool {
	v, ok := o[t]
	if !ok {
		v = overShape(t, cands)
		o[t] = v
	}
	return v
}

func overShape(t *cand, cands []*cand) bool {
	p := t.textPos
	for _, c := range cands {
		b := c.g.BBox
		if c.role == RoleMark && c.g.Closed && p.X >= b[0] && p.X <= b[0]+b[2] && p.Y >= b[1] && p.Y <= b[1]+b[3] {
			return true
		}
	}
	return false
}

// textBox is a text's box in page px: the reader's, or one estimated from
// its anchor, font size and length.
func textBox(t *cand) [4]float64 { return textBoxAt(t, fontSize(t.n, 10)) }

// textBoxAt is a text's box in page px at font size fs: the reader's, or
// one estimated from its anchor and its length (an advance of 0.55 em a
// character).
func textBoxAt(t *cand, fs float64) [4]float64 {
	if len(t.n.BBox) == 4 {
		return [4]float64{t.n.BBox[0], t.n.BBox[1], t.n.BBox[2], t.n.BBox[3]}
	}
	return [4]float64{t.textPos.X, t.textPos.Y - 0.8*fs, 0.55 * fs * float64(len([]rune(t.n.Text))), fs}
}

// fontSize is a text node's font size in page px, or def when the reader
// gave none.
func fontSize(n *snapshot.Node, def float64) float64 {
	if len(n.Geom) >= 3 {
		return n.Geom[2] * math.Sqrt(math.Abs(snapshot.Matrix(n.CTM).Det()))
	}
	return def
}

// seriesIcons merges a short straight line and a dot centred on it that
// pair with the same label into one swatch, the line, returning the dot
// kept with each line.
func seriesIcons(h *Heuristics, pairs []swatchPair) ([]swatchPair, map[*cand]*cand) {
	byLabel := map[*cand][]int{}
	for i, p := range pairs {
		byLabel[p.t] = append(byLabel[p.t], i)
	}
	dots := map[*cand]*cand{}
	drop := map[int]bool{}
	for _, idx := range byLabel {
		if len(idx) != 2 {
			continue
		}
		a, b := pairs[idx[0]], pairs[idx[1]]
		if _, _, ok := straight(&b.c.g); ok {
			a, b = b, a
			idx[0], idx[1] = idx[1], idx[0]
		}
		p, q, ok := straight(&a.c.g)
		if !ok || !b.c.g.Closed {
			continue
		}
		mid, c := Point{(p.X + q.X) / 2, (p.Y + q.Y) / 2}, b.c.g.Centroid
		if math.Hypot(c.X-mid.X, c.Y-mid.Y) <= h.AlignTol+0.25*a.c.g.Length {
			dots[a.c] = b.c
			drop[idx[1]] = true
		}
	}
	out := pairs[:0:0]
	for i, p := range pairs {
		if !drop[i] {
			out = append(out, p)
		}
	}
	return out, dots
}

// legendFrames: a shape drawn before two or more legend entries that
// holds them, swatches and labels' anchors, and is at most LegendFrameArea
// times the size of their box, is the legend's frame or background.
func legendFrames(h *Heuristics, cands []*cand, entries []swatchPair) {
	if len(entries) < 2 {
		return
	}
	x0, y0, x1, y1 := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
	first := math.MaxInt
	for _, e := range entries {
		b, tb := e.c.g.BBox, textBox(e.t)
		x0, y0 = min(x0, b[0], tb[0]), min(y0, b[1], tb[1])
		x1, y1 = max(x1, b[0]+b[2], tb[0]+tb[2]), max(y1, b[1]+b[3], tb[1]+tb[3])
		first = min(first, e.c.node)
	}
	area := max(x1-x0, 1) * max(y1-y0, 1)
	for _, c := range cands {
		if c.role != RoleMark || c.node > first || !c.g.Closed {
			continue
		}
		b := c.g.BBox
		// Labels' widths are estimates: they may overrun the frame a little.
		slack := 0.25 * (x1 - x0)
		if b[0] <= x0+0.5 && b[1] <= y0+0.5 && b[0]+b[2] >= x1-slack && b[1]+b[3] >= y1-0.5 && b[2]*b[3] <= h.LegendFrameArea*area {
			c.role = coverRole(c)
		}
	}
}

// assignKinds gives each remaining shape its mark kind. Closed outlines
// are judged per parent group, by repetition: a data series draws the same
// kind of glyph many times, while regions (maps, areas) vary.
func assignKinds(h *Heuristics, cands []*cand) {
	groups := map[int32][]*cand{}
	// Siblings come in runs: append to the last parent's group without a
	// map lookup.
	lastParent, last := int32(-2), []*cand(nil)
	flush := func() {
		if last != nil {
			groups[lastParent] = last
		}
	}
	for _, c := range cands {
		if c.role != RoleMark {
			continue
		}
		g := &c.g
		switch {
		case g.Shape == ShapeWedge:
			c.kind = KindArc
		case c.n.Tag == "circle" || c.n.Tag == "ellipse":
			c.kind = KindPoint
		case g.Closed && len(g.Subpaths) == 1:
			if c.n.Parent != lastParent {
				flush()
				lastParent, last = c.n.Parent, groups[c.n.Parent]
			}
			last = append(last, c)
		case g.Closed && pointCloud(h, g):
			c.kind, c.cloud = KindPoint, true
		case !g.Closed && symbolStrokes(h, g):
			c.kind = KindPoint
		case !g.Closed:
			if _, _, ok := straight(g); ok {
				c.kind = KindRule
			} else {
				c.kind = KindLine
			}
		default:
			c.kind = KindArea
		}
	}
	flush()
	for _, grp := range groups {
		groupKinds(h, grp)
	}
}

// homogeneous says whether a group of closed outlines is one series of
// glyphs: its commonest shape (and corner count) dominates, or nearly all
// are symbols of few kinds.
func homogeneous(h *Heuristics, grp []*cand) bool {
	type sig struct {
		s Shape
		k int
	}
	count := map[sig]int{}
	for _, c := range grp {
		count[sig{c.g.Shape, c.g.Corners}]++
	}
	var top sig
	for k, v := range count {
		if v > count[top] || v == count[top] && k.s < top.s {
			top = k
		}
	}
	symbols := 0
	for _, c := range grp {
		if c.g.Shape != ShapeOther && c.g.Shape != ShapeSquare || pointLike(h, &c.g) {
			symbols++
		}
	}
	return float64(count[top]) >= h.HomogeneousShare*float64(len(grp)) ||
		float64(symbols) >= h.SymbolShare*float64(len(grp)) && len(count) <= h.MaxSymbolKinds
}

// groupKinds gives the closed outlines of one parent their kinds: a
// series of glyphs is points (rectangles: bars, cells or points), a mixed
// group is areas.
func groupKinds(h *Heuristics, grp []*cand) {
	homo := homogeneous(h, grp)
	var rects []*cand
	for _, c := range grp {
		g := &c.g
		switch {
		case g.Shape == ShapeSquare:
			rects = append(rects, c)
		case !homo && len(grp) > 1:
			c.kind = KindArea
		case g.Shape != ShapeOther || pointLike(h, g):
			c.kind = KindPoint
		default:
			c.kind = KindArea
		}
	}
	if len(rects) > 0 && !homo && len(grp) > h.MixedRectsMin {
		for _, c := range rects {
			c.kind = KindArea
		}
		return
	}
	rectKinds(h, rects)
}

// rectKinds decides between bars, cells and square points for the
// rectangles of one group: equal sizes on a lattice are cells, small equal
// squares that do not tile are points, the rest are bars.
func rectKinds(h *Heuristics, grp []*cand) {
	if len(grp) == 0 {
		return
	}
	ws, hs := map[int64]int{}, map[int64]int{}
	xs, ys := map[int64]bool{}, map[int64]bool{}
	for _, c := range grp {
		b := c.g.BBox
		ws[int64(math.Round(b[2]*2))]++
		hs[int64(math.Round(b[3]*2))]++
		xs[int64(math.Round(b[0]))] = true
		ys[int64(math.Round(b[1]))] = true
	}
	kind := KindBar
	equal := len(ws) == 1 && len(hs) == 1
	switch {
	case len(grp) >= h.CellsMin && equal && len(xs) >= 2 && len(ys) >= 2 && tiles(h, grp):
		kind = KindCell
	case equal && len(grp) >= 2 && squareish(grp[0].g.Subpaths[0].Pts) && max(grp[0].g.BBox[2], grp[0].g.BBox[3]) <= h.SquarePointMax:
		kind = KindPoint
	}
	for _, c := range grp {
		c.kind = kind
	}
}

// tiles reports whether most rectangles have a neighbour within a tenth of
// their size: cells abut, scattered squares do not.
func tiles(h *Heuristics, grp []*cand) bool {
	if len(grp) > h.LatticeAssumed {
		return true // a lattice that large is a heat map
	}
	near := 0
	for i, a := range grp {
		ab := a.g.BBox
		gap := 0.1*max(ab[2], ab[3]) + 1
		for j, b := range grp {
			if i == j {
				continue
			}
			bb := b.g.BBox
			dx := max(bb[0]-(ab[0]+ab[2]), ab[0]-(bb[0]+bb[2]))
			dy := max(bb[1]-(ab[1]+ab[3]), ab[1]-(bb[1]+bb[3]))
			if max(dx, dy) <= gap {
				near++
				break
			}
		}
	}
	return near*2 >= len(grp)
}

// pointLike: a small closed outline with few corners and no long curves,
// such as a hexagon or an arrow glyph.
func pointLike(h *Heuristics, g *Geometry) bool {
	n := 0
	for _, s := range g.Subpaths {
		n += len(s.Pts)
	}
	return n <= h.PointMaxVertices && max(g.BBox[2], g.BBox[3]) <= h.PointMaxSize
}

// pointCloud: a compound outline of at least CloudMinPoints subpaths, all
// of one size (within a tenth) and point-sized, draws a scatter's points
// in one path (one subpath per point); holes and letters come in sizes.
func pointCloud(h *Heuristics, g *Geometry) bool {
	if len(g.Subpaths) < h.CloudMinPoints {
		return false
	}
	var w0, h0 float64
	for i, s := range g.Subpaths {
		x0, y0, x1, y1 := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
		for _, p := range s.Pts {
			x0, y0, x1, y1 = min(x0, p.X), min(y0, p.Y), max(x1, p.X), max(y1, p.Y)
		}
		w, ht := x1-x0, y1-y0
		if i == 0 {
			w0, h0 = w, ht
		}
		if max(w, ht) > h.PointMaxSize || math.Abs(w-w0) > 0.1*w0+0.1 || math.Abs(ht-h0) > 0.1*h0+0.1 {
			return false
		}
	}
	return w0 > 0 && h0 > 0
}

// cloudMarks makes one point mark per subpath of a point cloud.
func cloudMarks(ms []Mark, c *cand, paints *paintSlab) []Mark {
	ms = slices.Grow(ms, len(c.g.Subpaths))
	one := *c
	one.cloud = false
	for i, s := range c.g.Subpaths {
		one.g = Geometry{Subpaths: []Subpath{s}, Info: c.g.Info}
		one.g.measurePolys()
		m := next(&ms)
		makeMark(m, &one, paints)
		m.ID = c.n.Name + "#" + strconv.Itoa(i)
	}
	return ms
}

// symbolStrokes: a glyph drawn as a few short crossing strokes (a plus, an
// ×, an asterisk).
func symbolStrokes(h *Heuristics, g *Geometry) bool {
	if len(g.Subpaths) < 2 || len(g.Subpaths) > h.SymbolStrokesMax || max(g.BBox[2], g.BBox[3]) > h.SymbolStrokesSize {
		return false
	}
	for _, s := range g.Subpaths {
		if len(s.Pts) != 2 {
			return false
		}
	}
	return true
}

// makeMark makes the mark of candidate c in m, which is zero.
func makeMark(m *Mark, c *cand, paints *paintSlab) {
	nd := c.n
	m.ID, m.Node, m.Kind, m.Shape, m.Label, m.Class = nd.Name, c.node, c.kind, c.g.Shape, c.label, nd.Class
	m.Opacity, m.FillOpacity, m.StrokeOpacity, m.StrokeWidth = c.opacity, c.fillA, c.strokeA, c.strokeW
	m.BBox, m.Area, m.Centroid, m.Angle, m.Fold = c.g.BBox, c.g.Area, c.g.Centroid, c.g.Angle, c.g.Fold
	if nd.Fill.Kind != snapshot.PaintNone && (c.g.Area > 0 || nd.Tag == "text") {
		m.Fill = paints.of(nd.Fill.RGBA)
		m.FillStops = nd.Fill.Stops
	}
	if nd.Stroke.Kind != snapshot.PaintNone && c.strokeW > 0 {
		m.Stroke = paints.of(nd.Stroke.RGBA)
	}
	if nd.Tag == "text" {
		m.Kind, m.Shape, m.Text = KindText, ShapeOther, nd.Text
		fs := fontSize(nd, 16)
		m.Size, m.Weight = fs, 400
		if len(nd.Geom) >= 4 && nd.Geom[3] >= 1 && nd.Geom[3] <= 1000 {
			m.Weight = nd.Geom[3]
		}
		m.BBox = textBoxAt(c, fs)
		m.Centroid = Point{m.BBox[0] + m.BBox[2]/2, m.BBox[1] + m.BBox[3]/2}
		m.Area = m.BBox[2] * m.BBox[3]
		m.Fold = 2
		return
	}
	switch m.Kind {
	case KindBar, KindRule:
		m.Size = max(c.g.BBox[2], c.g.BBox[3])
		if m.Kind == KindRule {
			m.Size = c.g.Length
			for _, s := range c.g.Subpaths {
				m.Vertices = append(m.Vertices, s.Pts...)
			}
		}
	case KindLine:
		if m.Fill == nil || c.fillA == 0 {
			m.Area = 0 // an unfilled line encloses nothing the reader sees
		}
		m.Size = c.strokeW
		for _, s := range c.g.Subpaths {
			m.Vertices = append(m.Vertices, s.Pts...)
		}
	default:
		m.Size = c.g.Area
		if m.Size == 0 {
			m.Size = c.g.BBox[2] * c.g.BBox[3]
		}
	}
}
