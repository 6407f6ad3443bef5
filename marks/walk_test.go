package marks

import (
	"fmt"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/static"
)

// A group of lined-up segments decides as one whether it is grid or
// connects data. In a scatter over a grid, one gridline's two ends may
// each fall on a point's centre by chance (a Vega-Lite scatter of 240
// random points did so): it is still a gridline, like its siblings. A
// dumbbell chart's connectors, which all join two dots, stay data.
func TestGridlineGroupDecidesAsOne(t *testing.T) {
	grid := func(stroke string) string {
		var b strings.Builder
		b.WriteString(`<g>`)
		for x := 0; x <= 200; x += 40 {
			fmt.Fprintf(&b, `<line x1="%d" y1="0" x2="%d" y2="200" stroke="%s"/>`, x, x, stroke)
		}
		b.WriteString(`</g>`)
		return b.String()
	}
	t.Run("a gridline whose ends meet two points", func(t *testing.T) {
		var b strings.Builder
		b.WriteString(`<svg width="220" height="220">` + grid("#dddddd") + `<g fill="#3b6e8f">`)
		// Two points sit on the gridline at x = 80, one at each end.
		for _, p := range [][2]int{{80, 0}, {80, 200}, {13, 27}, {57, 151}, {101, 66}, {133, 122}, {177, 39}, {191, 173}, {29, 95}, {149, 187}} {
			fmt.Fprintf(&b, `<circle cx="%d" cy="%d" r="3"/>`, p[0], p[1])
		}
		b.WriteString(`</g></svg>`)
		ch := walkPage(t, b.String())
		assert.Len(t, ch.Marks, 10, "the points alone are data")
		assert.Equal(t, 6, ch.Furniture[RoleGridline])
	})
	t.Run("a dumbbell chart's connectors", func(t *testing.T) {
		var b strings.Builder
		b.WriteString(`<svg width="220" height="160"><g stroke="#7d8a99">`)
		for y := 20; y <= 110; y += 30 {
			fmt.Fprintf(&b, `<line x1="50" y1="%d" x2="150" y2="%d"/>`, y, y)
		}
		b.WriteString(`</g><g fill="#b5473a">`)
		for y := 20; y <= 110; y += 30 {
			fmt.Fprintf(&b, `<circle cx="50" cy="%d" r="5"/><circle cx="150" cy="%d" r="5"/>`, y, y)
		}
		b.WriteString(`</g></svg>`)
		ch := walkPage(t, b.String())
		assert.Len(t, ch.Marks, 12, "four connectors and their eight dots")
		assert.Zero(t, ch.Furniture[RoleGridline])
	})
}

// A drawing placed wholly above the page's top (a library's hidden
// drawing for measuring text sat at top: -10000px, 9,000 px tall, with
// one black square in it) is not a chart: no reader can scroll to it.
// One that reaches into the page still is.
func TestDrawingAboveThePageIsNoChart(t *testing.T) {
	page := `<svg width="300" height="200"><g fill="#3b6e8f"><rect x="10" y="50" width="30" height="150"/><rect x="60" y="90" width="30" height="110"/><rect x="110" y="20" width="30" height="180"/></g></svg>`
	for _, c := range []struct {
		y     float64
		chart bool
	}{{-10000, false}, {-200, false}, {-150, true}, {0, true}} {
		p, err := static.Build(strings.NewReader(page), static.Options{Source: t.Name()})
		require.NoError(t, err)
		s := &p.Charts[0]
		s.Box[1] = c.y
		ch, err := Walk(s)
		require.NoError(t, err)
		assert.Equal(t, c.chart, ch.IsChart, "top at %g px", c.y)
		if !c.chart {
			assert.Contains(t, ch.Reason, "above the top of the page")
		}
	}
}

// D3's axes draw the line along the axis as one path with the outer
// ticks at its ends, a bracket ("M0,6V0H300V6"). It is an axis line, on
// both axes, with its ticks or without; a data line of four points that
// turns back at both ends farther than a tick's length stays data.
func TestAxisBracketIsAxis(t *testing.T) {
	bars := `<g fill="#3b6e8f"><rect x="20" y="80" width="40" height="120"/><rect x="90" y="40" width="40" height="160"/><rect x="160" y="120" width="40" height="80"/><rect x="230" y="60" width="40" height="140"/></g>`
	ticks := func(axis string) string {
		var b strings.Builder
		for k := 0; k < 4; k++ {
			if axis == "x" {
				fmt.Fprintf(&b, `<g class="tick" transform="translate(%d,0)"><line stroke="currentColor" y2="6"/><text fill="currentColor" y="9" dy="0.71em">w%d</text></g>`, 40+70*k, k+1)
			} else {
				fmt.Fprintf(&b, `<g class="tick" transform="translate(0,%d)"><line stroke="currentColor" x2="-6"/><text fill="currentColor" x="-9" dy="0.32em">%d</text></g>`, 200-50*k, 10*k)
			}
		}
		return b.String()
	}
	for name, c := range map[string]struct {
		x, y  string
		marks int
		axes  int
	}{
		"with ticks": {
			`<g transform="translate(40,210)" fill="none" font-size="10">` + ticks("x") + `<path class="domain" stroke="currentColor" d="M0.5,6V0.5H300.5V6"/></g>`,
			`<g transform="translate(40,10)" fill="none" font-size="10">` + ticks("y") + `<path class="domain" stroke="currentColor" d="M-6,200.5H0.5V0.5H-6"/></g>`,
			4, 2},
		"without ticks": {
			`<g transform="translate(40,210)" fill="none"><path stroke="#333333" d="M0.5,6V0.5H300.5V6"/></g>`,
			`<g transform="translate(40,10)" fill="none"><path stroke="#333333" d="M-6,200.5H0.5V0.5H-6"/></g>`,
			4, 2},
		"a data line that turns back far": {
			`<g transform="translate(40,10)" fill="none"><path stroke="#b5473a" d="M10,180V40H290V180"/></g>`,
			``,
			5, 0},
	} {
		t.Run(name, func(t *testing.T) {
			ch := walkPage(t, `<svg width="360" height="240" color="#333333"><g transform="translate(40,10)">`+bars+`</g>`+c.x+c.y+`</svg>`)
			assert.Len(t, ch.Marks, c.marks)
			assert.Equal(t, c.axes, ch.Furniture[RoleAxis])
		})
	}
}

// What a clip region leaves wholly outside is not drawn, so it is no
// mark: a chart library parks its hover line left of the plot area in a
// group clipped to it, and a zoomed chart leaves the points beyond its
// axes in the markup. A mark the region cuts stays. The region is a
// <clipPath> of one <rect>, named by the clip-path attribute or by a
// style rule, with the <clipPath>'s and the <rect>'s transforms.
func TestClippedOutIsNotDrawn(t *testing.T) {
	const defs = `<defs><clipPath id="plot"><rect width="200" height="100"/></clipPath>` +
		`<clipPath id="moved" transform="translate(100,0)"><rect width="100" height="100"/></clipPath>` +
		`<clipPath id="box" clipPathUnits="objectBoundingBox"><rect width="0.5" height="1"/></clipPath>` +
		`<clipPath id="left"><rect width="50" height="100"/></clipPath><clipPath id="right"><rect x="150" width="50" height="100"/></clipPath></defs>`
	points := `<circle cx="20" cy="50" r="3"/><circle cx="120" cy="30" r="3"/><circle cx="199" cy="70" r="3"/><circle cx="260" cy="40" r="3"/><circle cx="90" cy="140" r="3"/>`
	for name, c := range map[string]struct {
		body          string
		marks, hidden int
	}{
		"by the attribute": {`<g transform="translate(40,10)"><g clip-path="url(#plot)"><line x1="-10" x2="-10" y1="0" y2="100" stroke="#aaaaaa"/></g>` +
			`<g clip-path="url(#plot)" fill="#3b6e8f">` + points + `</g></g>`, 3, 3},
		"by a style rule":                            {`<style>.plot { clip-path: url("#plot") }</style><g transform="translate(40,10)"><g class="plot" fill="#3b6e8f">` + points + `</g></g>`, 3, 2},
		"with the clip path's transform":             {`<g clip-path="url(#moved)" fill="#3b6e8f">` + points + `</g>`, 2, 3},
		"in the bounding box's units, left as drawn": {`<g clip-path="url(#box)" fill="#3b6e8f">` + points + `</g>`, 5, 0},
		"two regions that do not meet":               {`<g clip-path="url(#left)"><g clip-path="url(#right)" fill="#3b6e8f">` + points + `</g></g>`, 0, 5},
		"unclipped":                                  {`<g fill="#3b6e8f">` + points + `</g>`, 5, 0},
	} {
		t.Run(name, func(t *testing.T) {
			ch := walkPage(t, `<svg width="320" height="200">`+defs+c.body+`</svg>`)
			assert.Len(t, ch.Marks, c.marks)
			assert.Equal(t, c.hidden, ch.Furniture[RoleHidden])
		})
	}
}

// Bars drawn with rounded corners (paths of lines and arcs, as a chart
// library draws its columns by default) are bars, not pie wedges, and
// the line they stand on is their baseline. Wedges stay wedges.
func TestRoundedBarsAreBars(t *testing.T) {
	var b strings.Builder
	b.WriteString(`<svg width="400" height="300"><g>`)
	for k, top := range []float64{94.5, 198.5, 33.5, 150.5, 120.5} {
		x := 66.5 + 52*float64(k)
		fill := "#8d96a0"
		if k == 2 {
			fill = "#b5473a"
		}
		fmt.Fprintf(&b, `<path fill="%s" d="M %g %g L %g %g A 3 3 0 0 1 %g %g L %g 269.5 A 0 0 0 0 1 %g 269.5 L %g 269.5 A 0 0 0 0 1 %g 269.5 L %g %g A 3 3 0 0 1 %g %g Z"/>`,
			fill, x+3, top, x+23, top, x+26, top+3, x+26, x+26, x, x, x, top+3, x+3, top)
	}
	b.WriteString(`</g><path fill="none" stroke="#333333" d="M 60 270 L 330 270"/>`)
	// Two pie wedges with arcs, for contrast.
	b.WriteString(`<g fill="#3b6e8f"><path d="M350,60 L350,20 A40,40 0 0 1 390,60 Z"/><path d="M350,60 L390,60 A40,40 0 0 1 350,100 Z"/></g></svg>`)
	ch := walkPage(t, b.String())
	assert.Equal(t, map[Kind]int{KindBar: 5, KindArc: 2}, kinds(ch))
	assert.Equal(t, 1, ch.Furniture[RoleAxis], "the line the bars stand on")
}

// A line drawn over the grid's outermost gridline, end to end with it,
// is the axis line of a chart whose axes have no ticks, even with a
// legend below it. A rule over a gridline inside the grid stays data.
func TestLineOnTheGridEdgeIsAxis(t *testing.T) {
	var b strings.Builder
	b.WriteString(`<svg width="600" height="360"><g>`)
	for _, y := range []float64{46.5, 102.5, 159.5, 216.5, 273.5} {
		fmt.Fprintf(&b, `<path fill="none" stroke="#e6e6e6" d="M 64 %g L 590 %g"/>`, y, y)
	}
	b.WriteString(`</g><path fill="none" stroke="#333333" d="M 64 273.5 L 590 273.5"/>`)
	b.WriteString(`<path fill="none" stroke="#c2410c" stroke-width="2" d="M 64 159.5 L 590 159.5"/>`)
	b.WriteString(`<g fill="none" stroke-width="2"><path stroke="#3b6e8f" d="M 90 200 L 143 120 L 196 150 L 249 90 L 302 130 L 355 100"/>` +
		`<path stroke="#5a9a4e" d="M 90 240 L 143 230 L 196 190 L 249 210 L 302 170 L 355 180"/></g>`)
	b.WriteString(`<g font-size="12"><path stroke="#3b6e8f" stroke-width="2" d="M 256 331 L 270 331"/><text x="274" y="335">s1</text>` +
		`<path stroke="#5a9a4e" stroke-width="2" d="M 310 331 L 324 331"/><text x="328" y="335">s2</text></g></svg>`)
	ch := walkPage(t, b.String())
	assert.Equal(t, 1, ch.Furniture[RoleAxis])
	assert.Equal(t, map[Kind]int{KindLine: 2, KindRule: 1}, kinds(ch), "the two series and the rule across the middle")
}

// A chart's outermost <svg> clips what lies outside its box, as
// browsers' own style sheet has it, unless its overflow is made visible.
func TestOutsideTheDrawingIsNotDrawn(t *testing.T) {
	points := `<g fill="#3b6e8f"><circle cx="20" cy="50" r="4"/><circle cx="60" cy="40" r="4"/><circle cx="100" cy="60" r="4"/><circle cx="500" cy="50" r="4"/><circle cx="-30" cy="50" r="4"/></g>`
	for style, want := range map[string]int{"": 3, "overflow: hidden": 3, "overflow: visible": 5, "overflow: auto": 5} {
		ch := walkPage(t, `<svg width="200" height="100" style="`+style+`">`+points+`</svg>`)
		assert.Len(t, ch.Marks, want, "style %q", style)
	}
	ch := walkPage(t, `<svg width="200" height="100" overflow="visible">`+points+`</svg>`)
	assert.Len(t, ch.Marks, 5, "the presentation attribute")
}
