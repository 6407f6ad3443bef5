package report

import (
	"math"
	"strconv"
	"strings"
)

// SearchCurve is the model's estimate of the time a reader takes to find
// the emphasis as the number of marks grows, through this chart's
// emphasis: for a pop-out, guided search that grows with the logarithm of
// the number of marks, nearly flat; for a slow search, linear in it
// (perception.Params: LogSearchMs, SerialSlope). Ms is the upper end of
// the chart's estimate, at N marks.
type SearchCurve struct {
	N      int
	Ms     float64
	Serial bool
}

// At is the estimate, in ms, at n marks.
func (c SearchCurve) At(n float64) float64 {
	if c.N < 2 {
		return c.Ms
	}
	if c.Serial {
		return c.Ms * n / float64(c.N)
	}
	return c.Ms * math.Log(n) / math.Log(float64(c.N))
}

// CurveOf is the chart's search curve: that of its slowest emphasised
// mark; false when the chart has no emphasis or no estimate.
func CurveOf(c Chart) (SearchCurve, bool) {
	if c.Emphasis == nil || len(c.Emphasis.Marks) == 0 {
		return SearchCurve{}, false
	}
	em := map[string]bool{}
	for _, id := range c.Emphasis.Marks {
		em[id] = true
	}
	sc, ok := SearchCurve{N: len(c.Marks)}, false
	for _, m := range c.Marks {
		if em[m.ID] && len(m.SearchMs) == 2 && m.SearchMs[1] >= sc.Ms {
			sc.Ms, sc.Serial, ok = m.SearchMs[1], m.Verdict != "pops", true
		}
	}
	return sc, ok
}

// PlotWidth and PlotHeight are the plot's size in px.
const PlotWidth, PlotHeight = 260, 110

// SearchPlotSVG draws the curve as a small SVG document: seconds to find
// the emphasis against the number of marks, 10 to 10,000 on a log scale,
// with this chart marked. The panel draws the same plot (overlay.js).
func SearchPlotSVG(c SearchCurve) string {
	const left, right, top, bottom = 40, 24, 10, 28
	w, h := float64(PlotWidth-left-right), float64(PlotHeight-top-bottom)
	ymax := max(1000.0, c.At(10000))
	x := func(n float64) float64 { return left + w*(math.Log10(n)-1)/3 }
	y := func(ms float64) float64 { return top + h*(1-ms/ymax) }
	var b strings.Builder
	pw, ph := strconv.Itoa(PlotWidth), strconv.Itoa(PlotHeight)
	put(&b, `<svg xmlns="http://www.w3.org/2000/svg" width="`, pw, `" height="`, ph, `" viewBox="0 0 `, pw, ` `, ph, `" font-family="sans-serif" font-size="10">`)
	put(&b, `<title>Estimated time to find the emphasis as the number of marks grows</title><rect width="100%" height="100%" fill="`, Ink.Paper, `"/>`)
	put(&b, `<path d="M`, f1(left), ` `, f1(top), `V`, f1(top+h), `H`, f1(left+w), `" fill="none" stroke="`, Ink.Quiet, `"/>`)
	for _, n := range []float64{10, 100, 1000, 10000} {
		put(&b, `<text x="`, f1(x(n)), `" y="`, f1(top+h+12), `" text-anchor="middle" fill="`, Ink.Ink, `">`, thousands(int(n)), `</text>`)
	}
	put(&b, `<text x="`, f1(left+w/2), `" y="`, strconv.Itoa(PlotHeight-3), `" text-anchor="middle" fill="`, Ink.Ink, `">marks in the chart</text>`)
	put(&b, `<text x="`, strconv.Itoa(left-4), `" y="`, f1(top+4), `" text-anchor="end" fill="`, Ink.Ink, `">`, trimFloat(ymax/1000), ` s</text><text x="`,
		strconv.Itoa(left-4), `" y="`, f1(top+h), `" text-anchor="end" fill="`, Ink.Ink, `">0</text>`)
	var pts []string
	for i := 0; i <= 40; i++ {
		n := math.Pow(10, 1+3*float64(i)/40)
		pts = append(pts, f1(x(n))+" "+f1(y(min(c.At(n), ymax))))
	}
	colour := StyleOf("pops").Colour
	if c.Serial {
		colour = StyleOf("conjunction").Colour
	}
	put(&b, `<path d="M`, strings.Join(pts, "L"), `" fill="none" stroke="`, colour, `" stroke-width="2"/>`)
	if n := float64(max(c.N, 10)); n <= 10000 {
		put(&b, `<circle cx="`, f1(x(n)), `" cy="`, f1(y(min(c.At(n), ymax))), `" r="3.5" fill="`, Ink.Alert, `"/>`)
	}
	b.WriteString(`</svg>`)
	return b.String()
}

func thousands(n int) string {
	s := strconv.Itoa(n)
	for i := len(s) - 3; i > 0; i -= 3 {
		s = s[:i] + "," + s[i:]
	}
	return s
}

func trimFloat(v float64) string {
	return strings.TrimRight(strings.TrimRight(f1(v), "0"), ".")
}

// f1 writes a number with one decimal, as fmt's %.1f does.
func f1(v float64) string { return strconv.FormatFloat(v, 'f', 1, 64) }
