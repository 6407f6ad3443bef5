// Package main is the WebAssembly core of the extension: a thin layer that
// takes the read pass's snapshots as one JSON request and returns the
// report as one JSON response. The request handling (this file) is plain
// Go and tests natively; main_js.go only moves strings across syscall/js.
package main

import (
	"runtime"
	"strconv"

	"standout/internal/jsonio"
	"standout/internal/report"
	"standout/snapshot"
)

// Request is what the extension sends.
type Request struct {
	// Type is "analyse".
	Type   string `json:"type"`
	Source string `json:"source"`
	// Snapshots are the charts the read pass found.
	Snapshots []snapshot.Snapshot `json:"snapshots"`
	// Problems are page-level notes from the read pass (frames that could
	// not be read, …).
	Problems []string `json:"problems"`
	// Rasters are the page's charts drawn as pixels.
	Rasters []snapshot.Raster `json:"rasters"`
	// Emphasis names the intended emphasis by mark id; EmphasisNodes by
	// chart path and snapshot node, as "path#node" (the overlay's picks,
	// which it knows by the digest's node indices).
	Emphasis      []string `json:"emphasis"`
	EmphasisNodes []string `json:"emphasisNodes"`
	Severity      *float64 `json:"severity"`
	// Full asks for the whole report and its Markdown; otherwise the
	// response carries the overlay's digest (what the overlay draws and
	// lists).
	Full       bool    `json:"full"`
	DistanceCM float64 `json:"distanceCm"`
	PxPerInch  float64 `json:"pxPerInch"`
	// PhoneWidth, when set, judges the charts as scaled to a phone's
	// width (report.Options.PhoneWidth).
	PhoneWidth float64 `json:"phoneWidth"`
	// Frames place the readings of frames of other origins, which come
	// after the page (HandlePage): each one's name in the page and the
	// offset of its content box in page px.
	Frames []FramePlace `json:"frames"`
	// Pixels are the press's judgements of the charts drawn as pixels,
	// which the overlay keeps and sends with a request for the whole
	// report; Pick is a point the reader picked on one of them.
	Pixels []PixelJudgement `json:"pixels"`
	Pick   *PixelPick       `json:"pick"`
	// Fresh judges every chart again, with nothing kept, and keeps
	// nothing for the next request (charts.go): the background's training
	// requests, which must run the whole analysis, the neighbour search
	// included, and leave the last check's digests alone.
	Fresh bool `json:"fresh"`

	// options and raw are the request's options and each snapshot's JSON
	// as the page gave them, when the charts' digests may be recalled and
	// kept (charts.go).
	options []byte
	raw     [][]byte
	// known are the charts of the last page judged under these options,
	// which the decoder skips where they come again in their places;
	// skipped says which it skipped (their Snapshots are empty).
	known   []snapshot.Known
	skipped []bool
}

// PixelJudgement is one chart drawn as pixels as the press judged it: its
// salient regions per vision type, boxes in the chart's own px (Saliency).
type PixelJudgement struct {
	Name    string                     `json:"name"`
	Regions map[string][]report.Region `json:"regions"`
}

// PixelPick is a point picked on a chart drawn as pixels, in its own px.
type PixelPick struct {
	Name string  `json:"name"`
	X    float64 `json:"x"`
	Y    float64 `json:"y"`
}

// FramePlace is where a frame's reading goes in its page.
type FramePlace struct {
	Prefix string  `json:"prefix"`
	Dx     float64 `json:"dx"`
	Dy     float64 `json:"dy"`
}

// Response is what the core answers: a report, or an error.
type Response struct {
	OK     bool           `json:"ok"`
	Error  string         `json:"error,omitempty"`
	Report *report.Report `json:"report,omitempty"`
	// Overlay is the report's digest for drawing (digest.go).
	Overlay *report.Digest `json:"overlay,omitempty"`
	// Markdown is the report, ready for a ticket.
	Markdown string `json:"markdown,omitempty"`
	// Timing is how long each step took inside the core, in ms.
	Timing map[string]float64 `json:"timing,omitempty"`
}

// Handle answers one request given as one JSON document. It never
// panics: a panic becomes an error response with the stack, so nothing
// crosses into JavaScript.
func Handle(req []byte) (out []byte) {
	defer recoverTo(&out)
	t0 := now()
	// The options' decoder skips the page's fields and the page's decoder
	// the options'.
	q, err := parseOptions(req)
	if err != nil {
		return errorResponse("bad request: " + err.Error())
	}
	p, err := snapshot.DecodePage(req)
	if err != nil {
		return errorResponse("bad request: " + err.Error())
	}
	q.Source, q.Snapshots, q.Problems, q.Rasters = p.Source, p.Snapshots, p.Problems, p.Rasters
	return handle(q, t0)
}

// HandlePage answers a request whose page (the read pass's JSON, with
// source, snapshots and problems) comes apart from its options: the page
// is decoded by the fast snapshot decoder.
// The readings of frames of other origins follow the page, one for each
// of the options' frames.
func HandlePage(options, page []byte, frames ...[]byte) (out []byte) {
	defer recoverTo(&out)
	t0 := now()
	q, err := parseOptions(options)
	if err != nil {
		return errorResponse("bad request: " + err.Error())
	}
	if len(frames) == 0 && !q.Fresh && !q.Full {
		// A digest: the charts judged last need not be decoded again.
		q.known = charts.known(options)
	}
	p, err := snapshot.DecodePageKnowing(page, q.known)
	if err != nil {
		return errorResponse("bad page: " + err.Error())
	}
	q.skipped = p.Skipped
	if len(frames) != len(q.Frames) {
		return errorResponse("bad request: " + strconv.Itoa(len(frames)) + " frame readings for " + strconv.Itoa(len(q.Frames)) + " frames")
	}
	for i, f := range frames {
		fp, err := snapshot.DecodePage(f)
		if err != nil {
			return errorResponse("bad frame " + q.Frames[i].Prefix + ": " + err.Error())
		}
		p.MergeFrame(fp, q.Frames[i].Prefix, q.Frames[i].Dx, q.Frames[i].Dy)
	}
	if len(frames) > 0 {
		total := 0
		for _, s := range p.Snapshots {
			total += len(s.Nodes)
		}
		if total > snapshot.MaxPageNodes {
			return errorResponse("the page's charts and its frames' have more than " + strconv.Itoa(snapshot.MaxPageNodes) + " elements, more than one check takes")
		}
	}
	q.Source, q.Snapshots, q.Problems, q.Rasters = p.Source, p.Snapshots, p.Problems, p.Rasters
	if len(frames) == 0 && !q.Fresh {
		// A frame's charts are moved into the page after decoding: their
		// JSON as read is not what is judged.
		q.options, q.raw = options, p.Raw
	}
	return handle(q, t0)
}

// parseFrames reads the options' frames: [{prefix, dx, dy}, …].
func parseFrames(d *jsonio.Scanner) ([]FramePlace, error) {
	var out []FramePlace
	err := d.Array(func() error {
		var f FramePlace
		err := d.Object(func(key string) error {
			var err error
			switch key {
			case "prefix":
				f.Prefix, err = d.Text()
			case "dx":
				f.Dx, err = d.Number()
			case "dy":
				f.Dy, err = d.Number()
			default:
				err = d.Skip()
			}
			return err
		})
		out = append(out, f)
		return err
	})
	return out, err
}

// parseOptions reads a request's options (every field but the page's)
// with the snapshot decoder's scanner: encoding/json would bring its
// reflection into every check, and its code runs unoptimised on the
// extension's first one.
func parseOptions(b []byte) (*Request, error) {
	q := &Request{}
	d := jsonio.New(b)
	err := d.Object(func(key string) error {
		var err error
		switch key {
		case "type":
			q.Type, err = d.Text()
		case "emphasis":
			q.Emphasis, err = d.Strings(q.Emphasis[:0])
		case "emphasisNodes":
			q.EmphasisNodes, err = d.Strings(q.EmphasisNodes[:0])
		case "severity":
			if !d.Null() {
				var v float64
				if v, err = d.Number(); err == nil {
					q.Severity = &v
				}
			}
		case "full":
			q.Full, err = d.Bool()
		case "fresh":
			q.Fresh, err = d.Bool()
		case "distanceCm":
			q.DistanceCM, err = d.Number()
		case "pxPerInch":
			q.PxPerInch, err = d.Number()
		case "phoneWidth":
			q.PhoneWidth, err = d.Number()
		case "frames":
			q.Frames, err = parseFrames(d)
		case "pixels":
			q.Pixels, err = parsePixels(d)
		case "pick":
			q.Pick, err = parsePick(d)
		default:
			err = d.Skip()
		}
		return err
	})
	if err == nil {
		err = d.End()
	}
	return q, err
}

func recoverTo(out *[]byte) {
	if r := recover(); r != nil {
		msg := "a panic of an unexpected kind"
		switch v := r.(type) {
		case error:
			msg = v.Error()
		case string:
			msg = v
		}
		*out = errorResponse("internal error: " + msg + "\n" + string(stack()))
	}
}

// stack is runtime/debug.Stack, written here because runtime/debug
// brings fmt and os into the module.
func stack() []byte {
	buf := make([]byte, 1024)
	for {
		n := runtime.Stack(buf, false)
		if n < len(buf) {
			return buf[:n]
		}
		buf = make([]byte, 2*len(buf))
	}
}

// ms is the milliseconds since t (now).
func ms(t float64) float64 { return now() - t }

func handle(q *Request, t0 float64) []byte {
	timing := map[string]float64{}
	if q.Type != "analyse" {
		return errorResponse("unknown request type " + strconv.Quote(q.Type))
	}
	set := report.DefaultSettings
	if q.Severity != nil {
		set.Severity = *q.Severity
	}
	set.DistanceCM, set.PxPerInch, set.PhoneWidth = q.DistanceCM, q.PxPerInch, q.PhoneWidth
	set.EmphasisIDs, set.EmphasisNodes = q.Emphasis, q.EmphasisNodes
	// The overlay's digest needs the CVD re-analysis of the emphasis only.
	set.FindingsOnly = !q.Full
	opt, err := set.Options()
	if err != nil {
		return errorResponse("bad request: " + err.Error())
	}
	if !q.Fresh {
		opt.Params.Kept = charts.analysisKept()
	}
	timing["decodeMs"] = ms(t0)
	t1 := now()
	if !q.Full {
		return digestResponse(q, opt, timing, t1)
	}
	as, err := report.AnalyseSnapshots(q.Snapshots, opt)
	timing["analyseMs"] = ms(t1)
	if err != nil {
		return errorResponse(err.Error())
	}
	return fullReport(q, as, timing, now())
}

// digestResponse answers with the overlay's digest, written by hand
// (encoding/json's reflection over thousands of marks is slow under
// WebAssembly), judging only the charts whose digests are not kept from
// the last request (charts.go).
func digestResponse(q *Request, opt report.Options, timing map[string]float64, t1 float64) []byte {
	p, err := recallCharts(q)
	if err != nil {
		return errorResponse("bad page: " + err.Error())
	}
	as, err := report.AnalyseSnapshots(p.snapshots(), opt)
	timing["analyseMs"] = ms(t1)
	if err != nil {
		return errorResponse(err.Error())
	}
	recalled, size := p.recalled()
	timing["recalledCharts"] = float64(recalled)
	timing["decodedCharts"] = float64(p.decoded)
	t2 := now()
	b := append(make([]byte, 0, 64+80*report.CountMarks(as)+size), `{"ok":true,"overlay":`...)
	b = p.write(b, append(q.Problems, report.UncheckedNotes(report.UncheckedOf(q.Rasters))...), as)
	timing["encodeMs"] = ms(t2)
	b = append(b, `,"timing":`...)
	b = jsonio.AppendMap(b, timing, jsonio.AppendNumber)
	return append(b, '}')
}

func errorResponse(msg string) []byte {
	b := append(make([]byte, 0, len(msg)+32), `{"ok":false,"error":`...)
	b = jsonio.AppendString(b, msg)
	return append(b, '}')
}
