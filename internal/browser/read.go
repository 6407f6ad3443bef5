package browser

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"sync"
	"time"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/emulation"
	"github.com/chromedp/cdproto/page"
	"github.com/chromedp/cdproto/runtime"
	"github.com/chromedp/chromedp"
)

// PageResult is what the read pass found on one page.
type PageResult struct {
	URL string
	// View is the width and scheme the page was read in.
	View View
	// JSON is the read pass's result: {source, snapshots, problems, readMs}.
	JSON string
	// Screenshot is a PNG of the page's full height when requested.
	Screenshot []byte
	// Rasters are PNGs of the page's charts drawn as pixels, by the name
	// the read pass gave each (canvas0, img1), when requested.
	Rasters map[string][]byte
	// Frames are the read pass's results in frames of other origins.
	Frames []FrameRead
	// EmphasisBoxes are the boxes, in page CSS px, of the elements outside
	// any SVG that the emphasis selector matches in the page: a place in
	// a chart drawn as pixels (an annotation laid over it, an image map's
	// area), when rasters and an emphasis selector are asked for.
	EmphasisBoxes [][4]float64
	// LoadMs and ReadMs time the page load (until the DOM is stable) and
	// the read pass.
	LoadMs, ReadMs float64
	Err            error
}

// ReadOptions configure a batch read.
type ReadOptions struct {
	// Tabs is how many pages load at once (at least 1).
	Tabs int
	// Screenshot asks for a full-page PNG of each page.
	Screenshot bool
	// Rasters asks for a PNG of each chart drawn as pixels (up to
	// MaxRasterShots a page), cut from the rendered page by its box.
	Rasters bool
	// Timeout bounds each page.
	Timeout time.Duration
	// Progress, if set, is called after each page.
	Progress func(done, total int, r *PageResult)
	// Reader is the read pass's source: the extension's reader.js.
	Reader string
	// Emphasis is a CSS selector naming the intended emphasis.
	Emphasis string
	// Views are the widths and colour schemes each page is read in, one
	// result per page and view; none, or the zero View, leaves the
	// browser's own.
	Views []View
	// Stop, when done, ends the reads by closing the browser as a user
	// would (CDP's Browser.close, for up to closeWait), so that it tidies
	// up after itself: a browser killed at once can leave its temporary
	// files behind in TMPDIR. The allocator's own context should not be
	// Stop's, or the browser is killed first.
	Stop context.Context
}

// closeWait is how long a browser closed by ReadOptions.Stop may take to
// stop before it is killed.
const closeWait = 5 * time.Second

// View is how a reader gets the page: the viewport's width in CSS px (a
// phone's is narrow) and the colour scheme its prefers-color-scheme
// reports ("light" or "dark").
type View struct {
	Width  int    `json:"width,omitempty"`
	Scheme string `json:"scheme,omitempty"`
}

// viewHeight is the viewport's height in a View: a tall phone or a
// laptop's window, which charts below it are measured in regardless.
const viewHeight = 900

// emulate sets the tab's viewport and colour scheme before the page loads,
// through CDP's device metrics and media emulation. Widths under 600 px
// are a phone's: mobile layout (meta viewport honoured).
func emulate(ctx context.Context, v View) error {
	if v == (View{}) {
		return nil
	}
	_, err := chromedp.Run(ctx, func(ctx context.Context, tg *chromedp.Target) (chromedp.Void, error) {
		if v.Width > 0 {
			if _, err := cdp.Call(ctx, tg, emulation.SetDeviceMetricsOverride, emulation.SetDeviceMetricsOverrideParams{
				Width: int64(v.Width), Height: viewHeight, DeviceScaleFactor: 1, Mobile: v.Width < 600}); err != nil {
				return chromedp.Void{}, err
			}
		}
		if v.Scheme != "" {
			if _, err := cdp.Call(ctx, tg, emulation.SetEmulatedMedia, emulation.SetEmulatedMediaParams{
				Features: []*emulation.MediaFeature{{Name: "prefers-color-scheme", Value: v.Scheme}}}); err != nil {
				return chromedp.Void{}, err
			}
		}
		return chromedp.Void{}, nil
	})
	return err
}

// stableJS resolves once the document has loaded and its element count
// has not changed for 400 ms (charts drawn by script have rendered), or
// after 8 s.
const stableJS = `new Promise((resolve) => {
  const t0 = performance.now();
  let last = -1, since = performance.now();
  const tick = () => {
    const n = document.getElementsByTagName('*').length;
    if (n !== last) { last = n; since = performance.now(); }
    if ((document.readyState === 'complete' && performance.now() - since >= 400) || performance.now() - t0 > 8000) { resolve(true); return; }
    setTimeout(tick, 50);
  };
  tick();
})`

// ErrStart says that the browser did not start.
var ErrStart = errors.New("starting the browser")

// ReadPages loads each URL in a headless Chromium (browserCtx comes from
// NewAllocator) in each of o.Views and runs the extension's own read pass
// on it, with at most o.Tabs pages open at once. Results are in the order
// of the views, then of urls (view v, page i at v·len(urls)+i); a page
// that cannot be loaded has Err set and does not stop the others.
func ReadPages(browserCtx context.Context, urls []string, o ReadOptions) []PageResult {
	if o.Tabs < 1 {
		o.Tabs = 1
	}
	if o.Timeout <= 0 {
		o.Timeout = 60 * time.Second
	}
	// Start the browser once before the tabs fan out.
	bctx, cancel := chromedp.NewContext(browserCtx)
	defer cancel()
	if o.Stop != nil {
		closed := make(chan struct{})
		stop := context.AfterFunc(o.Stop, func() {
			defer close(closed)
			ctx, cancel := context.WithTimeout(bctx, closeWait)
			defer cancel()
			chromedp.Cancel(ctx)
		})
		defer func() {
			if !stop() {
				<-closed
			}
		}()
	}
	views := o.Views
	if len(views) == 0 {
		views = []View{{}}
	}
	out := make([]PageResult, len(urls)*len(views))
	if err := chromedp.Do(bctx, chromedp.Navigate("about:blank")); err != nil {
		for j := range out {
			out[j] = PageResult{URL: urls[j%len(urls)], View: views[j/len(urls)], Err: fmt.Errorf("%w: %w", ErrStart, err)}
		}
		return out
	}
	reader := o.Reader
	jobs := make(chan int)
	var wg sync.WaitGroup
	var mu sync.Mutex
	done := 0
	for w := 0; w < o.Tabs; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for j := range jobs {
				v := views[j/len(urls)]
				r := readOne(bctx, urls[j%len(urls)], reader, o, v)
				r.View = v
				out[j] = r
				mu.Lock()
				done++
				if o.Progress != nil {
					o.Progress(done, len(out), &out[j])
				}
				mu.Unlock()
			}
		}()
	}
	for j := range out {
		jobs <- j
	}
	close(jobs)
	wg.Wait()
	return out
}

// isolatedWorld creates an isolated world in the page's main frame and
// returns the option that evaluates there.
func isolatedWorld(ctx context.Context) (chromedp.EvaluateOption, runtime.ExecutionContextID, error) {
	id, err := chromedp.Run(ctx, func(ctx context.Context, tg *chromedp.Target) (runtime.ExecutionContextID, error) {
		tree, err := cdp.Call(ctx, tg, page.GetFrameTree, cdp.Empty{})
		if err != nil {
			return 0, err
		}
		w, err := cdp.Call(ctx, tg, page.CreateIsolatedWorld, page.CreateIsolatedWorldParams{FrameID: tree.FrameTree.Frame.ID, WorldName: "standout"})
		return w.ExecutionContextID, err
	})
	if err != nil {
		return nil, 0, fmt.Errorf("creating an isolated world: %w", err)
	}
	return func(p *runtime.EvaluateParams) { p.ContextID = id }, id, nil
}

func readOne(bctx context.Context, url, reader string, o ReadOptions, view View) PageResult {
	r := PageResult{URL: url}
	tctx, cancel := chromedp.NewContext(bctx)
	defer cancel()
	ctx, cancel2 := context.WithTimeout(tctx, o.Timeout)
	defer cancel2()
	if err := emulate(ctx, view); err != nil {
		r.Err = fmt.Errorf("emulating %d px, %s scheme: %w", view.Width, view.Scheme, err)
		return r
	}
	t0 := time.Now()
	resp, err := chromedp.RunResponse(ctx, chromedp.Navigate(url))
	if err != nil {
		r.Err = fmt.Errorf("loading %s: %w", url, err)
		return r
	}
	if resp != nil && resp.Status >= 400 {
		r.Err = fmt.Errorf("loading %s: HTTP %d", url, resp.Status)
		return r
	}
	// Everything runs in an isolated world of the page's own: the page's
	// scripts can neither see nor replace the read pass's globals (a page
	// that predefined standoutReader could otherwise forge its result) nor
	// the built-ins the read pass calls.
	world, worldID, err := isolatedWorld(ctx)
	if err != nil {
		r.Err = fmt.Errorf("reading %s: %w", url, err)
		return r
	}
	if _, err := chromedp.Run(ctx, chromedp.Evaluate[bool](stableJS, chromedp.EvalAwaitPromise, world)); err != nil {
		r.Err = fmt.Errorf("waiting for %s to render: %w", url, err)
		return r
	}
	r.LoadMs = float64(time.Since(t0).Microseconds()) / 1000
	t1 := time.Now()
	if _, err := chromedp.Run(ctx, chromedp.Evaluate[chromedp.Void](reader, world)); err != nil {
		r.Err = fmt.Errorf("reading %s: %w", url, err)
		return r
	}
	opts, _ := json.Marshal(map[string]string{"emphasis": o.Emphasis})
	js, err := chromedp.Run(ctx, chromedp.Evaluate[string](`globalThis.standoutReader.readPage(document, `+string(opts)+`).then((p) => JSON.stringify(p))`, chromedp.EvalAwaitPromise, world))
	if err != nil {
		r.Err = fmt.Errorf("reading %s: %w", url, err)
		return r
	}
	head, err := headOf(js)
	if err != nil {
		r.Err = fmt.Errorf("reading %s: %w", url, err)
		return r
	}
	// Frames of other origins, which the read pass cannot enter, CDP can.
	if r.Frames, err = readOtherOrigins(ctx, head.Problems, reader, string(opts), worldID); err != nil {
		r.Err = fmt.Errorf("reading the frames of %s: %w", url, err)
		return r
	}
	r.JSON = js
	r.ReadMs = float64(time.Since(t1).Microseconds()) / 1000
	if o.Rasters && o.Emphasis != "" {
		if r.EmphasisBoxes, err = emphasisBoxes(ctx, o.Emphasis, world); err != nil {
			r.Err = fmt.Errorf("finding the emphasis %q on %s: %w", o.Emphasis, url, err)
			return r
		}
	}
	if o.Rasters {
		if r.Rasters, err = rasterShots(ctx, head, r.Frames); err != nil {
			r.Err = fmt.Errorf("capturing the charts drawn as pixels on %s: %w", url, err)
			return r
		}
	}
	if o.Screenshot {
		if r.Screenshot, err = fullPage(ctx); err != nil {
			r.Err = fmt.Errorf("screenshot of %s: %w", url, err)
		}
	}
	return r
}

// fullPage is a PNG of the page's full height.
func fullPage(ctx context.Context) ([]byte, error) {
	return chromedp.Run(ctx, func(ctx context.Context, tg *chromedp.Target) ([]byte, error) {
		beyond := true
		res, err := cdp.Call(ctx, tg, page.CaptureScreenshot, page.CaptureScreenshotParams{Format: page.CaptureScreenshotFormatPng, CaptureBeyondViewport: &beyond})
		return res.Data, err
	})
}

// MaxRasterShots bounds the charts drawn as pixels captured on one page,
// and MaxRasterPixels the size of each (4 Mpx: the saliency map holds a
// few float planes of it).
const (
	MaxRasterShots  = 16
	MaxRasterPixels = 4 << 20
)

// rasterShots captures each chart drawn as pixels that the read pass
// named, in the page or in a frame of another origin (its result's
// rasters: name and box in page CSS px), as a PNG at
// one image pixel per CSS px, from beyond the viewport where it lies
// there.
func rasterShots(ctx context.Context, top readHead, frames []FrameRead) (map[string][]byte, error) {
	all := top.Rasters
	for _, f := range frames {
		fh, err := headOf(f.JSON)
		if err != nil {
			return nil, err
		}
		for _, r := range fh.Rasters {
			all = append(all, raster{f.Prefix + r.Name, [4]float64{r.Box[0] + f.Dx, r.Box[1] + f.Dy, r.Box[2], r.Box[3]}})
		}
	}
	out := map[string][]byte{}
	for _, rr := range all {
		if len(out) >= MaxRasterShots {
			break
		}
		b := rr.Box
		if !(b[2] >= 1 && b[3] >= 1) || b[2] > 8192 || b[3] > 8192 || b[2]*b[3] > MaxRasterPixels {
			continue
		}
		shot, err := chromedp.Run(ctx, func(ctx context.Context, tg *chromedp.Target) ([]byte, error) {
			beyond := true
			clip := &page.Viewport{X: b[0], Y: b[1], Width: b[2], Height: b[3], Scale: 1}
			res, err := cdp.Call(ctx, tg, page.CaptureScreenshot, page.CaptureScreenshotParams{Format: page.CaptureScreenshotFormatPng, Clip: clip, CaptureBeyondViewport: &beyond})
			return res.Data, err
		})
		if err != nil {
			return nil, err
		}
		out[rr.Name] = shot
	}
	return out, nil
}

// readHead is what the browser reader itself needs of a reading: its notes
// (for the frames it could not enter) and its charts drawn as pixels.
type readHead struct {
	Problems []string `json:"problems"`
	Rasters  []raster `json:"rasters"`
}

type raster struct {
	Name string     `json:"name"`
	Box  [4]float64 `json:"box"`
}

func headOf(readJSON string) (readHead, error) {
	var h readHead
	err := json.Unmarshal([]byte(readJSON), &h)
	return h, err
}

// emphasisBoxes finds the boxes, in page CSS px, of the first 1,000
// elements outside any SVG that the selector matches, in the read pass's
// isolated world.
func emphasisBoxes(ctx context.Context, selector string, world chromedp.EvaluateOption) ([][4]float64, error) {
	js, err := chromedp.Run(ctx, chromedp.Evaluate[string](`JSON.stringify(Array.from(document.querySelectorAll(`+string(quote(selector))+`)).slice(0, 1000)
		.filter((e) => !(e instanceof SVGElement)).map((e) => { const r = e.getBoundingClientRect(); return [r.left + scrollX, r.top + scrollY, r.width, r.height]; }))`, world))
	if err != nil {
		return nil, err
	}
	var out [][4]float64
	return out, json.Unmarshal([]byte(js), &out)
}

// quote is s as a JSON (and so JavaScript) string literal.
func quote(s string) []byte {
	b, _ := json.Marshal(s)
	return b
}
