package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"runtime"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/internal/report"
	"standout/internal/testkit"
	"standout/snapshot"
	"standout/static"
)

func TestHandleStaticSnapshot(t *testing.T) {
	// A snapshot from the static builder goes through the core exactly as
	// a browser snapshot would.
	doc := `<svg width="200" height="100"><g><rect x="0" y="50" width="10" height="50" fill="#999"/><rect x="20" y="40" width="10" height="60" fill="#999"/>
	<rect x="40" y="30" width="10" height="70" fill="#c23a2e"/><rect x="60" y="45" width="10" height="55" fill="#999"/></g></svg>`
	p, err := static.Build(strings.NewReader(doc), static.Options{Source: "t"})
	require.NoError(t, err)
	req, err := json.Marshal(Request{Type: "analyse", Source: "t", Snapshots: p.Charts, Emphasis: []string{"svg0/g0/rect2"}, Full: true})
	require.NoError(t, err, "snapshots must be JSON-safe")
	out := Handle(req)
	var resp Response
	dec := json.NewDecoder(bytes.NewReader(out))
	dec.DisallowUnknownFields()
	require.NoError(t, dec.Decode(&resp))
	require.True(t, resp.OK, resp.Error)
	// Written by hand, the response is what encoding/json writes for it
	// (with HTML escaping off).
	var want bytes.Buffer
	enc := json.NewEncoder(&want)
	enc.SetEscapeHTML(false)
	require.NoError(t, enc.Encode(resp))
	assert.Equal(t, strings.TrimSuffix(want.String(), "\n"), string(out))
	c := resp.Report.Pages[0].Charts[0]
	require.Len(t, c.Marks, 4)
	assert.Equal(t, "pops", c.Marks[2].Verdict)
	assert.Equal(t, []string{"svg0/g0/rect2"}, c.Emphasis.Marks)
}

func TestHandleErrors(t *testing.T) {
	for _, in := range []string{`{`, `{"type":"nope"}`, `{"type":"analyse","severity":3}`,
		`{"type":"analyse","snapshots":[{"v":99,"nodes":[]}]}`,
		`{"type":"analyse","snapshots":[{"v":2,"tags":["svg"],"paints":[0,0,0],"nodes":[5,0,0,0,0,0,0,1,1,1,1]}]}`} {
		var resp Response
		require.NoError(t, json.Unmarshal(Handle([]byte(in)), &resp), in)
		assert.False(t, resp.OK, in)
		assert.NotEmpty(t, resp.Error, in)
	}
}

func TestJSOnlyFilesHaveConstraint(t *testing.T) {
	// Every file that touches syscall/js must carry the js && wasm
	// constraint, so the rest builds and tests natively.
	files, _ := filepath.Glob("*.go")
	require.NotEmpty(t, files)
	for _, f := range files {
		t.Run(filepath.Base(f), func(t *testing.T) {
			b, err := os.ReadFile(f)
			require.NoError(t, err)
			s := string(b)
			if regexp.MustCompile(`(?m)^\s*(import\s+)?"syscall/js"\s*$`).MatchString(s) {
				assert.True(t, strings.HasPrefix(s, "//go:build js && wasm"), "%s imports syscall/js without the js && wasm constraint", f)
			}
		})
	}
}

func TestHandlePageMatchesHandle(t *testing.T) {
	doc := `<svg width="200" height="100"><g><circle cx="10" cy="10" r="4" fill="#999"/><circle cx="30" cy="10" r="4" fill="#999"/><circle cx="50" cy="10" r="4" fill="#c4521a"/></g></svg>`
	p, err := static.Build(strings.NewReader(doc), static.Options{Source: "t"})
	require.NoError(t, err)
	whole, err := json.Marshal(Request{Type: "analyse", Source: "t", Snapshots: p.Charts, Full: true})
	require.NoError(t, err)
	page, err := json.Marshal(map[string]any{"source": "t", "snapshots": p.Charts, "problems": []string{}, "readMs": 3})
	require.NoError(t, err)
	var a, b Response
	require.NoError(t, json.Unmarshal(Handle(whole), &a))
	require.NoError(t, json.Unmarshal(HandlePage([]byte(`{"type":"analyse","full":true}`), page), &b))
	require.True(t, a.OK, a.Error)
	require.True(t, b.OK, b.Error)
	a.Timing, b.Timing = nil, nil
	assert.Equal(t, a, b)
	var bad Response
	require.NoError(t, json.Unmarshal(HandlePage([]byte(`{"type":"analyse"}`), []byte(`{"snapshots":[`)), &bad))
	assert.False(t, bad.OK)
}

func TestDigestMatchesReport(t *testing.T) {
	// The overlay's digest says what the full report says of every mark
	// and finding, and is valid JSON for any text a page may hold.
	doc := `<svg width="200" height="100"><g><circle cx="10" cy="10" r="4" fill="#999"/><circle cx="30.333" cy="10" r="4" fill="#999"/>
	<circle cx="50" cy="10" r="4" fill="#999"/><circle cx="70" cy="10" r="4" fill="#c4521a" aria-label="a &quot;quoted&quot; \ label &#1;"/></g></svg>`
	p, err := static.Build(strings.NewReader(doc), static.Options{Source: "t\u2028\"x"})
	require.NoError(t, err)
	page, _ := json.Marshal(map[string]any{"source": "t\x00\xff\"", "snapshots": p.Charts, "problems": []string{"a\tb"}})
	var full, lite Response
	require.NoError(t, json.Unmarshal(HandlePage([]byte(`{"type":"analyse","full":true}`), page), &full))
	out := HandlePage([]byte(`{"type":"analyse"}`), page)
	require.True(t, json.Valid(out), "%s", out)
	require.NoError(t, json.Unmarshal(out, &lite))
	require.True(t, lite.OK, lite.Error)
	require.NotNil(t, lite.Overlay)
	assert.Nil(t, lite.Report)
	assert.Empty(t, lite.Markdown, "the Markdown is made on export")
	require.NotEmpty(t, lite.Overlay.Pages[0].Charts[0].Findings)
	digestMatchesReport(t, p.Charts, full, lite)
}

// digestMatchesReport checks that the overlay's digest of a page says what
// the full report says of every mark, finding and emphasis.
func digestMatchesReport(t *testing.T, snaps []snapshot.Snapshot, full, lite Response) {
	t.Helper()
	require.True(t, full.OK, full.Error)
	require.True(t, lite.OK, lite.Error)
	fp, lp := full.Report.Pages[0], lite.Overlay.Pages[0]
	assert.Equal(t, fp.Source, lp.Source)
	assert.Equal(t, fp.Problems, lp.Problems)
	require.Len(t, lp.Charts, len(fp.Charts))
	for ci, fc := range fp.Charts {
		t.Run(fc.Path, func(t *testing.T) {
			chartDigestMatches(t, snaps[ci], fc, lp.Charts[ci])
		})
	}
}

// chartDigestMatches compares one chart's digest with its report.
func chartDigestMatches(t *testing.T, snap snapshot.Snapshot, fc report.Chart, lc report.DigestChart) {
	assert.Equal(t, fc.Title, lc.Title)
	// The node of each mark is the node its id names.
	nodeName := func(k int) string { return snap.Nodes[lc.Nodes[k]].Name }
	require.Len(t, lc.Nodes, len(fc.Marks))
	require.Len(t, lc.Boxes, 4*len(fc.Marks))
	require.Len(t, lc.Verdicts, len(fc.Marks))
	for i, m := range fc.Marks {
		assert.Equal(t, m.ID, nodeName(i))
		assert.Equal(t, m.BBox[:], lc.Boxes[4*i:4*i+4])
		if fc.IsChart {
			assert.Equal(t, m.Verdict[:1], lc.Verdicts[i:i+1])
		}
	}
	// Each line and rule has its path, from the same vertices as the
	// report's points.
	paths := 0
	for i, m := range fc.Marks {
		if len(m.Points) >= 2 {
			require.Less(t, paths, len(lc.Paths))
			p := lc.Paths[paths]
			assert.Equal(t, float64(i), p[0])
			assert.InDelta(t, m.Points[0][0], p[2], 0.01)
			assert.InDelta(t, m.Points[0][1], p[3], 0.01)
			paths++
		}
	}
	assert.Len(t, lc.Paths, paths)
	require.Len(t, lc.Findings, len(fc.Findings))
	for i, f := range fc.Findings {
		g := lc.Findings[i]
		assert.Equal(t, []any{f.ID, f.Severity, f.Message, f.Evidence}, []any{g.ID, g.Severity, g.Message, g.Evidence})
		var ids []string
		for _, k := range g.Marks {
			ids = append(ids, nodeName(k))
		}
		assert.ElementsMatch(t, f.Marks, ids)
		if f.Fix != nil {
			require.NotNil(t, g.Fix)
			assert.Equal(t, report.DigestFix{Kind: f.Fix.Kind, CSS: f.Fix.CSS, Rule: f.Fix.Rule, Verified: f.Fix.Verified, Alternative: f.Fix.Alternative}, *g.Fix)
		}
	}
	if fc.Emphasis == nil {
		assert.Nil(t, lc.Emphasis)
		return
	}
	require.NotNil(t, lc.Emphasis)
	var em []string
	for _, k := range lc.Emphasis.Marks {
		em = append(em, nodeName(k))
	}
	assert.Equal(t, fc.Emphasis.Marks, nonNilStrings(em))
	assert.Equal(t, fc.Emphasis.Holds, lc.Emphasis.Holds)
	assert.Equal(t, fc.Emphasis.Inferred, lc.Emphasis.Inferred)
	// The panel's search plot follows the report's curve.
	if curve, ok := report.CurveOf(fc); ok {
		assert.InDelta(t, curve.Ms, lc.Emphasis.SearchMs, 0.05)
		assert.Equal(t, curve.Serial, lc.Emphasis.Serial)
	}
}

func nonNilStrings(s []string) []string {
	if s == nil {
		return []string{}
	}
	return s
}

// The digest is cut from the same analysis as the report on every test
// page and corpus chart.
func TestDigestMatchesReportOnEveryChart(t *testing.T) {
	if testing.Short() || runtime.GOOS == "js" {
		t.Skip("analyses every test page and corpus chart twice")
	}
	corpus, _ := filepath.Glob(filepath.Join(testkit.Corpus(t), "*", "*.svg"))
	for _, f := range append(testkit.Pages(t), corpus...) {
		t.Run(filepath.Base(f), func(t *testing.T) {
			data, err := os.ReadFile(f)
			require.NoError(t, err)
			p, err := static.Build(strings.NewReader(string(data)), static.Options{Source: f})
			require.NoError(t, err)
			page, err := json.Marshal(map[string]any{"source": f, "snapshots": p.Charts, "problems": p.Problems})
			require.NoError(t, err)
			var full, lite Response
			require.NoError(t, json.Unmarshal(HandlePage([]byte(`{"type":"analyse","full":true}`), page), &full))
			require.NoError(t, json.Unmarshal(HandlePage([]byte(`{"type":"analyse"}`), page), &lite))
			digestMatchesReport(t, p.Charts, full, lite)
		})
	}

}

func TestParseOptionsMatchesEncodingJSON(t *testing.T) {
	// The options scanner reads what encoding/json reads into a Request.
	for _, in := range []string{`{"type":"analyse"}`, `{"type":"analyse","emphasis":["svg0/g0/rect2","a\"b"],"severity":0.4,"full":true,"distanceCm":60,"pxPerInch":96}`,
		`{"type":"analyse","severity":null,"emphasis":null,"extra":{"x":[1]}}`, `{}`,
		`{"pixels":[{"name":"canvas0","regions":{"normal":[{"box":[1,2,3,4],"salience":1,"x":0}],"deutan":[]},"more":1}],"pick":{"name":"canvas0","x":5,"y":6.5}}`,
		`{"pixels":[],"pick":null}`, `{"pixels":null}`} {
		var want Request
		require.NoError(t, json.Unmarshal([]byte(in), &want), in)
		got, err := parseOptions([]byte(in))
		require.NoError(t, err, in)
		assert.Equal(t, want, *got, in)
	}
	for _, bad := range []string{`{`, `{"full":1}`, `{"severity":"x"}`, `[]`, `{} x`, `{"pixels":[{"regions":{"normal":[{"box":[1,2,3]}]}}]}`, `{"pick":{"x":"1"}}`} {
		_, err := parseOptions([]byte(bad))
		assert.Error(t, err, bad)
	}
}

func TestEmphasisByNode(t *testing.T) {
	// The overlay names its picks by chart and node; the core reports them
	// by id, as if they had been named so.
	doc := `<svg width="200" height="100"><g><rect x="0" y="50" width="10" height="50" fill="#999"/><rect x="20" y="40" width="10" height="60" fill="#999"/>
	<rect x="40" y="30" width="10" height="70" fill="#999"/><rect x="60" y="45" width="10" height="55" fill="#999"/></g></svg>`
	p, err := static.Build(strings.NewReader(doc), static.Options{Source: "t"})
	require.NoError(t, err)
	node := -1
	for i, n := range p.Charts[0].Nodes {
		if n.Name == "svg0/g0/rect2" {
			node = i
		}
	}
	require.GreaterOrEqual(t, node, 0)
	page, _ := json.Marshal(map[string]any{"source": "t", "snapshots": p.Charts})
	var byNode, byID Response
	require.NoError(t, json.Unmarshal(HandlePage([]byte(fmt.Sprintf(`{"type":"analyse","full":true,"emphasisNodes":["svg0#%d"]}`, node)), page), &byNode))
	require.NoError(t, json.Unmarshal(HandlePage([]byte(`{"type":"analyse","full":true,"emphasis":["svg0/g0/rect2"]}`), page), &byID))
	require.True(t, byNode.OK, byNode.Error)
	assert.Equal(t, []string{"svg0/g0/rect2"}, byNode.Report.Pages[0].Charts[0].Emphasis.Marks)
	byNode.Timing, byID.Timing = nil, nil
	assert.Equal(t, byID, byNode)
	var bad Response
	require.NoError(t, json.Unmarshal(HandlePage([]byte(`{"type":"analyse","emphasisNodes":["svg0"]}`), page), &bad))
	assert.False(t, bad.OK)
}

// A frame's reading, sent after the page with its place in the options,
// joins the page's charts under the frame's name, its marks moved into
// page px; a reading without a place, or a bad one, is an error.
func TestHandlePageWithFrames(t *testing.T) {
	doc := `<svg width="200" height="100"><g><rect x="10" y="40" width="20" height="60" fill="#999"/><rect x="40" y="20" width="20" height="80" fill="#c4521a"/></g></svg>`
	p, err := static.Build(strings.NewReader(doc), static.Options{Source: "t"})
	require.NoError(t, err)
	frame, err := json.Marshal(map[string]any{"source": "f", "snapshots": p.Charts, "problems": []string{}})
	require.NoError(t, err)
	page, err := json.Marshal(map[string]any{"source": "t", "snapshots": []any{}, "problems": []string{}})
	require.NoError(t, err)
	var r Response
	require.NoError(t, json.Unmarshal(HandlePage([]byte(`{"type":"analyse","full":true,"frames":[{"prefix":"frame0/","dx":54,"dy":34}]}`), page, frame), &r))
	require.True(t, r.OK, r.Error)
	require.Len(t, r.Report.Pages[0].Charts, 1)
	c := r.Report.Pages[0].Charts[0]
	assert.Equal(t, "frame0/svg0", c.Path)
	require.Len(t, c.Marks, 2)
	assert.Equal(t, "frame0/svg0/g0/rect0", c.Marks[0].ID)
	assert.InDelta(t, 64, c.Marks[0].BBox[0], 1e-9)
	assert.InDelta(t, 74, c.Marks[0].BBox[1], 1e-9)

	for _, bad := range [][2]string{{`{"type":"analyse"}`, string(frame)}, {`{"type":"analyse","frames":[{"prefix":"frame0/"}]}`, `{"snapshots":[`}} {
		var r Response
		require.NoError(t, json.Unmarshal(HandlePage([]byte(bad[0]), page, []byte(bad[1])), &r))
		assert.False(t, r.OK, bad[0])
	}
}

// The whole report (the panel's export) carries the press's judgements of
// the charts drawn as pixels: each judged one is a chart with its regions
// in page px, a point picked on it is checked as its emphasis, and a chart
// drawn as pixels that was not judged is named in the page's findings.
func TestFullReportCarriesJudgedPixels(t *testing.T) {
	page := `{"source":"t","snapshots":[],"problems":[],"rasters":[{"tag":"canvas","name":"canvas0","box":[20,300,480,300]},{"tag":"img","name":"img0","box":[20,700,480,300]}]}`
	opts := `{"type":"analyse","full":true,"pixels":[{"name":"canvas0","regions":{"normal":[{"box":[208,160,32,128],"salience":1},{"box":[144,80,16,32],"salience":0.51}],
		"deutan":[{"box":[208,160,32,128],"salience":1}],"achromat":[{"box":[64,64,176,224],"salience":1}]}}],"pick":{"name":"canvas0","x":223,"y":217}}`
	var r Response
	require.NoError(t, json.Unmarshal(HandlePage([]byte(opts), []byte(page)), &r))
	require.True(t, r.OK, r.Error)
	p := r.Report.Pages[0]
	require.Len(t, p.Unchecked, 2)
	require.Len(t, p.Charts, 1, "the judged canvas only")
	c := p.Charts[0]
	assert.Equal(t, "canvas0", c.Path)
	assert.Equal(t, "canvas", c.Source)
	assert.Equal(t, []report.Region{{Box: [4]float64{228, 460, 32, 128}, Salience: 1}, {Box: [4]float64{164, 380, 16, 32}, Salience: 0.51}}, c.Regions)
	assert.Equal(t, [4]float64{84, 364, 176, 224}, c.CVD["achromat"][0].Box)
	require.NotNil(t, c.Emphasis)
	assert.Equal(t, [4]float64{243, 517, 0, 0}, *c.Emphasis.Box)
	assert.Equal(t, map[string]bool{"normal": true, "deutan": true, "achromat": true}, c.Emphasis.Holds)
	var ids []string
	for _, f := range p.Findings {
		ids = append(ids, f.ID+" "+strings.Join(f.Marks, ","))
	}
	assert.Equal(t, []string{"pixels-unread img0"}, ids)
	assert.Contains(t, r.Markdown, "### Chart `canvas0` (canvas, judged by its pixels)")
	assert.Contains(t, r.Markdown, "pixels-unread")

	// A pick outside the strongest region is no emphasis that holds.
	opts = strings.Replace(opts, `"x":223,"y":217`, `"x":30,"y":250`, 1)
	require.NoError(t, json.Unmarshal(HandlePage([]byte(opts), []byte(page)), &r))
	require.True(t, r.OK, r.Error)
	assert.Equal(t, map[string]bool{"normal": false, "deutan": false, "achromat": false}, r.Report.Pages[0].Charts[0].Emphasis.Holds)
}
