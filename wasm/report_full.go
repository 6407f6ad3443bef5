//go:build !overlaycore

package main

import (
	"math"
	"strings"

	"standout/internal/jsonio"
	"standout/internal/report"
)

// fullReport answers a request for the whole report: the report as JSON
// and as Markdown. The extension's overlay core is built without it (the
// overlaycore tag, report_none.go), so that what every press loads links
// none of the report's formats; the extension loads the core built with
// it only for an export.
func fullReport(q *Request, as []report.Analysed, timing map[string]float64, t2 float64) []byte {
	page := report.PageOf(q.Source, q.Problems, as)
	page.Unchecked = report.UncheckedOf(q.Rasters)
	judged(page.Unchecked, q.Pixels, q.Pick)
	report.PixelCharts(&page)
	report.PageFindings(&page)
	rep := &report.Report{Schema: "standout-report", Version: report.Version, Minor: report.Minor, Pages: []report.Page{page}, Caution: report.Caution}
	var md strings.Builder
	report.WriteMarkdown(&md, rep, nil)
	timing["encodeMs"] = ms(t2)
	// The response as encoding/json would write Response, by hand (the
	// core does not link encoding/json: report.AppendJSON).
	b := append(make([]byte, 0, 1<<16), `{"ok":true,"report":`...)
	b = report.AppendJSON(b, rep)
	b = append(b, `,"markdown":`...)
	b = jsonio.AppendString(b, md.String())
	b = append(b, `,"timing":`...)
	b = jsonio.AppendMap(b, timing, jsonio.AppendNumber)
	return append(b, '}')
}

// judged puts the press's judgements of the charts drawn as pixels into
// their unchecked entries, boxes mapped into page px by each chart's box
// as the read pass measured it (the capture was cut to that box, at one
// pixel per CSS px rounded), and checks a point picked on one of them as
// a declared emphasis.
func judged(us []report.Unchecked, pixels []PixelJudgement, pick *PixelPick) {
	for i := range us {
		u := &us[i]
		for _, p := range pixels {
			if p.Name != u.Name || len(p.Regions["normal"]) == 0 {
				continue
			}
			w, h := max(math.Round(u.Box[2]), 1), max(math.Round(u.Box[3]), 1)
			u.Regions = report.PlaceRegions(p.Regions["normal"], w, h, u.Box)
			u.CVD = map[string][]report.Region{}
			for v, rs := range p.Regions {
				if v != "normal" {
					u.CVD[v] = report.PlaceRegions(rs, w, h, u.Box)
				}
			}
			if pick != nil && pick.Name == u.Name {
				u.Emphasis = report.EmphasisAt(u, [4]float64{u.Box[0] + pick.X, u.Box[1] + pick.Y, 0, 0})
			}
			break
		}
	}
}
