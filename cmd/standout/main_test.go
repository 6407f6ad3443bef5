package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"standout/internal/report"
	"standout/perception/colour"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func runCmd(args ...string) (int, string, string) {
	var out, errb bytes.Buffer
	code := run(args, &out, &errb)
	return code, out.String(), errb.String()
}

func TestPaletteJSON(t *testing.T) {
	// Red and green of equal lightness-ish, and a blue: the red/green pair
	// must collapse for deutan and protan readers (Machado et al. 2009 at
	// severity 1), and stay apart for normal vision.
	code, out, errs := runCmd("palette", "--json", "#c23a2e", "#3b9a3f", "#2a6fa8")
	require.Equal(t, 0, code, errs)
	var rep paletteReport
	require.NoError(t, json.Unmarshal([]byte(out), &rep))
	assert.Equal(t, 1, rep.Version)
	require.Len(t, rep.Colors, 3)
	assert.Equal(t, rep.Colors, rep.FormerColors, "the former key carries the same colours until version 2")
	assert.Contains(t, out, `"colours"`)
	assert.Equal(t, "#c23a2e", rep.Colors[0].Input)
	assert.Equal(t, "#c23a2e", rep.Colors[0].Hex)
	// Contrast against white: the WCAG 2.x ratio the colour package
	// verifies against the published examples, unrounded.
	assert.Equal(t, colour.ContrastRatio(colour.MustHex("#c23a2e"), colour.MustHex("#ffffff")), rep.Colors[0].Contrast)
	require.Len(t, rep.Pairs, 3)
	rg := rep.Pairs[0]
	assert.Equal(t, [2]int{0, 1}, [2]int{rg.A, rg.B})
	for _, v := range []string{"normal", "protan", "deutan", "tritan", "achromat"} {
		require.Contains(t, rg.Vision, v)
	}
	assert.True(t, rg.Vision["normal"].Noticeable)
	assert.False(t, rg.Vision["deutan"].Noticeable)
	assert.Less(t, rg.Vision["deutan"].DeltaE2000, rg.Vision["normal"].DeltaE2000/3)
	// The raw JSON uses the documented keys.
	var raw map[string]any
	require.NoError(t, json.Unmarshal([]byte(out), &raw))
	pair := raw["pairs"].([]any)[0].(map[string]any)
	normal := pair["vision"].(map[string]any)["normal"].(map[string]any)
	assert.Contains(t, normal, "deltaE2000")
	assert.Contains(t, normal, "noticeable")
}

func TestPaletteFailOnAndErrors(t *testing.T) {
	code, _, _ := runCmd("palette", "--fail-on", "cvd", "#c23a2e", "#3b9a3f")
	assert.Equal(t, 1, code)
	code, _, _ = runCmd("palette", "--fail-on", "normal", "#c23a2e", "#3b9a3f")
	assert.Equal(t, 0, code)
	code, _, _ = runCmd("palette", "--fail-on", "contrast", "#ffff00", "#000000")
	assert.Equal(t, 1, code, "yellow on white is below 3:1")
	code, _, errs := runCmd("palette", "#c23a2e", "bluish")
	assert.Equal(t, 2, code)
	assert.Contains(t, errs, `"bluish"`)
	code, _, errs = runCmd("palette", "--background", "nope", "red", "blue")
	assert.Equal(t, 2, code)
	assert.Contains(t, errs, "nope")
	code, _, _ = runCmd("palette", "red")
	assert.Equal(t, 2, code)
	code, _, _ = runCmd("palette", "--severity", "2", "red", "blue")
	assert.Equal(t, 2, code)
	// One name for CVD strength in every command; the former one still works.
	code, _, errs = runCmd("palette", "--cvd-severity", "2", "red", "blue")
	assert.Equal(t, 2, code)
	assert.Contains(t, errs, "--cvd-severity")
	code, out, _ := runCmd("palette", "--cvd-severity", "0.5", "red", "blue", "--size", "2.5")
	assert.Equal(t, 0, code)
	assert.Contains(t, out, "marks of 2.5 px (CVD severity 0.5)", "the size as given")
	code, out, _ = runCmd("palette", "red", "blue", "--mark", "bar", "--size", "20")
	assert.Equal(t, 0, code)
	assert.Contains(t, out, "Contrast against the background")
}

func TestCheckJSONAndExitCodes(t *testing.T) {
	dir := t.TempDir()
	page := filepath.Join(dir, "p.html")
	require.NoError(t, os.WriteFile(page, []byte(`<svg width="200" height="100"><rect width="200" height="100" fill="#fff"/>
	<circle cx="10" cy="10" r="4" fill="#2a6fa8"/><circle cx="30" cy="10" r="4" fill="#2a6fa8" opacity="0.5"/><circle cx="50" cy="10" r="4" stroke="red" fill="none"/></svg>`), 0o644))
	code, out, errs := runCmd("check", "--json", page)
	require.Equal(t, 0, code, errs)
	var rep report.Report
	require.NoError(t, json.Unmarshal([]byte(out), &rep))
	require.Len(t, rep.Pages, 1)
	require.Len(t, rep.Pages[0].Charts, 1)
	c := rep.Pages[0].Charts[0]
	require.Len(t, c.Marks, 3)
	assert.Equal(t, "point", c.Marks[0].Kind)
	assert.Equal(t, "circle", c.Marks[0].Shape)
	assert.Equal(t, "#2a6fa8", *c.Marks[0].Fill)
	assert.Nil(t, c.Marks[0].Stroke)
	assert.Equal(t, 0.5, c.Marks[1].Opacity)
	assert.Nil(t, c.Marks[2].Fill)
	assert.Equal(t, [4]float64{6, 6, 8, 8}, c.Marks[0].BBox)
	assert.Equal(t, 1, c.Furniture["background"])

	code, _, errs = runCmd("check", filepath.Join(dir, "missing.html"))
	assert.Equal(t, 2, code)
	assert.Contains(t, errs, "missing.html")
	code, _, _ = runCmd("check")
	assert.Equal(t, 2, code)
	code, _, _ = runCmd("frobnicate")
	assert.Equal(t, 2, code)
}

func TestDemo(t *testing.T) {
	code, out, errs := runCmd("demo", "--static")
	require.Equal(t, 0, code, errs)
	// The invented page holds a deutan collapse and a low-contrast series.
	assert.Contains(t, out, "Readers with deutan colour vision see #b8432e and #3f9b3a as the same colour")
	assert.Contains(t, out, "need 3:1")
	assert.Contains(t, out, "stands out at a glance")
	// Every kind of finding the demo is built to show.
	for _, want := range []string{
		"The emphasised mark is what a reader sees first",                                  // an emphasis that works
		"can be found only by checking marks one by one",                                   // only a conjunction carries it
		"the marks that look alike by colour are not the ones that group by connectedness", // colour fights position
		"The emphasised mark does not stand out",                                           // a weak emphasis drowns in a crowd
	} {
		assert.Contains(t, out, want)
	}
	// Every finding says what a reader meets and what to change, then the
	// evidence; no error stands for muted marks behind a working highlight.
	assert.Contains(t, out, "evidence: 1.98:1 against the background")
	assert.NotContains(t, out, "[error] 5 marks in #b8b8b8")
	assert.True(t, strings.Contains(out, "Caution:"))
}

func TestDemoInBrowser(t *testing.T) {
	needBrowser(t)
	code, out, errs := runCmd("demo")
	require.Equal(t, 0, code, errs)
	assert.Contains(t, out, "read as rendered in headless Chromium")
	assert.Contains(t, out, "Readers with deutan colour vision see #b8432e and #3f9b3a as the same colour")
	assert.Contains(t, out, "can be found only by checking marks one by one")
}

func TestCheckAnalysis(t *testing.T) {
	dir := t.TempDir()
	page := filepath.Join(dir, "bars.html")
	// Six grey bars and one orange: the orange pops out; named by a CSS
	// selector it is the declared emphasis.
	var b strings.Builder
	b.WriteString(`<svg width="300" height="200"><g>`)
	for i := 0; i < 7; i++ {
		fill := "#595959"
		cls := ""
		if i == 3 {
			fill, cls = "#e0611a", ` class="hero"`
		}
		b.WriteString(fmt.Sprintf(`<rect%s x="%d" y="%d" width="20" height="%d" fill="%s"/>`, cls, 10+i*30, 200-40-i*10, 40+i*10, fill))
	}
	b.WriteString(`</g></svg>`)
	require.NoError(t, os.WriteFile(page, []byte(b.String()), 0o644))
	code, out, errs := runCmd("check", "--json", "--emphasis", ".hero", page)
	require.Equal(t, 0, code, errs)
	var rep report.Report
	require.NoError(t, json.Unmarshal([]byte(out), &rep))
	c := rep.Pages[0].Charts[0]
	require.Len(t, c.Marks, 7)
	hero := c.Marks[3]
	assert.Equal(t, "pops", hero.Verdict)
	assert.Contains(t, hero.Channels, "hue")
	for _, v := range []string{"protan", "deutan", "tritan", "achromat"} {
		_, ok := hero.CVD.Get(v)
		require.True(t, ok, v)
	}
	assert.Equal(t, "blends", c.Marks[0].Verdict)
	require.NotNil(t, c.Emphasis)
	assert.Equal(t, []string{hero.ID}, c.Emphasis.Marks)
	assert.False(t, c.Emphasis.Inferred)
	var ids []string
	for _, f := range c.Findings {
		ids = append(ids, f.ID)
		assert.NotEmpty(t, f.Source)
		assert.NotEmpty(t, f.Message)
	}
	assert.Contains(t, ids, "emphasis-pops")
	// The same by mark id, and --fail-on.
	code, out, _ = runCmd("check", "--json", "--emphasis", hero.ID, page)
	require.Equal(t, 0, code)
	require.NoError(t, json.Unmarshal([]byte(out), &rep))
	assert.Equal(t, []string{hero.ID}, rep.Pages[0].Charts[0].Emphasis.Marks)
	code, _, _ = runCmd("check", "--fail-on", "info", page)
	assert.Equal(t, 1, code)
	code, _, _ = runCmd("check", "--fail-on", "error", page)
	assert.Equal(t, 0, code)
	code, _, _ = runCmd("check", "--fail-on", "loud", page)
	assert.Equal(t, 2, code)
	code, _, errs = runCmd("check", "--emphasis", "[[[", page)
	assert.Equal(t, 2, code)
	assert.Contains(t, errs, "[[[")
}

// TestLiteratureDisplaysThroughCheck builds visual-search displays as SVG
// files and runs them through the whole static path (build, walk,
// analysis, JSON), so the verdicts hold for charts as well as for the
// analysis package's own inputs. Treisman & Gelade (1980): a colour
// feature target pops out; a colour × shape conjunction target needs a
// serial search.
func TestLiteratureDisplaysThroughCheck(t *testing.T) {
	dir := t.TempDir()
	build := func(name string, target func(i int) (string, bool)) string {
		var b strings.Builder
		b.WriteString(`<svg xmlns="http://www.w3.org/2000/svg" width="400" height="400">`)
		for i := 0; i < 36; i++ {
			x, y := 20+(i%6)*60, 20+(i/6)*60
			fill, tri := target(i)
			if tri {
				fmt.Fprintf(&b, `<path d="M%d,%dl6,10h-12z" fill="%s"/>`, x, y-5, fill)
			} else {
				fmt.Fprintf(&b, `<rect x="%d" y="%d" width="10" height="10" fill="%s"/>`, x-5, y-5, fill)
			}
		}
		b.WriteString(`</svg>`)
		p := filepath.Join(dir, name)
		require.NoError(t, os.WriteFile(p, []byte(b.String()), 0o644))
		return p
	}
	half := func(i int) (string, bool) {
		if i%2 == 0 {
			return "#8b5a2b", true // brown triangles
		}
		return "#2e8b57", false // green squares
	}
	feature := build("feature.svg", func(i int) (string, bool) {
		if i == 14 {
			return "#1f4fb4", true
		}
		return half(i)
	})
	conj := build("conjunction.svg", func(i int) (string, bool) {
		if i == 14 {
			return "#2e8b57", true // a green triangle
		}
		return half(i)
	})
	verdicts := func(path string) map[string]int {
		code, out, errs := runCmd("check", "--json", path)
		require.Equal(t, 0, code, errs)
		var rep report.Report
		require.NoError(t, json.Unmarshal([]byte(out), &rep))
		c := rep.Pages[0].Charts[0]
		require.Len(t, c.Marks, 36)
		got := map[string]int{}
		for _, m := range c.Marks {
			got[m.Verdict]++
			require.Equal(t, "point", m.Kind, m.ID)
		}
		got["target:"+c.Marks[14].Verdict]++
		return got
	}
	f := verdicts(feature)
	assert.Equal(t, 1, f["target:pops"], "%v", f)
	assert.Equal(t, 35, f["blends"], "%v", f)
	c := verdicts(conj)
	assert.Equal(t, 1, c["target:conjunction"], "%v", c)
	assert.Equal(t, 35, c["blends"], "%v", c)
}

// The demo's text report is a golden file: chart names from titles, the
// authored colours, findings in plain words with their evidence, fixes as
// rules with selectors. Regenerate with go test ./cmd/standout -run
// DemoTextGolden -update, and review the diff.
func TestDemoTextGolden(t *testing.T) {
	code, out, errs := runCmd("demo", "--static")
	require.Equal(t, 0, code, errs)
	const golden = "testdata/demo-static.golden"
	if *update {
		require.NoError(t, os.WriteFile(golden, []byte(out), 0o644))
	}
	want, err := os.ReadFile(golden)
	require.NoError(t, err, "run go test ./cmd/standout -run DemoTextGolden -update")
	assert.Equal(t, string(want), out)
}

// No chart of the demo pages contradicts itself: a summary that has marks
// pop out goes with an emphasis that stands out or a named reason none
// does, and one with no mark popping never claims an emphasis that pops.
func TestDemoSummariesAgreeWithFindings(t *testing.T) {
	pages := parityPages(t)
	code, out, errs := runCmd(append([]string{"check", "--json"}, pages...)...)
	require.Equal(t, 0, code, errs)
	var rep report.Report
	require.NoError(t, json.Unmarshal([]byte(out), &rep))
	for _, p := range rep.Pages {
		for _, c := range p.Charts {
			if !c.IsChart {
				continue
			}
			ids := map[string]bool{}
			for _, f := range c.Findings {
				ids[f.ID] = true
			}
			sum := report.Summary(c)
			pops := strings.Contains(sum, "pop out") || strings.Contains(sum, "pops out")
			where := p.Source + " " + c.Path + ": " + sum
			if ids["no-standout-mark"] {
				assert.False(t, pops, "%s: marks pop, yet no mark stands apart", where)
			}
			if ids["emphasis-pops"] || ids["too-many-pop-out"] {
				assert.True(t, pops, "%s: a finding has marks pop, yet the summary has none", where)
			}
		}
	}
}
