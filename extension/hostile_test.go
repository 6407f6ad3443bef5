package extension

// End-to-end tests of hostile pages (issue 10), in real Chromium.

import (
	"context"
	"fmt"
	"net/http"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/cdproto/target"
	"github.com/chromedp/chromedp"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/snapshot"
)

// inWorker evaluates expr in the extension's service worker.
func (h *harness) inWorker(expr string) {
	h.workerValue(expr + "\n;''")
}

// workerValue evaluates expr, a string, in the extension's service worker.
// The worker's context lives as long as the harness: cancelling a
// context attached to the worker would close the worker, and the next
// message would start a fresh one without what a test put in it.
func (h *harness) workerValue(expr string) string {
	if h.worker == nil {
		ts, err := chromedp.Targets(h.ctx)
		require.NoError(h.t, err)
		var id target.ID
		for _, ti := range ts {
			if ti.Type == "service_worker" && strings.HasPrefix(ti.URL, "chrome-extension://"+h.extID) {
				id = ti.TargetID
			}
		}
		require.NotEmpty(h.t, id, "no service worker")
		wctx, cancel := chromedp.NewContext(h.ctx, chromedp.WithTargetID(id))
		h.t.Cleanup(cancel)
		h.worker = wctx
	}
	v, err := chromedp.Run(h.worker, chromedp.Evaluate[string](expr))
	require.NoError(h.t, err)
	return v
}

// coreTarget is the offscreen document that runs the core, or "" when
// there is none.
func (h *harness) coreTarget() target.ID {
	ts, err := chromedp.Targets(h.ctx)
	require.NoError(h.t, err)
	for _, ti := range ts {
		if ti.URL == "chrome-extension://"+h.extID+"/core.html" {
			return ti.TargetID
		}
	}
	return ""
}

// closeTarget closes a target of the browser, as the browser may.
func closeTarget(t testing.TB, h *harness, id target.ID) {
	require.NotEmpty(t, id)
	_, err := chromedp.CallBrowser(h.ctx, target.CloseTarget, target.CloseTargetParams{TargetID: id})
	require.NoError(t, err)
}

// coreValue evaluates expr, a string, in the service worker, which runs
// the core until the first press has granted "offscreen" (a worker keeps
// to the core it loaded: background.js, core). After that the core runs
// in the offscreen document's worker, which DevTools does not reach from
// here: its state is read through the document (hostValue,
// standoutCore).
func (h *harness) coreValue(expr string) string {
	require.Equal(h.t, "function", h.workerValue(`typeof globalThis.standoutHandle`), "the service worker runs no core")
	return h.workerValue(expr)
}

// hostValue evaluates expr, a string, in the offscreen document
// (core-host.js). Promises are awaited.
func (h *harness) hostValue(expr string) string {
	id := h.coreTarget()
	require.NotEmpty(h.t, id, "no offscreen document")
	if h.core == nil || h.coreID != id {
		ctx, cancel := chromedp.NewContext(h.ctx, chromedp.WithTargetID(id))
		h.t.Cleanup(cancel)
		h.core, h.coreID = ctx, id
	}
	v, err := chromedp.Run(h.core, chromedp.Evaluate[string](expr, chromedp.EvalAwaitPromise))
	require.NoError(h.t, err)
	return v
}

// inCore evaluates expr in the service worker's core (coreValue).
func (h *harness) inCore(expr string) {
	h.coreValue(expr + "\n;''")
}

func (h *harness) escape() {
	require.NoError(h.t, chromedp.Do(h.ctx, func(ctx context.Context, tg *chromedp.Target) (chromedp.Void, error) {
		return chromedp.Void{}, pressKey(ctx, tg, "Escape")
	}))
}

// A page that registers the old host's custom element name and keeps its
// ElementInternals gets no shadow root; synthetic events do nothing.
func TestIssue10PageCannotReachTheOverlay(t *testing.T) {
	h := newHarness(t)
	h.showPage(`<!doctype html><html><body style="margin:0"><script>
	window.stolen = [];
	for (const name of ['standout-overlay', 'standout-host']) {
	  customElements.define(name, class extends HTMLElement { constructor() { super(); window.stolen.push(this.attachInternals()); } });
	}
	const orig = Element.prototype.attachShadow;
	Element.prototype.attachShadow = function (o) { const r = orig.call(this, o); window.stolen.push({ shadowRoot: r }); return r; };
	</script>` + chartSVG + `</body></html>`)
	assert.Equal(t, "0", h.eval(`String(window.stolen.filter((i) => i.shadowRoot).length)`), "the page got hold of the overlay's shadow root")
	// Synthetic keys and clicks are not the reader's: the overlay stays.
	h.eval(`window.dispatchEvent(new KeyboardEvent('keydown', { key: 'Escape', bubbles: true })), document.body.dispatchEvent(new KeyboardEvent('keydown', { key: 'Escape', bubbles: true })), ''`)
	time.Sleep(200 * time.Millisecond)
	assert.Equal(t, "ready", h.state())
	h.escape()
	h.waitState("")
}

// Closing while a re-check is on its way keeps the overlay closed.
func TestIssue10CloseDuringRecheckStaysClosed(t *testing.T) {
	h := newHarness(t)
	h.showPage(scatterPage(4000, ""))
	h.eval(`document.querySelector('circle').setAttribute('r', '5'), ''`)
	deadline := time.Now().Add(10 * time.Second)
	for h.state() != "rechecking" && time.Now().Before(deadline) {
		time.Sleep(5 * time.Millisecond)
	}
	require.Equal(t, "rechecking", h.state())
	h.escape()
	h.waitState("")
	time.Sleep(1500 * time.Millisecond)
	assert.Equal(t, "", h.state(), "the re-check's answer brought the overlay back")
}

// The preview takes back only what it set: the page's own style changes
// made while it was on stay, and the read pass rewrites no transform list.
func TestIssue10PreviewAndReadLeaveThePageAlone(t *testing.T) {
	h := newHarness(t)
	h.showPage(`<!doctype html><html><body style="margin:0"><svg width="240" height="120" style="display:block"><g transform="translate(5,5) scale(0.9)">` +
		strings.TrimPrefix(strings.TrimSuffix(chartSVG, `</g></svg>`), `<svg width="240" height="120"><g>`) + `</g></svg></body></html>`)
	assert.Equal(t, "2 translate(5,5) scale(0.9)", h.eval(`(() => { const g = document.querySelector('g'); return g.transform.baseVal.numberOfItems + ' ' + g.getAttribute('transform'); })()`))
	h.chooseInOverlay("cvd", 2)
	time.Sleep(200 * time.Millisecond)
	require.Contains(t, h.eval(`document.querySelector('svg').getAttribute('style')`), "filter")
	h.eval(`document.querySelector('svg').style.outline = '3px solid rgb(10, 20, 30)', ''`)
	h.chooseInOverlay("cvd", 0)
	time.Sleep(200 * time.Millisecond)
	style := h.eval(`document.querySelector('svg').getAttribute('style')`)
	assert.Contains(t, style, "outline: rgb(10, 20, 30) solid 3px", "the page's own change was undone")
	assert.NotContains(t, style, "filter")
	// A re-check under an active preview keeps the control in step.
	h.chooseInOverlay("cvd", 3)
	h.eval(`document.querySelector('` + hostSelector + `').removeAttribute('data-state'), document.querySelectorAll('rect')[0].setAttribute('height', '70'), ''`)
	h.waitState("ready")
	assert.Contains(t, h.overlayHTML(), `<option value="tritan" selected="">`)
	assert.Contains(t, h.eval(`document.querySelector('svg').getAttribute('style')`), "filter")
	h.escape()
	h.waitState("")
	assert.NotContains(t, h.eval(`document.querySelector('svg').getAttribute('style')`), "filter")
}

// A standalone SVG document gets the overlay too.
func TestIssue10StandaloneSVG(t *testing.T) {
	h := newHarness(t)
	srv := serve(t, func(w http.ResponseWriter, r *http.Request) {
		w.Header().Set("Content-Type", "image/svg+xml")
		fmt.Fprint(w, strings.Replace(chartSVG, "<svg ", `<svg xmlns="http://www.w3.org/2000/svg" `, 1))
	})
	h.open(srv.URL + "/chart.svg")
	h.trigger()
	h.waitState("ready")
	assert.Len(t, layerRects(t, h.overlayHTML())["svg0"]["pops"], 1)
	h.escape()
	h.waitState("")
}

// A core that has exited is reloaded: the next press works, in the same
// document, without a restart.
func TestIssue10CoreReloadedAfterExit(t *testing.T) {
	h := newHarness(t)
	h.showPage(chartPage)
	h.escape()
	h.waitState("")
	// What the document holds after the Go program exits: a handle that throws.
	h.inCore(`globalThis.testThrew = false; globalThis.standoutHandle = () => { globalThis.testThrew = true; throw new Error('Go program has already exited'); }; 0`)
	// A label makes the page another request: a press on the unchanged
	// page would reuse the last answer and never reach the core.
	h.eval(`document.querySelector('rect').setAttribute('aria-label', 'first'), ''`)
	h.trigger()
	h.waitState("ready")
	assert.Equal(t, "true", h.coreValue(`String(globalThis.testThrew)`), "the press never reached the exited core")
	assert.Len(t, layerRects(t, h.overlayHTML())["svg0"]["pops"], 1)
}

// Pages built to exhaust the read pass: a <use> chain, many shadow roots,
// many icons. Each is answered (with the cap named where one applies),
// and the next press on a plain page works.
func TestIssue10ReadPassCaps(t *testing.T) {
	h := newHarness(t)
	var chain strings.Builder
	chain.WriteString(`<!doctype html><html><body>` + chartSVG + `<svg width="100" height="100"><defs><circle id="l0" r="1"/>`)
	for i := 1; i < 6; i++ {
		fmt.Fprintf(&chain, `<g id="l%d">%s</g>`, i, strings.Repeat(fmt.Sprintf(`<use href="#l%d"/>`, i-1), 10))
	}
	chain.WriteString(`</defs><use href="#l5"/></svg></body></html>`)
	start := time.Now()
	h.showPage(chain.String())
	t.Logf("<use> chain answered in %v", time.Since(start))
	ov := h.overlayHTML()
	assert.Contains(t, ov, "svg1: not checked: it instantiates more than 100000 elements through &lt;use&gt;")
	assert.Len(t, layerRects(t, ov)["svg0"]["pops"], 1, "the other chart is still checked")
	h.escape()
	h.waitState("")

	shadows := `<!doctype html><html><body><div id="m"></div><script>
	const m = document.getElementById('m');
	for (let i = 0; i < 30000; i++) { const d = document.createElement('span'); d.attachShadow({ mode: 'open' }).innerHTML = '<svg width="4" height="4"><rect width="4" height="4" fill="#5f6b3a"/></svg>'; m.appendChild(d); }
	</script></body></html>`
	start = time.Now()
	h.showPage(shadows)
	t.Logf("30,000 shadow roots answered in %v", time.Since(start))
	h.escape()
	h.waitState("")

	icons := `<!doctype html><html><body>` + strings.Repeat(`<svg width="12" height="12" viewBox="0 0 12 12"><path d="M1 1h10v10H1z" fill="#3b5b7a"/><circle cx="6" cy="6" r="3" fill="#f2efe6"/></svg>`, 25000) + `</body></html>`
	start = time.Now()
	h.showPage(icons)
	t.Logf("25,000 icons answered in %v", time.Since(start))
	assert.NotContains(t, h.overlayHTML(), "could not check")
	h.escape()
	h.waitState("")
	h.showPage(chartPage)
	assert.Len(t, layerRects(t, h.overlayHTML())["svg0"]["pops"], 1)
}

// The read pass and the Go core share their caps.
func TestIssue10ReadPassCapsMatchTheCore(t *testing.T) {
	// The read pass as the command line evaluates it (constants.js, then
	// reader.js), loaded in Node: the caps it exports are the core's.
	out := runNode(t, Reader()+`
console.log(JSON.stringify([standoutReader.MAX_CHART_NODES, standoutReader.MAX_PAGE_NODES, standoutReader.MAX_USE_NODES]));`)
	assert.Equal(t, fmt.Sprintf("[%d,%d,%d]", snapshot.MaxNodes, snapshot.MaxPageNodes, snapshot.MaxUseNodes), strings.TrimSpace(out))
}

// The worker answers only messages of the shapes its scripts send.
func TestIssue10MessagesAreShapeChecked(t *testing.T) {
	h := newHarness(t)
	h.open("chrome-extension://" + h.extID + "/export.html#none")
	send := func(msg string) string {
		return h.eval(`chrome.runtime.sendMessage(` + msg + `).then((r) => JSON.stringify(r === undefined ? 'no answer' : r), (e) => 'refused: ' + e.message)`)
	}
	// A well-formed request gets an answer (here: nothing to take).
	assert.Contains(t, send(`{ type: 'standout/take-export', data: 'no-such-key' }`), "expired")
	for _, bad := range []string{
		`{ type: 'standout/take-export', data: { key: 1 } }`,
		`{ type: 'standout/reanalyse', data: { emphasisNodes: 'svg0#1', severity: 1 } }`,
		`{ type: 'standout/reanalyse', data: { emphasisNodes: ['svg0#1'], severity: 5 } }`,
		`{ type: 'standout/full-report', data: { emphasisNodes: [{}], severity: 1 } }`,
		`{ type: 'standout/capture', data: { charts: [{ name: 'x', box: [0, 0, 1] }], viewport: [1, 1] } }`,
		`{ type: 'standout/unknown' }`,
		`null`,
	} {
		got := send(bad)
		assert.True(t, strings.HasPrefix(got, "refused") || got == `"no answer"`, "%s was answered: %s", bad, got)
	}
}
