package report

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"standout/internal/testkit"
	"standout/perception/colour"
	"standout/static"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// charts are the repository's test pages and the shared corpus of real
// charts.
func charts(t *testing.T) []string {
	files := testkit.Pages(t)
	corpus, _ := filepath.Glob(filepath.Join(testkit.Corpus(t), "*", "*.svg"))
	var out []string
	for _, f := range append(files, corpus...) {
		if !strings.HasSuffix(f, ".golden") {
			out = append(out, f)
		}
	}
	require.NotEmpty(t, out)
	return out
}

func TestFindingsOnlyAgreesOnCharts(t *testing.T) {
	// The overlay's analysis (FindingsOnly) says what the full one says of
	// every finding, every mark's verdict and the emphasis.
	lite := DefaultOptions
	lite.Params.FindingsOnly = true
	for _, f := range charts(t) {
		data, err := os.ReadFile(f)
		require.NoError(t, err)
		full, err := checkFile(f, data, DefaultOptions)
		require.NoError(t, err, f)
		part, err := checkFile(f, data, lite)
		require.NoError(t, err, f)
		require.Len(t, part.Charts, len(full.Charts), f)
		for i, c := range full.Charts {
			p := part.Charts[i]
			assert.Equal(t, c.Findings, p.Findings, "%s %s", f, c.Path)
			assert.Equal(t, c.Emphasis, p.Emphasis, "%s %s", f, c.Path)
			require.Len(t, p.Marks, len(c.Marks))
			for k := range c.Marks {
				assert.Equal(t, c.Marks[k].Verdict, p.Marks[k].Verdict, "%s %s", f, c.Marks[k].ID)
			}
		}
	}
}

// checkFile reads a file with the static reader and reports it.
func checkFile(name string, data []byte, opt Options) (Page, error) {
	page, err := static.Build(bytes.NewReader(data), static.Options{Source: name, Select: opt.Selector})
	if err != nil {
		return Page{}, err
	}
	p, err := FromSnapshots(name, page.Charts, page.Problems, opt)
	return p, err
}

func TestInkContrast(t *testing.T) {
	// WCAG 2.x SC 1.4.3 (4.5:1 for text) and SC 1.4.11 (3:1 for focus
	// indicators and graphics), with the contrast ratio of
	// perception/colour (checked there against the W3C's worked values).
	bgs := []string{Ink.Paper, Ink.Wash}
	for _, bg := range bgs {
		for name, fg := range map[string]string{"Ink": Ink.Ink, "Quiet": Ink.Quiet, "Alert": Ink.Alert} {
			t.Run(name+" on "+bg, func(t *testing.T) {
				assert.GreaterOrEqual(t, colour.ContrastRatio(colour.MustHex(fg), colour.MustHex(bg)), 4.5)
			})
		}
		for name, fg := range map[string]string{"Focus": Ink.Focus, "Highlight": Ink.Highlight, "pops": StyleOf("pops").Colour,
			"conjunction": StyleOf("conjunction").Colour, "blends": StyleOf("blends").Colour} {
			t.Run(name+" on "+bg, func(t *testing.T) {
				assert.GreaterOrEqual(t, colour.ContrastRatio(colour.MustHex(fg), colour.MustHex(bg)), 3.0)
			})
		}
	}
	// The pressed button's text: Paper on Ink.
	assert.GreaterOrEqual(t, colour.ContrastRatio(colour.MustHex(Ink.Paper), colour.MustHex(Ink.Ink)), 4.5)
}

// Findings quote a colour as the author wrote it, with its opacity, not
// the colour composited over the background, which appears in no style
// sheet (issue 15's cascade case).
func TestFindingsQuoteAuthoredColours(t *testing.T) {
	page := `<svg width="200" height="100"><g fill="#2a6fa8" fill-opacity="0.4">
	<circle cx="10" cy="10" r="5"/><circle cx="30" cy="10" r="5"/><circle cx="50" cy="10" r="5"/></g>
	<circle cx="70" cy="10" r="5" fill="#5a5a5a"/></svg>`
	p, err := checkFile("t", []byte(page), DefaultOptions)
	require.NoError(t, err)
	composited := colour.Over(colour.RGBA{SRGB: colour.MustHex("#2a6fa8"), A: 1}, 0.4, colour.MustHex("#ffffff")).Hex()
	var low *Finding
	for i, f := range p.Charts[0].Findings {
		if f.ID == "mark-contrast-low" {
			low = &p.Charts[0].Findings[i]
		}
	}
	require.NotNil(t, low)
	assert.Contains(t, low.Message, "#2a6fa8 at 40% opacity")
	assert.NotContains(t, low.Message, composited)
}

var updateGlossary = flag.Bool("update", false, "rewrite docs/glossary.md")

func TestGlossaryFileIsCurrent(t *testing.T) {
	var b strings.Builder
	WriteGlossary(&b)
	p := filepath.Join(testkit.Root(t), "docs", "glossary.md")
	if *updateGlossary {
		require.NoError(t, os.WriteFile(p, []byte(b.String()), 0o644))
	}
	got, err := os.ReadFile(p)
	require.NoError(t, err)
	assert.Equal(t, b.String(), string(got), "docs/glossary.md is stale: go test ./internal/report -run Glossary -update")
}

// Mark ids as the report writes them are ids, whatever their steps; the
// rest is a selector.
func TestSplitEmphasis(t *testing.T) {
	for text, ids := range map[string][]string{
		"svg0/g1/rect2,svg0/g1/rect3":            {"svg0/g1/rect2", "svg0/g1/rect3"},
		"svg0/g2/use0>path, svg0/g2/use1>path":   {"svg0/g2/use0>path", "svg0/g2/use1>path"},
		"svg1/path4#17":                          {"svg1/path4#17"},
		"frame1/svg0/circle3,shadow0/svg2/rect0": {"frame1/svg0/circle3", "shadow0/svg2/rect0"},
	} {
		got, sel := SplitEmphasis(text)
		assert.Equal(t, ids, got, text)
		assert.Empty(t, sel, text)
	}
	for _, sel := range []string{".pick", "svg > circle", "#sales rect:nth-child(3)", "svg0", "circle[data-x='1']"} {
		got, s := SplitEmphasis(sel)
		assert.Nil(t, got, sel)
		assert.Equal(t, sel, s)
	}
}

// An emphasis box is typed box:x,y,w,h; other text is not a box, and a
// malformed box is an error that says what is wanted.
func TestParseBox(t *testing.T) {
	b, ok, err := ParseBox(" box:230, 214,26,125.5")
	require.NoError(t, err)
	assert.True(t, ok)
	assert.Equal(t, [4]float64{230, 214, 26, 125.5}, b)
	_, ok, err = ParseBox("svg0/rect1")
	assert.False(t, ok)
	assert.NoError(t, err)
	for _, bad := range []string{"box:1,2,3", "box:1,2,x,4"} {
		_, ok, err = ParseBox(bad)
		assert.True(t, ok, bad)
		assert.Error(t, err, bad)
	}
	_, err = Settings{EmphasisBox: &[4]float64{0, 0, 0, 5}}.Options()
	assert.Error(t, err, "a box with no width")
}
