package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"standout/internal/testkit"
	"standout/static"

	"github.com/stretchr/testify/require"
)

// corpusPage is one page of four corpus charts, as the core receives it,
// with the second chart given an extra mark when edited.
func corpusPage(t testing.TB, edited bool) []byte {
	var body strings.Builder
	body.WriteString("<html><body>")
	for k, name := range []string{"vega-lite/bar.svg", "observable-plot/anscombeQuartet.svg", "vega-lite/area_gradient.svg", "observable-plot/aaplClose.svg"} {
		b, err := os.ReadFile(filepath.Join(testkit.Corpus(t), name))
		require.NoError(t, err)
		svg := string(b[strings.Index(string(b), "<svg"):])
		if edited && k == 1 {
			svg = strings.Replace(svg, "</svg>", `<circle cx="30" cy="30" r="6" fill="#2a7f62"/></svg>`, 1)
		}
		body.WriteString(svg)
	}
	body.WriteString("</body></html>")
	p, err := static.Build(strings.NewReader(body.String()), static.Options{Source: "four-charts"})
	require.NoError(t, err)
	require.Len(t, p.Charts, 4)
	page, err := json.Marshal(map[string]any{"source": p.Source, "snapshots": p.Charts, "problems": p.Problems})
	require.NoError(t, err)
	return page
}

// answer is one digest request's response without its timing, and how
// many charts the core recalled for it.
func answer(t *testing.T, options string, page []byte, frames ...[]byte) (string, float64) {
	t.Helper()
	out, timing := answerTimed(t, options, page, frames...)
	return out, timing["recalledCharts"]
}

// answerTimed is answer with the core's timing.
func answerTimed(t *testing.T, options string, page []byte, frames ...[]byte) (string, map[string]float64) {
	t.Helper()
	var r map[string]json.RawMessage
	require.NoError(t, json.Unmarshal(HandlePage([]byte(options), page, frames...), &r))
	require.JSONEq(t, "true", string(r["ok"]), "%s", r["error"])
	var timing map[string]float64
	require.NoError(t, json.Unmarshal(r["timing"], &timing))
	delete(r, "timing")
	out, err := json.Marshal(r)
	require.NoError(t, err)
	return string(out), timing
}

// A re-check decodes only the charts that are not where and as they were
// on the page checked last under the same options; the others it skips
// and recalls. A chart it skipped but cannot recall (what is kept lost
// its digest) it decodes then, and answers as a core that kept nothing.
func TestRecheckDecodesOnlyTheChangedCharts(t *testing.T) {
	const opts = `{"type":"analyse"}`
	page, edited := corpusPage(t, false), corpusPage(t, true)
	charts.forget()
	fresh, timing := answerTimed(t, opts, page)
	require.Equal(t, 4.0, timing["decodedCharts"])
	charts.forget()
	freshEdited, _ := answerTimed(t, opts, edited)
	charts.forget()
	answerTimed(t, opts, page)

	got, timing := answerTimed(t, opts, page)
	require.Equal(t, fresh, got)
	require.Equal(t, 0.0, timing["decodedCharts"], "the same page again")
	got, timing = answerTimed(t, opts, edited)
	require.Equal(t, freshEdited, got)
	require.Equal(t, 1.0, timing["decodedCharts"], "one chart edited")
	require.Equal(t, 3.0, timing["recalledCharts"])
	_, timing = answerTimed(t, `{"type":"analyse","severity":0.6}`, edited)
	require.Equal(t, 4.0, timing["decodedCharts"], "other options")
	answerTimed(t, opts, edited)

	charts.mu.Lock()
	delete(charts.digests, charts.last[2].Raw)
	charts.mu.Unlock()
	got, timing = answerTimed(t, opts, edited)
	require.Equal(t, freshEdited, got)
	require.Equal(t, 1.0, timing["decodedCharts"], "the chart skipped but not recalled")
	require.Equal(t, 3.0, timing["recalledCharts"])
}

// A re-check after an edit to one chart judges that chart alone, and
// answers as a core that kept nothing does.
func TestEditedChartAloneIsJudgedAgain(t *testing.T) {
	const opts = `{"type":"analyse"}`
	page, edited := corpusPage(t, false), corpusPage(t, true)
	charts.forget()
	fresh, n := answer(t, opts, page)
	require.Zero(t, n)
	charts.forget()
	freshEdited, _ := answer(t, opts, edited)
	require.NotEqual(t, fresh, freshEdited, "the edit changes the digest")

	got, n := answer(t, opts, page)
	require.Equal(t, 3.0, n, "the three charts the edit left alone are recalled")
	require.Equal(t, fresh, got)
	got, n = answer(t, opts, page)
	require.Equal(t, 4.0, n)
	require.Equal(t, fresh, got)
	got, n = answer(t, opts, edited)
	require.Equal(t, 3.0, n)
	require.Equal(t, freshEdited, got)

	// Other options: nothing is recalled.
	charts.forget()
	freshSevere, _ := answer(t, `{"type":"analyse","severity":0.6}`, page)
	answer(t, opts, page)
	got, n = answer(t, `{"type":"analyse","severity":0.6}`, page)
	require.Zero(t, n)
	require.Equal(t, freshSevere, got)
}

// A fresh request judges every chart and leaves what is kept alone.
func TestFreshRequestKeepsNothing(t *testing.T) {
	const opts = `{"type":"analyse"}`
	page, edited := corpusPage(t, false), corpusPage(t, true)
	charts.forget()
	want, _ := answer(t, opts, page)
	got, n := answer(t, `{"type":"analyse","fresh":true}`, page)
	require.Zero(t, n, "a fresh request recalled")
	require.Equal(t, want, got)
	answer(t, `{"type":"analyse","fresh":true}`, edited)
	_, n = answer(t, opts, page)
	require.Equal(t, 4.0, n, "a fresh request replaced what was kept")
}

// A bad page and a page with frames (whose charts are moved after
// reading) neither use nor spoil what is kept.
func TestRecallSkipsFramesAndSurvivesErrors(t *testing.T) {
	const opts = `{"type":"analyse"}`
	page := corpusPage(t, false)
	charts.forget()
	fresh, _ := answer(t, opts, page)
	var bad map[string]any
	require.NoError(t, json.Unmarshal(HandlePage([]byte(opts), []byte(`{"snapshots":[{"v":2,"nodes":[1,2`)), &bad))
	require.Equal(t, false, bad["ok"])
	got, n := answer(t, opts, page)
	require.Equal(t, 4.0, n)
	require.Equal(t, fresh, got)

	framed := `{"type":"analyse","frames":[{"prefix":"frame0/","dx":10,"dy":20}]}`
	charts.forget()
	want, _ := answer(t, framed, page, page)
	for i := 0; i < 2; i++ {
		got, n := answer(t, framed, page, page)
		require.Zero(t, n)
		require.Equal(t, want, got)
	}
}

// Within a chart judged again, the analysis reuses its kept neighbour
// search (perception.Kept) when the marks are where they were; a fresh
// request, the background's training, neither uses nor replaces it, so
// that it runs the search as a first check does.
func TestFreshRequestKeepsNoNeighbourSearch(t *testing.T) {
	const opts = `{"type":"analyse"}`
	big, other := benchPage(t, 1, 1500, nil), benchPage(t, 2, 1200, nil)
	charts.forget()
	answer(t, opts, big)
	kept := charts.analysisKept()
	require.Equal(t, 1500, kept.Points())
	fresh, _ := answer(t, `{"type":"analyse","fresh":true}`, other)
	require.Equal(t, 1500, kept.Points(), "a fresh request replaced the kept search")
	charts.forget()
	want, _ := answer(t, opts, other)
	require.Equal(t, 1200, charts.analysisKept().Points())
	require.Equal(t, want, fresh)
}
