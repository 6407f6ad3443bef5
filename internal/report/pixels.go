package report

import (
	"math"
	"strconv"
	"strings"
)

// Charts drawn as pixels in the report: a chart whose pixels were judged
// is listed among the page's charts (minor 4), with source "canvas",
// "image" or "object" and its salient regions in place of marks. The
// page's Unchecked entry for it stays as it was in minor 3.

// PixelCharts appends to p.Charts a chart for each of p.Unchecked whose
// pixels were judged (it has regions). Its findings stay on the page, as
// in minor 3 (pixels-emphasis-lost).
func PixelCharts(p *Page) {
	for _, u := range p.Unchecked {
		if len(u.Regions) == 0 {
			continue
		}
		c := Chart{Path: u.Name, Source: u.Kind, IsChart: true, Box: u.Box, Marks: []Mark{}, Legend: []Mark{},
			Furniture: map[string]int{}, Problems: []string{}, Findings: []Finding{}, Regions: u.Regions, CVD: u.CVD}
		if e := u.Emphasis; e != nil {
			box := e.Box
			c.Emphasis = &Emphasis{Marks: []string{}, Holds: e.Holds, Box: &box}
		}
		p.Charts = append(p.Charts, c)
	}
}

// PlaceRegions maps regions found in a chart's w×h pixels into its box
// in the page, in CSS px to the hundredth.
func PlaceRegions(rs []Region, w, h float64, box [4]float64) []Region {
	sx, sy := box[2]/w, box[3]/h
	out := make([]Region, 0, len(rs))
	for _, r := range rs {
		b := r.Box
		out = append(out, Region{Box: [4]float64{r2(box[0] + b[0]*sx), r2(box[1] + b[1]*sy), r2(b[2] * sx), r2(b[3] * sy)}, Salience: r2(r.Salience)})
	}
	return out
}

// EmphasisAt checks a declared emphasis box (page px) that lies in a
// chart drawn as pixels whose pixels were judged: for each vision type,
// whether the strongest region covers the box's centre. It is nil when
// the centre lies outside the chart.
func EmphasisAt(u *Unchecked, box [4]float64) *RasterEmphasis {
	cx, cy := box[0]+box[2]/2, box[1]+box[3]/2
	if len(u.Regions) == 0 || !InBox(u.Box, cx, cy) {
		return nil
	}
	first := func(rs []Region) bool { return len(rs) > 0 && InBox(rs[0].Box, cx, cy) }
	e := &RasterEmphasis{Box: box, Holds: map[string]bool{"normal": first(u.Regions)}}
	for v, rs := range u.CVD {
		e.Holds[v] = first(rs)
	}
	return e
}

// DrawnAsPixels says whether the chart is one drawn as pixels, judged by
// its pixels rather than its marks.
func (c *Chart) DrawnAsPixels() bool { return c.Source != "" && c.Source != "svg" }

// Unjudged is the page's charts drawn as pixels whose pixels were not
// judged: the ones a check could say nothing about.
func Unjudged(us []Unchecked) []Unchecked {
	var out []Unchecked
	for _, u := range us {
		if len(u.Regions) == 0 {
			out = append(out, u)
		}
	}
	return out
}

// PixelLines says in sentences where the eye is predicted to go first in a
// chart drawn as pixels: the strongest region for normal vision, whether
// each CVD type's map keeps it, and whether a declared emphasis holds.
func PixelLines(c Chart) []string {
	if len(c.Regions) == 0 {
		return nil
	}
	first := c.Regions[0].Box
	out := []string{"The eye is predicted to go first to " + regionWords(first) + " (the strongest region of the saliency map of its pixels; " +
		strconv.Itoa(len(c.Regions)) + " region(s) in all)."}
	var kept, wider, moved []string
	for _, v := range []string{"protan", "deutan", "tritan", "achromat"} {
		rs, ok := c.CVD[v]
		switch {
		case !ok:
		case len(rs) == 0:
			moved = append(moved, v+" to no region at all")
		case overlap(rs[0].Box, first) >= 0.5:
			kept = append(kept, v)
		case InBox(rs[0].Box, first[0]+first[2]/2, first[1]+first[3]/2):
			wider = append(wider, v+": "+regionWords(rs[0].Box))
		default:
			moved = append(moved, v+" to "+regionWords(rs[0].Box))
		}
	}
	if len(kept) > 0 {
		out = append(out, "There too for: "+strings.Join(kept, ", ")+".")
	}
	if len(wider) > 0 {
		out = append(out, "Spread wider, over it and its surround, for "+strings.Join(wider, "; ")+".")
	}
	if len(moved) > 0 {
		out = append(out, "Elsewhere for "+strings.Join(moved, "; ")+".")
	}
	if e := c.Emphasis; e != nil && e.Box != nil {
		var ok, lost []string
		for _, v := range []string{"normal", "protan", "deutan", "tritan", "achromat"} {
			if held, in := e.Holds[v]; in && held {
				ok = append(ok, v)
			} else if in {
				lost = append(lost, v)
			}
		}
		out = append(out, "Declared emphasis, "+regionWords(*e.Box)+": reached first for: "+orNone(strings.Join(ok, ", "))+". Not for: "+orNone(strings.Join(lost, ", "))+".")
	}
	return out
}

// regionWords names a box in page px: "the 40×120 px at 310, 92".
func regionWords(b [4]float64) string {
	n := func(v float64) string { return strconv.FormatFloat(math.Round(v), 'f', 0, 64) }
	return "the " + n(b[2]) + "×" + n(b[3]) + " px at " + n(b[0]) + ", " + n(b[1])
}

// overlap is the intersection over union of two boxes: 1 for the same
// box, 0 for boxes apart.
func overlap(a, b [4]float64) float64 {
	w := min(a[0]+a[2], b[0]+b[2]) - max(a[0], b[0])
	h := min(a[1]+a[3], b[1]+b[3]) - max(a[1], b[1])
	if w <= 0 || h <= 0 {
		return 0
	}
	in := w * h
	return in / (a[2]*a[3] + b[2]*b[3] - in)
}
