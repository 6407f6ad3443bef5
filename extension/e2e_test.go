package extension

// End-to-end tests: a real headless Chromium with the built extension
// loaded, pages served by httptest, and the toolbar action pressed through
// CDP Extensions.triggerAction on the tab target (which grants activeTab as
// a click does). They skip on a machine without Chromium and fail under
// CI=true.

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"image"
	"image/png"
	"math"
	"net/http"
	"net/http/httptest"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"sync"
	"testing"
	"time"

	cdpbrowser "github.com/chromedp/cdproto/browser"
	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/dom"
	"github.com/chromedp/cdproto/extensions"
	"github.com/chromedp/cdproto/input"
	"github.com/chromedp/cdproto/page"
	"github.com/chromedp/cdproto/target"
	"github.com/chromedp/chromedp"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"golang.org/x/net/html"

	"standout/internal/browser"
	"standout/internal/demo"
	"standout/internal/report"
	"standout/internal/testkit"
	"standout/marks"
	"standout/perception/colour"
	"standout/static"
)

var (
	buildOnce sync.Once
	builtDir  string
	buildErr  error
)

// TestMain removes the extension that built made, once every test of the
// binary is done with it.
func TestMain(m *testing.M) {
	code := m.Run()
	if builtDir != "" {
		os.RemoveAll(builtDir)
	}
	os.Exit(code)
}

// built builds the extension once per test binary.
func built(t testing.TB) string {
	buildOnce.Do(func() {
		d, err := os.MkdirTemp("", "standout-ext-")
		if err != nil {
			buildErr = err
			return
		}
		builtDir, buildErr = d, Build(d, false)
	})
	require.NoError(t, buildErr)
	return builtDir
}

// builtCopy copies the build into a folder of the test's own, whose
// manifest the test may rewrite: an unpacked extension's ID follows its
// folder, so the copy is one extension across its browser's starts.
func builtCopy(t testing.TB) string {
	src := built(t)
	dst := t.TempDir()
	require.NoError(t, os.CopyFS(dst, os.DirFS(src)))
	return dst
}

// grantOffscreen declares "offscreen" among the required permissions of a
// build copy: the grant the reader's first press gets (background.js:
// toggle). A browser keeps it across its starts, but forgets it for an
// extension loaded from the command line, which every start installs
// again, so a test that starts the browser again after a press declares
// it instead.
func grantOffscreen(t testing.TB, dir string) {
	require.NoError(t, editManifest(dir, func(m map[string]any) {
		m["permissions"] = append(m["permissions"].([]any), "offscreen")
	}))
}

type harness struct {
	t     testing.TB
	ctx   context.Context
	extID string
	// worker is the service worker's context, once a test reached into it.
	worker context.Context
	// core is the context of the offscreen document (core-host.js), and
	// coreID its target, once a test reached into it (hostValue).
	core   context.Context
	coreID target.ID
	url    string
	// dl is the downloads folder, once a test asked for one.
	dl string
	// close stops the browser before the test ends.
	close func()
}

func chromium(t testing.TB) string { return testkit.Chromium(t) }

func newHarness(t testing.TB) *harness { return newHarnessOf(t, built(t)) }

// newHarnessOf starts Chromium with the extension built in dir.
func newHarnessOf(t testing.TB, dir string) *harness { return newHarnessWith(t, dir, t.TempDir()) }

// newHarnessWith starts Chromium with the extension built in dir and the
// profile in profile, which a browser started before may have left.
func newHarnessWith(t testing.TB, dir, profile string) *harness {
	exe := chromium(t)
	actx, cancel := browser.NewAllocator(context.Background(), browser.Options{Exec: exe, Extension: dir, UserDataDir: profile, NoSandbox: browser.SandboxNote() != ""})
	ctx, cancel2 := chromedp.NewContext(actx)
	// A stopped browser leaves its profile's lock folder in TMPDIR; the
	// profile itself may serve a browser started again.
	stop := func() {
		cancel2()
		cancel()
		browser.RemoveLockFolder(profile)
	}
	t.Cleanup(stop)
	require.NoError(t, chromedp.Do(ctx, chromedp.Navigate("about:blank")))
	h := &harness{t: t, ctx: ctx, close: stop}
	deadline := time.Now().Add(15 * time.Second)
	for h.extID == "" && time.Now().Before(deadline) {
		ts, _ := chromedp.Targets(ctx)
		for _, ti := range ts {
			if strings.HasPrefix(ti.URL, "chrome-extension://") {
				h.extID = strings.SplitN(strings.TrimPrefix(ti.URL, "chrome-extension://"), "/", 2)[0]
			}
		}
		time.Sleep(50 * time.Millisecond)
	}
	require.NotEmpty(t, h.extID, "the extension's service worker did not start")
	return h
}

func (h *harness) open(url string) {
	h.url = url
	require.NoError(h.t, chromedp.Do(h.ctx, chromedp.Navigate(url)))
}

func (h *harness) tb() testing.TB { return h.t }

func (h *harness) trigger() { trigger(h) }

func (h *harness) press() {
	res, err := chromedp.CallBrowser(h.ctx, target.GetTargets, target.GetTargetsParams{Filter: target.Filter{{Type: "tab"}}})
	require.NoError(h.t, err)
	tab := ""
	for _, ti := range res.TargetInfos {
		if ti.Type == "tab" && ti.URL == h.url {
			tab = string(ti.TargetID)
		}
	}
	require.NotEmpty(h.t, tab, "no tab target for %s", h.url)
	_, err = chromedp.CallBrowser(h.ctx, extensions.TriggerAction, extensions.TriggerActionParams{ID: h.extID, TargetID: tab})
	require.NoError(h.t, err)
}

// stopWorker closes the extension's service worker, as the browser does
// after about 30 s idle, and returns how many it closed.
func (h *harness) stopWorker(tb testing.TB) int {
	ts, err := chromedp.Targets(h.ctx)
	require.NoError(tb, err)
	stopped := 0
	for _, ti := range ts {
		if ti.Type == "service_worker" && strings.HasPrefix(ti.URL, "chrome-extension://"+h.extID) {
			_, err := chromedp.CallBrowser(h.ctx, target.CloseTarget, target.CloseTargetParams{TargetID: ti.TargetID})
			require.NoError(tb, err)
			stopped++
		}
	}
	time.Sleep(500 * time.Millisecond)
	return stopped
}

func (h *harness) eval(expr string) string {
	v, err := chromedp.Run(h.ctx, chromedp.Evaluate[string](expr, chromedp.EvalAwaitPromise))
	require.NoError(h.t, err, expr)
	return v
}

func (h *harness) state() string { return state(h) }

func (h *harness) waitState(want string) { waitState(h, want) }

// hostTiming decodes the overlay host's data-timing attribute, the
// steps of the last check, into v.
func hostTiming(tb testing.TB, h e2eBrowser, v any) {
	require.NoError(tb, json.Unmarshal([]byte(h.eval(`document.querySelector('`+hostSelector+`').getAttribute('data-timing')`)), v))
}

// overlayHTML serialises the overlay host with its closed shadow root.
func (h *harness) overlayHTML() string {
	s, err := chromedp.Run(h.ctx, func(ctx context.Context, tg *chromedp.Target) (string, error) {
		depth := int64(-1)
		pierce := true
		doc, err := cdp.Call(ctx, tg, dom.GetDocument, dom.GetDocumentParams{Depth: &depth, Pierce: &pierce})
		if err != nil {
			return "", err
		}
		var find func(n *cdp.Node) *cdp.Node
		find = func(n *cdp.Node) *cdp.Node {
			if n.LocalName == "div" && hasAttr(n, "data-standout") {
				return n
			}
			for _, c := range n.Children {
				if f := find(c); f != nil {
					return f
				}
			}
			return nil
		}
		host := find(doc.Root)
		if host == nil {
			return "", fmt.Errorf("no overlay host")
		}
		inc := true
		out, err := cdp.Call(ctx, tg, dom.GetOuterHTML, dom.GetOuterHTMLParams{NodeID: host.NodeID, IncludeShadowDOM: &inc})
		return out.OuterHTML, err
	})
	require.NoError(h.t, err)
	return s
}

// hostSelector finds the overlay's host in the page.
const hostSelector = `div[data-standout]`

func hasAttr(n *cdp.Node, name string) bool {
	for i := 0; i+1 < len(n.Attributes); i += 2 {
		if n.Attributes[i] == name {
			return true
		}
	}
	return false
}

// nodeAttr is the value of a protocol node's attribute, "" when it has
// none.
func nodeAttr(n *cdp.Node, name string) string {
	for i := 0; i+1 < len(n.Attributes); i += 2 {
		if n.Attributes[i] == name {
			return n.Attributes[i+1]
		}
	}
	return ""
}

// findInOverlay finds the first element of the overlay's shadow root with
// the data-action attribute.
func findInOverlay(ctx context.Context, tg *chromedp.Target, action string) (*cdp.Node, error) {
	depth := int64(-1)
	pierce := true
	doc, err := cdp.Call(ctx, tg, dom.GetDocument, dom.GetDocumentParams{Depth: &depth, Pierce: &pierce})
	if err != nil {
		return nil, err
	}
	var find func(n *cdp.Node) *cdp.Node
	find = func(n *cdp.Node) *cdp.Node {
		if nodeAttr(n, "data-action") == action {
			return n
		}
		for _, c := range append(append([]*cdp.Node{}, n.ShadowRoots...), n.Children...) {
			if f := find(c); f != nil {
				return f
			}
		}
		return nil
	}
	n := find(doc.Root)
	if n == nil {
		return nil, fmt.Errorf("no control %q in the overlay", action)
	}
	return n, nil
}

// clickInOverlay clicks a control of the overlay as a person does: a
// trusted mouse press and release at its centre.
func (h *harness) clickInOverlay(action string) {
	_, err := chromedp.Run(h.ctx, func(ctx context.Context, tg *chromedp.Target) (chromedp.Void, error) {
		n, err := findInOverlay(ctx, tg, action)
		if err != nil {
			return chromedp.Void{}, err
		}
		x, y, err := centreInView(ctx, tg, n.NodeID)
		if err != nil {
			return chromedp.Void{}, err
		}
		return chromedp.Void{}, mouseClick(ctx, tg, x, y)
	})
	require.NoError(h.t, err)
}

// centreInView scrolls a node into view and returns its centre in the
// viewport's px.
func centreInView(ctx context.Context, tg *chromedp.Target, id cdp.NodeID) (x, y float64, err error) {
	if _, err := cdp.Call(ctx, tg, dom.ScrollIntoViewIfNeeded, dom.ScrollIntoViewIfNeededParams{NodeID: id}); err != nil {
		return 0, 0, err
	}
	box, err := cdp.Call(ctx, tg, dom.GetBoxModel, dom.GetBoxModelParams{NodeID: id})
	if err != nil {
		return 0, 0, err
	}
	q := box.Model.Border
	return (q[0] + q[4]) / 2, (q[1] + q[5]) / 2, nil
}

func (h *harness) clickAt(x, y float64) {
	require.NoError(h.t, chromedp.Do(h.ctx, func(ctx context.Context, tg *chromedp.Target) (chromedp.Void, error) {
		return chromedp.Void{}, mouseClick(ctx, tg, x, y)
	}))
}

func (h *harness) pressKey(key string) {
	require.NoError(h.t, chromedp.Do(h.ctx, func(ctx context.Context, tg *chromedp.Target) (chromedp.Void, error) {
		return chromedp.Void{}, pressKey(ctx, tg, key)
	}))
}

// downloads lets the browser save downloads, without asking, to a folder
// of the test's.
func (h *harness) downloads() string {
	if h.dl == "" {
		h.dl = h.t.TempDir()
		_, err := chromedp.CallBrowser(h.ctx, cdpbrowser.SetDownloadBehavior, cdpbrowser.SetDownloadBehaviorParams{Behavior: cdpbrowser.SetDownloadBehaviorBehaviorAllow, DownloadPath: h.dl})
		require.NoError(h.t, err)
	}
	return h.dl
}

func mouseClick(ctx context.Context, tg *chromedp.Target, x, y float64) error {
	for _, typ := range []input.DispatchMouseEventType{input.DispatchMouseEventTypeMousePressed, input.DispatchMouseEventTypeMouseReleased} {
		if _, err := cdp.Call(ctx, tg, input.DispatchMouseEvent, input.DispatchMouseEventParams{Type: typ, X: x, Y: y, Button: input.MouseButtonLeft, ClickCount: 1}); err != nil {
			return err
		}
	}
	return nil
}

func (h *harness) chooseInOverlay(action string, index int) { chooseInOverlay(h, action, index) }

// typeInOverlay focuses a control of the overlay and types keys into it
// as a person does (trusted key events): a letter picks the option of a
// <select> that starts with it; "ArrowLeft" and "ArrowRight" move a range.
func (h *harness) typeInOverlay(action string, keys ...string) {
	_, err := chromedp.Run(h.ctx, func(ctx context.Context, tg *chromedp.Target) (chromedp.Void, error) {
		n, err := findInOverlay(ctx, tg, action)
		if err != nil {
			return chromedp.Void{}, err
		}
		if _, err := cdp.Call(ctx, tg, dom.Focus, dom.FocusParams{NodeID: n.NodeID}); err != nil {
			return chromedp.Void{}, err
		}
		for _, k := range keys {
			if err := pressKey(ctx, tg, k); err != nil {
				return chromedp.Void{}, err
			}
		}
		return chromedp.Void{}, nil
	})
	require.NoError(h.t, err)
}

var keyCodes = map[string]int64{"Home": 36, "Escape": 27, "ArrowLeft": 37, "ArrowRight": 39, "ArrowUp": 38, "ArrowDown": 40}

func pressKey(ctx context.Context, tg *chromedp.Target, key string) error {
	p := input.DispatchKeyEventParams{Key: key, Code: key, WindowsVirtualKeyCode: keyCodes[key]}
	if len(key) == 1 {
		p.Text, p.Code, p.WindowsVirtualKeyCode = key, "Key"+strings.ToUpper(key), int64(strings.ToUpper(key)[0])
	}
	for _, typ := range []input.DispatchKeyEventType{input.DispatchKeyEventTypeKeyDown, input.DispatchKeyEventTypeKeyUp} {
		p.Type = typ
		if typ == input.DispatchKeyEventTypeKeyUp {
			p.Text = ""
		}
		if _, err := cdp.Call(ctx, tg, input.DispatchKeyEvent, p); err != nil {
			return err
		}
	}
	return nil
}

// layerRects parses the overlay's layers: for each chart, per verdict, the
// outline rectangles in page px (the drawn outline is the mark's box grown
// by 1.5 px).
func layerRects(t testing.TB, overlay string) map[string]map[string][][4]float64 {
	doc, err := html.Parse(strings.NewReader(overlay))
	require.NoError(t, err)
	out := map[string]map[string][][4]float64{}
	px := regexp.MustCompile(`(?:^|;)\s*(left|top):\s*([-\d.]+)px`)
	var walk func(n *html.Node, chart string, ox, oy float64)
	walk = func(n *html.Node, chart string, ox, oy float64) {
		attr := func(k string) string { return htmlAttr(n, k) }
		if n.Type == html.ElementNode && n.Data == "svg" && strings.Contains(attr("class"), "layer") {
			chart = attr("data-chart")
			for _, m := range px.FindAllStringSubmatch(attr("style"), -1) {
				v, _ := strconv.ParseFloat(m[2], 64)
				if m[1] == "left" {
					ox = v
				} else {
					oy = v
				}
			}
			out[chart] = map[string][][4]float64{}
		}
		if n.Type == html.ElementNode && n.Data == "path" && attr("data-verdict") != "" && chart != "" {
			subs, _, err := marks.ParsePath(attr("d"))
			require.NoError(t, err)
			for _, s := range subs {
				minX, minY, maxX, maxY := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
				for _, p := range s.Pts {
					minX, maxX = math.Min(minX, p.X), math.Max(maxX, p.X)
					minY, maxY = math.Min(minY, p.Y), math.Max(maxY, p.Y)
				}
				v := attr("data-verdict")
				if htmlHasAttr(n, "data-along") {
					// A band along a line: its path is the line's own.
					out[chart][v+"/along"] = append(out[chart][v+"/along"], [4]float64{ox + minX, oy + minY, maxX - minX, maxY - minY})
					continue
				}
				out[chart][v] = append(out[chart][v], [4]float64{ox + minX + 1.5, oy + minY + 1.5, maxX - minX - 3, maxY - minY - 3})
			}
		}
		for c := n.FirstChild; c != nil; c = c.NextSibling {
			walk(c, chart, ox, oy)
		}
	}
	walk(doc, "", 0, 0)
	return out
}

func htmlHasAttr(n *html.Node, k string) bool {
	for _, a := range n.Attr {
		if a.Key == k {
			return true
		}
	}
	return false
}

func serve(t testing.TB, handler http.HandlerFunc) *httptest.Server {
	s := httptest.NewServer(handler)
	t.Cleanup(s.Close)
	return s
}

func (h *harness) showPage(body string) { showPage(h, body) }

// screenshot captures the viewport.
func (h *harness) screenshot() ([]byte, image.Image) {
	shot, err := chromedp.Run(h.ctx, func(ctx context.Context, tg *chromedp.Target) ([]byte, error) {
		res, err := cdp.Call(ctx, tg, page.CaptureScreenshot, page.CaptureScreenshotParams{Format: page.CaptureScreenshotFormatPng})
		return res.Data, err
	})
	require.NoError(h.t, err)
	img, err := png.Decode(bytes.NewReader(shot))
	require.NoError(h.t, err)
	return shot, img
}

// chartPage is chartSVG alone on a page.
var chartPage = `<!doctype html><html><body style="margin:0">` + chartSVG + `</body></html>`

func demoPage(t testing.TB) []byte {
	b, err := demo.Pages.ReadFile("pages/harbour-ferries.html")
	require.NoError(t, err)
	return b
}

func TestE2EOverlayMatchesStaticPath(t *testing.T) { suiteOverlayMatchesStaticPath(t, newHarness(t)) }

func suiteOverlayMatchesStaticPath(t *testing.T, h e2eBrowser) {
	// On the demo page, on a fixture of rotated, skewed, nested and
	// <use>-instantiated shapes, and on one of marks its clip regions
	// leave out: every outline sits on its mark's getBoundingClientRect
	// within 1 px (the read pass measures only text and paths; the core
	// computes the other boxes), and the verdicts are the static path's.
	transforms, err := os.ReadFile("../testdata/transforms.svg")
	require.NoError(t, err)
	clipped, err := os.ReadFile("../testdata/clipped.html")
	require.NoError(t, err)
	pages := []struct {
		name   string
		body   []byte
		charts int
	}{
		{"demo", demoPage(t), 3},
		{"transforms", []byte(`<!doctype html><html><body style="margin:0">` + string(transforms) + `</body></html>`), 1},
		{"clipped", clipped, 1},
	}
	for _, pg := range pages {
		showPage(h, string(pg.body))
		layers := layerRects(t, h.overlayHTML())
		built, err := static.Build(bytes.NewReader(pg.body), static.Options{Source: pg.name})
		require.NoError(t, err)
		static, err := report.FromSnapshots(pg.name, built.Charts, built.Problems, report.DefaultOptions)
		require.NoError(t, err)
		charts, checked := 0, 0
		for _, c := range static.Charts {
			if !c.IsChart {
				continue
			}
			charts++
			got, ok := layers[c.Path]
			require.True(t, ok, "%s: no overlay layer for %s", pg.name, c.Path)
			byVerdict := map[string][]string{}
			along := map[string][][4]float64{}
			for _, m := range c.Marks {
				if len(m.Points) >= 2 {
					// Lines and rules are outlined along their path: the
					// band's extent is that of the line's points.
					minX, minY, maxX, maxY := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
					for _, p := range m.Points {
						minX, maxX = math.Min(minX, p[0]), math.Max(maxX, p[0])
						minY, maxY = math.Min(minY, p[1]), math.Max(maxY, p[1])
					}
					along[m.Verdict] = append(along[m.Verdict], [4]float64{0, 0, maxX - minX, maxY - minY})
					continue
				}
				byVerdict[m.Verdict] = append(byVerdict[m.Verdict], m.ID)
			}
			for v, sizes := range along {
				bands := got[v+"/along"]
				require.Len(t, bands, len(sizes), "%s %s: %s bands", pg.name, c.Path, v)
				for i := range sizes {
					checked++
					assert.InDelta(t, sizes[i][2], bands[i][2], 1, "%s %s: band %d width", pg.name, c.Path, i)
					assert.InDelta(t, sizes[i][3], bands[i][3], 1, "%s %s: band %d height", pg.name, c.Path, i)
				}
			}
			for v, ids := range byVerdict {
				require.Len(t, got[v], len(ids), "%s %s: %s outlines", pg.name, c.Path, v)
				// markRects finds elements by their child indices; content
				// a <use> instantiates has no element of its own.
				var own []string
				for _, id := range ids {
					if !strings.Contains(id, ">") {
						own = append(own, id)
					}
				}
				for i, want := range markRects(h, own) {
					checked++
					match := false
					for _, r := range got[v] {
						if math.Abs(r[0]-want[0]) <= 1 && math.Abs(r[1]-want[1]) <= 1 && math.Abs(r[2]-want[2]) <= 1 && math.Abs(r[3]-want[3]) <= 1 {
							match = true
						}
					}
					assert.True(t, match, "%s %s %s: mark %s at %v has no %s outline within 1 px (outlines %v)", pg.name, c.Path, v, own[i], want, v, got[v])
				}
			}
		}
		require.Equal(t, pg.charts, charts, pg.name)
		require.Greater(t, checked, 5, pg.name)
		trigger(h) // close
		waitState(h, "")
	}
}

// A finding the pointer rests on in the panel outlines its marks, as many
// as the static path's report of the demo page names: the answer carries
// each finding's marks in runs, which the overlay expands when the
// finding is shown (overlay.js, expandLater).
func TestE2EFindingOutlinesItsMarks(t *testing.T) {
	h := newHarness(t)
	body := demoPage(t)
	showPage(h, string(body))
	built, err := static.Build(bytes.NewReader(body), static.Options{Source: "demo"})
	require.NoError(t, err)
	rep, err := report.FromSnapshots("demo", built.Charts, built.Problems, report.DefaultOptions)
	require.NoError(t, err)
	checked := 0
	for _, c := range rep.Charts {
		if !c.IsChart {
			continue
		}
		for i, f := range c.Findings {
			if len(f.Marks) < 2 {
				continue
			}
			h.hoverFinding(c.Path, i, f.ID)
			doc, err := html.Parse(strings.NewReader(h.overlayHTML()))
			require.NoError(t, err)
			d, ok := highlightOf(doc, c.Path)
			require.True(t, ok, "%s: no highlight path", c.Path)
			subs, _, err := marks.ParsePath(d)
			require.NoError(t, err)
			assert.Len(t, subs, len(f.Marks), "%s: finding %d (%s) outlines", c.Path, i, f.ID)
			checked++
		}
	}
	require.GreaterOrEqual(t, checked, 2, "findings of two or more marks on the demo page")
}

// hoverFinding moves the pointer, as a person does, onto the i-th finding
// in the panel's section of the chart at path, which must have the id
// want.
func (h *harness) hoverFinding(path string, i int, want string) {
	_, err := chromedp.Run(h.ctx, func(ctx context.Context, tg *chromedp.Target) (chromedp.Void, error) {
		depth := int64(-1)
		pierce := true
		doc, err := cdp.Call(ctx, tg, dom.GetDocument, dom.GetDocumentParams{Depth: &depth, Pierce: &pierce})
		if err != nil {
			return chromedp.Void{}, err
		}
		var buttons []*cdp.Node
		var walk func(n *cdp.Node, in bool)
		walk = func(n *cdp.Node, in bool) {
			if n.LocalName == "section" {
				l := nodeAttr(n, "aria-label")
				in = l == "Chart "+path || strings.HasSuffix(l, " ("+path+")")
			}
			if in && n.LocalName == "button" && nodeAttr(n, "class") == "finding" {
				buttons = append(buttons, n)
			}
			for _, c := range append(append([]*cdp.Node{}, n.ShadowRoots...), n.Children...) {
				walk(c, in)
			}
		}
		walk(doc.Root, false)
		if i >= len(buttons) {
			return chromedp.Void{}, fmt.Errorf("%s: %d findings in the panel, not %d", path, len(buttons), i+1)
		}
		if got := nodeAttr(buttons[i], "data-id"); got != want {
			return chromedp.Void{}, fmt.Errorf("%s: finding %d is %s in the panel, %s in the report", path, i, got, want)
		}
		x, y, err := centreInView(ctx, tg, buttons[i].NodeID)
		if err != nil {
			return chromedp.Void{}, err
		}
		_, err = cdp.Call(ctx, tg, input.DispatchMouseEvent, input.DispatchMouseEventParams{Type: input.DispatchMouseEventTypeMouseMoved, X: x, Y: y})
		return chromedp.Void{}, err
	})
	require.NoError(h.t, err)
}

// highlightOf finds the path data of the highlight in the overlay's layer
// of the chart at path.
func highlightOf(n *html.Node, path string) (string, bool) {
	if n.Type == html.ElementNode && n.Data == "svg" && htmlAttr(n, "data-chart") == path {
		var d string
		var found bool
		for c := n.FirstChild; c != nil; c = c.NextSibling {
			if c.Type == html.ElementNode && c.Data == "path" && htmlAttr(c, "data-role") == "highlight" {
				d, found = htmlAttr(c, "d"), true
			}
		}
		return d, found
	}
	for c := n.FirstChild; c != nil; c = c.NextSibling {
		if d, ok := highlightOf(c, path); ok {
			return d, true
		}
	}
	return "", false
}

func htmlAttr(n *html.Node, k string) string {
	for _, a := range n.Attr {
		if a.Key == k {
			return a.Val
		}
	}
	return ""
}

// chartPage is a small bar chart with an emphasis.
const chartSVG = `<svg width="240" height="120"><g>
<rect x="10" y="40" width="30" height="80" fill="#8a8a8a"/><rect x="50" y="30" width="30" height="90" fill="#8a8a8a"/>
<rect x="90" y="10" width="30" height="110" fill="#c4521a"/><rect x="130" y="50" width="30" height="70" fill="#8a8a8a"/>
<rect x="170" y="60" width="30" height="60" fill="#8a8a8a"/></g></svg>`

func TestE2EStrictCSPFrameAndShadowRoot(t *testing.T) {
	suiteStrictCSPFrameAndShadowRoot(t, newHarness(t))
}

func suiteStrictCSPFrameAndShadowRoot(t *testing.T, h e2eBrowser) {
	srv := serve(t, func(w http.ResponseWriter, r *http.Request) {
		w.Header().Set("Content-Type", "text/html; charset=utf-8")
		switch r.URL.Path {
		case "/csp":
			w.Header().Set("Content-Security-Policy", "default-src 'self'; script-src 'self'")
			fmt.Fprintf(w, `<!doctype html><html><body><h1>Strict CSP</h1>%s</body></html>`, chartSVG)
		case "/frame":
			fmt.Fprintf(w, `<!doctype html><html><body style="margin:0">%s</body></html>`, chartSVG)
		case "/frames":
			fmt.Fprint(w, `<!doctype html><html><body><p>Outer</p><iframe src="/frame" width="300" height="160" style="border:3px solid #000"></iframe></body></html>`)
		case "/shadow.js":
			w.Header().Set("Content-Type", "text/javascript")
			fmt.Fprintf(w, "customElements.define('bar-card', class extends HTMLElement { connectedCallback() { this.attachShadow({mode: 'open'}).innerHTML = %q; } });", chartSVG)
		case "/shadow":
			fmt.Fprint(w, `<!doctype html><html><head><script src="/shadow.js"></script></head><body><bar-card></bar-card></body></html>`)
		}
	})
	for _, c := range []struct{ path, chart string }{{"/csp", "svg0"}, {"/frames", "frame0/svg0"}, {"/shadow", "shadow0/svg0"}} {
		h.open(srv.URL + c.path)
		trigger(h)
		waitState(h, "ready")
		layers := layerRects(t, h.overlayHTML())
		require.Contains(t, layers, c.chart)
		assert.Len(t, layers[c.chart]["pops"], 1, "the orange bar pops")
		assert.Len(t, layers[c.chart]["blends"], 4)
		// The outline sits on the bar as the page shows it.
		pos := h.eval(`(() => {
		  let doc = document, ox = scrollX, oy = scrollY;
		  const f = document.querySelector('iframe');
		  if (f) { const r = f.getBoundingClientRect(); ox += r.left + 3; oy += r.top + 3; doc = f.contentDocument; }
		  const host = document.querySelector('bar-card');
		  const root = host ? host.shadowRoot : doc;
		  const r = root.querySelectorAll('rect')[2].getBoundingClientRect();
		  return JSON.stringify([r.left + ox, r.top + oy, r.width, r.height]);
		})()`)
		var want [4]float64
		require.NoError(t, json.Unmarshal([]byte(pos), &want))
		got := layers[c.chart]["pops"][0]
		for i := range want {
			assert.InDelta(t, want[i], got[i], 1, "%s box %d", c.path, i)
		}
		trigger(h) // pressing the action again closes the check
		waitState(h, "")
	}
}

func TestE2ECVDPreviewAndPageRestored(t *testing.T) { suiteCVDPreviewAndPageRestored(t, newHarness(t)) }

func suiteCVDPreviewAndPageRestored(t *testing.T, h e2eBrowser) {
	srv := serve(t, func(w http.ResponseWriter, r *http.Request) {
		w.Header().Set("Content-Type", "text/html; charset=utf-8")
		fmt.Fprint(w, `<!doctype html><html><body style="margin:0;background:#fff"><svg width="400" height="300" style="display:block"><rect x="0" y="0" width="300" height="200" fill="#c23a2e"/><rect x="320" y="10" width="20" height="20" fill="#2a6fa8"/><rect x="350" y="10" width="20" height="20" fill="#3b9a3f"/></svg></body></html>`)
	})
	h.open(srv.URL + "/")
	before := h.eval(`document.documentElement.outerHTML`)
	trigger(h)
	waitState(h, "ready")
	chooseInOverlay(h, "cvd", 2)
	time.Sleep(300 * time.Millisecond)
	_, img := h.screenshot()
	r, g, b, _ := img.At(100, 150).RGBA()
	got := colour.SRGB8(uint8(r>>8), uint8(g>>8), uint8(b>>8))
	want := colour.Simulate(colour.Deutan, 1, colour.MustHex("#c23a2e"))
	// The browser runs the same matrix in linear RGB (feColorMatrix with
	// color-interpolation-filters: linearRGB) on 8-bit buffers: allow 3
	// levels per channel for the two 8-bit quantisations.
	const tol = 3.0 / 255
	assert.InDelta(t, want.R, got.R, tol, "R: got %s want %s", got.Hex(), want.Hex())
	assert.InDelta(t, want.G, got.G, tol, "G: got %s want %s", got.Hex(), want.Hex())
	assert.InDelta(t, want.B, got.B, tol, "B: got %s want %s", got.Hex(), want.Hex())
	// Tritan is two half-planes: the red and the blue lie on different
	// wings, and the filter's mask must pick each one's.
	chooseInOverlay(h, "cvd", 3)
	time.Sleep(300 * time.Millisecond)
	_, img = h.screenshot()
	for _, px := range []struct {
		x, y int
		fill string
	}{{100, 150, "#c23a2e"}, {330, 20, "#2a6fa8"}, {360, 20, "#3b9a3f"}} {
		r, g, b, _ := img.At(px.x, px.y).RGBA()
		got := colour.SRGB8(uint8(r>>8), uint8(g>>8), uint8(b>>8))
		want := colour.Simulate(colour.Tritan, 1, colour.MustHex(px.fill))
		// The chain keeps intermediate results in 8-bit linear-light
		// buffers, whose first step is sRGB 13: near black, allow one
		// linear level instead.
		wl, gl := colour.SRGBToLinear(want), colour.SRGBToLinear(got)
		for i, d := range [][2]float64{{want.R, got.R}, {want.G, got.G}, {want.B, got.B}} {
			lin := [][2]float64{{wl.R, gl.R}, {wl.G, gl.G}, {wl.B, gl.B}}[i]
			assert.True(t, math.Abs(d[0]-d[1]) <= tol || math.Abs(lin[0]-lin[1]) <= 1.0/255,
				"tritan %s channel %d: got %s want %s", px.fill, i, got.Hex(), want.Hex())
		}
	}
	// Switching the preview off, then closing with Escape, leaves the page
	// exactly as it was.
	chooseInOverlay(h, "cvd", 0)
	h.pressKey("Escape")
	waitState(h, "")
	assert.Equal(t, before, h.eval(`document.documentElement.outerHTML`))
}

func TestE2EPickingAndExport(t *testing.T) { suitePickingAndExport(t, newHarness(t)) }

func suitePickingAndExport(t *testing.T, h e2eBrowser) {
	showPage(h, chartPage)
	// Pick the second (grey) bar: the check then says whether it stands out.
	h.clickInOverlay("pick")
	h.clickAt(65, 80)
	h.eval(`document.querySelector('` + hostSelector + `').removeAttribute('data-state'), ''`)
	h.clickInOverlay("check-emphasis")
	waitState(h, "ready")
	ov := h.overlayHTML()
	assert.Contains(t, ov, "Declared emphasis (1 mark) stands out for normal: no")
	// The fix is a rule to paste, its selectors reaching the bars from the
	// chart's <svg>; the panel carries the reports' glossary.
	assert.Regexp(t, `<pre class="rule">body &gt; svg:nth-child\(1\) &gt; g:nth-child\(1\) &gt; rect:nth-child\(\d\)[^<]*\{ fill: #[0-9a-f]{6} !important; \}</pre>`, ov)
	assert.Contains(t, ov, "What these words mean")
	// The plot of the time to find the emphasis, rising for a highlight
	// that blends (the search is serial).
	assert.Regexp(t, `<svg [^>]*class="search-plot"[^>]*aria-label="Estimated time to find the emphasis: up to [0-9.]+ s among these 5 marks`, ov)

	// Export the JSON report: it decodes as the documented schema.
	dl := h.downloads()
	h.clickInOverlay("export-json")
	data := downloaded(dl, "standout-report.json")
	require.NotNil(t, data, "no exported report")
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.DisallowUnknownFields()
	var rep report.Report
	require.NoError(t, dec.Decode(&rep))
	assert.Equal(t, "standout-report", rep.Schema)
	assert.Equal(t, report.Version, rep.Version)
	require.Len(t, rep.Pages, 1)
	require.Len(t, rep.Pages[0].Charts, 1)
	c := rep.Pages[0].Charts[0]
	assert.Len(t, c.Marks, 5)
	assert.Equal(t, []string{"svg0/g0/rect1"}, c.Emphasis.Marks)
	for _, m := range c.Marks {
		assert.Contains(t, []string{"pops", "conjunction", "blends"}, m.Verdict)
		require.NotNil(t, m.CVD)
		for _, v := range []string{"protan", "deutan", "tritan", "achromat"} {
			r, ok := m.CVD.Get(v)
			assert.True(t, ok)
			assert.Contains(t, []string{"pops", "conjunction", "blends"}, r.Verdict)
		}
	}
}

func TestE2EShortcutDeclared(t *testing.T) {
	// The keyboard shortcut is the manifest's _execute_action command,
	// which the browser routes to the same action handler the toolbar
	// button uses (tested above). Synthetic CDP key events reach the page,
	// not the browser's accelerator table, so the binding itself is checked
	// here.
	for _, f := range []string{"manifest.json", "manifest.firefox.json"} {
		b, err := Files.ReadFile(f)
		require.NoError(t, err)
		var m struct {
			Commands map[string]struct {
				SuggestedKey map[string]string `json:"suggested_key"`
			} `json:"commands"`
			Permissions []string `json:"permissions"`
			HostPerms   []string `json:"host_permissions"`
			Optional    []string `json:"optional_host_permissions"`
			OptionalAPI []string `json:"optional_permissions"`
		}
		require.NoError(t, json.Unmarshal(b, &m), f)
		assert.Equal(t, "Alt+Shift+S", m.Commands["_execute_action"].SuggestedKey["default"], f)
		assert.ElementsMatch(t, []string{"activeTab", "scripting"}, m.Permissions, f)
		assert.Empty(t, m.HostPerms, f)
		// Frames of other origins are read only once the reader allows
		// their origin, one by one, when a check finds them.
		assert.ElementsMatch(t, []string{"http://*/*", "https://*/*"}, m.Optional, f)
		// Chromium's background asks at the first press, without a
		// prompt, to keep the core in an offscreen document
		// (core-host.js); Firefox's event page needs none.
		if f == "manifest.json" {
			assert.Equal(t, []string{"offscreen"}, m.OptionalAPI, f)
		} else {
			assert.Empty(t, m.OptionalAPI, f)
		}
	}
}

func TestE2EReRunsWhenTheChartChanges(t *testing.T) { suiteReRunsWhenTheChartChanges(t, newHarness(t)) }

func suiteReRunsWhenTheChartChanges(t *testing.T, h e2eBrowser) {
	showPage(h, chartPage)
	require.Len(t, layerRects(t, h.overlayHTML())["svg0"]["pops"], 1)
	// The page recolours the emphasis to the others' grey and gives it a
	// neighbour's height: the overlay re-runs (debounced) and nothing pops.
	h.eval(`document.querySelector('` + hostSelector + `').removeAttribute('data-state'), document.querySelectorAll('rect')[2].setAttribute('fill', '#8a8a8a'), document.querySelectorAll('rect')[2].setAttribute('y', '30'), document.querySelectorAll('rect')[2].setAttribute('height', '90'), ''`)
	waitState(h, "ready")
	l := layerRects(t, h.overlayHTML())["svg0"]
	assert.Empty(t, l["pops"])
	assert.Len(t, l["blends"], 5)
}

// TestE2EDocsScreenshot renders the overlay on the demo page. With
// STANDOUT_UPDATE_DOCS=1 it rewrites docs/overlay.png, the picture the
// README shows.
func TestE2EDocsScreenshot(t *testing.T) {
	h := newHarness(t)
	h.showPage(string(demoPage(t)))
	shot, img := h.screenshot()
	require.Greater(t, img.Bounds().Dx(), 800)
	if os.Getenv("STANDOUT_UPDATE_DOCS") == "1" {
		require.NoError(t, os.WriteFile("../docs/overlay.png", shot, 0o644))
	}
}

func TestE2ESurvivesServiceWorkerStop(t *testing.T) {
	// The browser stops an idle service worker after about 30 s and the Go
	// instance goes with it; the next press must load the core again.
	h := newHarness(t)
	h.showPage(chartPage)
	h.trigger()
	h.waitState("")
	require.Equal(t, 1, h.stopWorker(t), "the extension's service worker")
	h.trigger()
	h.waitState("ready")
	assert.Len(t, layerRects(t, h.overlayHTML())["svg0"]["pops"], 1)
}

func TestE2EPressesAfterTheFirstInjectNoScripts(t *testing.T) {
	// A page's first press injects the scripts; later presses on the same
	// page find the overlay in the isolated world and only press it. A
	// page loaded again is a new document and gets the scripts again.
	h := newHarness(t)
	h.showPage(chartPage)
	h.inWorker(`globalThis.injectedFiles = 0; globalThis.pressesRun = 0;
	  const orig = chrome.scripting.executeScript;
	  chrome.scripting.executeScript = function (inj) {
	    if (inj.files) globalThis.injectedFiles++;
	    if (inj.func && inj.func.name === 'pressInPage') globalThis.pressesRun++;
	    return orig.call(this, inj);
	  };`)
	count := func() (files, presses string) {
		return h.workerValue(`String(globalThis.injectedFiles)`), h.workerValue(`String(globalThis.pressesRun)`)
	}
	for range 2 {
		h.trigger() // close
		h.waitState("")
		h.trigger()
		h.waitState("ready")
	}
	files, presses := count()
	assert.Equal(t, "0", files, "scripts injected again into a page that has them")
	assert.Equal(t, "4", presses)
	assert.Len(t, layerRects(t, h.overlayHTML())["svg0"]["pops"], 1)

	h.open(h.url)
	h.trigger()
	h.waitState("ready")
	files, presses = count()
	assert.Equal(t, "1", files, "a page loaded again gets the scripts once")
	assert.Equal(t, "5", presses)
	assert.Len(t, layerRects(t, h.overlayHTML())["svg0"]["pops"], 1)
}

func TestE2EExportMarkdownAndPNG(t *testing.T) { suiteExportMarkdownAndPNG(t, newHarness(t)) }

func suiteExportMarkdownAndPNG(t *testing.T, h e2eBrowser) {
	showPage(h, chartPage)
	dl := h.downloads()
	h.clickInOverlay("export-md")
	h.clickInOverlay("export-png")
	md, shot := downloaded(dl, "standout-report.md"), downloaded(dl, "standout-svg0.png")
	require.NotNil(t, md, "no Markdown export")
	assert.Contains(t, string(md), "# Standout report")
	assert.Contains(t, string(md), "### Chart `svg0`")
	require.NotNil(t, shot, "no PNG export")
	img, err := png.Decode(bytes.NewReader(shot))
	require.NoError(t, err)
	// The chart (240 × 120) with a 10 px margin, outlines included, and
	// under it the key: a 16 px row per verdict style and 8 px of margin.
	assert.InDelta(t, 260, img.Bounds().Dx(), 4)
	assert.InDelta(t, 140+16*len(report.VerdictStyles)+8, img.Bounds().Dy(), 4)
	// The key's rows hold each style's sample in its colour.
	for i, st := range report.VerdictStyles {
		want := colour.MustHex(st.Colour)
		wr, wg, wb := want.RGB8()
		found := false
		for y := 140 + 4 + 16*i; y < 140+4+16*(i+1) && !found; y++ {
			for x := 0; x < 30 && !found; x++ {
				r, g, b, _ := img.At(x, y).RGBA()
				found = math.Abs(float64(int(r>>8)-int(wr))) <= 24 && math.Abs(float64(int(g>>8)-int(wg))) <= 24 && math.Abs(float64(int(b>>8)-int(wb))) <= 24
			}
		}
		assert.True(t, found, "the key's sample for %s", st.Verdict)
	}
	// The popping bar's solid outline colour (report.VerdictStyles) is in
	// the picture, within the anti-aliasing of the page's rendering.
	pops := colour.MustHex(report.StyleOf("pops").Colour)
	pr, pg, pb := pops.RGB8()
	outline := 0
	near := func(v uint32, want uint8) bool { return math.Abs(float64(int(v>>8)-int(want))) <= 24 }
	for y := 0; y < img.Bounds().Dy(); y++ {
		for x := 0; x < img.Bounds().Dx(); x++ {
			r, g, b, _ := img.At(x, y).RGBA()
			if near(r, pr) && near(g, pg) && near(b, pb) {
				outline++
			}
		}
	}
	assert.Greater(t, outline, 50)
}

func TestE2ESiblingStyleSharing(t *testing.T) {
	// Sibling style sharing must never change what the read pass reads:
	// on every page, the snapshots read with it and without it are the
	// same, and it is used only where no selector or animation can tell
	// siblings apart.
	other := serve(t, func(w http.ResponseWriter, r *http.Request) {
		w.Header().Set("Content-Type", "text/css")
		fmt.Fprint(w, `circle { fill: #123456; }`)
	})
	circles := func(n int) string {
		var b strings.Builder
		for i := 0; i < n; i++ {
			fmt.Fprintf(&b, `<circle cx="%d" cy="%d" r="3"/>`, 10+i*7%380, 10+i*13%180)
		}
		return b.String()
	}
	type page struct {
		name, body string
		shares     bool
	}
	pages := []page{
		{"classes, ids, inline styles and presentation attributes", `<!doctype html><html><head><style>
		  .a circle { fill: #2a6fa8; } .a > .b { fill: #c23a2e; stroke: #000; stroke-width: 2px } #x { fill: green } svg g.c { opacity: .5 }
		  .d { color: #8a2be2 } .d circle { fill: currentColor }</style></head><body>
		  <svg width="400" height="200"><g class="a">` + circles(40) + `<circle class="b" cx="5" cy="5" r="3"/><circle id="x" cx="9" cy="9" r="3"/>
		  <circle style="fill: orange" cx="7" cy="7" r="3"/><circle fill="red" cx="8" cy="8" r="3"/><circle fill-opacity=".3" cx="8" cy="9" r="3"/></g>
		  <g class="c">` + circles(20) + `</g><g class="d" color="#ff0000">` + circles(5) + `<circle color="#00ff00" cx="3" cy="3" r="2"/></g></svg></body></html>`, true},
		{":root, :not() and pseudo-elements", `<!doctype html><html><head><style>:root { --c: #2a6fa8 } circle:not(.z) { fill: var(--c) } p::before { content: "x" }</style></head><body>
		  <svg width="400" height="200"><g>` + circles(30) + `<circle class="z" cx="1" cy="1" r="1"/></g></svg></body></html>`, true},
		{"a state pseudo-class inside :not()", `<!doctype html><html><head><style>circle:not(:hover) { fill: #2a6fa8 }</style></head><body>
		  <svg width="400" height="200"><g>` + circles(30) + `</g></svg></body></html>`, false},
		{"a structural pseudo-class", `<!doctype html><html><head><style>circle:nth-child(2n) { fill: #c23a2e }</style></head><body>
		  <svg width="400" height="200"><g>` + circles(30) + `</g></svg></body></html>`, false},
		{"an attribute selector", `<!doctype html><html><head><style>[cy="23"] { fill: #c23a2e }</style></head><body>
		  <svg width="400" height="200"><g>` + circles(30) + `</g></svg></body></html>`, false},
		{"a sibling combinator", `<!doctype html><html><head><style>circle + circle { fill: #c23a2e }</style></head><body>
		  <svg width="400" height="200"><g>` + circles(30) + `</g></svg></body></html>`, false},
		{"a running animation", `<!doctype html><html><head><style>@keyframes k { to { fill: #c23a2e } } circle { animation: k 60s infinite }</style></head><body>
		  <svg width="400" height="200"><g>` + circles(30) + `</g></svg></body></html>`, false},
		{"a cross-origin style sheet", `<!doctype html><html><head><link rel="stylesheet" href="` + other.URL + `/s.css"></head><body>
		  <svg width="400" height="200"><g>` + circles(30) + `</g></svg></body></html>`, false},
		// Siblings that share a style and have no transform share their
		// group's CTM: transforms by attribute, class, inline style and
		// CSS's individual properties, among plain siblings, in nested
		// and linked groups, and marks right under the <svg>.
		{"transforms among alike siblings", `<!doctype html><html><head><style>
		  .t { transform: translate(5px, 7px) } .u { translate: 3px 4px } .r { rotate: 10deg } .s { scale: 1.5 } .z { zoom: 2 }</style></head><body>
		  <svg width="400" height="200" viewBox="0 0 800 400">` + circles(5) + `<g transform="translate(10,20) scale(1.5)">` + circles(10) +
			`<circle transform="rotate(30)" cx="4" cy="4" r="2"/>` + circles(3) + `<circle class="t" cx="5" cy="5" r="2"/><circle class="u" cx="6" cy="6" r="2"/>
		  <circle class="r" cx="7" cy="7" r="2"/><circle class="s" cx="8" cy="8" r="2"/><circle class="z" cx="8" cy="9" r="2"/><circle style="transform: scale(2)" cx="9" cy="9" r="2"/>
		  <g class="t">` + circles(6) + `<g>` + circles(4) + `<text x="3" y="9">a</text><text x="5" y="9">b</text></g></g>
		  <a href="#x"><rect x="1" y="1" width="4" height="4"/><rect x="6" y="1" width="4" height="4"/><rect x="11" y="1" width="4" height="4" transform="skewX(20)"/></a>
		  <g class="u">` + circles(4) + `</g><g style="transform: rotate(45deg)"><path d="M0,0 L10,10"/><path d="M0,5 L10,15"/></g></g></svg></body></html>`, true},
		{"a SMIL animation", `<!doctype html><html><head></head><body>
		  <svg width="400" height="200"><g>` + circles(10) + `<circle cx="5" cy="5" r="3"><animateTransform attributeName="transform" type="translate" to="40 0" dur="60s"/></circle>` +
			circles(10) + `</g></svg></body></html>`, false},
		{"the demo page", string(demoPage(t)), true},
	}
	for _, f := range []string{"../testdata/cascade.html", "../testdata/transforms.svg"} {
		b, err := os.ReadFile(f)
		require.NoError(t, err)
		body := string(b)
		if strings.HasSuffix(f, ".svg") {
			body = `<!doctype html><html><body style="margin:0">` + body + `</body></html>`
		}
		pages = append(pages, page{filepath.Base(f), body, false})
	}
	h := newHarness(t)
	for _, pg := range pages {
		srv := serve(t, func(w http.ResponseWriter, r *http.Request) {
			w.Header().Set("Content-Type", "text/html; charset=utf-8")
			fmt.Fprint(w, pg.body)
		})
		h.open(srv.URL + "/")
		h.eval(Reader() + `; ''`)
		out := h.eval(`(async () => {
		  const a = await globalThis.standoutReader.readPage(document, {});
		  const b = await globalThis.standoutReader.readPage(document, { noSharing: true });
		  const same = JSON.stringify(a.snapshots) === JSON.stringify(b.snapshots);
		  return JSON.stringify({ same, shared: a.sharedStyles, unshared: b.sharedStyles, charts: a.snapshots.length });
		})()`)
		var r struct {
			Same             bool
			Shared, Unshared int
			Charts           int
		}
		require.NoError(t, json.Unmarshal([]byte(out), &r), out)
		require.Greater(t, r.Charts, 0, pg.name)
		assert.True(t, r.Same, "%s: the snapshots differ with sibling style sharing", pg.name)
		assert.Zero(t, r.Unshared, pg.name)
		if pg.shares {
			assert.Equal(t, r.Charts, r.Shared, "%s: sharing should be used", pg.name)
		} else if !strings.HasPrefix(pg.name, "transforms") {
			assert.Zero(t, r.Shared, "%s: sharing must not be used", pg.name)
		}
		t.Logf("%s: %d of %d charts read with sibling style sharing", pg.name, r.Shared, r.Charts)
	}
}

// A chart drawn on a canvas, twelve bars with one highlighted: the press
// captures the visible tab (activeTab grants it), the core judges the
// canvas's pixels, and the overlay outlines the most salient region over
// the highlighted bar and names, in the panel, where the eye goes first
// for each vision type. The capture is taken before the overlay is drawn.
func TestE2EChartDrawnAsPixels(t *testing.T) { suiteChartDrawnAsPixels(t, newHarness(t)) }

func suiteChartDrawnAsPixels(t *testing.T, h e2eBrowser) {
	page, err := os.ReadFile(filepath.Join("..", "cmd", "standout", "testdata", "rasters.html"))
	require.NoError(t, err)
	showPage(h, string(page))
	ov := h.overlayHTML()
	assert.Contains(t, ov, `data-role="pixels"`)
	assert.Regexp(t, `canvas0: the eye is predicted to go first to the outlined region .*For other readers: protan: (the same|spread wider|elsewhere)`, ov)
	firstRegionHoldsTheBar(t, ov, "canvas0")
}

func TestE2EBusyWhileChecking(t *testing.T) { suiteBusyWhileChecking(t, newHarness(t)) }

// suiteBusyWhileChecking: between a press's read and its answer the host
// shows that the check is on its way (state "reading"; the panel's head,
// whose controls but Close wait, and a status line), so the reader sees
// the press was taken. On a page with a chart drawn as
// pixels the busy panel is laid out but hidden while the tab is captured,
// and the chart's regions are still found on its own pixels.
func suiteBusyWhileChecking(t *testing.T, h e2eBrowser) {
	// A check that takes a while: the browser's first, on 5,000 marks.
	srv := serve(h.tb(), func(w http.ResponseWriter, r *http.Request) {
		w.Header().Set("Content-Type", "text/html; charset=utf-8")
		fmt.Fprint(w, scatterPage(5000, ""))
	})
	h.open(srv.URL + "/")
	h.eval(`(() => { window.__states = []; const t0 = performance.now();
	  new MutationObserver(() => {
	    const e = document.querySelector('` + hostSelector + `'), s = e && e.getAttribute('data-state');
	    const last = window.__states[window.__states.length - 1];
	    if (s && (!last || last[0] !== s)) window.__states.push([s, performance.now() - t0]);
	  }).observe(document.documentElement, { subtree: true, childList: true, attributes: true });
	  return ''; })()`)
	trigger(h)
	waitState(h, "ready")
	var states []struct {
		State string
		Ms    float64
	}
	var raw [][2]json.RawMessage
	require.NoError(t, json.Unmarshal([]byte(h.eval(`JSON.stringify(window.__states)`)), &raw))
	for _, r := range raw {
		var st struct {
			State string
			Ms    float64
		}
		require.NoError(t, json.Unmarshal(r[0], &st.State))
		require.NoError(t, json.Unmarshal(r[1], &st.Ms))
		states = append(states, st)
	}
	require.NotEmpty(t, states)
	assert.Equal(t, "ready", states[len(states)-1].State)
	// The busy panel is due 100 ms after the read (BUSY_AFTER_MS): a core
	// that took longer than that and the messaging leaves time for it.
	var timing struct{ CoreMs float64 }
	hostTiming(t, h, &timing)
	t.Logf("the browser's first check: the core took %.0f ms; the host's states %+v", timing.CoreMs, states)
	if timing.CoreMs >= 150 {
		require.Len(t, states, 2, "the host's states from the press to the answer, the core taking %.0f ms: %+v", timing.CoreMs, states)
		assert.Equal(t, "reading", states[0].State)
	}
	trigger(h) // close
	waitState(h, "")

	// Charts drawn as pixels below the fold: each is scrolled into view
	// and captured, the captures spaced by CAPTURE_GAP_MS (background.js),
	// which keeps a press in its reading state for over a second.
	page := rastersBelowTheFold(t)
	srv2 := serve(h.tb(), func(w http.ResponseWriter, r *http.Request) {
		w.Header().Set("Content-Type", "text/html; charset=utf-8")
		fmt.Fprint(w, page)
	})
	h.open(srv2.URL + "/")
	trigger(h)
	busy := ""
	for deadline := time.Now().Add(45 * time.Second); time.Now().Before(deadline) && busy == ""; {
		switch state(h) {
		case "reading":
			if ov := h.overlayHTML(); strings.Contains(ov, `class="panel busy"`) {
				busy = ov
			}
		case "ready", "error":
			deadline = time.Now()
		}
	}
	require.NotEmpty(t, busy, "the busy panel was not seen while the charts drawn as pixels were judged")
	assert.Regexp(t, `<div class="panel busy" [^>]*aria-busy="true" style="visibility: hidden;">`, busy)
	assert.Contains(t, busy, `<p role="status">Checking the page’s charts…</p>`)
	// Until the answer only Close works.
	assert.Contains(t, busy, `data-action="pick" disabled="">`)
	assert.Contains(t, busy, `data-action="cvd" disabled="">`)
	assert.Contains(t, busy, `data-action="close">Close</button>`)
	waitState(h, "ready")
	firstRegionHoldsTheBar(t, h.overlayHTML(), "canvas0")

	// Escape closes a check on its way, and its answer, when it comes, is
	// dropped: the page stays as it was.
	trigger(h) // close
	waitState(h, "")
	trigger(h)
	waitState(h, "reading")
	h.pressKey("Escape")
	waitState(h, "")
	time.Sleep(5 * time.Second) // the captures of the three charts take about two
	assert.Equal(t, "", state(h), "a check closed on its way came back")
	assert.Equal(t, "0,0", h.eval(`scrollX + ',' + scrollY`), "the page is scrolled back")
}

// firstRegionHoldsTheBar checks that the region the overlay ranks first on
// a chart of testdata/rasters.html, in the chart's own pixels, holds the
// highlighted bar's centre: the bar is 26 × 125 px at 210, 155.
func firstRegionHoldsTheBar(t *testing.T, ov, name string) {
	b := firstRegion(t, ov, name)
	cx, cy := 210+13.0, 155+62.0
	assert.True(t, cx >= b[0] && cx <= b[0]+b[2] && cy >= b[1] && cy <= b[1]+b[3], "%s: first region %v", name, b)
}

// firstRegion is the box (x y width height) of the first region the
// overlay outlines on the chart drawn as pixels named name.
func firstRegion(t *testing.T, ov, name string) [4]float64 {
	m := regexp.MustCompile(`<svg class="layer pixels" data-raster="` + name + `"[^>]*>.*?<path d="M([\d.]+) ([\d.]+)h([\d.]+)v([\d.]+)[^"]*"[^>]*data-rank="1"`).FindStringSubmatch(ov)
	require.NotNil(t, m, "%s's first region: %s", name, ov)
	var b [4]float64
	for i := range b {
		var err error
		b[i], err = strconv.ParseFloat(m[i+1], 64)
		require.NoError(t, err)
	}
	return b
}

// builtWithHosts is the extension as built, with host_permissions for
// loopback pages declared in its manifest: a test build standing for a
// reader who allowed those origins through optional_host_permissions (the
// browser's prompt is a window no test can press).
func builtWithHosts(t *testing.T) string {
	dir := builtCopy(t)
	require.NoError(t, editManifest(dir, func(m map[string]any) {
		m["host_permissions"] = []string{"http://127.0.0.1/*"}
	}))
	return dir
}

// editManifest rewrites the manifest of the build in dir, for a test
// build.
func editManifest(dir string, edit func(m map[string]any)) error {
	p := filepath.Join(dir, "manifest.json")
	b, err := os.ReadFile(p)
	if err != nil {
		return err
	}
	var m map[string]any
	if err := json.Unmarshal(b, &m); err != nil {
		return err
	}
	edit(m)
	if b, err = json.Marshal(m); err != nil {
		return err
	}
	return os.WriteFile(p, b, 0o644)
}

// framedCharts serves a chart page on one loopback origin and a page that
// frames it on another (a different port is a different origin), and
// returns the framing page's address.
func framedCharts(t testing.TB) string {
	framed := serve(t, func(w http.ResponseWriter, r *http.Request) {
		w.Header().Set("Content-Type", "text/html; charset=utf-8")
		fmt.Fprint(w, testkit.QuayBars())
	})
	host := serve(t, func(w http.ResponseWriter, r *http.Request) {
		w.Header().Set("Content-Type", "text/html; charset=utf-8")
		fmt.Fprint(w, `<!doctype html><html><body><h1>Harbour report</h1><iframe src="`+framed.URL+`/quays.html" width="320" height="220" style="border:4px solid #ccc;margin:30px 0 0 50px;display:block"></iframe></body></html>`)
	})
	return host.URL + "/"
}

// A chart in a frame of another origin: with that origin allowed (a test
// build declaring it), a press reads the frame too and outlines its chart
// where it stands in the page, with no request left; without it, the panel
// names the origin and offers to ask, and the button opens the extension's
// page that asks (the browser's prompt itself no test can press).
// suiteFrameOfAllowedOrigin needs a build that may read loopback pages.
func suiteFrameOfAllowedOrigin(t *testing.T, h e2eBrowser) {
	h.open(framedCharts(t))
	trigger(h)
	waitState(h, "ready")
	ov := h.overlayHTML()
	assert.Contains(t, ov, `data-chart="frame0/svg0"`, "the framed chart is outlined")
	assert.NotContains(t, ov, `data-role="frames"`)
	assert.NotContains(t, ov, "not readable", "the note on the frame goes once it is read")
	rects := layerRects(t, ov)["frame0/svg0"]
	require.NotEmpty(t, rects)
	require.Len(t, rects["pops"], 1, "the highlighted bar pops")
	// In page px: the frame's content starts past its 50 px margin and 4
	// px border (and the body's 8 px margin); the bar stands at x 122 in
	// the frame.
	assert.InDelta(t, 8+54+122, rects["pops"][0][0], 3, "%v", rects["pops"][0])
}

func TestE2EFrameOfAnotherOrigin(t *testing.T) {
	t.Run("allowed", func(t *testing.T) { suiteFrameOfAllowedOrigin(t, newHarnessOf(t, builtWithHosts(t))) })
	t.Run("not yet allowed", func(t *testing.T) {
		h := newHarness(t)
		page := framedCharts(t)
		h.open(page)
		h.trigger()
		h.waitState("ready")
		ov := h.overlayHTML()
		assert.Contains(t, ov, `data-role="frames"`)
		assert.Regexp(t, `Frames from http://127\.0\.0\.1:\d+ were not read`, ov)
		assert.NotContains(t, ov, `data-chart="frame0/svg0"`)
		h.clickInOverlay("ask-frames")
		deadline := time.Now().Add(10 * time.Second)
		opened := false
		for !opened && time.Now().Before(deadline) {
			ts, err := chromedp.Targets(h.ctx)
			require.NoError(t, err)
			for _, ti := range ts {
				opened = opened || strings.HasPrefix(ti.URL, "chrome-extension://"+h.extID+"/grant.html#")
			}
			time.Sleep(100 * time.Millisecond)
		}
		assert.True(t, opened, "the page that asks for the origin opened")
	})
}

func TestE2EDarkCanvasUnderTheChart(t *testing.T) { suiteDarkCanvasUnderTheChart(t, newHarness(t)) }

// The colour behind a chart on a page without backgrounds is the canvas
// the browser paints: dark when the root's used colour scheme is (its
// color-scheme, or the page's <meta name="color-scheme">), white when the
// page offers both and the reader prefers light (the browsers' default).
// The reading must be the colour the screenshot shows beside the marks.
func suiteDarkCanvasUnderTheChart(t *testing.T, h e2eBrowser) {
	svg := `<svg width="200" height="100" style="display:block"><rect x="120" y="20" width="20" height="60" fill="#e0a458"/><rect x="160" y="40" width="20" height="40" fill="#8fb8de"/></svg>`
	for _, pg := range []struct{ name, head, root string }{
		{"color-scheme dark", "", ` style="color-scheme: dark"`},
		{"meta color-scheme dark", `<meta name="color-scheme" content="dark">`, ""},
		{"light dark, light preferred", "", ` style="color-scheme: light dark"`},
	} {
		srv := serve(t, func(w http.ResponseWriter, r *http.Request) {
			w.Header().Set("Content-Type", "text/html; charset=utf-8")
			fmt.Fprintf(w, `<!doctype html><html%s><head>%s</head><body style="margin:0">%s</body></html>`, pg.root, pg.head, svg)
		})
		h.open(srv.URL + "/")
		h.eval(Reader() + `; ''`)
		bg := h.eval(`globalThis.standoutReader.readPage(document, {}).then((p) => String(JSON.parse(JSON.stringify(p)).snapshots[0].bg))`)
		v, err := strconv.ParseUint(bg, 10, 32)
		require.NoError(t, err, pg.name)
		_, img := h.screenshot()
		r, g, b, _ := img.At(40, 50).RGBA()
		got := [3]uint32{uint32(v >> 24), uint32(v>>16) & 0xff, uint32(v>>8) & 0xff}
		assert.Equal(t, [3]uint32{r >> 8, g >> 8, b >> 8}, got, "%s: the reading against the screenshot", pg.name)
	}
}

func TestE2EChartsBelowTheFold(t *testing.T) { suiteChartsBelowTheFold(t, newHarness(t)) }

// rastersBelowTheFold is testdata/rasters.html after a screen of text.
func rastersBelowTheFold(t *testing.T) string {
	page, err := os.ReadFile(filepath.Join("..", "cmd", "standout", "testdata", "rasters.html"))
	require.NoError(t, err)
	return strings.Replace(string(page), "<body>", `<body><div style="height: 1400px">A long story before the charts.</div>`, 1)
}

// Charts drawn as pixels below the fold (rastersBelowTheFold): the press
// scrolls each into view for a capture of its own, judges its pixels, and
// leaves the page scrolled where the reader had it.
func suiteChartsBelowTheFold(t *testing.T, h e2eBrowser) {
	showPage(h, rastersBelowTheFold(t))
	ov := h.overlayHTML()
	for _, name := range []string{"canvas0", "img0", "background0"} {
		assert.Regexp(t, name+`: the eye is predicted to go first to the outlined region`, ov, "%s was judged", name)
		firstRegionHoldsTheBar(t, ov, name)
	}
	assert.NotContains(t, ov, "could not be captured in view")
	assert.Equal(t, "0,0", h.eval(`scrollX + ',' + scrollY`), "the page is scrolled back")
}

func TestE2EPickOnAChartDrawnAsPixels(t *testing.T) { suitePickOnPixels(t, newHarness(t)) }

// A point picked on a chart drawn as pixels is answered in the panel,
// for every vision type: whether the eye goes there first. On
// testdata/rasters.html's canvas, the highlighted bar is where it goes;
// the first grey bar is not.
func suitePickOnPixels(t *testing.T, h e2eBrowser) {
	page, err := os.ReadFile(filepath.Join("..", "cmd", "standout", "testdata", "rasters.html"))
	require.NoError(t, err)
	showPage(h, string(page))
	var box [2]float64
	require.NoError(t, json.Unmarshal([]byte(h.eval(`(() => { const r = document.querySelector('canvas').getBoundingClientRect(); return JSON.stringify([r.left, r.top]); })()`)), &box))
	for _, c := range []struct {
		x, y float64
		want string
	}{{223, 217, "normal: yes"}, {33, 250, "normal: no"}} {
		h.clickInOverlay("pick")
		h.clickAt(box[0]+c.x, box[1]+c.y)
		re := regexp.MustCompile(`data-role="pixel-pick">The point you picked in canvas0 \(\d+, \d+ px in it\): does the eye go there first\? ([^<]*)\.<`)
		var got []string
		for i := 0; i < 50 && got == nil; i++ {
			got = re.FindStringSubmatch(h.overlayHTML())
			time.Sleep(100 * time.Millisecond)
		}
		require.NotNil(t, got, "no answer for the pick at %v, %v", c.x, c.y)
		assert.Contains(t, got[1], c.want)
		assert.Regexp(t, `^normal: (yes|no), protan: (yes|no), deutan: (yes|no), tritan: (yes|no), achromat: (yes|no)$`, got[1])

		// The exported report holds the judged charts drawn as pixels as
		// charts (minor 4), the pick as the canvas's emphasis.
		dl := h.downloads()
		h.clickInOverlay("export-json")
		data := downloaded(dl, "standout-report.json")
		require.NotNil(t, data, "no exported report")
		require.NoError(t, os.Remove(filepath.Join(dl, "standout-report.json")))
		var rep report.Report
		require.NoError(t, json.Unmarshal(data, &rep))
		require.Len(t, rep.Pages, 1)
		judged := map[string]report.Chart{}
		for _, ch := range rep.Pages[0].Charts {
			judged[ch.Path] = ch
		}
		cv, ok := judged["canvas0"]
		require.True(t, ok, "canvas0 among the charts: %s", data)
		assert.Equal(t, "canvas", cv.Source)
		require.NotEmpty(t, cv.Regions)
		require.NotNil(t, cv.Emphasis)
		require.NotNil(t, cv.Emphasis.Box)
		assert.InDelta(t, box[0]+c.x+window(h)[0], cv.Emphasis.Box[0], 1.5, "the pick in page px")
		assert.Equal(t, c.want == "normal: yes", cv.Emphasis.Holds["normal"])
		assert.Equal(t, "image", judged["img0"].Source)
	}
}

// window is the page's scroll offset, [scrollX, scrollY].
func window(h e2eBrowser) [2]float64 {
	var v [2]float64
	if err := json.Unmarshal([]byte(h.eval(`JSON.stringify([window.scrollX, window.scrollY])`)), &v); err != nil {
		h.tb().Fatal(err)
	}
	return v
}

// A chart drawn as pixels taller than the window is not judged, and the
// panel says how to have it judged: zoomed out until it fits (the tab's
// zoom, set from the worker as the browser's zoom control sets it), the
// press judges it, and the eye goes first to its highlighted bar.
func TestE2EChartDrawnAsPixelsLargerThanTheWindow(t *testing.T) {
	h := newHarness(t)
	// Twelve bars on a canvas 400 px taller than the window; the sixth
	// highlighted (invented data).
	h.showPage(`<!doctype html><html><body style="margin:0"><canvas id="c" width="480"></canvas><script>
	  const c = document.getElementById("c"), H = innerHeight + 400;
	  c.height = H;
	  const g = c.getContext("2d");
	  g.fillStyle = "#ffffff"; g.fillRect(0, 0, 480, H);
	  for (let k = 0; k < 12; k++) {
	    const h = (0.2 + ((k * 53) % 200) / 300) * (H - 40);
	    g.fillStyle = k === 5 ? "#d1495b" : "#7d8a99";
	    g.fillRect(20 + k * 38, H - 20 - h, 26, h);
	  }
	</script></body></html>`)
	ov := h.overlayHTML()
	assert.Contains(t, ov, "canvas0 is larger than the window, so no reader sees it whole at a glance")
	assert.Contains(t, ov, "Zoom the page out until it fits in the window, and press again.")
	assert.NotContains(t, ov, `data-raster="canvas0"`, "outlines on a chart that was not judged")

	h.trigger() // close
	h.waitState("")
	h.inWorker(`chrome.tabs.query({}).then((ts) => Promise.all(ts.filter((t) => t.url && t.url.startsWith('http')).map((t) => chrome.tabs.setZoom(t.id, 0.5))))`)
	require.Eventually(t, func() bool { return h.eval(`String(innerHeight >= document.getElementById("c").height)`) == "true" }, 5*time.Second, 50*time.Millisecond, "the zoomed-out window holds the chart")
	h.trigger()
	h.waitState("ready")
	ov = h.overlayHTML()
	assert.NotContains(t, ov, "larger than the window")
	assert.Regexp(t, `canvas0: the eye is predicted to go first to the outlined region`, ov)
	b := firstRegion(t, ov, "canvas0")
	// The highlighted bar spans x 210–236 of the canvas at the page's left.
	assert.True(t, b[0] <= 223 && 223 <= b[0]+b[2], "first region %v", b)
}
