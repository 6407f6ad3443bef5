package static

import (
	"bytes"
	"fmt"
	"io"
	"io/fs"
	"math"
	"net/url"
	"path"
	"standout/internal/svgnum"
	"standout/snapshot"
	"strconv"
	"strings"
	"time"

	"github.com/andybalholm/cascadia"
	"golang.org/x/net/html"
)

// Limits on what Build accepts. Input beyond them is an error, never a
// silent truncation.
const (
	// MaxInputBytes is the largest document Build reads.
	MaxInputBytes = 256 << 20
	// MaxUseDepth bounds nested <use> expansion (and so reference cycles).
	MaxUseDepth = 16
)

// Options tunes the static builder.
type Options struct {
	// Source names the input in snapshots and messages.
	Source string
	// Dark selects the dark value of light-dark().
	Dark bool
	// Deadline, when set, bounds the build's time: past it, Build stops
	// with an error (checked between elements and between selector
	// tests).
	Deadline time.Time
	// Select is a CSS selector whose matches are recorded in each
	// snapshot's Selected list (an intended emphasis). Empty means
	// DefaultEmphasisSelector.
	Select string
	// Sheets, when set, holds the files beside the page: style sheets
	// that <link rel=stylesheet> names by a relative path are read from
	// it (at most MaxSheetBytes each). The caller roots it at the page's
	// folder (os.Root refuses paths that leave it); nothing is fetched
	// from the network.
	Sheets fs.FS
}

// MaxSheetBytes is the largest linked style sheet the static reader reads,
// and MaxPageSheetBytes the most it reads for one page's links together.
const (
	MaxSheetBytes     = 4 << 20
	MaxPageSheetBytes = 32 << 20
)

// DefaultEmphasisSelector marks the intended emphasis in a page's own
// markup: authors add the attribute data-standout-emphasis to the marks
// (or a group of them) that are the point of the chart.
const DefaultEmphasisSelector = "[data-standout-emphasis]"

// Page is what the static builder found in one document.
type Page struct {
	Source string
	Charts []snapshot.Snapshot
	// Rasters are the elements that draw a chart as pixels (canvas, img,
	// object, embed), at least snapshot.RasterMin by their attributes,
	// or of a size the attributes do not give.
	Rasters []snapshot.Raster
	// Problems are page-level notes: style sheet errors, external style
	// sheets that were not loaded.
	Problems []string
}

// Build parses an HTML page or a standalone SVG file and returns a
// snapshot of every outermost <svg> element in it, with the CSS cascade
// applied. It reads the markup with golang.org/x/net/html, which recovers
// from malformed markup as browsers do (an .svg file is parsed as foreign
// content of an HTML document). Anything that is read but cannot be
// understood is listed in the problems of the page or chart.
func Build(r io.Reader, opt Options) (*Page, error) {
	data, err := io.ReadAll(io.LimitReader(r, MaxInputBytes+1))
	if err != nil {
		return nil, fmt.Errorf("static: reading %s: %w", opt.Source, err)
	}
	if len(data) > MaxInputBytes {
		return nil, fmt.Errorf("static: %s is larger than %d MiB", opt.Source, MaxInputBytes>>20)
	}
	doc, err := html.Parse(bytes.NewReader(data))
	if err != nil {
		return nil, fmt.Errorf("static: parsing %s: %w", opt.Source, err)
	}
	page := &Page{Source: opt.Source}
	b := &builder{opt: opt, ids: map[string]*html.Node{}, idCount: map[string]int{}, labelCount: map[string]int{}, page: page,
		standalone: standaloneSVG(data)}
	if b.standalone {
		rootSVG(doc)
	}
	if opt.Select == "" {
		opt.Select = DefaultEmphasisSelector
	}
	b.casc = &cascader{problems: &page.Problems, dark: opt.Dark, meta: colourSchemeMeta(doc)}
	b.casc.budget.deadline = opt.Deadline
	sel, err := compileGroup(opt.Select, &b.casc.budget)
	if err != nil {
		return nil, fmt.Errorf("static: selector %q: %w", opt.Select, err)
	}
	b.sel = sel
	order := 0
	var svgs, rasterCands []*html.Node
	var heading *html.Node // the last h1–h6 so far, in document order
	b.headingOf = map[*html.Node]*html.Node{}
	walkNodes(doc, func(n *html.Node) bool {
		if n.Type != html.ElementNode {
			return true
		}
		if isHeading(n) {
			heading = n
		}
		if id := attr(n, "id"); id != "" {
			if _, dup := b.ids[id]; !dup {
				b.ids[id] = n
			}
			b.idCount[id]++
		}
		if n.Data == "svg" && n.Namespace == "svg" {
			b.labelCount[attr(n, "aria-label")]++
		}
		switch {
		case n.Data == "style":
			rules, probs := parseSheet(textContent(n), &order, fmt.Sprintf("<style> #%d", order), &b.casc.budget, opt.Dark)
			b.casc.rules = append(b.casc.rules, rules...)
			page.Problems = append(page.Problems, probs...)
		case n.Data == "link" && strings.Contains(strings.ToLower(attr(n, "rel")), "stylesheet"):
			rules, probs := b.linkedSheet(attr(n, "href"), &order)
			b.casc.rules = append(b.casc.rules, rules...)
			page.Problems = append(page.Problems, probs...)
		case n.Data == "svg" && n.Namespace == "svg" && !insideSVG(n):
			svgs = append(svgs, n)
			b.headingOf[n] = heading
		case n.Namespace == "" && (rasterTags[n.Data] || mayHoldBackground(n)):
			rasterCands = append(rasterCands, n) // named once every sheet is known
		}
		return true
	})
	page.Rasters = b.rasters(rasterCands)
	for i, s := range svgs {
		snap, err := b.chart(s, fmt.Sprintf("svg%d", i))
		if err == nil && b.casc.budget.err != nil {
			err = fmt.Errorf("static: %s: %w", opt.Source, b.casc.budget.err)
		}
		if err != nil {
			return nil, err
		}
		page.Charts = append(page.Charts, *snap)
	}
	return page, nil
}

type builder struct {
	// captions caches each <figure>'s caption (captionOf).
	captions map[*html.Node]string
	// sheetBytes counts the linked style sheets read so far.
	sheetBytes int
	// headingOf is, per outermost <svg>, the last heading before it.
	headingOf map[*html.Node]*html.Node
	opt       Options
	ids       map[string]*html.Node
	// standalone: the file is an SVG document, whose root element is the
	// <svg> (the HTML parser wraps it in a body).
	standalone bool
	// idCount and labelCount count each id in the document and each
	// aria-label among its <svg> elements, for anchor selectors.
	idCount, labelCount map[string]int
	casc                *cascader
	page                *Page
	html                map[*html.Node]*computed // computed styles of HTML ancestors
	snap                *snapshot.Snapshot
	sel                 cascadia.SelectorGroup
	// pageNodes counts the page's chart elements; useNodes those the
	// current chart instantiates through <use>.
	pageNodes, useNodes int
	// useStack holds the <use> targets being expanded, to refuse cycles.
	useStack map[*html.Node]bool
}

// linkedSheet reads a style sheet a <link> names by a path relative to
// the page, from Options.Sheets; any other (remote, absolute, outside the
// page's folder, missing, too large) is named in a problem instead.
func (b *builder) linkedSheet(href string, order *int) ([]rule, []string) {
	notLoaded := func(why string) ([]rule, []string) {
		return nil, []string{fmt.Sprintf("external style sheet %q was not loaded by the static reader (%s), so the charts may be read with default colours; run check --browser to read them as a browser styles them", clip(href, 120), why)}
	}
	u, err := url.Parse(href)
	switch {
	case err != nil || href == "":
		return notLoaded("not a usable address")
	case u.Scheme != "" || u.Host != "" || strings.HasPrefix(u.Path, "/"):
		return notLoaded("it is not beside the page")
	case b.opt.Sheets == nil:
		return notLoaded("no folder to read it from")
	}
	name := path.Clean(u.Path)
	if !fs.ValidPath(name) {
		return notLoaded("its path leaves the page's folder")
	}
	f, err := b.opt.Sheets.Open(name)
	if err != nil {
		return notLoaded("it could not be opened")
	}
	defer f.Close()
	data, err := io.ReadAll(io.LimitReader(f, MaxSheetBytes+1))
	if err != nil {
		return notLoaded("it could not be read")
	}
	if len(data) > MaxSheetBytes {
		return notLoaded(fmt.Sprintf("it is larger than %d MiB", MaxSheetBytes>>20))
	}
	if b.sheetBytes += len(data); b.sheetBytes > MaxPageSheetBytes {
		return notLoaded(fmt.Sprintf("the page's linked style sheets pass %d MiB", MaxPageSheetBytes>>20))
	}
	return parseSheet(string(data), order, "style sheet "+name, &b.casc.budget, b.opt.Dark)
}

// walkNodes visits n and its descendants in document order without
// recursion, so deep nesting cannot exhaust the stack. f returns false to
// skip a node's children.
// rootSVG makes an SVG document's <svg> the document's root element, as a
// browser has it, in place of the <html> and <body> the HTML parser wraps
// it in: so :root, and the :nth-child steps from it, match as they do in
// the browser.
func rootSVG(doc *html.Node) {
	var svg *html.Node
	walkNodes(doc, func(n *html.Node) bool {
		if svg == nil && n.Type == html.ElementNode && n.Data == "svg" && n.Namespace == "svg" {
			svg = n
		}
		return svg == nil
	})
	if svg == nil {
		return
	}
	svg.Parent.RemoveChild(svg)
	for c := doc.FirstChild; c != nil; {
		next := c.NextSibling
		if c.Type == html.ElementNode {
			doc.RemoveChild(c)
		}
		c = next
	}
	doc.AppendChild(svg)
}

func walkNodes(root *html.Node, f func(*html.Node) bool) {
	n := root
	for n != nil {
		descend := f(n)
		if descend && n.FirstChild != nil {
			n = n.FirstChild
			continue
		}
		for n != nil && n != root && n.NextSibling == nil {
			n = n.Parent
		}
		if n == nil || n == root {
			return
		}
		n = n.NextSibling
	}
}

func insideSVG(n *html.Node) bool {
	for p := n.Parent; p != nil; p = p.Parent {
		if p.Type == html.ElementNode && p.Namespace == "svg" {
			return true
		}
	}
	return false
}

func attr(n *html.Node, key string) string {
	for _, a := range n.Attr {
		if a.Key == key && (a.Namespace == "" || a.Namespace == "xlink" && key == "href") {
			return a.Val
		}
	}
	return ""
}

func hasAttr(n *html.Node, key string) bool {
	for _, a := range n.Attr {
		if a.Key == key && a.Namespace == "" {
			return true
		}
	}
	return false
}

func href(n *html.Node) string {
	for _, a := range n.Attr {
		if a.Key == "href" && (a.Namespace == "" || a.Namespace == "xlink") {
			return a.Val
		}
	}
	return ""
}

func textContent(n *html.Node) string {
	var b strings.Builder
	walkNodes(n, func(c *html.Node) bool {
		if c.Type == html.TextNode {
			b.WriteString(c.Data)
		}
		return true
	})
	return b.String()
}

// styleOfHTML computes the styles of an element's HTML ancestors, root first.
func (b *builder) styleOfHTML(n *html.Node) *computed {
	if n == nil || n.Type != html.ElementNode {
		return nil
	}
	if b.html == nil {
		b.html = map[*html.Node]*computed{}
	}
	if c, ok := b.html[n]; ok {
		return c
	}
	var parent *computed
	if n.Parent != nil && n.Parent.Type == html.ElementNode {
		parent = b.styleOfHTML(n.Parent)
	}
	c := b.casc.compute(n, parent, n.Data)
	b.html[n] = c
	return c
}

func (b *builder) chart(svg *html.Node, path string) (*snapshot.Snapshot, error) {
	snap := &snapshot.Snapshot{Version: snapshot.SnapshotVersion, Source: b.opt.Source, Path: path, Title: b.chartTitle(svg, b.headingOf[svg]), Anchor: b.anchor(svg), Background: 0xffffffff}
	b.snap = snap
	b.useNodes = 0
	var parentStyle *computed
	if svg.Parent != nil && svg.Parent.Type == html.ElementNode {
		parentStyle = b.styleOfHTML(svg.Parent)
	}
	// The page background behind the chart.
	bg := b.background(svg.Parent)
	snap.Background = bg
	st := b.casc.compute(svg, parentStyle, path)
	w, h, vb := b.viewport(svg, st, 300, 150)
	snap.Box = [4]float64{0, 0, w, h}
	ctm := viewBoxMatrix(vb, w, h, attr(svg, "preserveAspectRatio"))
	if err := b.addNode(svg, -1, path, st, snapshot.IdentityMatrix, ctm, 0); err != nil {
		return nil, err
	}
	// The <svg>'s own clip region comes last, so that the elements keep
	// their places.
	if clipsOverflow(st.v[pOverflow]) {
		if err := b.addClip(0, path, snap.Box[:], snapshot.IdentityMatrix); err != nil {
			return nil, err
		}
	}
	return snap, nil
}

// darkCanvas is the Canvas system colour (CSS Color 4 §6.2) Chromium, the
// browser of the command line's browser mode, paints under a page whose
// root is drawn dark: measured from its screenshots (the extension's
// end-to-end suite checks it, beside Firefox's).
var darkCanvas = snapshot.Unpack(0x121212ff).SRGB

// background composites the background colours of the HTML ancestors over
// the page's canvas, nearest last.
func (b *builder) background(n *html.Node) uint32 {
	var chain []*html.Node
	for p := n; p != nil && p.Type == html.ElementNode; p = p.Parent {
		chain = append(chain, p)
	}
	out := snapshot.Colour{SRGB: white, A: 1}
	if len(chain) > 0 && b.casc.usedDark(b.styleOfHTML(chain[len(chain)-1]).v[pColorScheme]) {
		out.SRGB = darkCanvas
	}
	for i := len(chain) - 1; i >= 0; i-- {
		st := b.styleOfHTML(chain[i])
		v := st.v[pBackgroundColor]
		if v == "transparent" || v == "" {
			v = backgroundShorthandColour(st.v[pBackground])
		}
		if c, err := ParseColor(resolveCurrent(v, st)); err == nil && c.A > 0 {
			out = snapshot.Colour{SRGB: overSRGB(c, out.SRGB), A: 1}
		}
	}
	return snapshot.RGBA(out)
}

// colourSchemeMeta is the content of the page's first <meta
// name="color-scheme"> in its head, or "".
func colourSchemeMeta(doc *html.Node) string {
	out := ""
	walkNodes(doc, func(n *html.Node) bool {
		if out == "" && n.Type == html.ElementNode && n.Data == "meta" && strings.EqualFold(attr(n, "name"), "color-scheme") {
			out = attr(n, "content")
		}
		return out == "" && n.Data != "body"
	})
	return out
}

func backgroundShorthandColour(v string) string {
	for _, t := range tokens(v) {
		if t.tt.String() == "Hash" {
			return t.s
		}
		if _, ok := namedColours[strings.ToLower(t.s)]; ok {
			return t.s
		}
	}
	if i := strings.Index(strings.ToLower(v), "rgb"); i >= 0 {
		if j := strings.IndexByte(v[i:], ')'); j > 0 {
			return v[i : i+j+1]
		}
	}
	return ""
}

// viewport returns the size of an <svg> in CSS px and its viewBox (nil if
// none or invalid). Missing or relative sizes fall back to the viewBox, and
// then to def.
func (b *builder) viewport(n *html.Node, st *computed, defW, defH float64) (float64, float64, []float64) {
	var vb []float64
	if s := attr(n, "viewBox"); s != "" {
		sc := svgnum.Scanner{S: s}
		for k := 0; k < 4; k++ {
			sc.SkipSep()
			v, ok := sc.Number()
			if !ok {
				vb = nil
				b.snap.Problems = append(b.snap.Problems, fmt.Sprintf("%s: viewBox %q is not four numbers and is ignored", b.snap.Path, clip(s, 40)))
				break
			}
			vb = append(vb, v)
		}
		if len(vb) == 4 && (vb[2] <= 0 || vb[3] <= 0) {
			vb = nil
		}
	}
	size := func(key string, def float64, fromVB float64) float64 {
		v := attr(n, key)
		if v != "" && !strings.HasSuffix(strings.TrimSpace(v), "%") && !strings.EqualFold(v, "auto") {
			if l, ok := length(v, 16); ok && l >= 0 {
				return l
			}
		}
		if fromVB > 0 {
			return fromVB
		}
		return def
	}
	var vbw, vbh float64
	if vb != nil {
		vbw, vbh = vb[2], vb[3]
	}
	w := size("width", defW, vbw)
	h := size("height", defH, vbh)
	// A missing dimension keeps the viewBox aspect ratio.
	if vb != nil {
		if attr(n, "width") == "" && attr(n, "height") != "" {
			w = h * vbw / vbh
		} else if attr(n, "height") == "" && attr(n, "width") != "" {
			h = w * vbh / vbw
		}
	}
	return w, h, vb
}

// viewBoxMatrix maps a viewBox to a viewport of w×h (SVG 1.1 §7.8, the
// viewBox and preserveAspectRatio algorithm).
func viewBoxMatrix(vb []float64, w, h float64, par string) snapshot.Matrix {
	if len(vb) != 4 {
		return snapshot.IdentityMatrix
	}
	sx, sy := w/vb[2], h/vb[3]
	f := strings.Fields(par)
	align, slice := "xMidYMid", false
	if len(f) > 0 {
		align = f[0]
	}
	if len(f) > 1 && f[1] == "slice" {
		slice = true
	}
	if align == "none" {
		return snapshot.Matrix{sx, 0, 0, sy, -vb[0] * sx, -vb[1] * sy}
	}
	s := min(sx, sy)
	if slice {
		s = max(sx, sy)
	}
	tx, ty := -vb[0]*s, -vb[1]*s
	switch {
	case strings.Contains(align, "xMid"):
		tx += (w - vb[2]*s) / 2
	case strings.Contains(align, "xMax"):
		tx += w - vb[2]*s
	}
	switch {
	case strings.Contains(align, "YMid"):
		ty += (h - vb[3]*s) / 2
	case strings.Contains(align, "YMax"):
		ty += h - vb[3]*s
	}
	return snapshot.Matrix{s, 0, 0, s, tx, ty}
}

// addNode appends n (with computed style st) and its rendered subtree.
// parentCTM is the parent's user space to page px; inner is an extra
// transform applied before this element's own (a viewBox, a <use> offset).
func (b *builder) addNode(n *html.Node, parent int32, name string, st *computed, parentCTM, inner snapshot.Matrix, useDepth int) error {
	if err := b.count(useDepth); err != nil {
		return err
	}
	snap := b.snap
	tag := strings.ToLower(n.Data)
	ctm, inner := b.nodeCTM(n, tag, parent, name, parentCTM, inner)
	node := b.styledNode(st, name)
	node.Parent, node.Tag, node.Name, node.CTM = parent, tag, name, ctm
	if inner == (snapshot.Matrix{}) {
		node.Flags |= snapshot.Hidden
	}
	node.Label = attr(n, "aria-label")
	if c := strings.TrimSpace(attr(n, "class")); len(c) <= snapshot.MaxClassBytes {
		node.Class = c
	}
	b.geometry(n, &node, st)
	switch tag {
	case "path":
		node.D = attr(n, "d")
	case "polyline", "polygon":
		node.D = attr(n, "points")
	case "text", "title", "desc":
		node.Text = strings.TrimSpace(textContent(n))
	}
	idx := int32(len(snap.Nodes))
	snap.Nodes = append(snap.Nodes, node)
	if b.sel != nil && b.sel.Match(n) {
		snap.Selected = append(snap.Selected, idx)
	}
	if tag == "text" || tag == "title" || tag == "desc" || snapshot.NotRendered[tag] {
		return nil
	}
	if tag == "use" {
		return b.expandUse(n, idx, name, st, ctm, useDepth)
	}
	if (tag == "g" || tag == "a") && useDepth == 0 {
		if err := b.clipRegion(idx, name, st, ctm); err != nil {
			return err
		}
	}
	return b.addChildren(n, idx, name, st, ctm, useDepth)
}

// clipRegion adds the clip region of the group at idx as a node of its
// own (snapshot.ClipTag) when its clip-path refers to a <clipPath> of one
// <rect> in the group's user space, as charts clip their plot area; the
// read pass does the same (extension/reader.js: ChartWalk.clip). Other
// clip paths are left out: the group is then read as if unclipped.
func (b *builder) clipRegion(idx int32, name string, st *computed, ctm snapshot.Matrix) error {
	ref, _, ok := urlRef(strings.TrimSpace(st.v[pClipPath]))
	if !ok || !strings.HasPrefix(ref, "#") {
		return nil
	}
	cp, ok := b.ids[ref[1:]]
	if !ok || !strings.EqualFold(cp.Data, "clippath") || strings.EqualFold(attr(cp, "clipPathUnits"), "objectBoundingBox") {
		return nil
	}
	var rect *html.Node
	for c := cp.FirstChild; c != nil; c = c.NextSibling {
		if c.Type != html.ElementNode {
			continue
		}
		if rect != nil || !strings.EqualFold(c.Data, "rect") {
			return nil
		}
		rect = c
	}
	if rect == nil {
		return nil
	}
	m := ctm
	for _, e := range []*html.Node{cp, rect} {
		if t := attr(e, "transform"); t != "" {
			tm, err := ParseTransform(t)
			if err != nil {
				return nil
			}
			m = m.Mul(tm)
		}
	}
	geom := make([]float64, 4)
	for i, k := range []string{"x", "y", "width", "height"} {
		if a := attr(rect, k); a != "" {
			x, ok := length(a, 0)
			if !ok {
				return nil
			}
			geom[i] = x
		}
	}
	return b.addClip(idx, name, geom, m)
}

// addClip adds a clip region (x y width height, mapped to page px by m)
// as a child of the node at idx, unless a value is not finite.
func (b *builder) addClip(idx int32, name string, rect []float64, m snapshot.Matrix) error {
	if !allFinite(rect) || !allFinite(m[:]) {
		return nil
	}
	if err := b.count(0); err != nil {
		return err
	}
	b.snap.Nodes = append(b.snap.Nodes, snapshot.Node{Parent: idx, Tag: snapshot.ClipTag, Name: name + ">" + snapshot.ClipTag,
		Geom: append([]float64(nil), rect...), CTM: m, Opacity: 1, FillOpacity: 1, StrokeOpacity: 1})
	return nil
}

// clipsOverflow says whether a chart's outermost <svg> clips what is
// drawn outside its box, by its overflow: browsers' own style sheet
// gives it hidden, which an author may make visible (auto, for an <svg>,
// means visible too). With two values, both must clip.
func clipsOverflow(v string) bool {
	f := strings.Fields(strings.ToLower(v))
	if len(f) == 0 {
		return true
	}
	for _, t := range f {
		if t != "hidden" && t != "clip" && t != "scroll" {
			return false
		}
	}
	return true
}

// count enforces the caps and the deadline before a node is added.
func (b *builder) count(useDepth int) error {
	snap := b.snap
	if len(snap.Nodes) >= snapshot.MaxNodes {
		return fmt.Errorf("static: %s: chart %s has more than %d elements", b.opt.Source, snap.Path, snapshot.MaxNodes)
	}
	if b.pageNodes++; b.pageNodes > snapshot.MaxPageNodes {
		return fmt.Errorf("static: %s: the page's charts have more than %d elements", b.opt.Source, snapshot.MaxPageNodes)
	}
	if useDepth > 0 {
		if b.useNodes++; b.useNodes > snapshot.MaxUseNodes {
			return fmt.Errorf("static: %s: chart %s instantiates more than %d elements through <use> (a chain of references?)", b.opt.Source, snap.Path, snapshot.MaxUseNodes)
		}
	}
	if len(snap.Nodes)&1023 == 1023 && !b.opt.Deadline.IsZero() && time.Now().After(b.opt.Deadline) {
		return fmt.Errorf("static: %s: %w", b.opt.Source, errTimeLimit)
	}
	return nil
}

// nodeCTM is the element's CTM: the parent's, its own transform (which
// the outermost <svg> does not take: its placement is the page's
// business), then inner. A CTM that overflows is recorded as a problem
// and the element is not drawn (inner comes back zero).
func (b *builder) nodeCTM(n *html.Node, tag string, parent int32, name string, ctm, inner snapshot.Matrix) (snapshot.Matrix, snapshot.Matrix) {
	if t := attr(n, "transform"); t != "" && (tag != "svg" || parent >= 0) {
		m, err := ParseTransform(t)
		if err != nil {
			b.snap.Problems = append(b.snap.Problems, fmt.Sprintf("%s: %v; the transform is ignored", name, err))
		} else {
			ctm = ctm.Mul(m)
		}
	}
	ctm = ctm.Mul(inner)
	if !allFinite(ctm[:]) {
		b.snap.Problems = append(b.snap.Problems, fmt.Sprintf("%s: the accumulated transform overflows; the element is not drawn", name))
		return snapshot.IdentityMatrix, snapshot.Matrix{}
	}
	return ctm, inner
}

// allFinite says whether no value is NaN or infinite.
func allFinite(vs []float64) bool {
	for _, v := range vs {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return false
		}
	}
	return true
}

// styledNode is a node with the computed paint, opacities, stroke width
// and flags of st, recorded as the read pass records them
// (snapshot.Node): no paint, no paint opacity.
func (b *builder) styledNode(st *computed, name string) snapshot.Node {
	node := snapshot.Node{
		FillOpacity: number01(st.v[pFillOpacity], 1), StrokeOpacity: number01(st.v[pStrokeOpacity], 1),
		Opacity: number01(st.v[pOpacity], 1), StrokeWidth: 1,
	}
	if sw, ok := length(st.v[pStrokeWidth], 16); ok && sw >= 0 {
		node.StrokeWidth = sw
	}
	if strings.EqualFold(st.v[pDisplay], "none") {
		node.Flags |= snapshot.Hidden
	}
	if v := strings.ToLower(st.v[pVisibility]); v == "hidden" || v == "collapse" {
		node.Flags |= snapshot.Invisible
	}
	node.Fill = b.paint(st.v[pFill], st, name)
	node.Stroke = b.paint(st.v[pStroke], st, name)
	if node.Fill.Kind == snapshot.PaintNone {
		node.FillOpacity = 1
	}
	if node.Stroke.Kind == snapshot.PaintNone {
		node.StrokeOpacity, node.StrokeWidth = 1, 0
	}
	return node
}

// geometry reads the tag's geometry attributes (snapshot.GeomLayout) into
// node.Geom; a value that is not a number hides the element, with a
// problem.
func (b *builder) geometry(n *html.Node, node *snapshot.Node, st *computed) {
	tag := node.Tag
	keys, ok := snapshot.GeomLayout[tag]
	if !ok {
		return
	}
	node.Geom = make([]float64, len(keys), len(keys)+1)
	for i, k := range keys {
		v := attr(n, k)
		if v == "" {
			if tag == "rect" && (k == "rx" || k == "ry") {
				node.Geom[i] = snapshot.GeomAuto // JSON has no NaN
			}
			continue
		}
		if tag == "text" {
			// x and y may be lists; the first value anchors the text.
			if f := strings.FieldsFunc(v, func(r rune) bool { return r == ' ' || r == ',' }); len(f) > 0 {
				v = f[0]
			}
		}
		x, ok := length(v, 0)
		if !ok {
			b.snap.Problems = append(b.snap.Problems, fmt.Sprintf("%s: %s=%q is not a number; the element is not drawn", node.Name, k, clip(v, 30)))
			node.Flags |= snapshot.Hidden
			continue
		}
		node.Geom[i] = x
	}
	if tag == "text" {
		node.Geom = append(node.Geom, fontSize(st.v[pFontSize], 16), fontWeight(st.v[pFontWeight], 400))
	}
}

// addChildren adds the SVG element children of n; a nested <svg> is a
// viewport of its own.
func (b *builder) addChildren(n *html.Node, idx int32, name string, st *computed, ctm snapshot.Matrix, useDepth int) error {
	k := 0
	for c := n.FirstChild; c != nil; c = c.NextSibling {
		if c.Type != html.ElementNode {
			continue
		}
		cname := name + "/" + strings.ToLower(c.Data) + strconv.Itoa(k)
		k++
		if c.Namespace != "svg" {
			continue
		}
		cst := b.casc.compute(c, st, cname)
		inner := snapshot.IdentityMatrix
		if strings.ToLower(c.Data) == "svg" {
			x, _ := length(attr(c, "x"), 0)
			y, _ := length(attr(c, "y"), 0)
			w, h, vb := b.viewport(c, cst, 0, 0)
			if !hasAttr(c, "width") {
				w = 0
			}
			inner = snapshot.Matrix{1, 0, 0, 1, x, y}.Mul(viewBoxMatrix(vb, w, h, attr(c, "preserveAspectRatio")))
		}
		if err := b.addNode(c, idx, cname, cst, ctm, inner, useDepth); err != nil {
			return err
		}
	}
	return nil
}

// expandUse adds the content a <use> references as its children, the way
// SVG 2 §5.6 instantiates a shadow tree: a <symbol> becomes a nested
// viewport sized by the use's width and height; x and y translate.
func (b *builder) expandUse(n *html.Node, idx int32, name string, st *computed, ctm snapshot.Matrix, depth int) error {
	ref := href(n)
	if !strings.HasPrefix(ref, "#") {
		if ref != "" {
			b.snap.Problems = append(b.snap.Problems, fmt.Sprintf("%s: <use> refers to %q outside the document; not drawn", name, clip(ref, 60)))
		}
		return nil
	}
	target, ok := b.ids[ref[1:]]
	if !ok {
		b.snap.Problems = append(b.snap.Problems, fmt.Sprintf("%s: <use> refers to missing #%s", name, clip(ref[1:], 60)))
		return nil
	}
	for p := n; p != nil; p = p.Parent {
		if p == target {
			b.snap.Problems = append(b.snap.Problems, fmt.Sprintf("%s: <use> refers to #%s, which contains it (a reference cycle); not expanded", name, clip(ref[1:], 60)))
			return nil
		}
	}
	if b.useStack[target] {
		b.snap.Problems = append(b.snap.Problems, fmt.Sprintf("%s: <use> of #%s inside its own expansion (a reference cycle); not expanded", name, clip(ref[1:], 60)))
		return nil
	}
	if b.useStack == nil {
		b.useStack = map[*html.Node]bool{}
	}
	b.useStack[target] = true
	defer delete(b.useStack, target)
	if depth >= MaxUseDepth {
		b.snap.Problems = append(b.snap.Problems, fmt.Sprintf("%s: <use> nesting deeper than %d (a reference cycle?); not expanded", name, MaxUseDepth))
		return nil
	}
	x, _ := length(attr(n, "x"), 0)
	y, _ := length(attr(n, "y"), 0)
	inner := snapshot.Matrix{1, 0, 0, 1, x, y}
	cname := name + ">" + strings.ToLower(target.Data)
	cst := b.casc.compute(target, st, cname)
	tag := strings.ToLower(target.Data)
	if tag == "symbol" || tag == "svg" {
		w, h := 100.0, 100.0
		if v, ok := length(attr(n, "width"), 0); ok && attr(n, "width") != "" {
			w = v
		} else if v, ok := length(attr(target, "width"), 0); ok && attr(target, "width") != "" {
			w = v
		}
		if v, ok := length(attr(n, "height"), 0); ok && attr(n, "height") != "" {
			h = v
		} else if v, ok := length(attr(target, "height"), 0); ok && attr(target, "height") != "" {
			h = v
		}
		_, _, vb := b.viewport(target, cst, w, h)
		inner = inner.Mul(viewBoxMatrix(vb, w, h, attr(target, "preserveAspectRatio")))
		// A symbol renders like a <g> holding its children.
		gi := int32(len(b.snap.Nodes))
		b.snap.Nodes = append(b.snap.Nodes, snapshot.Node{Parent: idx, Tag: "g", Name: cname, CTM: ctm.Mul(inner),
			Fill: b.paint(cst.v[pFill], cst, cname), Stroke: b.paint(cst.v[pStroke], cst, cname),
			FillOpacity: 1, StrokeOpacity: 1, Opacity: number01(cst.v[pOpacity], 1), StrokeWidth: 1})
		k := 0
		for c := target.FirstChild; c != nil; c = c.NextSibling {
			if c.Type != html.ElementNode || c.Namespace != "svg" {
				continue
			}
			ccname := cname + "/" + strings.ToLower(c.Data) + strconv.Itoa(k)
			k++
			if err := b.addNode(c, gi, ccname, b.casc.compute(c, cst, ccname), ctm.Mul(inner), snapshot.IdentityMatrix, depth+1); err != nil {
				return err
			}
		}
		return nil
	}
	return b.addNode(target, idx, cname, cst, ctm, inner, depth+1)
}

var white = snapshot.Unpack(0xffffffff).SRGB

func resolveCurrent(v string, st *computed) string {
	if strings.EqualFold(strings.TrimSpace(v), "currentcolor") {
		c := st.v[pColor]
		if strings.EqualFold(strings.TrimSpace(c), "currentcolor") {
			return "black"
		}
		return c
	}
	return v
}

// paint turns a computed fill or stroke value into a snapshot.Paint.
func (b *builder) paint(v string, st *computed, name string) snapshot.Paint {
	v = strings.TrimSpace(v)
	lv := strings.ToLower(v)
	if lv == "none" || lv == "" {
		return snapshot.Paint{}
	}
	if lv == "context-fill" || lv == "context-stroke" {
		return snapshot.Paint{}
	}
	if strings.HasPrefix(lv, "url(") {
		ref, fallback, ok := urlRef(v)
		if !ok {
			return snapshot.Paint{}
		}
		if p, ok := b.server(ref, st, name); ok {
			return p
		}
		if fallback != "" {
			return b.paint(fallback, st, name)
		}
		b.snap.Problems = append(b.snap.Problems, fmt.Sprintf("%s: paint server %q not found; painted as none", name, clip(ref, 60)))
		return snapshot.Paint{}
	}
	c, err := ParseColor(resolveCurrent(v, st))
	if err != nil {
		b.snap.Problems = append(b.snap.Problems, fmt.Sprintf("%s: %v; painted as none", name, err))
		return snapshot.Paint{}
	}
	return snapshot.Paint{Kind: snapshot.PaintColour, RGBA: snapshot.RGBA(c)}
}

// urlRef splits a value that begins with url(…) (in any case) into the
// reference it holds, unquoted, and what follows it, such as a paint's
// fallback; ok is false for any other value, or one without its ")".
func urlRef(v string) (ref, rest string, ok bool) {
	if len(v) < 4 || !strings.EqualFold(v[:4], "url(") {
		return "", "", false
	}
	end := strings.IndexByte(v, ')')
	if end < 0 {
		return "", "", false
	}
	return strings.Trim(strings.TrimSpace(v[4:end]), `'"`), strings.TrimSpace(v[end+1:]), true
}

// server resolves a gradient or pattern to the colours it paints.
func (b *builder) server(ref string, st *computed, name string) (snapshot.Paint, bool) {
	if !strings.HasPrefix(ref, "#") {
		return snapshot.Paint{}, false
	}
	n, ok := b.ids[ref[1:]]
	if !ok {
		return snapshot.Paint{}, false
	}
	switch strings.ToLower(n.Data) {
	case "lineargradient", "radialgradient":
		stops := b.stops(n, 0)
		if len(stops) == 0 {
			return snapshot.Paint{}, true // no stops: painted as none (SVG 1.1 §13.2.4)
		}
		var list []uint32
		for _, s := range stops {
			list = append(list, snapshot.RGBA(s.c))
		}
		return snapshot.Paint{Kind: snapshot.PaintServer, RGBA: snapshot.RGBA(stopAt(stops, 0.5)), Stops: list}, true
	case "pattern":
		var list []uint32
		var best uint32
		bestArea := -1.0
		pst := b.casc.compute(n, nil, name)
		walkNodes(n, func(c *html.Node) bool {
			if c == n || c.Type != html.ElementNode || c.Namespace != "svg" {
				return true
			}
			cst := b.casc.compute(c, pst, name)
			if strings.ToLower(cst.v[pFill]) == "none" || strings.HasPrefix(strings.ToLower(cst.v[pFill]), "url(") {
				return true
			}
			if _, isShape := snapshot.GeomLayout[strings.ToLower(c.Data)]; !isShape && c.Data != "path" && c.Data != "polygon" {
				return true
			}
			col, err := ParseColor(resolveCurrent(cst.v[pFill], cst))
			if err != nil || col.A == 0 {
				return true
			}
			v := snapshot.RGBA(col)
			list = append(list, v)
			area := 1.0
			if w, ok := length(attr(c, "width"), 0); ok {
				h, _ := length(attr(c, "height"), 0)
				area = w * h
			}
			if area > bestArea {
				best, bestArea = v, area
			}
			return true
		})
		if len(list) == 0 {
			return snapshot.Paint{}, true
		}
		return snapshot.Paint{Kind: snapshot.PaintServer, RGBA: best, Stops: list}, true
	}
	return snapshot.Paint{}, false
}

type stop struct {
	off float64
	c   snapshot.Colour
}

// stops returns the gradient stops, following href to an inherited
// gradient when this one has none (SVG 1.1 §13.2.4).
func (b *builder) stops(n *html.Node, depth int) []stop {
	var out []stop
	last := 0.0
	gst := b.casc.compute(n, nil, "gradient")
	for c := n.FirstChild; c != nil; c = c.NextSibling {
		if c.Type != html.ElementNode || strings.ToLower(c.Data) != "stop" {
			continue
		}
		st := b.casc.compute(c, gst, "stop")
		off := number01(attr(c, "offset"), 0)
		if off < last {
			off = last
		}
		last = off
		col, err := ParseColor(resolveCurrent(st.v[pStopColor], st))
		if err != nil {
			col = snapshot.Colour{A: 1}
		}
		col.A *= number01(st.v[pStopOpacity], 1)
		out = append(out, stop{off, col})
	}
	if len(out) == 0 && depth < MaxUseDepth {
		if r := href(n); strings.HasPrefix(r, "#") {
			if t, ok := b.ids[r[1:]]; ok {
				return b.stops(t, depth+1)
			}
		}
	}
	return out
}

// stopAt interpolates the gradient colour at offset t (in sRGB, the
// default color-interpolation).
func stopAt(s []stop, t float64) snapshot.Colour {
	if t <= s[0].off {
		return s[0].c
	}
	for i := 1; i < len(s); i++ {
		if t <= s[i].off {
			a, z := s[i-1], s[i]
			f := 0.0
			if z.off > a.off {
				f = (t - a.off) / (z.off - a.off)
			}
			mix := func(x, y float64) float64 { return x + (y-x)*f }
			return snapshot.Colour{SRGB: struct{ R, G, B float64 }{mix(a.c.R, z.c.R), mix(a.c.G, z.c.G), mix(a.c.B, z.c.B)}, A: mix(a.c.A, z.c.A)}
		}
	}
	return s[len(s)-1].c
}

func overSRGB(c snapshot.Colour, dst struct{ R, G, B float64 }) struct{ R, G, B float64 } {
	a := c.A
	return struct{ R, G, B float64 }{a*c.R + (1-a)*dst.R, a*c.G + (1-a)*dst.G, a*c.B + (1-a)*dst.B}
}

// rasterTags are the elements that draw pixels a chart may be made of.
var rasterTags = map[string]bool{"canvas": true, "img": true, "object": true, "embed": true}

// rasters names the charts drawn as pixels among the candidates, in
// document order, once every style sheet is known.
func (b *builder) rasters(cands []*html.Node) []snapshot.Raster {
	b.casc.backgroundURLs = b.casc.declaresBackgroundURL()
	count := map[string]int{}
	var out []snapshot.Raster
	for _, n := range cands {
		r, ok := snapshot.Raster{}, false
		if rasterTags[n.Data] {
			r, ok = rasterOf(n, &count)
		} else {
			r, ok = b.backgroundRaster(n, &count)
		}
		if ok && len(out) < snapshot.MaxRasters {
			out = append(out, r)
		}
	}
	return out
}

// mayHoldBackground says whether an HTML element may draw a chart as its
// CSS background image, as the read pass takes one: an element that holds
// nothing, no element and no text (a page's or a section's background,
// or a card's behind its text, is decoration).
func mayHoldBackground(n *html.Node) bool {
	switch n.Data {
	case "html", "body", "iframe", "frame", "head", "title", "meta", "link", "style", "script", "noscript", "template", "br", "hr", "wbr", "input", "option":
		return false
	}
	for c := n.FirstChild; c != nil; c = c.NextSibling {
		if c.Type == html.ElementNode || c.Type == html.TextNode && strings.TrimSpace(c.Data) != "" {
			return false
		}
	}
	return true
}

// backgroundRaster names an element whose CSS background is an image (a
// url(), not a gradient) at chart size: its CSS width and height in px at
// least snapshot.RasterMin. Without layout, other sizes are unknown, and
// such an element is left unnamed rather than taken for a chart: icons
// are drawn this way too.
func (b *builder) backgroundRaster(n *html.Node, count *map[string]int) (snapshot.Raster, bool) {
	if !b.casc.backgroundURLs && !strings.Contains(attr(n, "style"), "url(") {
		return snapshot.Raster{}, false
	}
	st := b.styleOfHTML(n)
	if st.v[pDisplay] == "none" || !strings.Contains(st.v[pBackgroundImage], "url(") && !strings.Contains(st.v[pBackground], "url(") {
		return snapshot.Raster{}, false
	}
	w, okW := length(st.v[pWidth], 0)
	h, okH := length(st.v[pHeight], 0)
	if !okW || !okH || w < snapshot.RasterMin[0] || h < snapshot.RasterMin[1] {
		return snapshot.Raster{}, false
	}
	k := (*count)["background"]
	(*count)["background"] = k + 1
	return snapshot.Raster{Tag: "background", Name: "background" + strconv.Itoa(k), Box: [4]float64{0, 0, w, h}}, true
}

// rasterOf names a raster element of chart size: its width and height
// attributes (a canvas is 300 × 150 without them, as HTML specifies) at
// least snapshot.RasterMin, or not given, since without layout the static
// reader cannot tell an image's size and a chart must not go unnamed.
func rasterOf(n *html.Node, count *map[string]int) (snapshot.Raster, bool) {
	size := func(key string, def float64) float64 {
		if v, ok := length(attr(n, key), 0); ok && v >= 0 {
			return v
		}
		return def
	}
	w, h := 0.0, 0.0
	if n.Data == "canvas" {
		w, h = 300, 150
	}
	w, h = size("width", w), size("height", h)
	if w > 0 && w < snapshot.RasterMin[0] || h > 0 && h < snapshot.RasterMin[1] {
		return snapshot.Raster{}, false
	}
	k := (*count)[n.Data]
	(*count)[n.Data] = k + 1
	return snapshot.Raster{Tag: n.Data, Name: n.Data + strconv.Itoa(k), Box: [4]float64{0, 0, w, h}}, true
}
