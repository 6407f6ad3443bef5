package static

import (
	"fmt"
	"runtime"
	"standout/internal/testkit"
	"standout/marks"
	"standout/snapshot"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestHostile200kMarks(t *testing.T) {
	if testing.Short() {
		t.Skip("large input")
	}
	p, err := Build(strings.NewReader(testkit.ManyCircles(200000)), Options{Source: "big"})
	require.NoError(t, err)
	ch, err := marks.Walk(&p.Charts[0])
	require.NoError(t, err)
	assert.Len(t, ch.Marks, 200000)
}

func TestHostileDeepNesting(t *testing.T) {
	doc := `<svg width="100" height="100">` + strings.Repeat("<g>", 10000) + `<circle cx="5" cy="5" r="3"/>` + strings.Repeat("</g>", 10000) + `</svg>`
	// x/net/html refuses documents nested deeper than 512 open elements;
	// Build passes that on as a clear error naming the input, rather than
	// a partial chart.
	_, err := Build(strings.NewReader(doc), Options{Source: "deep.html"})
	require.Error(t, err)
	assert.Contains(t, err.Error(), "deep.html")
	assert.Contains(t, err.Error(), "512")
	// 500 levels are read in full.
	doc = `<svg width="100" height="100">` + strings.Repeat("<g>", 500) + `<circle cx="5" cy="5" r="3"/>` + strings.Repeat("</g>", 500) + `</svg>`
	p, err := Build(strings.NewReader(doc), Options{Source: "deep"})
	require.NoError(t, err)
	ch, err := marks.Walk(&p.Charts[0])
	require.NoError(t, err)
	assert.Len(t, ch.Marks, 1)
}

func TestHostileHugePath(t *testing.T) {
	var b strings.Builder
	b.WriteString(`<svg width="100" height="100"><path fill="none" stroke="black" d="M0,0`)
	for b.Len() < 5<<20 {
		b.WriteString("L1.5,2.5L3.25,0.75")
	}
	b.WriteString(`"/></svg>`)
	p, err := Build(strings.NewReader(b.String()), Options{Source: "huge"})
	require.NoError(t, err)
	ch, err := marks.Walk(&p.Charts[0])
	require.NoError(t, err)
	require.Len(t, ch.Marks, 1)
	assert.Equal(t, marks.KindLine, ch.Marks[0].Kind)
}

func TestHostileNaNAndInfinity(t *testing.T) {
	doc := `<svg width="100" height="100"><circle cx="NaN" cy="5" r="3"/><rect x="0" y="0" width="Infinity" height="5"/>
	<circle cx="5" cy="5" r="3" transform="scale(NaN)"/><path d="M0,0L1e999,0"/><circle cx="50" cy="50" r="4"/><circle cx="60" cy="50" r="4"/></svg>`
	p, err := Build(strings.NewReader(doc), Options{Source: "nan"})
	require.NoError(t, err)
	ch, err := marks.Walk(&p.Charts[0])
	require.NoError(t, err)
	// The good circles are marks, and so is the one whose transform is
	// invalid: browsers ignore an invalid transform list and draw the
	// element untransformed. Each bad attribute is named in a problem.
	assert.Len(t, ch.Marks, 3)
	joined := strings.Join(ch.Problems, "\n")
	assert.Contains(t, joined, "cx=\"NaN\"")
	assert.Contains(t, joined, "width=\"Infinity\"")
	assert.Contains(t, joined, "transform")
	assert.Contains(t, joined, "path")
}

func TestHostileUnclosedTagsAndBadCSS(t *testing.T) {
	doc := `<html><style>circle { fill: red } }}} .x { fill: blue }</style><body><svg width="100" height="100"><g><circle cx="5" cy="5" r="3"><circle cx="15" cy="5" r="3">`
	p, err := Build(strings.NewReader(doc), Options{Source: "unclosed"})
	require.NoError(t, err)
	require.Len(t, p.Charts, 1)
	ch, err := marks.Walk(&p.Charts[0])
	require.NoError(t, err)
	assert.Len(t, ch.Marks, 2)
	assert.Equal(t, "#ff0000", snapshot.Hex(*ch.Marks[0].Fill))
	require.NotEmpty(t, p.Problems, "the CSS error is reported")
	assert.Contains(t, p.Problems[0], "CSS error")
}

func TestHostileUseCycle(t *testing.T) {
	doc := `<svg width="100" height="100"><g id="a"><use href="#a"/><circle cx="5" cy="5" r="3"/></g></svg>`
	p, err := Build(strings.NewReader(doc), Options{Source: "cycle"})
	require.NoError(t, err)
	assert.Contains(t, strings.Join(p.Charts[0].Problems, "\n"), "reference cycle")
	// Two references per level to a target that contains them would
	// otherwise expand 2^16 times.
	doc = `<svg width="100" height="100"><g id="t"><use href="#t"/><use href="#t"/><circle r="2"/></g></svg>`
	p, err = Build(strings.NewReader(doc), Options{Source: "bomb"})
	require.NoError(t, err)
	assert.Less(t, len(p.Charts[0].Nodes), 20)
}

// Issue 10: a 2 kB chain of <use> references, each level instantiating
// the previous ten times, took 52 s and 4.4 GB before the element cap
// stopped it. The cap on instantiated elements stops it at once.
func TestIssue10UseChainStopsEarly(t *testing.T) {
	var b strings.Builder
	b.WriteString(`<svg width="100" height="100"><defs><circle id="l0" r="1"/>`)
	for i := 1; i < 8; i++ {
		fmt.Fprintf(&b, `<g id="l%d">`, i)
		for k := 0; k < 10; k++ {
			fmt.Fprintf(&b, `<use href="#l%d" x="%d"/>`, i-1, k)
		}
		b.WriteString(`</g>`)
	}
	b.WriteString(`</defs><use href="#l7"/></svg>`)
	require.Less(t, b.Len(), 3000)
	var before, after runtime.MemStats
	runtime.ReadMemStats(&before)
	_, err := Build(strings.NewReader(b.String()), Options{Source: "chain.svg"})
	runtime.ReadMemStats(&after)
	require.Error(t, err)
	assert.Contains(t, err.Error(), "chain.svg")
	assert.Contains(t, err.Error(), fmt.Sprint(snapshot.MaxUseNodes))
	assert.Less(t, after.TotalAlloc-before.TotalAlloc, uint64(512<<20), "bytes allocated")
}

// The elements of all a page's charts are capped too.
func TestIssue10PageNodeCap(t *testing.T) {
	if testing.Short() {
		t.Skip("large input")
	}
	one := `<svg width="10" height="10">` + strings.Repeat(`<circle r="1"/>`, snapshot.MaxNodes-2) + `</svg>`
	_, err := Build(strings.NewReader(`<html><body>`+strings.Repeat(one, 3)+`</body></html>`), Options{Source: "many.html"})
	require.Error(t, err)
	assert.Contains(t, err.Error(), fmt.Sprint(snapshot.MaxPageNodes))
}

// A chain of custom properties that each reference the next twice
// (--v0: var(--v1) var(--v1); …) doubles at every step: 20 steps would
// build a million copies, and read them again at each of 2,000 elements
// that use it, which stalled the reader for minutes. A value longer than
// maxSubstituted after substitution is invalid at computed-value time
// (CSS Variables 1 §3), so fill falls back to its initial black; a short
// chain still resolves.
func TestHostileCustomPropertyDoubling(t *testing.T) {
	var css strings.Builder
	css.WriteString(":root{")
	for i := 0; i < 20; i++ {
		fmt.Fprintf(&css, "--v%d: var(--v%d) var(--v%d);", i, i+1, i+1)
	}
	css.WriteString("--v20: #123; --s: var(--t); --t: #3b6e8f; }")
	page := `<style>` + css.String() + ` rect { fill: var(--v0) } rect.s { fill: var(--s) }</style><svg>` +
		strings.Repeat(`<rect width="5" height="5"/>`, 2000) + `<rect class="s" width="5" height="5"/></svg>`
	p, err := Build(strings.NewReader(page), Options{Source: "doubling"})
	require.NoError(t, err)
	var fills []string
	for _, n := range p.Charts[0].Nodes {
		if n.Tag == "rect" {
			fills = append(fills, snapshot.Hex(n.Fill.RGBA))
		}
	}
	require.Len(t, fills, 2001)
	assert.Equal(t, "#000000", fills[0], "the doubled value is invalid: fill's initial value")
	assert.Equal(t, "#3b6e8f", fills[2000], "a short chain resolves")
}
