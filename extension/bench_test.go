package extension

import (
	"context"
	"fmt"
	"math/rand"
	"net/http"
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
// emphasised mark.
func scatterPage(n int) string {
	rng := rand.New(rand.NewSource(int64(n)))
	cols := []string{"#4c78a8", "#f58518", "#54a24b", "#b279a2"}
	var b strings.Builder
	b.WriteString(`<!doctype html><html><body style="margin:0"><svg width="1000" height="800"><g>`)
	for i := 0; i < n; i++ {
		c := cols[rng.Intn(len(cols))]
		if i == n/2 {
			c = "#111111"
		}
		fmt.Fprintf(&b, `<circle cx="%.1f" cy="%.1f" r="3" fill="%s"/>`, 10+rng.Float64()*980, 10+rng.Float64()*780, c)
	}
	b.WriteString(`</g></svg></body></html>`)
	return b.String()
}

// clickToOverlay presses the action and returns the milliseconds from the
// press to the overlay's ready state, timed in the page.
func (h *harness) clickToOverlay(tb testing.TB) float64 {
	h.eval(`(() => { window.__t1 = 0; const o = new MutationObserver(() => { const e = document.querySelector('standout-overlay'); if (e && e.getAttribute('data-state') === 'ready' && !window.__t1) { window.__t1 = performance.now(); o.disconnect(); } }); o.observe(document.documentElement, { subtree: true, attributes: true, childList: true }); window.__t0 = performance.now(); return ''; })()`)
	h.trigger()
	deadline := time.Now().Add(60 * time.Second)
	for time.Now().Before(deadline) {
		if v := h.eval(`String(window.__t1 ? window.__t1 - window.__t0 : '')`); v != "" {
			var ms float64
			fmt.Sscan(v, &ms)
			return ms
		}
		time.Sleep(5 * time.Millisecond)
	}
	tb.Fatal("the overlay did not appear")
	return 0
}

// floor times a plain JavaScript loop, in an isolated world like a content
// script's, that reads what the read pass reads of every mark (computed
// paint, opacity and stroke width, the screen CTM and the bounding box) and
// nothing else.
func (h *harness) floor(tb testing.TB) float64 {
	ms, err := chromedp.Run(h.ctx, func(ctx context.Context, tg *chromedp.Target) (float64, error) {
		tree, err := cdp.Call(ctx, tg, page.GetFrameTree, cdp.Empty{})
		if err != nil {
			return 0, err
		}
		w, err := cdp.Call(ctx, tg, page.CreateIsolatedWorld, page.CreateIsolatedWorldParams{FrameID: tree.FrameTree.Frame.ID, WorldName: "standout-floor"})
		if err != nil {
			return 0, err
		}
		ret := true
		res, err := cdp.Call(ctx, tg, runtime.Evaluate, runtime.EvaluateParams{
			ContextID:     w.ExecutionContextID,
			ReturnByValue: &ret,
			Expression: `(() => { const t0 = performance.now(); const out = [];
			  for (const el of document.querySelectorAll('svg *')) {
			    const cs = getComputedStyle(el); const m = el.getScreenCTM && el.getScreenCTM(); const r = el.getBoundingClientRect();
			    out.push(cs.fill, cs.stroke, cs.fillOpacity, cs.strokeOpacity, cs.opacity, cs.strokeWidth, cs.display, cs.visibility, m && m.a, m && m.e, r.left, r.top, r.width, r.height);
			  }
			  return performance.now() - t0; })()`,
		})
		if err != nil {
			return 0, err
		}
		var v float64
		fmt.Sscan(string(res.Result.Value), &v)
		return v, nil
	})
	require.NoError(tb, err)
	return ms
}

// BenchmarkBrowserClickToOverlay reports click-to-overlay milliseconds for
// charts of 1,000, 5,000 and 20,000 marks: cold (a fresh browser, so the
// core is compiled first) and warm (the same page, clicked again), with
// the floor measured in the same run. Warm is the mean of three presses
// after the first. Run with:
//
//	go test ./extension -run '^$' -bench BrowserClickToOverlay -benchtime 1x
func BenchmarkBrowserClickToOverlay(b *testing.B) {
	for _, n := range []int{1000, 5000, 20000} {
		body := scatterPage(n)
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			var cold, warm, floor float64
			for i := 0; i < b.N; i++ {
				h := newHarness(b)
				srv := serve(b, func(w http.ResponseWriter, r *http.Request) {
					w.Header().Set("Content-Type", "text/html; charset=utf-8")
					fmt.Fprint(w, body)
				})
				h.open(srv.URL + "/")
				cold += h.clickToOverlay(b)
				h.trigger() // close
				h.waitState("")
				// Warm: the mean of three more presses on the loaded page.
				for k := 0; k < 3; k++ {
					warm += h.clickToOverlay(b) / 3
					h.trigger()
					h.waitState("")
				}
				floor += h.floor(b)
			}
			k := float64(b.N)
			b.ReportMetric(cold/k, "cold-ms")
			b.ReportMetric(warm/k, "warm-ms")
			b.ReportMetric(floor/k, "floor-ms")
			b.ReportMetric(warm/floor, "warm/floor")
		})
	}
}
