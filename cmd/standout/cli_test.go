package main

import (
	"encoding/json"
	"image"
	"image/color"
	"image/draw"
	"os"
	"path/filepath"
	"standout/internal/report"
	"standout/perception/colour"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// Help is asked for, not an error: -h exits 0 and writes to standard
// output the flags as --name (as the README writes them) and the exit
// codes; bad usage exits 2 with the help on standard error.
func TestHelpAndExitCodes(t *testing.T) {
	for _, cmd := range []string{"check", "palette", "demo", "extension"} {
		t.Run(cmd, func(t *testing.T) {
			code, out, errs := runCmd(cmd, "-h")
			assert.Equal(t, 0, code)
			assert.Empty(t, errs)
			assert.Contains(t, out, "usage: standout "+cmd)
			assert.Contains(t, out, "exit status: 0")
			assert.NotRegexp(t, `(?m)^  -[a-z]`, out, "flags are written --name")
			code, out, errs = runCmd(cmd, "--no-such-flag")
			assert.Equal(t, 2, code)
			assert.Empty(t, out)
			assert.Contains(t, errs, "no-such-flag")
			assert.Equal(t, 1, strings.Count(errs, "usage: "), "the help once")
		})
	}
	code, out, _ := runCmd("--version")
	assert.Equal(t, 0, code)
	assert.True(t, strings.HasPrefix(out, "standout "), out)
}

// An emphasis that names nothing is an error with no report, not a run
// that silently falls back to the inferred emphasis.
func TestEmphasisThatMatchesNothing(t *testing.T) {
	page := "../../testdata/cascade.html"
	code, out, errs := runCmd("check", "--emphasis", ".no-such-class", page)
	assert.Equal(t, 2, code)
	assert.Empty(t, out)
	assert.Contains(t, errs, `--emphasis ".no-such-class" matches no mark`)
	code, out, errs = runCmd("check", "--emphasis", "svg0/g9/rect99", page)
	assert.Equal(t, 2, code)
	assert.Empty(t, out)
	assert.Contains(t, errs, "svg0/g9/rect99")
}

// A page that cannot be read gets its error and nothing else: no summary
// of nothing checked.
func TestMissingPageHasNoSummary(t *testing.T) {
	code, out, errs := runCmd("check", "no-such-page.html")
	assert.Equal(t, 2, code)
	assert.Empty(t, out)
	assert.Contains(t, errs, "no-such-page.html")
	assert.NotContains(t, errs, "pages checked")
}

// check reads the style sheets a page links beside it, and none from
// outside its folder, not even through a symbolic link.
func TestCheckReadsLocalStyleSheets(t *testing.T) {
	dir := t.TempDir()
	site := filepath.Join(dir, "site")
	require.NoError(t, os.Mkdir(site, 0o755))
	require.NoError(t, os.WriteFile(filepath.Join(site, "chart.css"), []byte(`rect { fill: #2a6fa8 }`), 0o644))
	require.NoError(t, os.WriteFile(filepath.Join(dir, "outside.css"), []byte(`circle { fill: #c23a2e }`), 0o644))
	require.NoError(t, os.Symlink(filepath.Join(dir, "outside.css"), filepath.Join(site, "escape.css")))
	page := filepath.Join(site, "page.html")
	require.NoError(t, os.WriteFile(page, []byte(`<html><head><link rel="stylesheet" href="chart.css"><link rel="stylesheet" href="escape.css"></head>
	<body><svg width="100" height="50"><rect width="5" height="5"/><rect x="10" width="5" height="5"/><circle cx="30" cy="5" r="3"/></svg></body></html>`), 0o644))
	code, out, errs := runCmd("check", "--json", page)
	require.Equal(t, 0, code, errs)
	var rep report.Report
	require.NoError(t, json.Unmarshal([]byte(out), &rep))
	fills := map[string]string{}
	for _, m := range rep.Pages[0].Charts[0].Marks {
		if m.Fill != nil {
			fills[m.ID] = *m.Fill
		}
	}
	assert.Equal(t, "#2a6fa8", fills["svg0/rect0"], "the sheet beside the page is read")
	assert.Equal(t, "#000000", fills["svg0/circle2"], "the sheet outside the folder is not")
	assert.Contains(t, strings.Join(rep.Pages[0].Problems, "\n"), "escape.css")
}

// A declared emphasis that does not stand out is framed in the picture,
// dashed in the panel's alert colour (report.Ink.Alert).
func TestAnnotateMarksFailedEmphasis(t *testing.T) {
	page := image.NewRGBA(image.Rect(0, 0, 200, 100))
	draw.Draw(page, page.Bounds(), image.White, image.Point{}, draw.Src)
	c := report.Chart{Path: "svg0", IsChart: true, Box: [4]float64{0, 0, 200, 100},
		Marks:    []report.Mark{{ID: "m0", Verdict: "blends", BBox: [4]float64{50, 40, 10, 10}}, {ID: "m1", Verdict: "blends", BBox: [4]float64{100, 40, 10, 10}}},
		Emphasis: &report.Emphasis{Marks: []string{"m0"}, Holds: map[string]bool{"normal": false}}}
	alert := colour.MustHex(report.Ink.Alert)
	ar, ag, ab := alert.RGB8()
	count := func(img *image.RGBA) int {
		n := 0
		for y := 0; y < img.Bounds().Dy(); y++ {
			for x := 0; x < img.Bounds().Dx(); x++ {
				if p := img.RGBAAt(x, y); p.R == ar && p.G == ag && p.B == ab {
					n++
				}
			}
		}
		return n
	}
	assert.Greater(t, count(annotate(page, c)), 40, "the failed emphasis is framed")
	c.Emphasis.Holds["normal"] = true
	assert.Equal(t, 0, count(annotate(page, c)), "one that holds is not")
	c.Emphasis.Holds["normal"], c.Emphasis.Inferred = false, true
	assert.Equal(t, 0, count(annotate(page, c)), "nor an inferred one")
}

// A line is outlined along its path, leaving the line itself in view, and
// every picture carries a key under the chart: a sample of each outline it
// uses, with its words.
func TestAnnotateLinesAndKey(t *testing.T) {
	page := image.NewRGBA(image.Rect(0, 0, 200, 100))
	draw.Draw(page, page.Bounds(), image.White, image.Point{}, draw.Src)
	black := color.RGBA{0, 0, 0, 0xff}
	for x := 20; x <= 180; x++ {
		for w := -1; w <= 1; w++ {
			page.SetRGBA(x, 50+w, black) // a horizontal line, 3 px wide
		}
	}
	c := report.Chart{Path: "svg0", IsChart: true, Box: [4]float64{10, 10, 180, 80},
		Marks: []report.Mark{{ID: "l0", Kind: "line", Verdict: "pops", Size: 3, BBox: [4]float64{20, 48.5, 160, 3},
			Points: [][2]float64{{20, 50.5}, {180, 50.5}}}}}
	out := annotate(page, c)
	pops := opaque(report.StyleOf("pops").Colour)
	origin := image.Pt(0, 0) // the crop starts at the chart's box less its margin
	at := func(x, y int) color.RGBA { return out.RGBAAt(x-origin.X, y-origin.Y) }
	assert.Equal(t, black, at(100, 50), "the line itself stays in view")
	assert.Equal(t, pops, at(100, 50-4), "the outline runs above the line")
	assert.Equal(t, pops, at(100, 50+4), "and below it")
	assert.NotEqual(t, pops, at(100, 20), "not as a box around its extent")
	// The key: taller than the crop, with a sample in the verdict's ink
	// and lettering in the panel's ink below the chart.
	require.Greater(t, out.Bounds().Dy(), 100)
	inkR, inkG, inkB := colour.MustHex(report.Ink.Ink).RGB8()
	var sample, letters int
	for y := 100; y < out.Bounds().Dy(); y++ {
		for x := 0; x < out.Bounds().Dx(); x++ {
			switch p := out.RGBAAt(x, y); {
			case p == pops:
				sample++
			case p.R == inkR && p.G == inkG && p.B == inkB:
				letters++
			}
		}
	}
	assert.Greater(t, sample, 20, "a sample of the outline")
	assert.Greater(t, letters, 50, "its words")
}

// A page whose charts are drawn as pixels is never a silent pass: each is
// named as not checked, and --fail-on fails the run, whatever its level,
// since nothing was read there.
func TestPixelChartsAreNamedAndFailTheGate(t *testing.T) {
	code, out, errs := runCmd("check", "../../testdata/pixels.html")
	require.Equal(t, 0, code, errs)
	assert.Contains(t, out, "note: canvas0, a canvas 480×200 px, was not checked")
	assert.Contains(t, out, "note: img0, an image 420×180 px, was not checked")
	assert.NotContains(t, out, "img1", "an icon is no chart")
	code, _, errs = runCmd("check", "--fail-on", "error", "../../testdata/pixels.html")
	assert.Equal(t, 1, code)
	assert.Contains(t, errs, "2 chart(s) drawn as pixels (canvas, image or object) were not checked")
	code, out, _ = runCmd("check", "--json", "../../testdata/pixels.html")
	require.Equal(t, 0, code)
	var rep report.Report
	require.NoError(t, json.Unmarshal([]byte(out), &rep))
	require.Len(t, rep.Pages, 1)
	assert.Equal(t, []report.Unchecked{
		{Kind: "canvas", Name: "canvas0", Box: [4]float64{0, 0, 480, 200}},
		{Kind: "image", Name: "img0", Box: [4]float64{0, 0, 420, 180}},
	}, rep.Pages[0].Unchecked)
}

// What a check could not read is a warning on the page, naming what to do,
// and --fail-on warning fails on it: a page with no chart at all, a chart
// drawn as pixels whose pixels the static reader cannot judge, and a style
// sheet it did not load. A page with a readable chart and none of these
// has no page finding.
func TestUnreadIsAWarning(t *testing.T) {
	dir := t.TempDir()
	for name, c := range map[string]struct {
		body string
		ids  []string
	}{
		"empty.html":  {`<!doctype html><p>Ferry news, in words only.</p>`, []string{"no-chart-found"}},
		"canvas.html": {`<!doctype html><canvas width="480" height="200"></canvas>`, []string{"pixels-unread"}},
		"sheet.html": {`<!doctype html><link rel="stylesheet" href="https://cdn.example/quays.css">` + lostEmphasis,
			[]string{"style-sheet-unread"}},
	} {
		t.Run(name, func(t *testing.T) {
			page := writePage(t, dir, name, c.body)
			code, out, _ := runCmd("check", "--json", page)
			require.Equal(t, 0, code)
			var rep report.Report
			require.NoError(t, json.Unmarshal([]byte(out), &rep))
			var ids []string
			for _, f := range rep.Pages[0].Findings {
				ids = append(ids, f.ID)
				assert.Equal(t, "warning", f.Severity)
				assert.NotEmpty(t, f.Message)
			}
			assert.Equal(t, c.ids, ids)
			code, _, _ = runCmd("check", "--fail-on", "warning", page)
			assert.Equal(t, 1, code, "--fail-on warning")
		})
	}
	page := writePage(t, dir, "plain.html", `<!doctype html><svg width="200" height="100"><rect x="10" y="40" width="20" height="60" fill="#777"/><rect x="40" y="20" width="20" height="80" fill="#777"/></svg>`)
	code, out, _ := runCmd("check", "--json", page)
	require.Equal(t, 0, code)
	var rep report.Report
	require.NoError(t, json.Unmarshal([]byte(out), &rep))
	assert.Empty(t, rep.Pages[0].Findings)
}

// The static reader reads a page in each colour scheme --scheme names: its
// light-dark() colours, custom properties and @media (prefers-color-scheme)
// rules resolve for the scheme, each page carries its view, and the report
// says what changes between them. Widths still need the browser.
func TestStaticColourSchemes(t *testing.T) {
	page := writePage(t, t.TempDir(), "tides.html", `<!doctype html><html><head><style>
	:root { color-scheme: light dark; --bar: light-dark(#3b6e8f, #9cc3dc); --bg: light-dark(#ffffff, #14161a); }
	body { background: var(--bg); }
	@media (prefers-color-scheme: dark) { .hi { fill: #ffb86b; } }
	</style></head><body><svg width="200" height="100">
	<rect x="10" y="40" width="20" height="60" style="fill: var(--bar)"/><rect class="hi" x="40" y="20" width="20" height="80" fill="#c8553d"/>
	<rect x="70" y="50" width="20" height="50" style="fill: var(--bar)"/></svg></body></html>`)
	code, out, errs := runCmd("check", "--json", "--scheme", "light,dark", page)
	require.Equal(t, 0, code, errs)
	var rep report.Report
	require.NoError(t, json.Unmarshal([]byte(out), &rep))
	require.Len(t, rep.Pages, 2)
	for i, want := range []struct{ scheme, bg, bar, hi string }{{"light", "#ffffff", "#3b6e8f", "#c8553d"}, {"dark", "#14161a", "#9cc3dc", "#ffb86b"}} {
		p := rep.Pages[i]
		require.NotNil(t, p.View)
		assert.Equal(t, want.scheme, p.View.Scheme)
		c := p.Charts[0]
		assert.Equal(t, want.bg, c.Background, want.scheme)
		require.Len(t, c.Marks, 3)
		assert.Equal(t, want.bar, *c.Marks[0].Fill, want.scheme)
		assert.Equal(t, want.hi, *c.Marks[1].Fill, want.scheme)
	}
	code, _, errs = runCmd("check", "--widths", "360", page)
	assert.Equal(t, 2, code)
	assert.Contains(t, errs, "--widths needs --browser")
}
