package report

import (
	"testing"

	"github.com/stretchr/testify/assert"

	"standout/marks"
)

// The rule's selectors are checked against Chromium's selector engine in
// cmd/standout (TestFixesHoldWhenApplied); these cases pin the form.
func TestRuleForms(t *testing.T) {
	a := "#sales"
	assert.Equal(t, "#sales > g:nth-child(2) > rect:nth-child(6) { fill: #1f5585; }",
		Rule(a, "svg0", []string{"svg0/g1/rect5"}, "fill: #1f5585"))
	// A run of siblings is one selector; a gap starts another.
	assert.Equal(t, "#sales > g:nth-child(1) > circle:nth-child(n+1):nth-child(-n+3),\n#sales > g:nth-child(1) > circle:nth-child(5) { fill: #777777; }",
		Rule(a, "svg0", []string{"svg0/g0/circle2", "svg0/g0/circle0", "svg0/g0/circle1", "svg0/g0/circle4"}, "fill: #777777"))
	// Content a <use> instantiates is reached through its <use>.
	assert.Equal(t, "#sales > use:nth-child(5) { fill: #777777; }",
		Rule(a, "svg0", []string{"svg0/use4>symbol/path0", "svg0/use4>symbol/path1"}, "fill: #777777"))
	// Nothing to anchor to, or an id from elsewhere: no rule.
	assert.Equal(t, "", Rule("", "svg0", []string{"svg0/g1/rect5"}, "fill: #1f5585"))
	assert.Equal(t, "", Rule(a, "svg0", []string{"svg1/g1/rect5"}, "fill: #1f5585"))
	assert.Equal(t, "", Rule(a, "svg0", []string{"svg0/g1/rect"}, "fill: #1f5585"))
}

// The search curve keeps the model's forms (perception.Params.LogSearchMs,
// SerialSlope): through the chart's estimate, logarithmic in the number of
// marks for a pop-out, linear for a slow search.
func TestSearchCurve(t *testing.T) {
	pop := SearchCurve{N: 100, Ms: 300}
	assert.InDelta(t, 300, pop.At(100), 1e-9)
	assert.InDelta(t, 450, pop.At(1000), 1e-9, "ln 1000 / ln 100 = 1.5")
	serial := SearchCurve{N: 100, Ms: 5000, Serial: true}
	assert.InDelta(t, 50000, serial.At(1000), 1e-9)
	svg := SearchPlotSVG(serial)
	assert.Contains(t, svg, "<title>Estimated time to find the emphasis")
	assert.Contains(t, svg, StyleOf("conjunction").Colour)
	assert.Contains(t, SearchPlotSVG(pop), StyleOf("pops").Colour)
}

// The author's classes are preferred: one class held by exactly the fix's
// marks, or, for a mute fix, a class of all the marks less a class only
// the emphasis has. A class a legend swatch shares is not exact.
func TestRuleForPrefersClasses(t *testing.T) {
	ch := &marks.Chart{Path: "svg0", Anchor: "#quays", Marks: []marks.Mark{
		{ID: "svg0/g0/rect0", Class: "bar"}, {ID: "svg0/g0/rect1", Class: "bar pick"}, {ID: "svg0/g0/rect2", Class: "bar"},
	}}
	assert.Equal(t, "#quays .pick { fill: #5c799f !important; }", RuleFor(ch, []int{1}, []int{1}, "fill: #5c799f"))
	assert.Equal(t, "#quays .bar:not(.pick) { fill: #5e5e5e !important; }", RuleFor(ch, []int{0, 2}, []int{1}, "fill: #5e5e5e"))
	ch.Legend = []marks.Mark{{ID: "svg0/g1/rect0", Class: "pick"}}
	assert.Equal(t, "#quays > g:nth-child(1) > rect:nth-child(2) { fill: #5c799f !important; }", RuleFor(ch, []int{1}, []int{1}, "fill: #5c799f"),
		"the legend swatch shares .pick: a path instead")
	ch.Marks[0].Class, ch.Marks[1].Class = "2x", "2x"
	ch.Legend = nil
	assert.Equal(t, "#quays > g:nth-child(1) > rect:nth-child(n+1):nth-child(-n+2) { fill: #5e5e5e !important; }", RuleFor(ch, []int{0, 1}, nil, "fill: #5e5e5e"),
		"a class no selector can name plainly (2x) is passed over")
}
