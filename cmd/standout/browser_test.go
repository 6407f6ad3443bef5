package main

import (
	"encoding/json"
	"flag"
	"fmt"
	"image"
	"image/png"
	"io/fs"
	"math"
	"net"
	"net/http"
	"net/http/httptest"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/extension"
	"standout/internal/browser"
	"standout/internal/demo"
	"standout/internal/report"
	"standout/internal/testkit"
	"standout/perception/colour"
)

var update = flag.Bool("update", false, "rewrite the golden files")

func needBrowser(t testing.TB) { testkit.Chromium(t) }

// parityPages are the demo pages, the testdata pages and the generator
// corpus (testdata/generators).
func parityPages(t *testing.T) []string {
	dir := t.TempDir()
	var out []string
	names, _ := fs.Glob(demo.Pages, "pages/*.html")
	for _, n := range names {
		b, _ := demo.Pages.ReadFile(n)
		p := filepath.Join(dir, filepath.Base(n))
		require.NoError(t, os.WriteFile(p, b, 0o644))
		out = append(out, p)
	}
	for _, pat := range []string{"../../testdata/*.html", "../../testdata/*.svg", "../../testdata/generators/*/*.svg"} {
		m, _ := filepath.Glob(pat)
		out = append(out, m...)
	}
	require.NotEmpty(t, out)
	return out
}

func TestBrowserPathMatchesStaticPath(t *testing.T) {
	needBrowser(t)
	pages := parityPages(t)
	code, bout, errs := runCmd(append([]string{"check", "--browser", "--json"}, pages...)...)
	require.Equal(t, 0, code, errs)
	code, sout, errs := runCmd(append([]string{"check", "--json"}, pages...)...)
	require.Equal(t, 0, code, errs)
	var b, s report.Report
	require.NoError(t, json.Unmarshal([]byte(bout), &b))
	require.NoError(t, json.Unmarshal([]byte(sout), &s))
	require.Len(t, b.Pages, len(pages))
	require.Len(t, s.Pages, len(pages))
	for i := range pages {
		bp, sp := b.Pages[i], s.Pages[i]
		// The browser also lists the charts drawn as pixels whose pixels
		// it judged (minor 4), after the SVG charts; the static reader
		// judges none.
		var svg []report.Chart
		judged := 0
		for _, c := range bp.Charts {
			if !c.DrawnAsPixels() {
				require.Zero(t, judged, "%s: the charts drawn as pixels come after the SVG charts", pages[i])
				svg = append(svg, c)
				continue
			}
			judged++
			assert.NotEmpty(t, c.Regions, "%s %s", pages[i], c.Path)
		}
		assert.Equal(t, len(bp.Unchecked)-len(report.Unjudged(bp.Unchecked)), judged, pages[i])
		bp.Charts = svg
		require.Len(t, bp.Charts, len(sp.Charts), pages[i])
		for _, c := range sp.Charts {
			assert.Equal(t, "svg", c.Source, "%s %s", pages[i], c.Path)
		}
		// Charts drawn as pixels are named alike; the static reader has
		// no layout, so only the sizes the attributes give compare.
		require.Len(t, bp.Unchecked, len(sp.Unchecked), pages[i])
		for k, u := range sp.Unchecked {
			assert.Equal(t, u.Name, bp.Unchecked[k].Name, pages[i])
			assert.Equal(t, u.Kind, bp.Unchecked[k].Kind, pages[i])
			if u.Box[2] > 0 {
				assert.InDelta(t, u.Box[2], bp.Unchecked[k].Box[2], 1, pages[i])
				assert.InDelta(t, u.Box[3], bp.Unchecked[k].Box[3], 1, pages[i])
			}
		}
		for c := range sp.Charts {
			bc, sc := bp.Charts[c], sp.Charts[c]
			require.Equal(t, sc.Path, bc.Path)
			assert.Equal(t, sc.Anchor, bc.Anchor, "%s %s: anchor", pages[i], sc.Path)
			require.Len(t, bc.Marks, len(sc.Marks), "%s %s", pages[i], sc.Path)
			assert.Len(t, bc.Legend, len(sc.Legend), "%s %s: legend", pages[i], sc.Path)
			assert.Equal(t, sc.Furniture, bc.Furniture, "%s %s: furniture", pages[i], sc.Path)
			require.Len(t, bc.Findings, len(sc.Findings), "%s %s", pages[i], sc.Path)
			for k, f := range sc.Findings {
				if f.Fix != nil && bc.Findings[k].Fix != nil {
					assert.Equal(t, f.Fix.Rule, bc.Findings[k].Fix.Rule, "%s %s: the fix's rule", pages[i], sc.Path)
				}
			}
			for k := range sc.Marks {
				bm, sm := bc.Marks[k], sc.Marks[k]
				where := fmt.Sprintf("%s %s", filepath.Base(pages[i]), sm.ID)
				require.Equal(t, sm.ID, bm.ID, where)
				assert.Equal(t, sm.Kind, bm.Kind, where)
				assert.Equal(t, sm.Shape, bm.Shape, where)
				assert.Equal(t, sm.Fill, bm.Fill, where)
				assert.Equal(t, sm.Weight, bm.Weight, where)
				assert.Equal(t, sm.Verdict, bm.Verdict, where)
				// The static path has no layout: compare boxes relative to
				// the chart's own box. Both paths bound a shape's local box
				// mapped by its CTM, as getBoundingClientRect does, rotated
				// and skewed shapes included.
				// Text is the exception: without font metrics the static
				// path estimates a text's extent from its font size, to
				// within a quarter of it.
				tol := 1.0
				if sm.Kind == "text" {
					tol = 0.25 * sm.Size
				}
				near := true
				for j := 0; j < 2; j++ {
					near = near && math.Abs(sm.BBox[j]-sc.Box[j]-(bm.BBox[j]-bc.Box[j])) <= tol && math.Abs(sm.BBox[j+2]-bm.BBox[j+2]) <= tol
				}
				assert.True(t, near, "%s: static box %v (chart at %v), browser box %v (chart at %v)", where, sm.BBox, sc.Box, bm.BBox, bc.Box)
			}
		}
	}
}

func TestBatchWithUnreachablePages(t *testing.T) {
	needBrowser(t)
	srv := httptest.NewServer(http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		if strings.HasPrefix(r.URL.Path, "/missing") {
			http.NotFound(w, r)
			return
		}
		w.Header().Set("Content-Type", "text/html; charset=utf-8")
		fmt.Fprintf(w, `<!doctype html><html><body><svg width="200" height="100"><rect x="10" y="10" width="20" height="60" fill="#777"/><rect x="40" y="20" width="20" height="50" fill="#777"/><rect x="70" y="5" width="20" height="65" fill="#b91c1c"/></svg><p>%s</p></body></html>`, r.URL.Path)
	}))
	defer srv.Close()
	// A port with nothing listening.
	l, err := net.Listen("tcp", "127.0.0.1:0")
	require.NoError(t, err)
	dead := "http://" + l.Addr().String() + "/"
	l.Close()
	var urls []string
	for i := 0; i < 47; i++ {
		urls = append(urls, fmt.Sprintf("%s/page%d", srv.URL, i))
	}
	urls = append(urls, srv.URL+"/missing1", dead, srv.URL+"/missing2")
	start := time.Now()
	code, out, errs := runCmd(append([]string{"check", "--browser", "--tabs", "4", "--json"}, urls...)...)
	t.Logf("50 pages in %v", time.Since(start))
	assert.Equal(t, 2, code)
	var rep report.Report
	require.NoError(t, json.Unmarshal([]byte(out), &rep))
	assert.Len(t, rep.Pages, 47)
	require.Len(t, rep.Errors, 3)
	for _, bad := range []string{srv.URL + "/missing1", dead, srv.URL + "/missing2"} {
		assert.Contains(t, errs, bad)
		found := false
		for _, e := range rep.Errors {
			if strings.Contains(e, bad) {
				found = true
			}
		}
		assert.True(t, found, bad)
	}
	assert.Contains(t, errs, "| 47 | 3 | 47 |")
	for _, p := range rep.Pages {
		require.Len(t, p.Charts, 1)
		assert.Len(t, p.Charts[0].Marks, 3)
	}
}

func TestMarkdownAndPNGGolden(t *testing.T) {
	needBrowser(t)
	dir := t.TempDir()
	b, err := demo.Pages.ReadFile("pages/harbour-ferries.html")
	require.NoError(t, err)
	page := filepath.Join(dir, "harbour-ferries.html")
	require.NoError(t, os.WriteFile(page, b, 0o644))
	md, pngs := filepath.Join(dir, "md"), filepath.Join(dir, "png")
	code, _, errs := runCmd("check", "--browser", "--md", md, "--png", pngs, page)
	require.Equal(t, 0, code, errs)
	mds, _ := filepath.Glob(filepath.Join(md, "*.md"))
	require.Len(t, mds, 1)
	written, _ := filepath.Glob(filepath.Join(pngs, "*.png"))
	// The run says where its files went, and how many.
	assert.Contains(t, errs, fmt.Sprintf("wrote %d annotated PNG(s) to %s", len(written), pngs))
	assert.Contains(t, errs, "wrote 1 Markdown report(s) to "+md)
	got, err := os.ReadFile(mds[0])
	require.NoError(t, err)
	// A local page is named by its path from the report's folder.
	assert.Contains(t, string(got), "\n## ../harbour-ferries.html\n")
	// Any absolute path would differ per run; the golden file has a
	// placeholder for it.
	gotS := strings.ReplaceAll(string(got), page, "PAGE")
	gotS = strings.ReplaceAll(gotS, report.MarkdownEscape(page), "PAGE")
	golden := "testdata/harbour-ferries.md.golden"
	if *update {
		require.NoError(t, os.MkdirAll("testdata", 0o755))
		require.NoError(t, os.WriteFile(golden, []byte(gotS), 0o644))
	}
	want, err := os.ReadFile(golden)
	require.NoError(t, err, "run go test ./cmd/standout -run Golden -update")
	assert.Equal(t, string(want), gotS)

	shots, _ := filepath.Glob(filepath.Join(pngs, "*-svg0.png"))
	require.Len(t, shots, 1)
	img := decodePNG(t, shots[0])
	goldenPNG := "testdata/harbour-ferries-svg0.png"
	if *update {
		data, _ := os.ReadFile(shots[0])
		require.NoError(t, os.WriteFile(goldenPNG, data, 0o644))
	}
	if os.Getenv("STANDOUT_UPDATE_DOCS") == "1" {
		data, _ := os.ReadFile(shots[0])
		require.NoError(t, os.WriteFile("../../docs/report-picture.png", data, 0o644))
	}
	ref := decodePNG(t, goldenPNG)
	require.Equal(t, ref.Bounds(), img.Bounds())
	// Sampled pixels on a 24 × 24 grid, within 24 levels per channel
	// (font rendering and anti-aliasing may shift between runs).
	bad := 0
	for gy := 0; gy < 24; gy++ {
		for gx := 0; gx < 24; gx++ {
			x := ref.Bounds().Min.X + gx*ref.Bounds().Dx()/24
			y := ref.Bounds().Min.Y + gy*ref.Bounds().Dy()/24
			r1, g1, b1, _ := ref.At(x, y).RGBA()
			r2, g2, b2, _ := img.At(x, y).RGBA()
			d := math.Max(math.Abs(float64(r1)-float64(r2)), math.Max(math.Abs(float64(g1)-float64(g2)), math.Abs(float64(b1)-float64(b2)))) / 257
			if d > 24 {
				bad++
			}
		}
	}
	assert.LessOrEqual(t, bad, 5, "sampled pixels off the golden PNG")
	// The outline of the emphasised bar (it pops) is drawn in the style
	// the overlay draws it in (report.VerdictStyles).
	pr, pg, pb := colour.MustHex(report.StyleOf("pops").Colour).RGB8()
	var outline int
	bb := img.Bounds()
	for y := bb.Min.Y; y < bb.Max.Y; y++ {
		for x := bb.Min.X; x < bb.Max.X; x++ {
			r, g, b, _ := img.At(x, y).RGBA()
			if uint8(r>>8) == pr && uint8(g>>8) == pg && uint8(b>>8) == pb {
				outline++
			}
		}
	}
	assert.Greater(t, outline, 100)
}

func decodePNG(t *testing.T, p string) image.Image {
	f, err := os.Open(p)
	require.NoError(t, err)
	defer f.Close()
	img, err := png.Decode(f)
	require.NoError(t, err)
	return img
}

// BenchmarkBatch reports pages per minute for a batch of 24 demo-like pages
// with 1, 2 and 4 tabs, and with 4 tabs and four views of each page (360
// and 1,280 px, light and dark: --widths 360,1280 --scheme light,dark),
// and the shares of time in page load, read pass and analysis. Run with:
//
//	go test ./cmd/standout -run '^$' -bench Batch -benchtime 1x
func BenchmarkBatch(b *testing.B) {
	needBrowser(b)
	page, err := demo.Pages.ReadFile("pages/harbour-ferries.html")
	require.NoError(b, err)
	srv := httptest.NewServer(http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		w.Header().Set("Content-Type", "text/html; charset=utf-8")
		w.Write(page)
	}))
	defer srv.Close()
	var urls []string
	for i := 0; i < 24; i++ {
		urls = append(urls, fmt.Sprintf("%s/p%d", srv.URL, i))
	}
	exe := testkit.Chromium(b)
	fourViews := []browser.View{{Width: 360, Scheme: "light"}, {Width: 360, Scheme: "dark"}, {Width: 1280, Scheme: "light"}, {Width: 1280, Scheme: "dark"}}
	for _, run := range []struct {
		tabs  int
		views []browser.View
	}{{1, nil}, {2, nil}, {4, nil}, {4, fourViews}} {
		name := fmt.Sprintf("tabs=%d", run.tabs)
		if run.views != nil {
			name += fmt.Sprintf("/views=%d", len(run.views))
		}
		b.Run(name, func(b *testing.B) {
			var load, read, analyse, wall float64
			views := 0
			for i := 0; i < b.N; i++ {
				profile := b.TempDir()
				ctx, cancel := browser.NewAllocator(b.Context(), browser.Options{Exec: exe, UserDataDir: profile, NoSandbox: browser.SandboxNote() != ""})
				t0 := time.Now()
				res := browser.ReadPages(ctx, urls, browser.ReadOptions{Tabs: run.tabs, Reader: extension.Reader(), Views: run.views})
				views += len(res)
				for _, r := range res {
					require.NoError(b, r.Err)
					load += r.LoadMs
					read += r.ReadMs
					a0 := time.Now()
					_, err := pageFromRead(r.URL, r, report.DefaultOptions)
					require.NoError(b, err)
					analyse += float64(time.Since(a0).Microseconds()) / 1000
				}
				wall += time.Since(t0).Seconds()
				cancel()
				browser.RemoveProfile(profile)
			}
			total := load + read + analyse
			b.ReportMetric(float64(len(urls)*b.N)/wall*60, "pages/min")
			b.ReportMetric(float64(views)/wall*60, "views/min")
			b.ReportMetric(100*load/total, "%load")
			b.ReportMetric(100*read/total, "%read")
			b.ReportMetric(100*analyse/total, "%analyse")
		})
	}
}

func TestBrowserEmphasisSelector(t *testing.T) {
	needBrowser(t)
	dir := t.TempDir()
	page := filepath.Join(dir, "p.html")
	require.NoError(t, os.WriteFile(page, []byte(`<svg width="200" height="100"><g>
	<rect x="10" y="40" width="20" height="60" fill="#777"/><rect class="key" x="40" y="30" width="20" height="70" fill="#777"/>
	<rect x="70" y="10" width="20" height="90" fill="#b91c1c"/></g></svg>`), 0o644))
	for _, browserMode := range []bool{false, true} {
		args := []string{"check", "--json", "--emphasis", "rect.key", page}
		if browserMode {
			args = append([]string{"check", "--browser"}, args[1:]...)
		}
		code, out, errs := runCmd(args...)
		require.Equal(t, 0, code, errs)
		var rep report.Report
		require.NoError(t, json.Unmarshal([]byte(out), &rep))
		em := rep.Pages[0].Charts[0].Emphasis
		require.NotNil(t, em)
		assert.Equal(t, []string{"svg0/g0/rect1"}, em.Marks, "browser=%v", browserMode)
		assert.False(t, em.Holds["normal"], "a grey bar among grey bars does not stand out")
	}
}

// One page read at two widths in two colour schemes: four views, each
// with its view in the JSON. The berth the story is about stands out at
// 1,280 px, where its dots are large, and blends at 360 px, where the
// chart re-lays out with small dots: the size-dependent noticeable
// difference (Szafir 2018; Stone, Szafir & Setlur 2014) grows as marks
// shrink. The dark scheme swaps the ground, so its charts are read on it.
func TestViewsAcrossWidthsAndSchemes(t *testing.T) {
	needBrowser(t)
	code, out, errs := runCmd("check", "--browser", "--json", "--widths", "360,1280", "--scheme", "light,dark", "testdata/views.html")
	require.Equal(t, 0, code, errs)
	var rep report.Report
	require.NoError(t, json.Unmarshal([]byte(out), &rep))
	require.Len(t, rep.Pages, 4)
	got := map[report.View]*report.Chart{}
	for i := range rep.Pages {
		p := &rep.Pages[i]
		require.NotNil(t, p.View)
		require.Len(t, p.Charts, 1)
		got[*p.View] = &p.Charts[0]
	}
	wide, narrow := got[report.View{Width: 1280, Scheme: "light"}], got[report.View{Width: 360, Scheme: "light"}]
	require.NotNil(t, wide)
	require.NotNil(t, narrow)
	assert.True(t, wide.Emphasis.Holds["normal"], "the highlight stands out on a desktop")
	assert.False(t, narrow.Emphasis.Holds["normal"], "and blends on a phone")
	assert.Less(t, narrow.Marks[0].BBox[2], wide.Marks[0].BBox[2]/3, "the phone's dots are small")
	dark := got[report.View{Width: 1280, Scheme: "dark"}]
	require.NotNil(t, dark)
	assert.Equal(t, "#ffffff", wide.Background)
	assert.Equal(t, "#17161b", dark.Background, "the dark scheme's ground")
	var changes string
	for _, l := range rep.ViewChanges {
		changes += l + "\n"
	}
	assert.Contains(t, changes, "at 360 px, light the emphasis blends in for every reader")
	assert.Contains(t, changes, "mark-contrast-low only at 360 px, dark; 1280 px, dark")
}

// --widths and --scheme need the browser and take only what they say.
func TestViewFlagsRefuseBadInput(t *testing.T) {
	for _, args := range [][]string{
		{"check", "--widths", "360", "x.html"},
		{"check", "--browser", "--widths", "phone", "x.html"},
		{"check", "--browser", "--widths", "50", "x.html"},
		{"check", "--browser", "--scheme", "blue", "x.html"},
	} {
		code, _, errs := runCmd(args...)
		assert.Equal(t, 2, code, "%v", args)
		assert.Contains(t, errs, "standout check: --", "%v", args)
	}
}

// Charts drawn as pixels, a canvas, an <img> and a CSS background image,
// each with one bar of twelve highlighted (testdata/rasters.html): check --browser captures
// their pixels and the strongest region of their saliency map (Itti, Koch
// & Niebur 1998) covers the highlighted bar, for normal vision; each
// vision type has its own regions. The static reader, which has no
// pixels, names them only.
func TestRasterChartsSalientRegions(t *testing.T) {
	needBrowser(t)
	page := filepath.Join("testdata", "rasters.html")
	code, out, errs := runCmd("check", "--browser", "--json", page)
	require.Equal(t, 0, code, errs)
	var rep report.Report
	require.NoError(t, json.Unmarshal([]byte(out), &rep))
	us := rep.Pages[0].Unchecked
	require.Len(t, us, 3)
	assert.Equal(t, []string{"canvas0", "img0", "background0"}, []string{us[0].Name, us[1].Name, us[2].Name})
	assert.Equal(t, []string{"canvas", "image", "image"}, []string{us[0].Kind, us[1].Kind, us[2].Kind})
	for _, u := range us {
		require.NotEmpty(t, u.Regions, u.Name)
		// The highlighted bar, pier 6, in the chart's own pixels.
		bar := [4]float64{u.Box[0] + 210, u.Box[1] + 155, 26, 125}
		cx, cy := bar[0]+bar[2]/2, bar[1]+bar[3]/2
		r := u.Regions[0]
		assert.True(t, cx >= r.Box[0] && cx <= r.Box[0]+r.Box[2] && cy >= r.Box[1] && cy <= r.Box[1]+r.Box[3],
			"%s: strongest region %v, highlighted bar %v", u.Name, r.Box, bar)
		assert.Equal(t, 1.0, r.Salience)
		for k := 1; k < len(u.Regions); k++ {
			assert.LessOrEqual(t, u.Regions[k].Salience, u.Regions[k-1].Salience, "strongest first")
		}
		assert.Len(t, u.CVD, 4, "protan, deutan, tritan, achromat")
	}
	// A declared emphasis: the highlighted bar of the canvas holds for
	// every reader; a box on a grey bar does not, and is an error.
	for box, holds := range map[string]bool{"box:230,214,26,125": true, "box:30,150,20,20": false} {
		code, out, errs = runCmd("check", "--browser", "--json", "--emphasis", box, page)
		require.Equal(t, 0, code, errs)
		var got report.Report
		require.NoError(t, json.Unmarshal([]byte(out), &got))
		e := got.Pages[0].Unchecked[0].Emphasis
		require.NotNil(t, e, box)
		assert.Equal(t, holds, e.Holds["normal"], box)
		assert.Len(t, e.Holds, 5, box)
		assert.Nil(t, got.Pages[0].Unchecked[1].Emphasis, "the box lies in the canvas only")
		assert.Nil(t, got.Pages[0].Unchecked[2].Emphasis, "the box lies in the canvas only")
		lost := false
		for _, f := range got.Pages[0].Findings {
			lost = lost || f.ID == "pixels-emphasis-lost" && f.Severity == "error"
		}
		assert.Equal(t, !holds, lost, box)
	}
	code, out, errs = runCmd("check", "--json", page)
	require.Equal(t, 0, code, errs)
	var static report.Report
	require.NoError(t, json.Unmarshal([]byte(out), &static))
	require.Len(t, static.Pages[0].Unchecked, 3)
	assert.Empty(t, static.Pages[0].Unchecked[0].Regions)
	// The background image's size comes from its style sheet.
	assert.Equal(t, "background0", static.Pages[0].Unchecked[2].Name)
	assert.Equal(t, [4]float64{0, 0, 480, 300}, static.Pages[0].Unchecked[2].Box)
}

// --emphasis with a selector reaches a chart drawn as pixels through an
// element laid over it, such as a callout's frame: its box is the place
// the eye should reach first, checked as a box would be.
func TestSelectorEmphasisOnPixels(t *testing.T) {
	needBrowser(t)
	rasters, err := os.ReadFile(filepath.Join("testdata", "rasters.html"))
	require.NoError(t, err)
	dir := t.TempDir()
	page := filepath.Join(dir, "callouts.html")
	// Over the canvas (20 px from the left, 10 px below the first
	// heading): one frame on the highlighted bar, one on a grey bar.
	callouts := `<script>addEventListener('load', () => { const c = document.getElementById('piers').getBoundingClientRect();
	for (const [cls, x, y] of [['on-highlight', 210, 155], ['on-grey', 10, 200]]) { const d = document.createElement('div'); d.className = cls;
	Object.assign(d.style, {position: 'absolute', left: (c.left + scrollX + x) + 'px', top: (c.top + scrollY + y) + 'px', width: '26px', height: '60px', outline: '1px dashed #555'}); document.body.append(d); } });</script>`
	require.NoError(t, os.WriteFile(page, []byte(strings.Replace(string(rasters), "</body>", callouts+"</body>", 1)), 0o644))
	for sel, c := range map[string]struct {
		x     float64
		holds bool
	}{".on-highlight": {210, true}, ".on-grey": {10, false}} {
		holds := c.holds
		code, out, errs := runCmd("check", "--browser", "--json", "--emphasis", sel, page)
		require.Equal(t, 0, code, errs)
		var got report.Report
		require.NoError(t, json.Unmarshal([]byte(out), &got))
		p := got.Pages[0]
		require.NotEmpty(t, p.Unchecked)
		u := p.Unchecked[0]
		require.Equal(t, "canvas0", u.Name)
		require.NotNil(t, u.Emphasis, sel)
		assert.InDelta(t, u.Box[0]+c.x, u.Emphasis.Box[0], 1, sel)
		assert.InDelta(t, 26, u.Emphasis.Box[2], 1, sel)
		assert.Equal(t, holds, u.Emphasis.Holds["normal"], sel)
		var charts []string
		for _, ch := range p.Charts {
			if ch.Emphasis != nil && ch.Emphasis.Box != nil {
				charts = append(charts, ch.Path)
			}
		}
		assert.Equal(t, []string{"canvas0"}, charts, "only the chart under the callout has it")
		lost := false
		for _, f := range p.Findings {
			lost = lost || f.ID == "pixels-emphasis-lost" && f.Severity == "error"
		}
		assert.Equal(t, !holds, lost, sel)
	}
	code, _, errs := runCmd("check", "--browser", "--json", "--emphasis", ".nowhere", page)
	assert.Equal(t, 2, code, "a selector that matches nothing is an error: %s", errs)
}

// A page on one loopback origin embeds a chart page served from another
// (a different port is a different origin; "localhost" for 127.0.0.1 is
// another site, which the browser runs in a process of its own), beside
// a canvas chart and an <img> chart: the read pass cannot enter the frame,
// but check --browser reads it through CDP, with its chart's marks in page
// coordinates under the frame's name, and judges the two raster charts by
// their pixels.
func TestCrossOriginFrameAndRasters(t *testing.T) {
	needBrowser(t)
	for name, host := range map[string]string{"same site": "127.0.0.1", "another site": "localhost"} {
		t.Run(name, func(t *testing.T) { crossOriginFrame(t, host) })
	}
}

func crossOriginFrame(t *testing.T, framedHost string) {
	framed := httptest.NewServer(http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		w.Header().Set("Content-Type", "text/html; charset=utf-8")
		fmt.Fprint(w, testkit.QuayBars())
	}))
	defer framed.Close()
	rasters, err := os.ReadFile(filepath.Join("testdata", "rasters.html"))
	require.NoError(t, err)
	frame := `<iframe src="` + strings.Replace(framed.URL, "127.0.0.1", framedHost, 1) + `/quays.html" width="320" height="220" style="border:4px solid #ccc;margin:30px 0 0 50px;display:block"></iframe>`
	host := httptest.NewServer(http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		w.Header().Set("Content-Type", "text/html; charset=utf-8")
		fmt.Fprint(w, strings.Replace(string(rasters), "<body>", "<body>"+frame, 1))
	}))
	defer host.Close()

	code, out, errs := runCmd("check", "--browser", "--json", host.URL+"/page.html")
	require.Equal(t, 0, code, errs)
	var rep report.Report
	require.NoError(t, json.Unmarshal([]byte(out), &rep))
	p := rep.Pages[0]
	require.Len(t, p.Charts, 4, "the framed chart and three charts drawn as pixels: %v", p.Problems)
	c := p.Charts[0]
	assert.Equal(t, "frame0/svg0", c.Path)
	assert.Equal(t, "svg", c.Source)
	require.Len(t, c.Marks, 8)
	// The frame's content starts past its 50 px margin and 4 px border.
	assert.InDelta(t, 54, c.Box[0], 1)
	assert.InDelta(t, 54+20, c.Marks[0].BBox[0], 1, "a mark's box is in page px")
	for _, pr := range p.Problems {
		assert.NotContains(t, pr, "not readable", "the frame was read")
	}
	require.Len(t, p.Unchecked, 3, "the canvas, the <img> and the CSS background image")
	for _, u := range p.Unchecked {
		require.NotEmpty(t, u.Regions, u.Name)
		bar := [4]float64{u.Box[0] + 210, u.Box[1] + 155, 26, 125}
		r := u.Regions[0].Box
		assert.True(t, bar[0]+13 >= r[0] && bar[0]+13 <= r[0]+r[2] && bar[1]+62 >= r[1] && bar[1]+62 <= r[1]+r[3], "%s: %v", u.Name, r)
	}
	// Each judged one is a chart of the page too (minor 4), with its
	// source and the same regions.
	for k, want := range []string{"canvas", "image", "image"} {
		pc, u := p.Charts[1+k], p.Unchecked[k]
		assert.Equal(t, u.Name, pc.Path)
		assert.Equal(t, want, pc.Source, pc.Path)
		assert.True(t, pc.DrawnAsPixels())
		assert.Equal(t, u.Box, pc.Box, pc.Path)
		assert.Equal(t, u.Regions, pc.Regions, pc.Path)
		assert.Equal(t, u.CVD, pc.CVD, pc.Path)
		assert.Empty(t, pc.Marks, pc.Path)
	}
}

// What colour scheme a chart is drawn in is the element's used scheme
// (CSS Color Adjustment 1 §2; light-dark(), CSS Color 5 §7): its
// color-scheme, or the page's <meta name="color-scheme"> for normal, with
// the reader's preference choosing only where both are offered; the
// canvas under a page drawn dark is dark. The static reader must read what
// Chromium draws, in both preferences: fills and the colour behind each
// chart.
func TestColourSchemesMatchTheBrowser(t *testing.T) {
	needBrowser(t)
	const bars = `<svg width="160" height="80"><rect x="10" y="20" width="20" height="60" style="fill: light-dark(#3b6e8f, #9cc3dc)"/>
	<rect x="40" y="30" width="20" height="50" class="b"/><rect x="70" y="40" width="20" height="40" class="b"/></svg>`
	const style = `<style>.b { fill: var(--b); } :root { --b: light-dark(#b5651d, #f2b880); }</style>`
	dir := t.TempDir()
	var pages []string
	for name, page := range map[string]string{
		"normal":      `<!doctype html><html><head>` + style + `</head><body>` + bars + `</body></html>`,
		"dark-only":   `<!doctype html><html style="color-scheme: dark"><head>` + style + `</head><body>` + bars + `</body></html>`,
		"light-dark":  `<!doctype html><html style="color-scheme: light dark"><head>` + style + `</head><body>` + bars + `</body></html>`,
		"meta":        `<!doctype html><html><head><meta name="color-scheme" content="light dark">` + style + `</head><body>` + bars + `</body></html>`,
		"nested-dark": `<!doctype html><html><head>` + style + `</head><body><figure style="color-scheme: dark">` + bars + `</figure></body></html>`,
	} {
		p := filepath.Join(dir, name+".html")
		require.NoError(t, os.WriteFile(p, []byte(page), 0o644))
		pages = append(pages, p)
	}
	slices.Sort(pages)
	read := func(args ...string) report.Report {
		code, out, errs := runCmd(append(append([]string{"check", "--json", "--scheme", "light,dark"}, args...), pages...)...)
		require.Equal(t, 0, code, errs)
		var rep report.Report
		require.NoError(t, json.Unmarshal([]byte(out), &rep))
		return rep
	}
	b, s := read("--browser"), read()
	require.Len(t, b.Pages, 2*len(pages))
	require.Len(t, s.Pages, len(b.Pages))
	static := map[string]report.Page{}
	for _, p := range s.Pages {
		static[p.Source+" "+p.View.Scheme] = p
	}
	dark := 0
	for _, bp := range b.Pages {
		where := fmt.Sprintf("%s (%s)", filepath.Base(bp.Source), bp.View.Scheme)
		sp, ok := static[bp.Source+" "+bp.View.Scheme]
		require.True(t, ok, where)
		require.Len(t, bp.Charts, 1, where)
		require.Len(t, sp.Charts, 1, where)
		assert.Equal(t, bp.Charts[0].Background, sp.Charts[0].Background, "%s: the colour behind the chart", where)
		if bp.Charts[0].Background != "#ffffff" {
			dark++
		}
		require.Len(t, sp.Charts[0].Marks, len(bp.Charts[0].Marks), where)
		for k, m := range bp.Charts[0].Marks {
			require.NotNil(t, m.Fill, where)
			require.NotNil(t, sp.Charts[0].Marks[k].Fill, where)
			assert.Equal(t, *m.Fill, *sp.Charts[0].Marks[k].Fill, "%s: %s", where, m.ID)
		}
	}
	// dark-only in both preferences, light-dark and meta in the dark one.
	assert.Equal(t, 4, dark, "charts on a dark canvas")
}
