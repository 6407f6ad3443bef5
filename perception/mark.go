package perception

import (
	"math"
	"standout/perception/colour"
	"strconv"
)

// Mark is one data mark as the analysis sees it. Coordinates are page CSS
// px.
type Mark struct {
	ID string
	// Kind groups marks that are compared with each other ("point",
	// "bar", …); marks of different kinds are separate displays.
	Kind string
	// Type selects the noticeable-difference fit for the mark's colour.
	Type colour.MarkType
	// Colour is the colour the reader sees: the paint composited with its
	// opacity over the background.
	Colour colour.SRGB
	// Outline, when HasOutline, is a stroke drawn around a filled mark,
	// composited likewise; it counts for contrast against the background.
	Outline    colour.SRGB
	HasOutline bool
	// Paint is the colour as the page's author wrote it (#rrggbb) and
	// Alpha the opacity the reader sees it through (paint alpha × fill- or
	// stroke-opacity × opacity); findings quote these, since the colour
	// composited over the background is not one the author can find in
	// their style sheet. Empty Paint: Colour is quoted.
	Paint string
	Alpha float64
	// Size is the size channel's value: area (px²) for points, cells,
	// arcs and areas; length (px) for bars and rules; stroke width for
	// lines. Length tells which Stevens exponent applies.
	Size   float64
	Length bool
	// MinPx and MaxPx are the smallest and largest dimensions (MinPx is
	// the stroke width for lines), for the noticeable-difference model.
	MinPx, MaxPx float64
	// Angle is the orientation in degrees modulo 360/Fold; Fold 0 means no
	// orientation (a circle).
	Angle float64
	Fold  int
	Shape string
	// Bold marks text of font weight 700 or more, for the large-text rule
	// of WCAG 2.x.
	Bold bool
	X, Y float64
	// Box is the mark's bounding box (x, y, width, height), for marks
	// that may touch their neighbours (bars).
	Box [4]float64
	// Vertices of a line or path mark, for connectedness.
	Vertices [][2]float64
}

// Input is one chart to analyse.
type Input struct {
	Marks      []Mark
	Background colour.SRGB
	// Legend holds legend swatches, checked for distinguishability.
	Legend []Mark
	// Emphasis lists indices into Marks that the chart means to emphasise.
	// Empty means: infer candidates.
	Emphasis []int
	// Labelled is true when the chart labels its marks directly (text
	// marks beside the data), which makes colour not the only cue.
	Labelled bool
}

// Shown names a mark's colour as its author wrote it: the paint, with the
// opacity the reader sees it through when that is below one ("#2a6fa8 at
// 40% opacity"), or the colour as seen when no paint is known.
func (m *Mark) Shown() string {
	if m.Paint == "" {
		return m.Colour.Hex()
	}
	if m.Alpha > 0 && m.Alpha < 0.995 {
		return m.Paint + " at " + strconv.Itoa(int(math.Round(m.Alpha*100))) + "% opacity"
	}
	return m.Paint
}
