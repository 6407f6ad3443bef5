package marks

import (
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

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
