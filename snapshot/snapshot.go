package snapshot

// SnapshotVersion is the version of the Snapshot layout and of its JSON
// form (snapshotjson.go). A browser read pass must send the same version;
// the decoder and Walk reject others. Version 2 made the JSON columnar.
const SnapshotVersion = 2

// Snapshot is one chart as rendered: the root <svg> element and its subtree,
// flattened in document order, with each element's resolved paint and its
// transform to page CSS pixels. It is what both ways in produce: the static
// builder (Build) from markup and CSS, and the extension's read pass from
// the live DOM. It crosses the JavaScript–Go boundary as one compact,
// columnar JSON document (MarshalJSON documents it): a flat array of
// numbers for the nodes, and tables of the tags, paints and strings they
// share.
//
// <use> elements are expanded (their referenced content appears as their
// children), so a snapshot never refers to anything outside itself except
// paint servers, whose colours are resolved into Paint.
type Snapshot struct {
	Version int
	// Source names the page or file the chart came from.
	Source string
	// Path is the stable id of the root <svg> within the page, such as
	// "svg0" or "iframe1/svg2".
	Path string
	// Title is the chart's name for people: its aria-label, its own
	// <title>, the caption of the <figure> that holds it, or the nearest
	// heading before it; empty when it has none (then Path names it).
	Title string
	// Anchor is a CSS selector that matches the root <svg> and nothing
	// else in its document (its id, its aria-label, or :nth-child steps
	// from an ancestor with an id or from body), for fixes an author can
	// paste; empty where no document-wide selector reaches it (a shadow
	// root).
	Anchor string
	// Box is the root <svg>'s viewport in page CSS px: x, y, width, height.
	Box [4]float64
	// Background is the colour behind the chart (0xRRGGBBAA), from the
	// nearest ancestor with an opaque background; white when none is known.
	Background uint32
	// Nodes are the elements of the chart in document order; Nodes[0] is
	// the root <svg>.
	Nodes []Node
	// Selected lists the nodes that matched Options.Select (the caller's
	// declared emphasis), as indices into Nodes.
	Selected []int32
	// Problems lists what could not be read, each naming the element.
	Problems []string
}

// Node is one element of a Snapshot.
//
// Coordinates in Geom and D are in the element's local user units; CTM maps
// them to page CSS px. Colours are 0xRRGGBBAA, not premultiplied.
type Node struct {
	// Parent is the index of the parent node, -1 for the root.
	Parent int32
	// Tag is the lowercase local name: "svg", "g", "rect", "text", ….
	Tag string
	// Name is the stable path of the element within the page, used as the
	// mark id, such as "svg0/g1/circle3".
	Name string
	// Geom holds the tag's numeric geometry attributes in the order
	// GeomLayout lists them (rx and ry of a rect are GeomAuto when not
	// given); a <text> adds its computed font size in px and its font
	// weight (1–1000) after x and y.
	Geom []float64
	// D is the path data of a <path>, or the points of a <polyline> or
	// <polygon>.
	D string
	// CTM is the matrix (a b c d e f) from local user units to page CSS px.
	CTM [6]float64
	// BBox, when the browser measured it, is the element's box in page CSS
	// px (x y width height), as getBoundingClientRect gives it. The read
	// pass measures text and paths only; for the other shapes, and in
	// static snapshots, Walk computes the same box from the geometry.
	BBox []float64
	// Fill and Stroke are the computed paints.
	Fill   Paint
	Stroke Paint
	// FillOpacity, StrokeOpacity and Opacity are the computed values of the
	// properties, each within [0, 1]. Opacity is this element's own;
	// ancestors' opacities are on the ancestors.
	//
	// Both ways in record a paint's properties only where the paint is
	// drawn: without a fill, FillOpacity is 1; without a stroke,
	// StrokeOpacity is 1 and StrokeWidth 0. The read pass thereby saves a
	// computed-style read per property it need not read.
	FillOpacity   float64
	StrokeOpacity float64
	Opacity       float64
	// StrokeWidth is in local user units.
	StrokeWidth float64
	// Flags holds Hidden and Invisible.
	Flags uint8
	// Text is the text content of <text>, <title> and <desc>.
	Text string
	// Label is the element's aria-label, if any.
	Label string
	// Class is the element's class attribute, trimmed (at most
	// MaxClassBytes), for fixes that name the author's own classes.
	Class string
}

// Node flags.
const (
	// Hidden: display:none on this element (the subtree is not rendered).
	Hidden uint8 = 1 << iota
	// Invisible: visibility is hidden or collapse.
	Invisible
)

// ClipTag tags a node that is no element but the clip region of its
// parent: a group (<g> or <a>) whose clip-path refers to a <clipPath> of
// one <rect> in the group's user space, or the chart's outermost <svg>
// when its overflow clips what lies outside its box (as browsers' own
// style sheet has it). Geom holds the rectangle's x, y, width and height,
// which CTM maps to page CSS px: for a group, the group's CTM with the
// <clipPath>'s and the <rect>'s own transforms; for the <svg>, its Box
// with the identity. It follows a group as its first child, and comes
// last for the <svg>, named its parent's name and ">#clip". No element's
// local name can begin with "#". Both ways in write it; Walk sets aside
// what lies wholly outside a region that clips it.
const ClipTag = "#clip"

// Paint is a computed fill or stroke.
type Paint struct {
	// Kind is PaintNone, PaintColour or PaintServer.
	Kind uint8
	// RGBA is the colour (0xRRGGBBAA). For a paint server it is the colour
	// the server paints in the middle of its area (WCAG: "take the central
	// colour"), and Stops lists every colour it paints.
	RGBA  uint32
	Stops []uint32
}

// Paint kinds.
const (
	PaintNone uint8 = iota
	PaintColour
	PaintServer
)

// Limits shared by both ways in: the static builder and the read pass
// (extension/reader.js, whose copies are generated from these) refuse a
// chart or page beyond them, as an error that names the limit.
const (
	// MaxNodes bounds the elements of one chart after <use> expansion:
	// 2.5 times the largest chart the benchmarks read (200,000 marks),
	// and about 0.6 GB in the static builder.
	MaxNodes = 1 << 19
	// MaxPageNodes bounds the elements of all charts of one page (or one
	// request to the extension's core).
	MaxPageNodes = 1 << 20
	// MaxUseNodes bounds the elements one chart instantiates through
	// <use>: a chain of references that each instantiate the previous
	// level ten times is a few hundred bytes of markup per power of ten.
	// Glyph text, the heaviest honest use, takes one element per letter.
	MaxUseNodes = 100_000
)

// NotRendered lists the elements whose content is never rendered
// directly; both ways in leave them out of a snapshot.
var NotRendered = map[string]bool{
	"defs": true, "clippath": true, "mask": true, "marker": true, "pattern": true, "symbol": true,
	"lineargradient": true, "radialgradient": true, "style": true, "script": true, "metadata": true,
	"foreignobject": true, "filter": true,
}

// GeomAuto stands for an absent rx or ry of a rect (auto).
const GeomAuto = -1

// GeomLayout lists, per tag, the attributes stored in Node.Geom, in
// order; tags not listed store none.
var GeomLayout = map[string][]string{
	"rect":    {"x", "y", "width", "height", "rx", "ry"},
	"image":   {"x", "y", "width", "height"},
	"circle":  {"cx", "cy", "r"},
	"ellipse": {"cx", "cy", "rx", "ry"},
	"line":    {"x1", "y1", "x2", "y2"},
	"text":    {"x", "y"},
}
