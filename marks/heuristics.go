package marks

// Heuristics are the walk's thresholds. Each says what it decides and why.
// Its evidence is the corpus charts the walk reads right with the value
// and wrong with it halved or doubled (heuristicsEvidence in
// heuristics_test.go, which TestHeuristicsEvidence recomputes from
// shared/corpus). Where the corpus reads the same across that range, the
// value is provisional: common practice or a case built by a unit test,
// and a candidate for tuning on more charts. Lengths are in page CSS px.
type Heuristics struct {
	// IconMax: a drawing at most this wide and high is an icon, not a
	// chart. Common practice: interface icons are 16–48 px.
	IconMax float64

	// BackgroundChart and BackgroundUnion: a rectangle covering at least
	// this share of the drawing, or of the union of the shapes' boxes, is
	// a background (filled) or a frame (unfilled), not a bar. Evidence
	// (BackgroundChart): vega-lite/bar_1d.
	BackgroundChart, BackgroundUnion float64
	// PanelMinShare: a rectangle covering at least this share of the
	// drawing and holding PanelMinInside shapes drawn after it is a facet's
	// background or frame; each inner shape covers at most PanelInnerShare
	// of it.
	PanelMinShare   float64
	PanelMinInside  int
	PanelInnerShare float64

	// AxisAlignSlack: a segment is axis-aligned when its extent across
	// its direction is within this; segments line up when their ends are
	// within AlignTol.
	AxisAlignSlack, AlignTol float64
	// PooledGroupMin and PooledGroupMax: segments pooled across parents
	// (ticks each wrapped in a <g> of its own) count as a tick or grid
	// group only in groups of this many; more is a data series of rules.
	PooledGroupMin, PooledGroupMax int
	// TickMaxLen: an aligned segment shorter than this is a tick, a longer
	// one a gridline, unless most long segments of its group pass through
	// the centres of two closed shapes each (within half the stroke plus
	// ThroughTol): then they connect data.
	TickMaxLen, ThroughTol float64
	// AxisTickTouches: a long line that this many tick ends touch (within
	// AlignTol) is an axis line.
	AxisTickTouches int
	// BaselineBars: a straight axis-aligned line on which this many bars
	// stand (or hang from), their ends on it within AlignTol and half its
	// stroke, is the value axis's baseline, not a data mark. Provisional:
	// a bar chart's baseline is drawn as a rule by several generators.
	BaselineBars int
	// SpineMinSpan: a straight axis-aligned line with every data mark on
	// one side is an axis line or a frame's side when it spans at least
	// this share of the marks' extent along it. Provisional: spines span
	// the plot, and a legend's line icons are a fraction of it.
	SpineMinSpan float64

	// LabelGroupMin: texts sharing a parent are marks (direct labels of
	// data) only in groups of at least this many that do not line up.
	// Evidence: most corpus charts, whose lone titles and axis labels
	// would be marks at half the value. LabelSpacingTol: texts lined up in a row or column are an axis's or
	// a legend's labels when their gaps differ by at most this share of
	// the median gap. Provisional: ticks are evenly spaced on linear and
	// band scales, and calendar months differ by up to a tenth.
	LabelGroupMin   int
	LabelSpacingTol float64

	// SwatchMaxSiblings: a legend swatch is never one of more siblings
	// than this. SwatchMaxSize: nor larger than this. A swatch's label
	// starts within max(size, SwatchLabelGapMin) + SwatchLabelGapExtra
	// to its right.
	SwatchMaxSiblings                      int
	SwatchMaxSize                          float64
	SwatchLabelGapMin, SwatchLabelGapExtra float64
	// LegendFrameArea: a closed shape behind two or more legend entries,
	// holding them and at most this many times the area of their box, is
	// the legend's frame. Provisional: frames pad their entries by about
	// an entry's height on each side.
	LegendFrameArea float64
	// RampMinAspect: a lone gradient-filled rectangle at least this many
	// times longer than wide is a colour ramp in a legend. Evidence:
	// vega-lite/rect_heatmap, vega-lite/layer_text_heatmap.
	RampMinAspect float64
	// RampMinCells: a colour ramp drawn in steps has at least this many
	// rectangles. Provisional: stepped ramps use 5 to 256 steps.
	RampMinCells int

	// HomogeneousShare: a group of closed outlines is one series of glyphs
	// when its commonest shape makes up this share, or when SymbolShare of
	// them are symbols of at most MaxSymbolKinds kinds. Evidence
	// (HomogeneousShare): eight bar charts of both libraries, among them
	// vega-lite/bar and observable-plot/letterFrequencyBar; (SymbolShare)
	// observable-plot/explicitSymbol, observable-plot/symbolSetFill,
	// vega-lite/point_color_with_shape; (MaxSymbolKinds)
	// observable-plot/symbolSetFill.
	HomogeneousShare, SymbolShare float64
	MaxSymbolKinds                int
	// MixedRectsMin: in a group that is not homogeneous and has more
	// outlines than this, rectangles are areas (map regions), not bars.
	MixedRectsMin int
	// CellsMin: equal rectangles on a lattice are cells in groups of at
	// least this many; SquarePointMax: equal squares at most this large
	// that do not tile are points. LatticeAssumed: a group this large is
	// taken for a lattice without testing neighbours (the test is
	// quadratic).
	CellsMin       int
	SquarePointMax float64
	LatticeAssumed int
	// PointMaxVertices and PointMaxSize: a small closed outline of few
	// vertices is a point symbol (a hexagon, an arrow glyph).
	PointMaxVertices int
	PointMaxSize     float64
	// CloudMinPoints: a compound path of at least this many point-sized
	// subpaths of one size is a scatter drawn in one path, a point per
	// subpath. Provisional: renderers switch to one path for large
	// scatters, of hundreds of points and more.
	CloudMinPoints int
	// SymbolStrokesMax and SymbolStrokesSize: two to this many short
	// crossing strokes within this size are one symbol (a plus, an ×).
	SymbolStrokesMax  int
	SymbolStrokesSize float64

	// GlyphMaxSize: an instance of a <use> at most this wide and high,
	// filled and sitting on its origin rather than around it, is a glyph
	// of text drawn as outlines. GlyphGap: glyphs on one baseline belong
	// to one text while each starts within this many ems (glyph heights)
	// of the last one's end. Common practice: labels are set at 8–36 px,
	// and a word space is a third to half an em.
	GlyphMaxSize, GlyphGap float64
}

// DefaultHeuristics are the thresholds the walk uses.
var DefaultHeuristics = Heuristics{
	IconMax: 64,

	BackgroundChart: 0.5, BackgroundUnion: 0.85,
	PanelMinShare: 0.05, PanelMinInside: 3, PanelInnerShare: 0.25,

	AxisAlignSlack: 0.5, AlignTol: 1,
	PooledGroupMin: 3, PooledGroupMax: 200,
	TickMaxLen: 15, ThroughTol: 1.5,
	AxisTickTouches: 2,
	BaselineBars:    2,
	SpineMinSpan:    0.5,

	LabelGroupMin: 3, LabelSpacingTol: 0.25,

	SwatchMaxSiblings: 20, SwatchMaxSize: 60,
	SwatchLabelGapMin: 10, SwatchLabelGapExtra: 12,
	LegendFrameArea: 4,
	RampMinAspect:   4,

	HomogeneousShare: 0.8, SymbolShare: 0.9, MaxSymbolKinds: 12,
	MixedRectsMin:    4,
	CellsMin:         4,
	SquarePointMax:   24,
	LatticeAssumed:   2000,
	PointMaxVertices: 48, PointMaxSize: 60,
	CloudMinPoints:   3,
	SymbolStrokesMax: 4, SymbolStrokesSize: 30,
	GlyphMaxSize: 48, GlyphGap: 1.2,
}
