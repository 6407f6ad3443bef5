package extension

import (
	"context"
	"encoding/json"
	"fmt"
	"math/rand"
	"net/http"
	"sort"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/page"
	"github.com/chromedp/cdproto/runtime"
	"github.com/chromedp/chromedp"
	"github.com/stretchr/testify/require"
)

// scatterPage is an invented scatter of n circles in four colours with one
// emphasised mark. css goes into the page's style sheet.
func scatterPage(n int, css string) string { return scatterCharts(1, n, css) }

// scatterCharts is an invented page of k scatters of n circles each, in
// four colours with one emphasised mark each, one below the other.
func scatterCharts(k, n int, css string) string {
	rng := rand.New(rand.NewSource(int64(n)))
	cols := []string{"#3b6e8f", "#d0842c", "#5a9a4e", "#9a6aa6"}
	var b strings.Builder
	b.WriteString(`<!doctype html><html><head><style>` + css + `</style></head><body style="margin:0">`)
	for range k {
		b.WriteString(`<svg width="1000" height="800"><g>`)
		for i := 0; i < n; i++ {
			c := cols[rng.Intn(len(cols))]
			if i == n/2 {
				c = "#111111"
			}
			fmt.Fprintf(&b, `<circle cx="%.1f" cy="%.1f" r="3" fill="%s"/>`, 10+rng.Float64()*980, 10+rng.Float64()*780, c)
		}
		b.WriteString(`</g></svg>`)
	}
	b.WriteString(`</body></html>`)
	return b.String()
}

// press is one timed press of the action.
type press struct {
	// Ready is the milliseconds from the press to the overlay's ready
	// state; Painted to the end of the first frame after it.
	Ready, Painted float64
	// Timing is what the extension recorded of its steps. StartedAt is
	// when the press reached the background, on the clock the page
	// shares (timeOrigin plus now); DeliveryMs the answer's crossing to
	// the page, UnpackMs its unpacking there.
	Timing struct {
		ReadMs, StringifyMs, ReadTripMs, CoreLoadMs, CoreMs, RenderMs float64
		StartedAt, DeliveryMs, UnpackMs                               float64
		// PatchMs is the page's making of its reading's patch; ReadSent
		// and AnswerSent what crossed of the reading and the answer
		// (patch.js).
		PatchMs, ReadSent, AnswerSent float64
		Reused                        bool
		Core                          map[string]float64
	}
	// ClickMs is from the press to the background's handler.
	ClickMs float64
}

// clickToOverlay presses the action once and times it in the page. A
// press the browser loses (no overlay within 10 s; the harness's trigger
// would press again) is retried and not timed.
func (h *harness) clickToOverlay(tb testing.TB) press {
	for attempt := 0; attempt < 3; attempt++ {
		h.eval(`(() => { window.__t1 = 0; window.__t2 = 0;
		  const o = new MutationObserver(() => {
		    const e = document.querySelector('` + hostSelector + `');
		    if (e && e.getAttribute('data-state') === 'ready' && !window.__t1) {
		      window.__t1 = performance.now(); o.disconnect();
		      // The frame that shows the overlay: rAF runs before its paint,
		      // a task queued there runs after it.
		      requestAnimationFrame(() => setTimeout(() => { window.__t2 = performance.now(); }));
		    }
		  });
		  o.observe(document.documentElement, { subtree: true, attributes: true, childList: true });
		  window.__t0 = performance.now(); return ''; })()`)
		h.press()
		deadline := time.Now().Add(10 * time.Second)
		for time.Now().Before(deadline) {
			v := h.eval(`window.__t2 ? JSON.stringify([window.__t1 - window.__t0, window.__t2 - window.__t0, document.querySelector('` + hostSelector + `').getAttribute('data-timing'), performance.timeOrigin + window.__t0]) : ''`)
			if v == "" {
				time.Sleep(5 * time.Millisecond)
				continue
			}
			var raw [4]json.RawMessage
			require.NoError(tb, json.Unmarshal([]byte(v), &raw))
			var p press
			var timing string
			var pressedAt float64
			require.NoError(tb, json.Unmarshal(raw[0], &p.Ready))
			require.NoError(tb, json.Unmarshal(raw[1], &p.Painted))
			require.NoError(tb, json.Unmarshal(raw[2], &timing))
			require.NoError(tb, json.Unmarshal(raw[3], &pressedAt))
			require.NoError(tb, json.Unmarshal([]byte(timing), &p.Timing))
			p.ClickMs = p.Timing.StartedAt - pressedAt
			return p
		}
		tb.Logf("press %d was lost; pressing again", attempt)
		if h.state() != "" {
			h.trigger()
			h.waitState("")
		}
	}
	tb.Fatal("the overlay did not appear")
	return press{}
}

// floorJS is a plain loop that reads what the read pass could read of
// every element (computed paint, opacities, stroke width, display and
// visibility, the screen CTM and the bounding box) and nothing else.
const floorJS = `(() => { const t0 = performance.now(); const out = [];
  for (const el of document.querySelectorAll('svg *')) {
    const cs = getComputedStyle(el); const m = el.getScreenCTM && el.getScreenCTM(); const r = el.getBoundingClientRect();
    out.push(cs.fill, cs.stroke, cs.fillOpacity, cs.strokeOpacity, cs.opacity, cs.strokeWidth, cs.display, cs.visibility, m && m.a, m && m.e, r.left, r.top, r.width, r.height);
  }
  return performance.now() - t0; })()`

// floor times floorJS in an isolated world like a content script's: once
// in a new world (cold, as the definition of the floor has it), then three
// times more in the same world, whose median is the warm floor (the read
// pass on a warm press runs in a world whose code has run before).
func (h *harness) floor(tb testing.TB) (cold, warm float64) {
	ms, err := chromedp.Run(h.ctx, func(ctx context.Context, tg *chromedp.Target) ([]float64, error) {
		tree, err := cdp.Call(ctx, tg, page.GetFrameTree, cdp.Empty{})
		if err != nil {
			return nil, err
		}
		w, err := cdp.Call(ctx, tg, page.CreateIsolatedWorld, page.CreateIsolatedWorldParams{FrameID: tree.FrameTree.Frame.ID, WorldName: "standout-floor"})
		if err != nil {
			return nil, err
		}
		var out []float64
		for i := 0; i < 4; i++ {
			ret := true
			res, err := cdp.Call(ctx, tg, runtime.Evaluate, runtime.EvaluateParams{ContextID: w.ExecutionContextID, ReturnByValue: &ret, Expression: floorJS})
			if err != nil {
				return nil, err
			}
			var v float64
			if err := json.Unmarshal(res.Result.Value, &v); err != nil {
				return nil, err
			}
			out = append(out, v)
		}
		return out, nil
	})
	require.NoError(tb, err)
	return ms[0], median(ms[1:])
}

func median(v []float64) float64 {
	s := append([]float64(nil), v...)
	sort.Float64s(s)
	if len(s)%2 == 1 {
		return s[len(s)/2]
	}
	return (s[len(s)/2-1] + s[len(s)/2]) / 2
}

// warmPresses presses the action five times on the loaded page, closing
// the panel after each; with change, one mark's fill is changed before
// each press, so that no press can reuse the last answer.
func (h *harness) warmPresses(b *testing.B, n int, change bool) []press {
	var out []press
	for k := 0; k < 5; k++ {
		if change {
			// The other of two fills than the mark has now, so that every
			// press finds the page changed, the first of a series too.
			h.eval(`(() => { const c = document.querySelector('circle'); c.setAttribute('fill', c.getAttribute('fill') === '#5d6e7f' ? '#7f6e5d' : '#5d6e7f'); return ''; })()`)
		}
		p := h.clickToOverlay(b)
		if change && p.Timing.Reused {
			b.Fatalf("%d marks, warm press %d: the page changed, yet the last answer was reused", n, k)
		}
		b.Logf("%d marks, warm press %d (page changed: %v): %.0f ms to ready, %.0f ms to the frame, %.1f ms to the background; %+v", n, k, change, p.Ready, p.Painted, p.ClickMs, p.Timing)
		out = append(out, p)
		h.trigger()
		h.waitState("")
	}
	return out
}

// readingPause is how long the benchmark's reader reads an answer
// before the service worker is stopped or the browser closed: long enough
// for the background's training (core.js: train) and V8's caching
// of the optimised code two seconds after its last compile.
const readingPause = 6 * time.Second

// BenchmarkBrowserClickToOverlay reports click-to-overlay milliseconds for
// charts of 1,000, 5,000 and 20,000 marks, of 5,000 marks on a page whose
// style sheet rules out the read pass's sibling style sharing
// (5000-unshared), and of five charts of 1,000 marks on one page (5x1000),
// with the floor measured in the same run:
//
//   - cold-ms: a fresh browser, the first press on a loaded page, so the
//     scripts are injected first, and the core was loaded at the install
//     and has barely begun training (background.js: trainAtInstall);
//   - restart-ms: a press after the service worker was stopped, following
//     a pause to read the last answer (readingPause; the first press got
//     "offscreen", so the core is loaded again in the offscreen document
//     it runs in from then on, from the code Chromium kept of it:
//     core-host.js; the scripts are in the page);
//   - relaunch-ms: the first press after the browser was closed and
//     started again with the same profile, on the page loaded again (the
//     start installs the extension again, but the mark of the finished
//     training spares it a second one, as a real restart, which installs
//     nothing, would; the grant of "offscreen" holds, as a real restart
//     keeps it: grantOffscreen; the core loads as the browser starts, in
//     its offscreen document: background.js, loadAtStart);
//   - relaunch-stopped-ms: the same, with the service worker stopped
//     before the press, as Chromium stops it half a minute after the
//     start when no press came (the offscreen document keeps the core;
//     the scripts are injected into the page);
//   - warm-ms: the median of five presses on the loaded page, to the
//     overlay's ready state; warm-paint-ms to the end of the frame that
//     shows it. The page has not changed, so from the second press on the
//     background reuses the core's answer (timing.reused);
//   - warm-changed-ms: the same with one mark's fill changed before each
//     press, so that every press runs the core; the presses follow the
//     first at once, and find the core's code partly unoptimised (the
//     engine optimises a function once it has run a while, from its next
//     call on, and the background's training starts only half a second
//     after a check: core.js, TRAIN_DELAY_MS);
//   - paced-changed-ms: the median of five more presses on a changed
//     page, the first made after a pause to read the last answer
//     (readingPause), as a reader edits and checks again, the others at
//     once after it, all on a core the training has optimised meanwhile;
//     paced-core-ms is their core's step (the log gives each press, the
//     first of the five apart);
//   - hosted-changed-ms: the median of five presses on a changed page
//     in the worker after that press, which asks the offscreen document
//     for each check, as every worker after a reader's first press does
//     (the presses before ran the core in the worker that asked for the
//     grant: background.js, core); hosted-core-ms their core's step;
//   - floor-ms: a loop reading every element's computed paint, CTM and box
//     once in a new isolated world; floor-warm-ms its median over three more
//     runs in that world;
//   - read (the read pass in the page), read-trip (from the service
//     worker's call to the page's answer, the read included), core,
//     render, click (from the press to the background's handler) and
//     delivery (the answer's crossing to the page): the warm presses'
//     median steps, in ms; changed-core the core's step of the presses
//     on a changed page.
//
// Run with:
//
//	go test ./extension -run '^$' -bench BrowserClickToOverlay -benchtime 1x
func BenchmarkBrowserClickToOverlay(b *testing.B) {
	for _, c := range []struct {
		n, charts int
		name      string
		css       string
	}{
		{1000, 1, "1000", ""},
		{5000, 1, "5000", ""},
		{20000, 1, "20000", ""},
		// A rule the read pass cannot rule out telling siblings apart:
		// every mark's style is read.
		{5000, 1, "5000-unshared", "circle:hover { stroke: #000 }"},
		// A story page of five charts: a changed press edits the first,
		// and the core recalls the other four (wasm/charts.go).
		{5000, 5, "5x1000", ""},
	} {
		n, body := c.n, scatterCharts(c.charts, c.n/c.charts, c.css)
		b.Run(c.name, func(b *testing.B) {
			var cold, restart, relaunch, warm, changed, paint, floor, floorWarm, read, trip, core, render float64
			var click, delivery, changedCore, paced, pacedCore, relaunchStopped, hosted, hostedCore float64
			for i := 0; i < b.N; i++ {
				profile, dir := b.TempDir(), builtCopy(b)
				h := newHarnessWith(b, dir, profile)
				srv := serve(b, func(w http.ResponseWriter, r *http.Request) {
					w.Header().Set("Content-Type", "text/html; charset=utf-8")
					fmt.Fprint(w, body)
				})
				h.open(srv.URL + "/")
				p := h.clickToOverlay(b)
				cold += p.Ready
				b.Logf("%d marks, cold press: %.0f ms to ready, %.0f ms to the frame, %.0f ms to the background; %+v", n, p.Ready, p.Painted, p.ClickMs, p.Timing)
				h.trigger() // close
				h.waitState("")
				var ws, ps, rs, ts, cs, ds, ks, ls, wc, cc []float64
				for _, p := range h.warmPresses(b, n, false) {
					ws, ps = append(ws, p.Ready), append(ps, p.Painted)
					rs, ts = append(rs, p.Timing.ReadMs), append(ts, p.Timing.ReadTripMs)
					cs, ds = append(cs, p.Timing.CoreMs), append(ds, p.Timing.RenderMs)
					ks, ls = append(ks, p.ClickMs), append(ls, p.Timing.DeliveryMs)
				}
				for _, p := range h.warmPresses(b, n, true) {
					wc, cc = append(wc, p.Ready), append(cc, p.Timing.CoreMs)
				}
				changed, changedCore = changed+median(wc), changedCore+median(cc)
				click, delivery = click+median(ks), delivery+median(ls)
				warm, paint = warm+median(ws), paint+median(ps)
				read, trip = read+median(rs), trip+median(ts)
				core, render = core+median(cs), render+median(ds)
				fc, fw := h.floor(b)
				floor, floorWarm = floor+fc, floorWarm+fw
				// The reader reads the last answer before the worker stops
				// (the background trains the core meanwhile).
				time.Sleep(readingPause)
				b.Logf("%d marks, the core's training after the warm presses: %s", n, h.workerValue(`JSON.stringify(globalThis.standoutTraining || null)`))
				// Having read the answer, the reader edits and presses
				// again, on a core its training has optimised.
				var pc, pcc []float64
				for _, p := range h.warmPresses(b, n, true) {
					pc, pcc = append(pc, p.Ready), append(pcc, p.Timing.CoreMs)
				}
				paced, pacedCore = paced+median(pc), pacedCore+median(pcc)
				time.Sleep(readingPause)
				h.worker = nil
				h.stopWorker(b)
				p = h.clickToOverlay(b)
				restart += p.Ready
				b.Logf("%d marks, press after the worker stopped: %.0f ms to ready, %.0f ms to the background; %+v", n, p.Ready, p.ClickMs, p.Timing)
				time.Sleep(readingPause)
				// This worker asks the offscreen document for every check,
				// as every worker after a reader's first press does.
				var hc, hcc []float64
				h.trigger()
				h.waitState("")
				for _, p := range h.warmPresses(b, n, true) {
					hc, hcc = append(hc, p.Ready), append(hcc, p.Timing.CoreMs)
				}
				hosted, hostedCore = hosted+median(hc), hostedCore+median(hcc)
				time.Sleep(readingPause)
				h.close()
				// The browser started again on the profile, and the page
				// loaded; the press made at once, or once the worker is
				// stopped. The first press's grant of "offscreen" holds, as
				// in a reader's browser (grantOffscreen).
				grantOffscreen(b, dir)
				relaunched := func(stopped bool, sum *float64, what string) {
					h := newHarnessWith(b, dir, profile)
					h.open(srv.URL + "/")
					if stopped {
						h.stopWorker(b)
					}
					p := h.clickToOverlay(b)
					*sum += p.Ready
					b.Logf("%d marks, first press after the browser started again%s: %.0f ms to ready, %.0f ms to the background; %+v", n, what, p.Ready, p.ClickMs, p.Timing)
					h.close()
				}
				relaunched(false, &relaunch, "")
				relaunched(true, &relaunchStopped, " and its worker stopped")
			}
			k := float64(b.N)
			b.ReportMetric(cold/k, "cold-ms")
			b.ReportMetric(restart/k, "restart-ms")
			b.ReportMetric(relaunch/k, "relaunch-ms")
			b.ReportMetric(relaunchStopped/k, "relaunch-stopped-ms")
			b.ReportMetric(warm/k, "warm-ms")
			b.ReportMetric(paint/k, "warm-paint-ms")
			b.ReportMetric(floor/k, "floor-ms")
			b.ReportMetric(floorWarm/k, "floor-warm-ms")
			b.ReportMetric(warm/floor, "warm/floor")
			b.ReportMetric(warm/floorWarm, "warm/floor-warm")
			b.ReportMetric(changed/k, "warm-changed-ms")
			b.ReportMetric(changed/floor, "warm-changed/floor")
			b.ReportMetric(read/k, "read-ms")
			b.ReportMetric(trip/k, "read-trip-ms")
			b.ReportMetric(core/k, "core-ms")
			b.ReportMetric(render/k, "render-ms")
			b.ReportMetric(click/k, "click-ms")
			b.ReportMetric(delivery/k, "delivery-ms")
			b.ReportMetric(changedCore/k, "changed-core-ms")
			b.ReportMetric(paced/k, "paced-changed-ms")
			b.ReportMetric(paced/floor, "paced-changed/floor")
			b.ReportMetric(pacedCore/k, "paced-core-ms")
			b.ReportMetric(hosted/k, "hosted-changed-ms")
			b.ReportMetric(hosted/floor, "hosted-changed/floor")
			b.ReportMetric(hostedCore/k, "hosted-core-ms")
		})
	}
}

// BenchmarkBrowserFirstPressAfterInstall reports the first press on a
// 5,000-mark chart in a new profile, where the background trains the core
// from the install on (background.js: trainAtInstall):
//
//   - soon-ms: made soonAfter the page opened, while the worker that
//     trained still runs, as when a reader tries Standout right after
//     installing it (the press at once is the other benchmark's cold-ms);
//
//   - first-ms: made after the reader has left the browser alone for a
//     while (installPause) and the service worker has stopped, as it does
//     when idle, so the core is loaded from the code Chromium kept.
//
//     go test ./extension -run '^$' -bench FirstPressAfterInstall -benchtime 1x -v
func BenchmarkBrowserFirstPressAfterInstall(b *testing.B) {
	const soonAfter, installPause = 3 * time.Second, 16 * time.Second
	body := scatterPage(5000, "")
	var soon, first float64
	for i := 0; i < b.N; i++ {
		for _, idle := range []bool{false, true} {
			h := newHarness(b)
			srv := serve(b, func(w http.ResponseWriter, r *http.Request) {
				w.Header().Set("Content-Type", "text/html; charset=utf-8")
				fmt.Fprint(w, body)
			})
			if idle {
				time.Sleep(installPause)
				b.Logf("the core's training after the install: %s", h.workerValue(`JSON.stringify(globalThis.standoutTraining || null)`))
				h.worker = nil
				h.stopWorker(b)
			}
			h.open(srv.URL + "/")
			if !idle {
				time.Sleep(soonAfter)
			}
			p := h.clickToOverlay(b)
			if idle {
				first += p.Ready
			} else {
				soon += p.Ready
			}
			b.Logf("first press after the install (idle and stopped: %v): %.0f ms to ready, %.0f ms to the background; %+v", idle, p.Ready, p.ClickMs, p.Timing)
			h.close()
		}
	}
	b.ReportMetric(soon/float64(b.N), "soon-ms")
	b.ReportMetric(first/float64(b.N), "first-ms")
}

// saliencyJS draws, in the service worker, which runs the core until the
// first press's grant takes effect (background.js: core), the saliency
// benchmark's chart (perception/saliency: 20 grey bars on white, one of them red) as
// 600 × 400 RGBA pixels and times the core's judgement of it (the map
// for normal vision and each CVD type's simulation) once cold, then five
// times more, in ms.
const saliencyJS = `(() => {
  const w = 600, h = 400, px = new Uint8ClampedArray(4 * w * h).fill(255);
  for (let k = 0; k < 20; k++) {
    const bh = 60 + (k * 53) % 280, c = k === 13 ? [0xd1, 0x49, 0x5b] : [0x7d, 0x8a, 0x99];
    for (let y = 380 - bh; y < 380; y++) for (let x = 20 + k * 28; x < 40 + k * 28; x++) px.set(c, 4 * (y * w + x));
  }
  const times = [];
  for (let i = 0; i < 6; i++) {
    const t0 = performance.now();
    const r = JSON.parse(globalThis.standoutSaliency(px, w, h, 1));
    if (!r.ok) throw new Error(r.error);
    times.push(performance.now() - t0);
  }
  return JSON.stringify(times);
})()`

// BenchmarkBrowserSaliency600x400 reports how long the core in the
// extension's service worker takes to judge a 600 × 400 chart drawn as
// pixels, as a press does for each one: first-ms on the core's first
// such call, ms the median of five more.
//
//	go test ./extension -run '^$' -bench BrowserSaliency -benchtime 1x
func BenchmarkBrowserSaliency600x400(b *testing.B) {
	var first, warm float64
	for i := 0; i < b.N; i++ {
		h := newHarness(b)
		srv := serve(b, func(w http.ResponseWriter, r *http.Request) {
			w.Header().Set("Content-Type", "text/html; charset=utf-8")
			fmt.Fprint(w, scatterPage(10, ""))
		})
		h.open(srv.URL + "/")
		h.clickToOverlay(b) // loads the core
		var times []float64
		require.NoError(b, json.Unmarshal([]byte(h.workerValue(saliencyJS)), &times))
		b.Logf("saliency of 600×400 px, 5 vision types: %.0f ms first, then %v", times[0], times[1:])
		first, warm = first+times[0], warm+median(times[1:])
	}
	b.ReportMetric(first/float64(b.N), "first-ms")
	b.ReportMetric(warm/float64(b.N), "ms")
}
