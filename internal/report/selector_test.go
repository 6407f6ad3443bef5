package report

import (
	"testing"

	"github.com/stretchr/testify/assert"
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
