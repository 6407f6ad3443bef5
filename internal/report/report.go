// Package report turns walked and analysed charts into Standout's
// versioned report (docs/report.md) and its text form. The command-line
// tool and the WebAssembly core share it, so both ways in report alike.
package report

import (
	"errors"
	"math"
	"strconv"
	"strings"

	"standout/marks"
	"standout/perception"
	"standout/snapshot"
)

// Caution is the statement of the limits of the check, carried in every
// report.
const Caution = "CVD simulation is a model of average readers and real readers vary; verdicts are predictions from published laboratory findings, not measurements of your audience; passing is not an accessibility audit: follow the accessibility law that applies to you, WCAG conformance reviews and tests with real readers."

// Version is the version of the check --json document (see
// docs/report.md); Minor counts the fields added within it.
const (
	Version = 1
	Minor   = 5
)

// Mark is one mark of a chart as the report states it: what it is, its
// paint as authored (packed colours as #rrggbb), its box in page px and
// channel values, and, for data marks, its verdict under normal vision and
// each CVD type.
type Mark struct {
	ID          string     `json:"id"`
	Kind        string     `json:"kind"`
	Shape       string     `json:"shape"`
	Fill        *string    `json:"fill"`
	Stroke      *string    `json:"stroke"`
	FillStops   []string   `json:"fillStops,omitempty"`
	Opacity     float64    `json:"opacity"`
	FillOpacity float64    `json:"fillOpacity"`
	BBox        [4]float64 `json:"bbox"`
	Area        float64    `json:"area"`
	Angle       float64    `json:"angle"`
	Size        float64    `json:"size"`
	Text        string     `json:"text,omitempty"`
	// Points are a line's or rule's vertices in page CSS px (minor 2), at
	// most MaxPoints of them, evenly chosen, so that pictures outline it
	// along its path.
	Points [][2]float64 `json:"points,omitempty"`
	// Weight is a text mark's font weight, 1–1000 (minor 2).
	Weight float64 `json:"weight,omitempty"`
	Label  string  `json:"label,omitempty"`
	// Analysis (absent for legend swatches).
	Verdict     string      `json:"verdict,omitempty"`
	Channels    []string    `json:"channels,omitempty"`
	SearchSlope []float64   `json:"searchSlopeMsPerMark,omitempty"`
	SearchMs    []float64   `json:"searchMsEstimate,omitempty"`
	CVD         *CVDResults `json:"cvd,omitempty"`
}

// Chart is one drawing of a page: whether it is a chart (and if not,
// why), its marks, legend swatches and furniture, the problems met
// reading it, and the analysis's findings, grouping and emphasis.
type Chart struct {
	Path string `json:"path"`
	// Source is what the chart is drawn with (minor 4): "svg" for an
	// inline SVG chart, whose marks are read; "canvas", "image" or
	// "object" for a chart drawn as pixels whose pixels were judged, with
	// Regions in place of marks.
	Source string `json:"source"`
	// Title is the chart's name for people: its aria-label, <title>,
	// figure caption or nearest heading (minor 1); absent when it has none.
	Title string `json:"title,omitempty"`
	// Anchor is a CSS selector for the chart's <svg> in its document
	// (minor 2); absent inside a shadow root.
	Anchor     string         `json:"anchor,omitempty"`
	IsChart    bool           `json:"isChart"`
	Reason     string         `json:"reason,omitempty"`
	Box        [4]float64     `json:"box"`
	Background string         `json:"background,omitempty"`
	Marks      []Mark         `json:"marks"`
	Legend     []Mark         `json:"legend"`
	Furniture  map[string]int `json:"furniture"`
	Problems   []string       `json:"problems"`
	Findings   []Finding      `json:"findings"`
	Groups     *Groups        `json:"groups,omitempty"`
	// Extremes are the data extremes: marks that stand out only through
	// the value they encode (added in version 1, minor 1).
	Extremes []string  `json:"extremes,omitempty"`
	Emphasis *Emphasis `json:"emphasis,omitempty"`
	// Regions and CVD are, for a chart drawn as pixels (minor 4), its
	// pixels' most salient regions, strongest first, and the same for each
	// vision type: as in the page's Unchecked entry for it.
	Regions []Region            `json:"regions,omitempty"`
	CVD     map[string][]Region `json:"cvd,omitempty"`
}

// Page is one page or file: its charts and the problems met reading it.
type Page struct {
	Source string `json:"source"`
	// View is the width and colour scheme the page was read in (check
	// --browser --widths/--scheme; minor 2); absent for the browser's own.
	View     *View    `json:"view,omitempty"`
	Charts   []Chart  `json:"charts"`
	Problems []string `json:"problems"`
	// Unchecked are the page's charts drawn as pixels (canvas, image,
	// object), whose marks no reader can read (minor 2): named so that a
	// check never passes in silence where nothing was read.
	Unchecked []Unchecked `json:"unchecked,omitempty"`
	// Findings are about the page rather than one chart (minor 3): what
	// could not be read, and a page with no chart at all, each a warning
	// that says what to do, so that --fail-on warning fails on them.
	Findings []Finding `json:"findings,omitempty"`
}

// Unchecked is one element of chart size drawn as pixels: its kind
// ("canvas", "image", a CSS background image included, or "object"), its
// name within the page (canvas0, background1,
// frame1/img2) and its box in page CSS px (the static reader knows only
// the size its attributes give, at 0, 0; 0 where it gives none).
type Unchecked struct {
	Kind string     `json:"kind"`
	Name string     `json:"name"`
	Box  [4]float64 `json:"box"`
	// Regions are the most salient regions of its pixels, strongest
	// first, from the saliency map of Itti, Koch & Niebur (1998), when
	// the browser could capture them (minor 3); CVD holds the same for
	// each vision type, the map re-run on the simulated pixels.
	Regions []Region            `json:"regions,omitempty"`
	CVD     map[string][]Region `json:"cvd,omitempty"`
	// Emphasis is a declared emphasis box within it (--emphasis
	// box:x,y,w,h) and, per vision type, whether the strongest region
	// covers its centre: whether the eye goes there first (minor 3).
	Emphasis *RasterEmphasis `json:"emphasis,omitempty"`
}

// RasterEmphasis is a declared emphasis in a chart drawn as pixels.
type RasterEmphasis struct {
	Box   [4]float64      `json:"box"`
	Holds map[string]bool `json:"holds"`
}

// Region is a salient region of a chart drawn as pixels: its box in page
// CSS px and its salience relative to the strongest region's (1).
type Region struct {
	Box      [4]float64 `json:"box"`
	Salience float64    `json:"salience"`
}

// UncheckedOf names the rasters a reader found.
func UncheckedOf(rs []snapshot.Raster) []Unchecked {
	var out []Unchecked
	for _, r := range rs {
		kind := map[string]string{"canvas": "canvas", "img": "image", "background": "image", "object": "object", "embed": "object"}[r.Tag]
		if kind == "" {
			continue
		}
		out = append(out, Unchecked{Kind: kind, Name: r.Name, Box: [4]float64{r2(r.Box[0]), r2(r.Box[1]), r2(r.Box[2]), r2(r.Box[3])}})
	}
	return out
}

// UncheckedNotes says of each chart drawn as pixels, in a sentence, that
// it was not checked and why: the text report's and the panel's words.
func UncheckedNotes(us []Unchecked) []string {
	var out []string
	for _, u := range us {
		size := "of a size the page does not give"
		if u.Box[2] > 0 && u.Box[3] > 0 {
			size = strconv.FormatFloat(math.Round(u.Box[2]), 'f', 0, 64) + "×" + strconv.FormatFloat(math.Round(u.Box[3]), 'f', 0, 64) + " px"
		}
		art := "a "
		if strings.ContainsRune("aeiou", rune(u.Kind[0])) {
			art = "an "
		}
		note := u.Name + ", " + art + u.Kind + " " + size + ", was not checked: a chart drawn as pixels has no marks to read; check it by eye, or draw it as SVG."
		if len(u.Regions) > 0 {
			b := u.Regions[0].Box
			note += " Its pixels' most salient region (a prediction of where the eye goes first) is the " +
				strconv.FormatFloat(math.Round(b[2]), 'f', 0, 64) + "×" + strconv.FormatFloat(math.Round(b[3]), 'f', 0, 64) + " px at " +
				strconv.FormatFloat(math.Round(b[0]), 'f', 0, 64) + ", " + strconv.FormatFloat(math.Round(b[1]), 'f', 0, 64) + "."
		}
		out = append(out, note)
	}
	return out
}

// View is how a reader got the page: the viewport's width in CSS px and
// the colour scheme (light or dark) it preferred.
type View struct {
	Width  int    `json:"width,omitempty"`
	Scheme string `json:"scheme,omitempty"`
}

// String names the view for people: "360 px, dark".
func (v View) String() string {
	var parts []string
	if v.Width > 0 {
		parts = append(parts, strconv.Itoa(v.Width)+" px")
	}
	if v.Scheme != "" {
		parts = append(parts, v.Scheme)
	}
	return strings.Join(parts, ", ")
}

// CVDResults holds a mark's result for each simulated vision type. A
// struct rather than a map: same JSON, much faster to encode.
type CVDResults struct {
	Protan   Result `json:"protan"`
	Deutan   Result `json:"deutan"`
	Tritan   Result `json:"tritan"`
	Achromat Result `json:"achromat"`
}

// Get returns the result for a vision type name.
func (c *CVDResults) Get(v string) (Result, bool) {
	switch v {
	case "protan":
		return c.Protan, true
	case "deutan":
		return c.Deutan, true
	case "tritan":
		return c.Tritan, true
	case "achromat":
		return c.Achromat, true
	}
	return Result{}, false
}

// Report is the whole document.
type Report struct {
	// Errors names the pages that could not be loaded or read; the other
	// pages are reported in full.
	Errors  []string `json:"errors,omitempty"`
	Schema  string   `json:"schema"`
	Version int      `json:"version"`
	Minor   int      `json:"minor"`
	Pages   []Page   `json:"pages"`
	// ViewChanges says, for pages read in several views, what changes
	// from one to another, chart by chart (ViewChanges; minor 2).
	ViewChanges []string `json:"viewChanges,omitempty"`
	Caution     string   `json:"caution"`
}

func r2(v float64) float64 { return math.Round(v*100) / 100 }

func hexPtr(v *uint32) *string {
	if v == nil {
		return nil
	}
	s := snapshot.Hex(*v)
	return &s
}

func toMark(m marks.Mark) Mark {
	rm := Mark{ID: m.ID, Kind: string(m.Kind), Shape: string(m.Shape), Fill: hexPtr(m.Fill), Stroke: hexPtr(m.Stroke),
		Opacity: r2(m.Opacity * paintAlpha(m)), FillOpacity: r2(m.FillOpacity), Area: r2(m.Area), Angle: r2(m.Angle), Size: r2(m.Size),
		Text: m.Text, Weight: m.Weight, Label: m.Label}
	for i, v := range m.BBox {
		rm.BBox[i] = r2(v)
	}
	for _, s := range m.FillStops {
		rm.FillStops = append(rm.FillStops, snapshot.Hex(s))
	}
	if (m.Kind == marks.KindLine || m.Kind == marks.KindRule) && len(m.Vertices) >= 2 {
		step := max(1, (len(m.Vertices)+MaxPoints-1)/MaxPoints)
		for i := 0; i < len(m.Vertices); i += step {
			rm.Points = append(rm.Points, [2]float64{r2(m.Vertices[i].X), r2(m.Vertices[i].Y)})
		}
		if last := m.Vertices[len(m.Vertices)-1]; (len(m.Vertices)-1)%step != 0 {
			rm.Points = append(rm.Points, [2]float64{r2(last.X), r2(last.Y)})
		}
	}
	return rm
}

// MaxPoints bounds the vertices a report keeps of one line.
const MaxPoints = 1000

// paintAlpha is the alpha of the paint that shows the mark: the fill's when
// it has one, else the stroke's.
func paintAlpha(m marks.Mark) float64 {
	if m.Fill != nil && m.FillOpacity > 0 {
		return m.FillOpacity
	}
	if m.Stroke != nil {
		return m.StrokeOpacity
	}
	return 1
}

// Options are the analysis settings of a check.
type Options struct {
	// Selector is a CSS selector naming the intended emphasis.
	Selector string
	// IDs names the intended emphasis by mark id.
	IDs map[string]bool
	// Dark asks the static reader for the dark colour scheme: light-dark(),
	// custom properties and @media (prefers-color-scheme) rules resolve
	// for it (check --scheme dark without --browser).
	Dark bool
	// Box names it by a box in page CSS px: the marks whose centres it
	// holds.
	Box *[4]float64
	// Nodes names it by snapshot node: per chart path, the node indices
	// (the overlay's picks).
	Nodes map[string]map[int]bool
	// Params are the perception model's thresholds.
	Params perception.Params
	// Expired, when set, says whether a check ran past its time: no
	// further chart is analysed then. (A function, not a time: the
	// extension's core keeps package time out of its module.)
	Expired func() bool
	// PhoneWidth, when set, judges each chart wider than it as if scaled
	// down to it, as on a phone that shrinks a chart without re-laying it
	// out: marks get smaller, and small marks need bigger colour
	// differences (Szafir 2018). Charts that re-lay out need a reading at
	// that width (check --browser --widths).
	PhoneWidth float64
}

// DefaultOptions are the options of a check nobody tuned.
var DefaultOptions = Options{Params: perception.DefaultParams}

// Analysed is one chart walked and, if it is a chart, analysed.
type Analysed struct {
	Chart *marks.Chart
	// Result is nil when Chart.IsChart is false.
	Result *perception.Result
}

// AnalyseSnapshots walks and analyses snapshots, from the static builder
// or a browser's read pass, without building the report: the overlay's
// digest needs only part of it.
func AnalyseSnapshots(snaps []snapshot.Snapshot, opt Options) ([]Analysed, error) {
	out := make([]Analysed, 0, len(snaps))
	for i := range snaps {
		if opt.Expired != nil && opt.Expired() {
			return nil, errors.New("the check ran past its time limit at chart " + snaps[i].Path + " (see --timeout)")
		}
		ch, err := marks.Walk(&snaps[i])
		if err != nil {
			return nil, err
		}
		a := Analysed{Chart: ch}
		if ch.IsChart {
			in := ToPerception(ch, emphasisIDs(ch, opt))
			if opt.PhoneWidth > 0 && ch.Box[2] > opt.PhoneWidth {
				ScaleInput(&in, opt.PhoneWidth/ch.Box[2])
			}
			a.Result = perception.Analyse(in, opt.Params)
		}
		out = append(out, a)
	}
	return out, nil
}

// emphasisIDs is the declared emphasis of one chart by mark id: opt.IDs,
// and the marks of the nodes opt.Nodes names in this chart.
func emphasisIDs(ch *marks.Chart, opt Options) map[string]bool {
	nodes := opt.Nodes[ch.Path]
	if len(nodes) == 0 && opt.Box == nil {
		return opt.IDs
	}
	ids := map[string]bool{}
	for id := range opt.IDs {
		ids[id] = true
	}
	for _, m := range ch.Marks {
		if nodes[m.Node] || opt.Box != nil && InBox(*opt.Box, m.Centroid.X, m.Centroid.Y) {
			ids[m.ID] = true
		}
	}
	return ids
}

// InBox says whether (x, y) lies in box b (x, y, width, height).
func InBox(b [4]float64, x, y float64) bool {
	return x >= b[0] && x <= b[0]+b[2] && y >= b[1] && y <= b[1]+b[3]
}

// FromSnapshots walks and analyses snapshots, from the static builder or
// a browser's read pass, into a report page.
func FromSnapshots(name string, snaps []snapshot.Snapshot, problems []string, opt Options) (Page, error) {
	as, err := AnalyseSnapshots(snaps, opt)
	if err != nil {
		return Page{}, err
	}
	return PageOf(name, problems, as), nil
}

// PageOf builds the report page of analysed charts.
func PageOf(name string, problems []string, as []Analysed) Page {
	rp := Page{Source: name, Problems: nonNil(problems), Charts: []Chart{}}
	for _, a := range as {
		ch := a.Chart
		rc := Chart{Path: ch.Path, Source: "svg", Title: ch.Title, Anchor: ch.Anchor, IsChart: ch.IsChart, Reason: ch.Reason, Box: ch.Box,
			Background: snapshot.Hex(ch.Background), Marks: make([]Mark, 0, len(ch.Marks)), Legend: []Mark{},
			Furniture: furniture(ch.Furniture), Problems: nonNil(ch.Problems)}
		for _, m := range ch.Marks {
			rc.Marks = append(rc.Marks, toMark(m))
		}
		for _, m := range ch.Legend {
			rc.Legend = append(rc.Legend, toMark(m))
		}
		rc.Findings = []Finding{}
		if a.Result != nil {
			attachAnalysis(&rc, ch, a.Result)
		}
		rp.Charts = append(rp.Charts, rc)
	}
	return rp
}

// Name is how the reports call a chart: its title with its path, or its
// path alone.
func (c *Chart) Name() string {
	if c.Title == "" {
		return c.Path
	}
	return "“" + c.Title + "” (" + c.Path + ")"
}

// furniture counts what the walk set aside, by role name.
func furniture(f map[marks.Role]int) map[string]int {
	out := make(map[string]int, len(f))
	for r, n := range f {
		out[string(r)] = n
	}
	return out
}

func nonNil(s []string) []string {
	if s == nil {
		return []string{}
	}
	return s
}
