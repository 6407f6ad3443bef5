package marks

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/snapshot"
	"standout/static"
)

// walkPage walks the single chart of an SVG page written inline.
func walkPage(t *testing.T, page string) *Chart {
	t.Helper()
	p, err := static.Build(strings.NewReader(page), static.Options{Source: t.Name()})
	require.NoError(t, err)
	require.Len(t, p.Charts, 1)
	ch, err := Walk(&p.Charts[0])
	require.NoError(t, err)
	return ch
}

func kinds(ch *Chart) map[Kind]int {
	out := map[Kind]int{}
	for _, m := range ch.Marks {
		out[m.Kind]++
	}
	return out
}

// Text drawn as glyph outlines: each label a row of <use> references to
// glyph paths (font units, flipped, as a plotting library writes them),
// beside markers that are <use> references too. The glyphs make one
// text each, set aside as labels; the markers, drawn around their
// origins, stay points. The glyph shapes here are a 0 (two subpaths) and
// a 1, in a 1000-unit em with the baseline at y=0.
func TestGlyphOutlinesAreText(t *testing.T) {
	const glyphs = `<defs>
	<path id="g0" d="M 300 -10 C 120 -10 60 150 60 360 C 60 570 120 730 300 730 C 480 730 540 570 540 360 C 540 150 480 -10 300 -10 Z M 300 70 C 420 70 450 200 450 360 C 450 520 420 650 300 650 C 180 650 150 520 150 360 C 150 200 180 70 300 70 Z"/>
	<path id="g1" d="M 110 0 L 530 0 L 530 80 L 370 80 L 370 730 L 270 730 L 110 690 L 110 610 L 270 650 L 270 80 L 110 80 Z"/>
	<path id="dot" d="M 0 3 C 1.7 3 3 1.7 3 0 C 3 -1.7 1.7 -3 0 -3 C -1.7 -3 -3 -1.7 -3 0 C -3 1.7 -1.7 3 0 3 Z"/></defs>`
	var b strings.Builder
	b.WriteString(`<svg xmlns:xlink="http://www.w3.org/1999/xlink" width="400" height="300">` + glyphs)
	for i, x := range []int{50, 150, 250} { // tick labels "0", "10", "10"
		b.WriteString(`<g transform="translate(` + itoa(x) + ` 280) scale(0.012 -0.012)"><use xlink:href="#g` + itoa(i%2) + `"/>`)
		if i > 0 {
			b.WriteString(`<use xlink:href="#g0" x="600"/>`)
		}
		b.WriteString(`</g>`)
	}
	b.WriteString(`<g transform="translate(10 150) rotate(-90) scale(0.012 -0.012)"><use xlink:href="#g1"/><use xlink:href="#g0" x="600"/><use xlink:href="#g0" x="1200"/></g>`)
	b.WriteString(`<g style="fill:#4f8a8b">`)
	for i := 0; i < 12; i++ {
		b.WriteString(`<use xlink:href="#dot" x="` + itoa(60+i*25) + `" y="` + itoa(60+(i*37)%150) + `"/>`)
	}
	b.WriteString(`</g></svg>`)
	ch := walkPage(t, b.String())
	assert.Equal(t, map[Kind]int{KindPoint: 12}, kinds(ch), "the markers are the only marks")
	assert.Equal(t, 4, ch.Furniture[RoleLabel], "three tick labels and the rotated axis title are labels")
	assert.Equal(t, 8, ch.Furniture[RoleGlyph], "every glyph is part of a text")
}

func itoa(v int) string { return strconv.Itoa(v) }

// Both axes' tick labels in one parent (as hand-written chart code and
// some libraries put them) are labels, though the group as a whole does
// not line up; values written in a table's cells are text marks.
func TestTextRunsInOneParent(t *testing.T) {
	var b strings.Builder
	b.WriteString(`<svg width="400" height="300"><g fill="#333">`)
	for i := 0; i < 6; i++ {
		b.WriteString(`<text x="` + itoa(50+i*60) + `" y="290" text-anchor="middle">` + itoa(i*2) + `</text>`)
		b.WriteString(`<text x="40" y="` + itoa(260-i*45) + `" text-anchor="end">` + itoa(i*10) + `</text>`)
	}
	b.WriteString(`</g><g fill="#4f8a8b">`)
	for i := 0; i < 5; i++ {
		b.WriteString(`<circle cx="` + itoa(80+i*50) + `" cy="` + itoa(60+i*30) + `" r="4"/>`)
	}
	b.WriteString(`</g></svg>`)
	ch := walkPage(t, b.String())
	assert.Equal(t, map[Kind]int{KindPoint: 5}, kinds(ch))
	assert.Equal(t, 12, ch.Furniture[RoleLabel])

	b.Reset()
	b.WriteString(`<svg width="400" height="300"><g>`)
	for r := 0; r < 3; r++ {
		for c := 0; c < 4; c++ {
			b.WriteString(`<rect x="` + itoa(20+c*60) + `" y="` + itoa(20+r*40) + `" width="60" height="40" fill="#` + []string{"e8dcd0", "b78f8e", "86414c"}[(r+c)%3] + `"/>`)
		}
	}
	b.WriteString(`</g><g fill="#000">`)
	for r := 0; r < 3; r++ {
		for c := 0; c < 4; c++ {
			b.WriteString(`<text x="` + itoa(50+c*60) + `" y="` + itoa(44+r*40) + `" text-anchor="middle">` + itoa(r*4+c) + `</text>`)
		}
	}
	b.WriteString(`</g></svg>`)
	ch = walkPage(t, b.String())
	assert.Equal(t, map[Kind]int{KindCell: 12, KindText: 12}, kinds(ch), "a table of values is text marks")
}

// Axis lines drawn as two <line> spines meeting at the origin, without
// ticks, are furniture: in a scatter of 100 dots with 11 in red, they
// were rules that "popped through orientation" as the inferred emphasis.
// A lone line beyond the data (a target) stays a mark, and so does a rule
// with data on both sides.
func TestSpinesAreFurniture(t *testing.T) {
	dots := func() string {
		var b strings.Builder
		for i := 0; i < 100; i++ {
			fill := "#a7a9ac"
			if i%9 == 4 {
				fill = "#d1495b"
			}
			b.WriteString(`<circle cx="` + itoa(60+(i*37)%420) + `" cy="` + itoa(30+(i*53)%320) + `" r="4" fill="` + fill + `"/>`)
		}
		return b.String()
	}
	ch := walkPage(t, `<svg width="500" height="400"><g stroke="#333"><line x1="50" x2="490" y1="360" y2="360"/><line x1="50" x2="50" y1="360" y2="20"/></g>`+dots()+`</svg>`)
	assert.Equal(t, map[Kind]int{KindPoint: 100}, kinds(ch))
	assert.Equal(t, 2, ch.Furniture[RoleAxis])

	ch = walkPage(t, `<svg width="500" height="400"><line x1="50" x2="490" y1="10" y2="10" stroke="#c23a2e"/><line x1="50" x2="490" y1="200" y2="200" stroke="#333"/>`+dots()+`</svg>`)
	assert.Equal(t, map[Kind]int{KindPoint: 100, KindRule: 2}, kinds(ch), "a target beyond the data and a rule through it stay marks")
}

// A gridline that happens to cross the centres of scattered points is
// still a gridline; a rule joining two dots at its ends connects them.
func TestGridlineThroughPoints(t *testing.T) {
	var b strings.Builder
	b.WriteString(`<svg width="500" height="400"><g stroke="#e0e6f1">`)
	for y := 50; y <= 350; y += 60 {
		b.WriteString(`<line x1="40" x2="480" y1="` + itoa(y) + `" y2="` + itoa(y) + `"/>`)
	}
	b.WriteString(`</g><g fill="#4f8a8b"><circle cx="100" cy="110" r="4"/><circle cx="300" cy="110" r="4"/>`)
	for i := 0; i < 20; i++ {
		b.WriteString(`<circle cx="` + itoa(70+i*19) + `" cy="` + itoa(75+(i*41)%260) + `" r="4"/>`)
	}
	b.WriteString(`</g></svg>`)
	ch := walkPage(t, b.String())
	assert.Equal(t, map[Kind]int{KindPoint: 22}, kinds(ch))
	assert.Equal(t, 6, ch.Furniture[RoleGridline])
}

// Pie and ring wedges drawn with cubic Bézier curves back to the centre
// (a plotting library's arcs) are arcs, like those drawn with elliptical
// arc commands. The curves here are the standard four-segment circle
// approximation (k = 0.5523) cut into quarters.
func TestBezierWedgesAreArcs(t *testing.T) {
	const k = 0.5523
	quarter := func(cx, cy, r float64, q int, inner float64) string {
		// The quarter from angle q·90° to (q+1)·90°, outer rim, then back
		// along the inner rim (or to the centre when inner is 0).
		pt := func(rr, deg float64) (float64, float64) {
			s, c := math.Sincos(deg * math.Pi / 180)
			return cx + rr*c, cy + rr*s
		}
		a0, a1 := float64(q*90), float64(q*90+90)
		x0, y0 := pt(r, a0)
		x1, y1 := pt(r, a1)
		c1x, c1y := x0-k*r*math.Sin(a0*math.Pi/180), y0+k*r*math.Cos(a0*math.Pi/180)
		c2x, c2y := x1+k*r*math.Sin(a1*math.Pi/180), y1-k*r*math.Cos(a1*math.Pi/180)
		d := fmt.Sprintf("M %.3f %.3f C %.3f %.3f %.3f %.3f %.3f %.3f ", x0, y0, c1x, c1y, c2x, c2y, x1, y1)
		if inner == 0 {
			return d + fmt.Sprintf("L %.3f %.3f Z", cx, cy)
		}
		ix1, iy1 := pt(inner, a1)
		ix0, iy0 := pt(inner, a0)
		d += fmt.Sprintf("L %.3f %.3f ", ix1, iy1)
		d += fmt.Sprintf("C %.3f %.3f %.3f %.3f %.3f %.3f ", ix1+k*inner*math.Sin(a1*math.Pi/180), iy1-k*inner*math.Cos(a1*math.Pi/180),
			ix0-k*inner*math.Sin(a0*math.Pi/180), iy0+k*inner*math.Cos(a0*math.Pi/180), ix0, iy0)
		return d + "Z"
	}
	for name, inner := range map[string]float64{"pie": 0, "ring": 60} {
		t.Run(name, func(t *testing.T) {
			var b strings.Builder
			b.WriteString(`<svg width="300" height="300">`)
			for q, fill := range []string{"#3b6e8f", "#c8553d", "#6a994e", "#e0a458"} {
				b.WriteString(`<path d="` + quarter(150, 150, 100, q, inner) + `" fill="` + fill + `"/>`)
			}
			b.WriteString(`</svg>`)
			ch := walkPage(t, b.String())
			assert.Equal(t, map[Kind]int{KindArc: 4}, kinds(ch))
		})
	}
	// A rounded rectangle (a legend's frame) is not a wedge.
	g, ok, err := Measure(&snapshot.Node{Tag: "path", CTM: snapshot.IdentityMatrix,
		D: "M 10 0 L 90 0 Q 100 0 100 10 L 100 50 Q 100 60 90 60 L 10 60 Q 0 60 0 50 L 0 10 Q 0 0 10 0 Z"})
	require.True(t, ok)
	require.NoError(t, err)
	assert.NotEqual(t, ShapeWedge, g.Shape)
}

// A filled circle drawn as one open elliptical arc on a unit circle,
// placed and scaled by matrix(...) (as some desktop tools export bubbles),
// is a filled disc: a point, not a line.
func TestOpenArcBubbleIsAPoint(t *testing.T) {
	var b strings.Builder
	b.WriteString(`<svg width="400" height="300">`)
	for i := 0; i < 8; i++ {
		b.WriteString(`<path d="M1,0A1,1,0,1,1,0.99995,-0.01" fill="#a7a9ac" transform="matrix(` + itoa(8+i*2) + `,0,0,` + itoa(8+i*2) + `,` + itoa(40+i*45) + `,` + itoa(60+(i*71)%200) + `)"/>`)
	}
	b.WriteString(`<path d="M 20 280 C 100 200 200 250 380 120" fill="none" stroke="#333"/></svg>`)
	ch := walkPage(t, b.String())
	assert.Equal(t, map[Kind]int{KindPoint: 8, KindLine: 1}, kinds(ch), "the unfilled curve stays a line")
	assert.Equal(t, ShapeCircle, ch.Marks[0].Shape)
}

// A legend built from plain shapes: a rounded frame, and per entry a
// series icon (a short line with a dot on it) and a label. The icons are
// legend swatches, and the frame is set aside; the data
// lines and dots stay marks.
func TestPlainShapeLegend(t *testing.T) {
	var b strings.Builder
	b.WriteString(`<svg width="640" height="400">`)
	for s, colour := range []string{"#4f8a8b", "#c8553d", "#8e5572"} {
		var d strings.Builder
		for i := 0; i < 10; i++ {
			x, y := 60+i*40, 100+s*80+(i*29)%50
			if i == 0 {
				d.WriteString("M")
			} else {
				d.WriteString("L")
			}
			d.WriteString(itoa(x) + "," + itoa(y))
			b.WriteString(`<circle cx="` + itoa(x) + `" cy="` + itoa(y) + `" r="3" fill="` + colour + `"/>`)
		}
		b.WriteString(`<path d="` + d.String() + `" fill="none" stroke="` + colour + `" stroke-width="2"/>`)
	}
	b.WriteString(`<g transform="translate(510,20)"><rect width="110" height="72" rx="6" fill="#fff" stroke="#bbb"/>`)
	for i, e := range [][2]string{{"upper ford", "#4f8a8b"}, {"mill weir", "#c8553d"}, {"sea lock", "#8e5572"}} {
		b.WriteString(`<g transform="translate(10,` + itoa(16+i*20) + `)"><line x2="18" stroke="` + e[1] + `" stroke-width="2"/><circle cx="9" r="3.5" fill="` + e[1] + `"/><text x="26" y="4">` + e[0] + `</text></g>`)
	}
	b.WriteString(`</g></svg>`)
	ch := walkPage(t, b.String())
	assert.Equal(t, map[Kind]int{KindPoint: 30, KindLine: 3}, kinds(ch))
	// Each icon's dot is a swatch, with its line when that was not already
	// taken for a tick (three equal segments lined up).
	assert.GreaterOrEqual(t, len(ch.Legend), 3)
	assert.LessOrEqual(t, len(ch.Legend), 6)
	assert.Equal(t, 1, ch.Furniture[RoleBackground], "the frame")
	assert.Equal(t, 3, ch.Furniture[RoleLegendLabel])
}

// A row legend in a flat drawing (every shape a child of the root, as a
// canvas-style renderer writes SVG) is found although the swatches have
// hundreds of siblings: what counts is siblings of the same shape and
// size.
func TestFlatRowLegend(t *testing.T) {
	var b strings.Builder
	b.WriteString(`<svg width="640" height="400">`)
	for i, e := range [][2]string{{"east bakery", "#3b6e8f"}, {"west bakery", "#e0a458"}} {
		x := 200 + i*130
		b.WriteString(`<rect x="` + itoa(x) + `" y="5" width="25" height="14" fill="` + e[1] + `"/><text x="` + itoa(x+30) + `" y="16">` + e[0] + `</text>`)
	}
	for i := 0; i < 60; i++ {
		h := 40 + (i*67)%200
		b.WriteString(`<rect x="` + itoa(40+i*9) + `" y="` + itoa(350-h) + `" width="7" height="` + itoa(h) + `" fill="` + []string{"#3b6e8f", "#e0a458"}[i%2] + `"/>`)
	}
	b.WriteString(`</svg>`)
	ch := walkPage(t, b.String())
	assert.Equal(t, map[Kind]int{KindBar: 60}, kinds(ch))
	assert.Len(t, ch.Legend, 2)
}

// Labels tied to pie wedges by leader lines are labels, and the lines
// too: they are not five text marks and five line marks.
func TestLeaderLinesTieLabels(t *testing.T) {
	var b strings.Builder
	b.WriteString(`<svg width="400" height="400">`)
	for i, fill := range []string{"#3b6e8f", "#c8553d", "#6a994e", "#e0a458", "#8e5572"} {
		a0, a1 := float64(i)*72, float64(i+1)*72
		s0, c0 := math.Sincos(a0 * math.Pi / 180)
		s1, c1 := math.Sincos(a1 * math.Pi / 180)
		b.WriteString(fmt.Sprintf(`<path d="M200,200L%.2f,%.2fA100,100,0,0,1,%.2f,%.2fZ" fill="%s"/>`, 200+100*c0, 200+100*s0, 200+100*c1, 200+100*s1, fill))
		sm, cm := math.Sincos((a0 + a1) / 2 * math.Pi / 180)
		ex, ey := 200+100*cm, 200+100*sm
		kx, ky := 200+118*cm, 200+118*sm
		dir := 1.0
		if cm < 0 {
			dir = -1
		}
		b.WriteString(fmt.Sprintf(`<polyline points="%.1f %.1f %.1f %.1f %.1f %.1f" fill="none" stroke="%s"/>`, ex, ey, kx, ky, kx+15*dir, ky, fill))
		b.WriteString(fmt.Sprintf(`<text x="%.1f" y="%.1f">slice %d</text>`, kx+20*dir, ky+4, i))
	}
	b.WriteString(`</svg>`)
	ch := walkPage(t, b.String())
	assert.Equal(t, map[Kind]int{KindArc: 5}, kinds(ch))
	assert.Equal(t, 10, ch.Furniture[RoleLabel])
}

// A colour bar drawn as a strip of graded rectangles, with an outline and
// two range handles, is a legend, not 24 bars; a heat map's cells beside
// it stay cells. A ramp drawn as an image takes its outline with it.
func TestSteppedColourBar(t *testing.T) {
	var b strings.Builder
	b.WriteString(`<svg width="640" height="400"><g>`)
	for r := 0; r < 6; r++ {
		for c := 0; c < 10; c++ {
			v := (r*7 + c*3) % 11
			b.WriteString(fmt.Sprintf(`<rect x="%d" y="%d" width="35" height="35" fill="#%02x%02x%02x"/>`, 50+c*36, 20+r*36, 0xee-v*17, 0xf3-v*15, 0xe8-v*18))
		}
	}
	b.WriteString(`</g><g transform="translate(530,20)">`)
	for k := 0; k < 24; k++ {
		v := 23 - k
		b.WriteString(fmt.Sprintf(`<rect y="%d" width="16" height="9" fill="#%02x%02x%02x"/>`, k*9, 0x2f+v*8, 0x5d+v*6, 0x50+v*6))
	}
	b.WriteString(`<rect width="16" height="216" fill="none" stroke="#333"/><path d="M-6,-4L0,0L-6,4Z"/><path d="M-6,212L0,216L-6,220Z"/></g>`)
	b.WriteString(`<image x="600" y="20" width="12" height="200" href="data:,"/><rect x="600" y="20" width="12" height="200" fill="none" stroke="#333"/></svg>`)
	ch := walkPage(t, b.String())
	assert.Equal(t, map[Kind]int{KindCell: 60}, kinds(ch))
	assert.Len(t, ch.Legend, 24)
	assert.Equal(t, 4, ch.Furniture[RoleFrame]+ch.Furniture[RoleBackground], "two outlines and two handles")
}

// A scatter of many points drawn as one compound path, a subpath per
// point, is that many points, not one area; a letter's outline with its
// hole is not a cloud.
func TestCompoundPathScatter(t *testing.T) {
	var d strings.Builder
	for i := 0; i < 500; i++ {
		x, y := 20+float64((i*37)%560), 20+float64((i*91)%360)
		d.WriteString(fmt.Sprintf("M%.1f %.1fA2 2 0 1 1 %.1f %.1fA2 2 0 0 1 %.1f %.1f", x, y+2, x, y-2, x, y+2))
	}
	ch := walkPage(t, `<svg width="600" height="400"><path fill="#6a994e" d="`+d.String()+`"/></svg>`)
	require.Equal(t, map[Kind]int{KindPoint: 500}, kinds(ch))
	assert.InDelta(t, 4, ch.Marks[0].BBox[2], 0.2, "each point is measured on its own")

	g, ok, err := Measure(&snapshot.Node{Tag: "path", CTM: snapshot.IdentityMatrix,
		D: "M0 0H10V14H0Z M3 3H7V11H3Z M20 0H30V14H20Z"})
	require.True(t, ok)
	require.NoError(t, err)
	assert.False(t, pointCloud(&DefaultHeuristics, &g))
}
