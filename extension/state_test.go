package extension

import (
	"encoding/json"
	"fmt"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// After an error the overlay stops watching the charts: a change of the
// page neither re-checks nor throws (issue 11: the observers stayed on and
// the next change re-ran a check into the error panel). The machine's own
// transitions are unit-tested in test/machine.test.js.
func TestIssue11NoWatchAfterError(t *testing.T) {
	h := newHarness(t)
	h.showPage(`<!doctype html><html><body style="margin:0">` + chartSVG + `</body></html>`)
	// The core now answers every check with an error, and counts them.
	h.inCore(`globalThis.testCalls = 0; globalThis.standoutHandle = () => { globalThis.testCalls++; return JSON.stringify({ ok: false, error: 'the core refused this check' }); }; 0`)
	h.eval(`document.querySelector('` + hostSelector + `').removeAttribute('data-state'), document.querySelectorAll('rect')[0].setAttribute('height', '70'), ''`)
	h.waitState("error")
	assert.Contains(t, h.overlayHTML(), "the core refused this check")
	calls := func() int {
		n, err := strconv.Atoi(h.coreValue(`String(globalThis.testCalls)`))
		require.NoError(t, err)
		return n
	}
	before := calls()
	require.Equal(t, 1, before)
	h.eval(`document.querySelectorAll('rect')[1].setAttribute('height', '40'), ''`)
	time.Sleep(1500 * time.Millisecond) // past the overlay's 600 ms debounce
	assert.Equal(t, before, calls(), "a change after the error ran another check")
	assert.Equal(t, "error", h.state())
	h.escape()
	h.waitState("")
}

// A press on a page that has not changed since the last check is answered
// with that check's answer, without the core; a changed page, or the
// same page with other options, runs the core again.
func TestPressOnUnchangedPageReusesTheAnswer(t *testing.T) {
	h := newHarness(t)
	h.showPage(chartPage)
	first := h.overlayHTML()
	h.trigger()
	h.waitState("")
	// Checks are counted; the background's training runs (fresh) are not.
	h.inCore(`globalThis.testCalls = 0; globalThis.testReal = globalThis.standoutHandle; globalThis.standoutHandle = (...a) => { if (!String(a[0]).includes('"fresh":true')) globalThis.testCalls++; return globalThis.testReal(...a); }; 0`)
	calls := func() int {
		n, err := strconv.Atoi(h.coreValue(`String(globalThis.testCalls)`))
		require.NoError(t, err)
		return n
	}
	h.trigger()
	h.waitState("ready")
	assert.Equal(t, 0, calls(), "the unchanged page ran the core again")
	assert.Equal(t, withoutHostState(first), withoutHostState(h.overlayHTML()), "the reused answer shows as the first did")
	h.trigger()
	h.waitState("")
	h.eval(`document.querySelectorAll('rect')[1].setAttribute('fill', '#3f5a8c'), ''`)
	h.trigger()
	h.waitState("ready")
	assert.Equal(t, 1, calls(), "the changed page reused an answer")
	assert.NotEqual(t, withoutHostState(first), withoutHostState(h.overlayHTML()), "the changed page shows its own answer")
	// A phone's width is another request: the re-check runs the core.
	chooseInOverlay(h, "screen", 1)
	require.Eventually(t, func() bool { return calls() == 2 }, 10*time.Second, 20*time.Millisecond)
	h.escape()
	h.waitState("")
}

// A press after an edit to one of a page's two charts judges that chart
// alone (the core recalls the other's digest, wasm/charts.go), and the
// overlay shows what a core that kept nothing shows.
func TestPressAfterEditJudgesTheEditedChartAlone(t *testing.T) {
	h := newHarness(t)
	second := strings.Replace(chartSVG, "<svg ", `<svg id="second" `, 1)
	h.showPage(`<!doctype html><html><body style="margin:0">` + chartSVG + second + `</body></html>`)
	h.trigger()
	h.waitState("")
	h.eval(`document.querySelectorAll('#second rect')[1].setAttribute('fill', '#3f5a8c'), ''`)
	h.trigger()
	h.waitState("ready")
	var timing struct{ Core map[string]float64 }
	hostTiming(t, h, &timing)
	assert.Equal(t, 1.0, timing.Core["recalledCharts"], "the chart the edit left alone was judged again: %v", timing.Core)
	recalled := h.overlayHTML()
	h.trigger()
	h.waitState("")
	require.Equal(t, 1, h.stopWorker(t)) // a fresh core keeps nothing
	h.worker = nil
	h.trigger()
	h.waitState("ready")
	hostTiming(t, h, &timing)
	require.Zero(t, timing.Core["recalledCharts"])
	assert.Equal(t, withoutHostState(h.overlayHTML()), withoutHostState(recalled))
	h.escape()
	h.waitState("")
}

// After the first press of a page, the reading and the answer cross
// between the page and the background as patches against the ones the
// other side holds (patch.js); after the background was stopped they
// cross whole again, and the overlay shows the same either way.
func TestPressesCrossAsPatches(t *testing.T) {
	h := newHarness(t)
	h.showPage(scatterCharts(1, 1000, ""))
	var timing struct {
		PageBytes, ResponseBytes, ReadSent, AnswerSent float64
		Reused                                         bool
	}
	read := func() {
		hostTiming(t, h, &timing)
		t.Logf("%+v", timing)
	}
	read()
	require.Positive(t, timing.PageBytes)
	assert.Equal(t, timing.PageBytes, timing.ReadSent, "the first reading crossed as a patch")
	assert.Equal(t, timing.ResponseBytes, timing.AnswerSent, "the first answer crossed as a patch")
	press := func() string {
		h.trigger()
		h.waitState("")
		h.trigger()
		h.waitState("ready")
		read()
		return withoutHostState(h.overlayHTML())
	}
	press()
	assert.True(t, timing.Reused)
	assert.Less(t, timing.ReadSent, timing.PageBytes/100, "the unchanged reading crossed whole")
	assert.Less(t, timing.AnswerSent, timing.ResponseBytes/100, "the reused answer crossed whole")
	// A new colour on the first mark takes the next entry of the chart's
	// paints table, which the reader keeps from its last reading, instead
	// of renumbering the paints after it (reader.js: keptPaints).
	h.eval(`document.querySelector('circle').setAttribute('fill', '#5d6e7f'), ''`)
	press()
	assert.False(t, timing.Reused)
	assert.Less(t, timing.ReadSent, timing.PageBytes/100, "the reading after a new colour on the first mark crossed whole")
	assert.Less(t, timing.AnswerSent, timing.ResponseBytes/4, "the edited page's answer crossed whole")
	// A mark added, then one taken away: the records after it are the
	// same numbers (snapshot/json.go, NameNext), and the reading crosses
	// as a patch.
	h.eval(`(() => { const c = document.querySelectorAll('circle')[500]; const n = c.cloneNode(); n.setAttribute('cx', '3'); c.before(n); return ''; })()`)
	press()
	assert.Less(t, timing.ReadSent, timing.PageBytes/100, "the reading after a mark was added crossed whole")
	h.eval(`document.querySelectorAll('circle')[700].remove(), ''`)
	press()
	assert.Less(t, timing.ReadSent, timing.PageBytes/100, "the reading after a mark was taken away crossed whole")
	h.eval(`document.querySelector('circle').setAttribute('fill', '#7f6e5d'), ''`)
	patched := press()
	assert.False(t, timing.Reused)
	assert.Less(t, timing.ReadSent, timing.PageBytes/100, "the edited reading crossed whole")
	assert.Less(t, timing.AnswerSent, timing.ResponseBytes/4, "the edited page's answer crossed whole")
	h.trigger()
	h.waitState("")
	require.Equal(t, 1, h.stopWorker(t)) // the background now holds nothing to patch against
	h.worker = nil
	h.trigger()
	h.waitState("ready")
	read()
	assert.Equal(t, timing.PageBytes, timing.ReadSent)
	assert.Equal(t, timing.ResponseBytes, timing.AnswerSent)
	assert.Equal(t, patched, withoutHostState(h.overlayHTML()), "the overlay differs with whole crossings")
	h.trigger()
	h.waitState("")
	// An overlay of an earlier version, still in the page after an update,
	// sends its reading whole as json and reads the answer whole from
	// response.
	h.inWorker(`globalThis.testOld = 0; chrome.tabs.query({}).then((ts) => chrome.scripting.executeScript({ target: { tabId: ts.find((x) => x.url.startsWith('http')).id }, func: () => {
	  const o = globalThis.standoutOverlay;
	  const old = (r) => (r && r.sent ? { json: r.sent.text, seq: r.seq, readMs: r.readMs, rasters: r.rasters, frames: r.frames, view: r.view } : r);
	  globalThis.standoutOverlay = Object.freeze({
	    press: () => { const r = o.press(); return r instanceof Promise ? r.then(old) : r; },
	    read: () => o.read().then(old),
	    show: (r) => { if (typeof r.response !== 'string' || r.answer !== undefined) throw new Error('the answer did not come whole'); return o.show(r); },
	    showError: o.showError,
	  });
	} })).then(() => { globalThis.testOld = 1; })`)
	require.Eventually(t, func() bool { return h.workerValue(`String(globalThis.testOld)`) == "1" }, 5*time.Second, 20*time.Millisecond)
	h.eval(`document.querySelector('circle').setAttribute('fill', '#5d6e7f'), ''`)
	h.trigger()
	h.waitState("ready")
	read()
	assert.Equal(t, timing.PageBytes, timing.ReadSent)
	assert.Equal(t, timing.ResponseBytes, timing.AnswerSent)
	h.escape()
	h.waitState("")
}

// Marks drawn as paths with titles, each with strings of its own in the
// reading: a bar added or taken away leaves the other records as they
// were (snapshot/json.go, NameNext and StrNext), and the reading crosses
// as a patch.
func TestAddedPathCrossesAsPatch(t *testing.T) {
	h := newHarness(t)
	var b strings.Builder
	b.WriteString(`<!doctype html><html><body style="margin:0"><svg width="900" height="400"><g>`)
	for i := range 300 {
		fill := "#4f7d6a"
		if i == 150 {
			fill = "#b04a2f"
		}
		// Invented heights.
		fmt.Fprintf(&b, `<path d="M%d 380V%dh2V380Z" fill="%s"><title>Day %d</title></path>`, 10+3*i, 380-(i*37)%300, fill, i+1)
	}
	b.WriteString(`</g></svg></body></html>`)
	h.showPage(b.String())
	var timing struct{ PageBytes, ReadSent float64 }
	press := func() {
		h.trigger()
		h.waitState("")
		h.trigger()
		h.waitState("ready")
		hostTiming(t, h, &timing)
		t.Logf("%+v", timing)
	}
	press()
	require.Positive(t, timing.PageBytes)
	h.eval(`(() => { const p = document.querySelectorAll('path')[100]; const n = p.cloneNode(true); n.setAttribute('d', 'M5 380V200h2V380Z'); n.firstChild.textContent = 'Day 0'; p.before(n); return ''; })()`)
	press()
	assert.Less(t, timing.ReadSent, timing.PageBytes/50, "the reading after a bar was added crossed whole")
	h.eval(`document.querySelectorAll('path')[200].remove(), ''`)
	press()
	assert.Less(t, timing.ReadSent, timing.PageBytes/50, "the reading after a bar was taken away crossed whole")
}

// The paints and styles tables the reader keeps from one reading of a
// chart to the next (reader.js: keptPaints) keep the entries no longer
// used only while they do not outnumber those in use by more than
// sixteen: a chart recoloured again and again reads with bounded tables,
// and each reading decodes. A chart of fifty styles of one fill (an
// opacity for each mark) reads the same, reading after reading, once the
// tables have started again from the entries in use. A reading of the
// page drops the tables of the charts it no longer has.
func TestKeptTablesStayBounded(t *testing.T) {
	h := newHarness(t)
	h.showPage(scatterCharts(1, 50, ""))
	// Forty readings in the overlay's world, the first mark given a colour
	// of its own before each: the paints and styles each reading carries.
	h.inWorker(`globalThis.testTables = null; chrome.tabs.query({}).then((ts) => chrome.scripting.executeScript({ target: { tabId: ts.find((x) => x.url.startsWith('http')).id }, func: async () => {
	  const sizes = [];
	  for (let i = 0; i < 40; i++) {
	    document.querySelector('circle').setAttribute('fill', 'rgb(' + (10 + i) + ', 90, 120)');
	    const s = (await globalThis.standoutReader.readPage(document)).snapshots[0];
	    sizes.push([s.paints.length / 3, s.styles.length / 7]);
	  }
	  const svg = document.querySelector('svg');
	  const at = svg.nextSibling;
	  svg.remove();
	  await globalThis.standoutReader.readPage(document);
	  document.body.insertBefore(svg, at);
	  const back = (await globalThis.standoutReader.readPage(document)).snapshots[0];
	  const returned = [back.paints.length / 3, back.styles.length / 7];
	  document.querySelectorAll('circle').forEach((c, i) => (c.setAttribute('fill', '#3b6e8f'), c.setAttribute('fill-opacity', String((i + 1) / 60))));
	  const again = [];
	  for (let i = 0; i < 4; i++) again.push(JSON.stringify((await globalThis.standoutReader.readPage(document)).snapshots[0]));
	  return JSON.stringify({ sizes, returned, same: again[1] === again[2] && again[2] === again[3] });
	} })).then(([r]) => { globalThis.testTables = r.result; })`)
	var got struct {
		Sizes    [][2]int
		Returned [2]int
		Same     bool
	}
	require.Eventually(t, func() bool { return h.workerValue(`String(globalThis.testTables)`) != "null" }, 20*time.Second, 50*time.Millisecond)
	require.NoError(t, json.Unmarshal([]byte(h.workerValue(`globalThis.testTables`)), &got))
	sizes := got.Sizes
	require.Len(t, sizes, 40)
	assert.True(t, got.Same, "readings of a chart of fifty styles of one fill differ")
	// A chart the page no longer had when it was read lost its tables: put
	// back, it reads as at first.
	assert.Equal(t, sizes[0], got.Returned, "the tables of a chart taken away and put back")
	t.Logf("paints and styles of each reading: %v", sizes)
	// In use: the chart's five colours, the first mark's own and the
	// root's and the group's black (the paints, after entry 0, none); at
	// most eight styles: the root's, the group's and those of the marks. A
	// reading carries what the last kept, at most twice what it used and
	// sixteen, and one new entry.
	grew, shrank := false, false
	for i, sz := range sizes {
		assert.LessOrEqual(t, sz[0], 1+2*7+16+1, "reading %d's paints", i)
		assert.LessOrEqual(t, sz[1], 2*8+16+1, "reading %d's styles", i)
		if i > 0 {
			grew = grew || sz[0] > sizes[i-1][0]
			shrank = shrank || sz[0] < sizes[i-1][0]
		}
	}
	assert.True(t, grew && shrank, "the tables kept the entries no longer used, then started again: %v", sizes)
	h.trigger()
	h.waitState("")
	h.trigger()
	h.waitState("ready")
	assert.NotEmpty(t, layerRects(t, h.overlayHTML())["svg0"], "the last reading judged")
}

// The core is trained (core.js: train), from the install
// on and after a slow check: it runs a request again, fresh, until its
// budget is spent; a check that needs the core stops it, and it takes up
// again after that check's answer, here on that check's request; the
// answers it leaves are the checks' own.
func TestCoreTrainedAfterASlowCheck(t *testing.T) {
	h := newHarness(t)
	h.showPage(scatterCharts(1, 5000, ""))
	first := h.overlayHTML()
	var st training
	status := func() { st = h.training(t) }
	require.Eventually(t, func() bool { status(); return st.Requests > 0 }, 20*time.Second, 20*time.Millisecond, "no training after the install and the first check")
	require.False(t, st.Finished, "training ended after %d requests: %+v", st.Requests, st)
	// A check on a changed page, while the core trains.
	h.trigger()
	h.waitState("")
	h.eval(`document.querySelector('circle').setAttribute('fill', '#5d6e7f'), ''`)
	h.trigger()
	h.waitState("ready")
	require.Eventually(t, func() bool { status(); return st.Finished }, 30*time.Second, 50*time.Millisecond, "training did not end: %+v", st)
	assert.Positive(t, st.Stops, "the check did not stop the training")
	assert.GreaterOrEqual(t, st.SpentMs, 2000.0, "training ended before its budget: %+v", st)
	// The last answer is still the check's own: the page as it was first
	// is another request, and the unchanged one is answered as before.
	changed := h.overlayHTML()
	h.trigger()
	h.waitState("")
	h.trigger()
	h.waitState("ready")
	assert.Equal(t, withoutHostState(changed), withoutHostState(h.overlayHTML()))
	assert.NotEqual(t, withoutHostState(first), withoutHostState(changed))
	h.escape()
	h.waitState("")
}

// withoutHostState leaves out of the overlay's markup the host's state and
// its record of the steps' timings, which differ from press to press.
func withoutHostState(html string) string {
	return regexp.MustCompile(` data-(timing|state)="[^"]*"`).ReplaceAllString(html, "")
}

// In Chromium the first press asks for "offscreen" (an optional permission
// that comes without a prompt), and from the next worker on the core runs
// in an offscreen document (core-host.js), loaded soon after the grant,
// that outlives the worker: a press after the worker stopped finds the
// core loaded and its memory of the page kept (wasm/charts.go), and shows
// what a fresh core shows. When the document has been idle (keep.js) the
// background closes it, and the next press makes it again.
func TestCoreOutlivesTheWorker(t *testing.T) {
	h := newHarness(t)
	h.showPage(chartPage)
	first := withoutHostState(h.overlayHTML())
	require.Eventually(t, func() bool {
		return h.workerValue(`chrome.permissions.contains({ permissions: ['offscreen'] }).then((g) => { globalThis.testGranted = g; }), String(globalThis.testGranted)`) == "true"
	}, 5*time.Second, 50*time.Millisecond, "the press did not get the offscreen permission")
	// The worker that asked keeps its core; the document loads one for
	// the next worker (background.js: prepareHost).
	assert.Equal(t, "function", h.workerValue(`typeof globalThis.standoutHandle`), "the worker that asked moved its core")
	require.Eventually(t, func() bool {
		return h.coreTarget() != "" && h.hostValue(`String(globalThis.standoutCore.loaded)`) == "true"
	}, 10*time.Second, 50*time.Millisecond, "no core loaded in an offscreen document after the grant")
	doc := h.coreTarget()
	var timing struct {
		CoreLoadMs float64
		Core       map[string]float64
	}
	press := func(what string) {
		h.trigger()
		h.waitState("")
		require.Equal(t, 1, h.stopWorker(t), what)
		h.worker = nil
		h.trigger()
		h.waitState("ready")
		hostTiming(t, h, &timing)
		assert.Equal(t, first, withoutHostState(h.overlayHTML()), what)
	}
	press("the first press in the document")
	assert.Equal(t, doc, h.coreTarget(), "the press did not find the document")
	assert.Zero(t, timing.Core["recalledCharts"], "a new core recalled a chart")
	press("a press after the worker stopped again")
	assert.Equal(t, doc, h.coreTarget(), "the document did not outlive the worker")
	assert.Equal(t, 1.0, timing.Core["recalledCharts"], "the core did not keep its memory of the page: %v", timing.Core)
	// The document tells the background it has been idle.
	h.hostValue(`chrome.runtime.sendMessage({ type: 'standout/host-idle' }).catch(() => {}), ''`)
	require.Eventually(t, func() bool { return h.coreTarget() == "" }, 5*time.Second, 50*time.Millisecond, "the idle document stayed open")
	press("the press after the idle document closed")
	require.NotEmpty(t, h.coreTarget(), "no document after the idle one closed")
	assert.Zero(t, timing.Core["recalledCharts"], "a new core recalled a chart")
	h.escape()
	h.waitState("")
}

// A core loaded ahead of a press touches, as it starts, the heap the last
// core's requests needed (core.js: roomToReserve; wasm/heap.go:
// reserve), so that its first request meets no new pages: the press's
// core records the most a request allocated in a mark, and the core the
// offscreen document loads after the grant (background.js: prepareHost)
// holds that and a quarter more. A fresh core holds about 3 MB; the
// request on 3,000 marks allocates several times that.
func TestCoreLoadsWithTheRoomItNeeds(t *testing.T) {
	h := newHarness(t)
	h.showPage(scatterPage(3000, ""))
	mark := func() float64 {
		v, err := strconv.ParseFloat(h.workerValue(`caches.open('standout').then((c) => c.match('https://standout.invalid/room')).then((r) => (r ? r.text() : '')).then((v) => { globalThis.testRoom = v; }), String(globalThis.testRoom || '')`), 64)
		if err != nil {
			return 0
		}
		return v
	}
	var room float64
	require.Eventually(t, func() bool { room = mark(); return room > 0 }, 5*time.Second, 50*time.Millisecond, "the press left no mark of its heap")
	allocated, err := strconv.ParseFloat(h.coreValue(`String(globalThis.standoutHandleAllocated)`), 64)
	require.NoError(t, err)
	assert.GreaterOrEqual(t, room, allocated, "the mark holds less than the press's core allocated")
	assert.Greater(t, room, float64(4<<20), "a check of 3,000 marks allocated only %.0f bytes", room)
	require.Eventually(t, func() bool {
		return h.coreTarget() != "" && h.hostValue(`String(globalThis.standoutCore.loaded)`) == "true"
	}, 10*time.Second, 50*time.Millisecond, "no core loaded in an offscreen document after the grant")
	held, err := strconv.ParseFloat(h.hostValue(`String(globalThis.standoutCore.held)`), 64)
	require.NoError(t, err)
	t.Logf("the mark: %.0f bytes; the document's core holds %.0f before any request", room, held)
	assert.GreaterOrEqual(t, held, 1.25*room, "the document's core holds %.0f bytes before any request, against a mark of %.0f", held, room)
}

// A press whose offscreen document goes away before it answers (closed by
// the browser, or its process lost) fails with an error that says so,
// instead of waiting for ever; the next press makes the document again.
func TestPressWhenTheCoreDocumentCloses(t *testing.T) {
	h := newHarness(t)
	h.showPage(chartPage)
	require.Eventually(t, func() bool { return h.coreTarget() != "" }, 10*time.Second, 50*time.Millisecond, "no offscreen document after the grant")
	h.trigger()
	h.waitState("")
	require.Equal(t, 1, h.stopWorker(t))
	h.worker = nil
	// The document no longer hands requests to its core's worker, so
	// none is answered.
	h.hostValue(`Worker.prototype.postMessage = function () {}, ''`)
	h.trigger()
	h.waitState("reading")
	closeTarget(t, h, h.coreTarget())
	h.waitState("error")
	assert.Contains(t, h.overlayHTML(), "the Standout core stopped before it answered")
	h.escape()
	h.waitState("")
	h.trigger()
	h.waitState("ready")
	assert.NotEmpty(t, layerRects(t, h.overlayHTML())["svg0"]["pops"])
	assert.NotEmpty(t, h.coreTarget(), "no document for the press after")
}
