// Package main is the WebAssembly core of the extension: a thin layer that
// takes the read pass's snapshots as one JSON request and returns the
// report as one JSON response. The request handling (this file) is plain
// Go and tests natively; main_js.go only moves strings across syscall/js.
package main

import (
	"encoding/json"
	"fmt"
	"runtime/debug"
	"strings"
	"time"

	"standout/dom"
	"standout/internal/report"
	"standout/perception/colour"
)

// Request is what the extension sends.
type Request struct {
	// Type is "analyse".
	Type   string `json:"type"`
	Source string `json:"source"`
	// Snapshots are the charts the read pass found.
	Snapshots []dom.Snapshot `json:"snapshots"`
	// Problems are page-level notes from the read pass (frames that could
	// not be read, …).
	Problems []string `json:"problems"`
	// Emphasis names the intended emphasis by mark id.
	Emphasis []string `json:"emphasis"`
	Severity *float64 `json:"severity"`
	// Full asks for the whole report; otherwise the response carries the
	// overlay's digest (what the overlay draws and lists) and the Markdown.
	Full       bool    `json:"full"`
	DistanceCM float64 `json:"distanceCm"`
	PxPerInch  float64 `json:"pxPerInch"`
}

// Response is what the core answers: a report, or an error.
type Response struct {
	OK     bool           `json:"ok"`
	Error  string         `json:"error,omitempty"`
	Report *report.Report `json:"report,omitempty"`
	// Overlay is the report's digest for drawing: per chart the marks'
	// ids, boxes and verdicts, the findings and the emphasis.
	Overlay *Digest `json:"overlay,omitempty"`
	// Markdown is the same report, ready for a ticket.
	Markdown string `json:"markdown,omitempty"`
	// Timing is how long each step took inside the core, in ms.
	Timing map[string]float64 `json:"timing,omitempty"`
}

// Handle answers one request given as one JSON document. It never
// panics: a panic becomes an error response with the stack, so nothing
// crosses into JavaScript.
func Handle(req []byte) (out []byte) {
	defer recoverTo(&out)
	t0 := time.Now()
	var q Request
	if err := json.Unmarshal(req, &q); err != nil {
		return errorResponse("bad request: " + err.Error())
	}
	return handle(&q, t0)
}

// HandlePage answers a request whose page (the read pass's JSON, with
// source, snapshots and problems) comes apart from its options: the page
// is decoded by the fast snapshot decoder, the options by encoding/json.
func HandlePage(options, page []byte) (out []byte) {
	defer recoverTo(&out)
	t0 := time.Now()
	var q Request
	if err := json.Unmarshal(options, &q); err != nil {
		return errorResponse("bad request: " + err.Error())
	}
	p, err := dom.DecodePage(page)
	if err != nil {
		return errorResponse("bad page: " + err.Error())
	}
	q.Source, q.Snapshots, q.Problems = p.Source, p.Snapshots, p.Problems
	return handle(&q, t0)
}

func recoverTo(out *[]byte) {
	if r := recover(); r != nil {
		*out = errorResponse(fmt.Sprintf("internal error: %v\n%s", r, debug.Stack()))
	}
}

func handle(q *Request, t0 time.Time) []byte {
	ms := func(t time.Time) float64 { return float64(time.Since(t).Microseconds()) / 1000 }
	timing := map[string]float64{}
	if q.Type != "analyse" {
		return errorResponse(fmt.Sprintf("unknown request type %q", q.Type))
	}
	opt := report.DefaultOptions
	if q.Severity != nil {
		if !(*q.Severity >= 0 && *q.Severity <= 1) {
			return errorResponse("severity must be within [0, 1]")
		}
		opt.Params.Severity = *q.Severity
	}
	if q.DistanceCM > 0 && q.PxPerInch > 0 {
		opt.Params.ND.Viewing = colour.Viewing{DistanceCM: q.DistanceCM, CSSPxPerInch: q.PxPerInch}
	}
	// The overlay's digest needs the CVD re-analysis of the emphasis only.
	opt.Params.CVDEmphasisOnly = !q.Full
	if len(q.Emphasis) > 0 {
		opt.IDs = map[string]bool{}
		for _, id := range q.Emphasis {
			opt.IDs[id] = true
		}
	}
	timing["decodeMs"] = ms(t0)
	t1 := time.Now()
	page, _, err := report.FromSnapshots(q.Source, q.Snapshots, q.Problems, opt)
	timing["analyseMs"] = ms(t1)
	if err != nil {
		return errorResponse(err.Error())
	}
	rep := &report.Report{Schema: "standout-report", Version: report.Version, Pages: []report.Page{page}, Caution: report.Caution}
	t2 := time.Now()
	var md strings.Builder
	report.WriteMarkdown(&md, rep, nil)
	timing["markdownMs"] = ms(t2)
	// Encoding time is the rest of the call; the caller measures the whole.
	resp := Response{OK: true, Markdown: md.String(), Timing: timing}
	if q.Full {
		resp.Report = rep
	} else {
		resp.Overlay = digest(rep)
	}
	b, err := json.Marshal(resp)
	if err != nil {
		return errorResponse(err.Error())
	}
	return b
}

func errorResponse(msg string) []byte {
	b, _ := json.Marshal(Response{OK: false, Error: msg})
	return b
}

// Digest is the part of a report the overlay needs, in the report's own
// field names, so it encodes and crosses to JavaScript in a fraction of
// the time of the whole report.
type Digest struct {
	Pages   []DigestPage `json:"pages"`
	Caution string       `json:"caution"`
}

// DigestPage is one page of a Digest.
type DigestPage struct {
	Source   string        `json:"source"`
	Problems []string      `json:"problems"`
	Charts   []DigestChart `json:"charts"`
}

// DigestChart is one chart of a Digest.
type DigestChart struct {
	Path     string           `json:"path"`
	IsChart  bool             `json:"isChart"`
	Box      [4]float64       `json:"box"`
	Marks    []DigestMark     `json:"marks"`
	Findings []report.Finding `json:"findings"`
	Emphasis *report.Emphasis `json:"emphasis,omitempty"`
}

// DigestMark is one mark of a Digest.
type DigestMark struct {
	ID      string     `json:"id"`
	BBox    [4]float64 `json:"bbox"`
	Verdict string     `json:"verdict"`
}

func digest(r *report.Report) *Digest {
	d := &Digest{Caution: r.Caution}
	for _, p := range r.Pages {
		dp := DigestPage{Source: p.Source, Problems: p.Problems}
		for _, c := range p.Charts {
			dc := DigestChart{Path: c.Path, IsChart: c.IsChart, Box: c.Box, Findings: c.Findings, Emphasis: c.Emphasis, Marks: make([]DigestMark, len(c.Marks))}
			for i, m := range c.Marks {
				dc.Marks[i] = DigestMark{ID: m.ID, BBox: m.BBox, Verdict: m.Verdict}
			}
			dp.Charts = append(dp.Charts, dc)
		}
		d.Pages = append(d.Pages, dp)
	}
	return d
}
