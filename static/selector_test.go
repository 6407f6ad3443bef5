package static

import (
	"standout/internal/testkit"
	"standout/marks"
	"standout/snapshot"
	"strings"
	"testing"
	"time"

	"github.com/andybalholm/cascadia"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"golang.org/x/net/html"
)

// Issue 10: one rule of twelve descendant combinators over 480 nested
// groups made cascadia's backtracking matcher run for hours. The chain
// matcher decides each (element, position) once.
func TestIssue10SelectorDoesNotBacktrack(t *testing.T) {
	doc := `<html><style>` + strings.TrimSpace(strings.Repeat("g ", 12)) + ` circle { fill: #7a3b8c }</style><body><svg width="100" height="100">` +
		strings.Repeat("<g>", 480) + `<circle cx="5" cy="5" r="3"/>` + strings.Repeat("</g>", 480) + `</svg></body></html>`
	p, err := Build(strings.NewReader(doc), Options{Source: "nested.html"})
	require.NoError(t, err)
	ch, err := marks.Walk(&p.Charts[0])
	require.NoError(t, err)
	require.Len(t, ch.Marks, 1)
	assert.Equal(t, "#7a3b8c", snapshot.Hex(*ch.Marks[0].Fill), "the rule still applies")
}

// Selectors that cascadia would backtrack through inside one test are
// refused and named; the rest of the sheet applies.
func TestIssue10ComplexArgumentRefused(t *testing.T) {
	doc := `<html><style>g:not(g g g g g g g g g g x) circle { fill: #123 } circle { fill: #7a3b8c }</style><body><svg>` +
		strings.Repeat("<g>", 300) + `<circle r="1"/>` + strings.Repeat("</g>", 300) + `</svg></body></html>`
	p, err := Build(strings.NewReader(doc), Options{Source: "costly.html"})
	require.NoError(t, err)
	assert.Contains(t, strings.Join(p.Problems, "\n"), "is not supported and its rule is ignored")
	ch, err := marks.Walk(&p.Charts[0])
	require.NoError(t, err)
	require.Len(t, ch.Marks, 1)
	assert.Equal(t, "#7a3b8c", snapshot.Hex(*ch.Marks[0].Fill))
	// :nth-child's argument is not a selector: it stays supported.
	_, err = compileGroup("circle:nth-child(2n+1)", nil)
	assert.NoError(t, err)
}

// The step budget and the deadline stop matching, and say why.
func TestIssue10SelectorBudgetAndDeadline(t *testing.T) {
	root, err := html.Parse(strings.NewReader(`<svg>` + strings.Repeat("<g>", 200) + `<circle/>` + strings.Repeat("</g>", 200) + `</svg>`))
	require.NoError(t, err)
	budget := &matchBudget{limit: 1000}
	sel, err := compileGroup("x g g g g g circle", budget)
	require.NoError(t, err)
	walkNodes(root, func(n *html.Node) bool {
		sel.Match(n)
		return true
	})
	require.Error(t, budget.err)
	assert.Contains(t, budget.err.Error(), "more than 1000 selector tests")

	_, err = Build(strings.NewReader(testkit.ManyCircles(5000)), Options{Source: "slow.html", Deadline: time.Now().Add(-time.Second)})
	require.Error(t, err)
	assert.Contains(t, err.Error(), "slow.html")
	assert.Contains(t, err.Error(), "time limit")
}

// chainCases are selectors whose matches the chain matcher must share
// with cascadia's own (the oracle), on a small document where
// backtracking is cheap.
var chainCases = []string{
	"g circle", "svg > g > circle", "g g circle", "rect + circle", "rect ~ circle", "g.a circle.b",
	"svg g > g circle", ".a > .b", "g   >   circle", "g:not(.a) circle", "g circle:first-child",
	"[data-x='a b'] circle", "svg :is(g) circle", "g rect ~ circle.b", "#k circle",
}

const chainDoc = `<svg><g class="a"><rect/><circle class="b"/><g id="k"><circle/><rect data-x="a b"/><circle class="b"/></g></g>` +
	`<g data-x="a b"><g class="b"><circle/></g><rect/><rect/><circle/></g></svg>`

func TestChainMatchesLikeCascadia(t *testing.T) {
	root, err := html.Parse(strings.NewReader(chainDoc))
	require.NoError(t, err)
	for _, sel := range chainCases {
		t.Run(sel, func(t *testing.T) {
			assertSameMatches(t, root, sel)
		})
	}
}

func assertSameMatches(t *testing.T, root *html.Node, sel string) {
	want, err := cascadia.ParseGroup(sel)
	if err != nil {
		return
	}
	got, err := compileGroup(sel, &matchBudget{})
	if err != nil && (strings.Contains(sel, "(") || strings.Contains(sel, "/*") || strings.Contains(sel, "|")) {
		return // a complex argument, a comment or a namespace, refused by design
	}
	require.NoError(t, err)
	walkNodes(root, func(n *html.Node) bool {
		if n.Type == html.ElementNode {
			assert.Equal(t, want.Match(n), got.Match(n), "%q on <%s %v>", sel, n.Data, n.Attr)
		}
		return true
	})
}

// FuzzSelectorChain checks the memoised chain matcher against cascadia on
// small documents (the oracle), within a step budget per input.
func FuzzSelectorChain(f *testing.F) {
	for _, s := range chainCases {
		f.Add(s, chainDoc)
	}
	f.Add("g g g g g g circle", `<svg>`+strings.Repeat("<g>", 20)+`<circle/>`+strings.Repeat("</g>", 20)+`</svg>`)
	f.Fuzz(func(t *testing.T, sel, doc string) {
		// Small inputs only: cascadia, the oracle, backtracks.
		if len(sel) > 60 || len(doc) > 400 || strings.Count(doc, "<") > 40 || strings.Count(sel, " ")+strings.Count(sel, ">") > 6 {
			return
		}
		root, err := html.Parse(strings.NewReader(doc))
		if err != nil {
			return
		}
		assertSameMatches(t, root, sel)
	})
}
