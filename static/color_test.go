package static

import (
	"fmt"
	"standout/snapshot"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"golang.org/x/image/colornames"
)

func TestNamedColoursAgainstSVGTable(t *testing.T) {
	// golang.org/x/image/colornames carries the SVG 1.1 colour keyword
	// table, which CSS Color 4 §6.1 adopts; CSS Color 4 adds only
	// rebeccapurple (#663399).
	require.Len(t, namedColours, len(colornames.Map)+1)
	for name, c := range colornames.Map {
		got, err := ParseColor(name)
		require.NoError(t, err, name)
		r, g, b := got.SRGB.RGB8()
		assert.Equal(t, [3]uint8{c.R, c.G, c.B}, [3]uint8{r, g, b}, name)
		assert.Equal(t, 1.0, got.A, name)
	}
	got, err := ParseColor("RebeccaPurple")
	require.NoError(t, err)
	assert.Equal(t, "#663399", got.SRGB.Hex())
}

func TestParseColorSyntaxes(t *testing.T) {
	// CSS Color 4 §5 (hex), §5.1 (rgb), §7 (hsl); expected values by the
	// spec's definitions (hsl(120 100% 25%) is the spec's green example).
	for _, c := range []struct {
		in  string
		hex string
		a   float64
	}{
		{"#f00", "#ff0000", 1},
		{"#F008", "#ff0000", 0x88 / 255.0},
		{"#00ff00", "#00ff00", 1},
		{"#0000ff80", "#0000ff", 0x80 / 255.0},
		{"rgb(255, 0, 0)", "#ff0000", 1},
		{"rgba(255,0,0,0.5)", "#ff0000", 0.5},
		{"rgb(255 0 0 / 50%)", "#ff0000", 0.5},
		{"rgb(100% 50% 0%)", "#ff8000", 1},
		{"hsl(120, 100%, 25%)", "#008000", 1},
		{"hsl(120deg 100% 25% / .25)", "#008000", 0.25},
		{"hsla(0.5turn, 100%, 50%, 1)", "#00ffff", 1},
		{"transparent", "#000000", 0},
		{"  Red ", "#ff0000", 1},
	} {
		t.Run(c.in, func(t *testing.T) {
			got, err := ParseColor(c.in)
			if assert.NoError(t, err, c.in) {
				assert.Equal(t, c.hex, got.SRGB.Hex(), c.in)
				assert.InDelta(t, c.a, got.A, 1e-9, c.in)
			}
		})
	}
	for _, bad := range []string{"", "#12", "#12345", "rgb(1,2)", "rgb(1 2 3 4)", "rgb(1, 2 3)", "hsl(1, 2%)", "notacolour", "rgb(NaN, 0, 0)", "#ggg", "rgb(1 2 3 / 4 / 5)"} {
		_, err := ParseColor(bad)
		assert.Error(t, err, "%q", bad)
	}
}

func TestTransforms(t *testing.T) {
	// SVG 1.1 §7.4–7.6 definitions.
	m, err := ParseTransform("translate(10,20) scale(2) rotate(90)")
	require.NoError(t, err)
	x, y := m.Apply(1, 0)
	assert.InDelta(t, 10, x, 1e-12)
	assert.InDelta(t, 22, y, 1e-12)
	m, err = ParseTransform("rotate(180 5 5)")
	require.NoError(t, err)
	x, y = m.Apply(0, 0)
	assert.InDelta(t, 10, x, 1e-12)
	assert.InDelta(t, 10, y, 1e-12)
	m, err = ParseTransform("matrix(1 0 0 1 3 4)skewX(45)")
	require.NoError(t, err)
	x, y = m.Apply(0, 1)
	assert.InDelta(t, 4, x, 1e-12)
	assert.InDelta(t, 5, y, 1e-12)
	m, err = ParseTransform("translate(1-2)")
	require.NoError(t, err)
	assert.Equal(t, snapshot.Matrix{1, 0, 0, 1, 1, -2}, m)
	for _, bad := range []string{"translate(1", "rotate(1,2)", "foo(1)", "scale()", "translate(NaN)", "translate(1e999)"} {
		_, err := ParseTransform(bad)
		assert.Error(t, err, bad)
	}
}

func TestWhereHasZeroSpecificity(t *testing.T) {
	// Selectors 4 §4.4: :where() contributes no specificity, so a later
	// type selector overrides it, and a presentation attribute does not.
	doc := `<style>:where(.a) { fill: red } circle { fill: blue } :where(.b) { fill: green }</style>
	<svg width="100" height="100"><circle class="a" r="3"/><circle class="b" r="3" fill="orange"/></svg>`
	p, err := Build(strings.NewReader(doc), Options{})
	require.NoError(t, err)
	assert.Empty(t, p.Problems)
	n := p.Charts[0].Nodes
	assert.Equal(t, "#0000ff", snapshot.Hex(n[1].Fill.RGBA))
	// The type selector (0,0,1) beats :where(.b) (0,0,0), and both beat
	// the presentation attribute.
	assert.Equal(t, "#0000ff", snapshot.Hex(n[2].Fill.RGBA))
}

func TestHexMatchesFormat(t *testing.T) {
	for _, v := range []uint32{0, 0xffffffff, 0x12345678, 0xabcdef00, 0x0f766eff} {
		assert.Equal(t, fmt.Sprintf("#%06x", v>>8), snapshot.Hex(v))
	}
}
