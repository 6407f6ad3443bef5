package main

import (
	"image"
	"image/color"
	"image/draw"
	"math"

	"golang.org/x/image/font"
	"golang.org/x/image/font/basicfont"
	"golang.org/x/image/math/fixed"

	"standout/internal/report"
	"standout/perception/colour"
)

// ink is a verdict's style (report.VerdictStyles, which the overlay
// draws too) as the raster draws it: whole pixels, and a white halo under
// every outline, which costs a raster nothing.
type ink struct {
	c      color.RGBA
	width  int
	dash   []int // on, off (px); nil is solid
	corner string
}

// opaque is one of the look's #rrggbb colours as an opaque pixel.
func opaque(hex string) color.RGBA {
	r, g, b := colour.MustHex(hex).RGB8()
	return color.RGBA{r, g, b, 0xff}
}

func inkOf(verdict string) ink {
	st := report.StyleOf(verdict)
	k := ink{c: opaque(st.Colour), width: int(math.Ceil(st.Width)), corner: st.Corner}
	for _, d := range st.Dash {
		k.dash = append(k.dash, int(math.Round(d)))
	}
	return k
}

// annotate crops a full-page screenshot (1 image px per CSS px) to a
// chart with a 10 px margin, outlines each mark by its verdict (a line
// along its path) and adds a key below: what each outline means.
func annotate(page image.Image, c report.Chart) *image.RGBA {
	return withKey(outlined(page, c), c)
}

// outlined is the chart's crop with its marks outlined.
func outlined(page image.Image, c report.Chart) *image.RGBA {
	const margin = 10
	r := image.Rect(int(math.Floor(c.Box[0]))-margin, int(math.Floor(c.Box[1]))-margin,
		int(math.Ceil(c.Box[0]+c.Box[2]))+margin, int(math.Ceil(c.Box[1]+c.Box[3]))+margin).Intersect(page.Bounds())
	out := image.NewRGBA(image.Rect(0, 0, r.Dx(), r.Dy()))
	draw.Draw(out, out.Bounds(), page, r.Min, draw.Src)
	white := color.RGBA{0xff, 0xff, 0xff, 0xff}
	for i := len(report.VerdictStyles) - 1; i >= 0; i-- {
		v := report.VerdictStyles[i].Verdict
		ink := inkOf(v)
		for _, m := range c.Marks {
			if m.Verdict != v {
				continue
			}
			if len(m.Points) >= 2 {
				alongPath(out, m, r.Min, ink)
				continue
			}
			x0 := int(math.Round(m.BBox[0]-1.5)) - r.Min.X
			y0 := int(math.Round(m.BBox[1]-1.5)) - r.Min.Y
			x1 := int(math.Round(m.BBox[0]+m.BBox[2]+1.5)) - r.Min.X
			y1 := int(math.Round(m.BBox[1]+m.BBox[3]+1.5)) - r.Min.Y
			rectOutline(out, x0-1, y0-1, x1+1, y1+1, ink.width+2, nil, white)
			rectOutline(out, x0, y0, x1, y1, ink.width, ink.dash, ink.c)
			switch ink.corner {
			case "notch":
				// A right triangle at the top-right corner, as in the overlay.
				for dy := 0; dy < 7; dy++ {
					for dx := 0; dx < 7-dy; dx++ {
						set(out, x1+dx, y0+dy, ink.c)
					}
				}
			case "ring":
				for a := 0.0; a < 2*math.Pi; a += 0.1 {
					for rr := 2.5; rr <= 4; rr += 0.5 {
						set(out, x1+int(math.Round(rr*math.Cos(a))), y0+int(math.Round(rr*math.Sin(a))), ink.c)
					}
				}
			}
		}
	}
	markFailedEmphasis(out, c, r.Min)
	return out
}

// markFailedEmphasis frames, in the panel's alert colour and dashed, each
// mark of a declared emphasis that does not stand out for normal vision:
// the picture then shows what the report says failed.
func markFailedEmphasis(out *image.RGBA, c report.Chart, origin image.Point) {
	em := c.Emphasis
	if em == nil || em.Inferred || em.Holds["normal"] {
		return
	}
	alert := opaque(report.Ink.Alert)
	box := map[string][4]float64{}
	for _, m := range c.Marks {
		box[m.ID] = m.BBox
	}
	for _, id := range em.Marks {
		bb, ok := box[id]
		if !ok {
			continue
		}
		x0 := int(math.Round(bb[0]-5)) - origin.X
		y0 := int(math.Round(bb[1]-5)) - origin.Y
		x1 := int(math.Round(bb[0]+bb[2]+5)) - origin.X
		y1 := int(math.Round(bb[1]+bb[3]+5)) - origin.Y
		rectOutline(out, x0, y0, x1, y1, 2, []int{4, 3}, alert)
	}
}

func set(img *image.RGBA, x, y int, c color.RGBA) {
	if image.Pt(x, y).In(img.Bounds()) {
		img.SetRGBA(x, y, c)
	}
}

// rectOutline draws a rectangle's outline of the given width, dashed when
// dash is non-nil (the pattern runs along the perimeter).
func rectOutline(img *image.RGBA, x0, y0, x1, y1, width int, dash []int, c color.RGBA) {
	on := func(i int) bool {
		if dash == nil {
			return true
		}
		p := dash[0] + dash[1]
		return i%p < dash[0]
	}
	i := 0
	for x := x0; x <= x1; x, i = x+1, i+1 {
		if on(i) {
			for w := 0; w < width; w++ {
				set(img, x, y0+w, c)
				set(img, x, y1-w, c)
			}
		}
	}
	for y := y0; y <= y1; y, i = y+1, i+1 {
		if on(i) {
			for w := 0; w < width; w++ {
				set(img, x0+w, y, c)
				set(img, x1-w, y, c)
			}
		}
	}
}

// alongPath outlines a line along its path: a band of the verdict's ink,
// on a white halo, a little outside the line on both sides, so the line
// itself stays visible.
func alongPath(out *image.RGBA, m report.Mark, origin image.Point, k ink) {
	half := 1.0
	if m.Kind == "line" {
		half = max(m.Size/2, 0.5)
	}
	inner, outer := half+1.5, half+1.5+float64(k.width)
	pts := make([][2]float64, len(m.Points))
	lo, hi := [2]float64{math.Inf(1), math.Inf(1)}, [2]float64{math.Inf(-1), math.Inf(-1)}
	for i, p := range m.Points {
		pts[i] = [2]float64{p[0] - float64(origin.X), p[1] - float64(origin.Y)}
		lo = [2]float64{min(lo[0], pts[i][0]), min(lo[1], pts[i][1])}
		hi = [2]float64{max(hi[0], pts[i][0]), max(hi[1], pts[i][1])}
	}
	b := image.Rect(int(lo[0]-outer-2), int(lo[1]-outer-2), int(hi[0]+outer+3), int(hi[1]+outer+3)).Intersect(out.Bounds())
	white := color.RGBA{0xff, 0xff, 0xff, 0xff}
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := b.Min.X; x < b.Max.X; x++ {
			d := distToPath(float64(x)+0.5, float64(y)+0.5, pts)
			switch {
			case d >= inner && d < outer:
				out.SetRGBA(x, y, k.c)
			case d >= inner-1 && d < inner || d >= outer && d < outer+1:
				out.SetRGBA(x, y, white)
			}
		}
	}
}

// distToPath is the distance from (x, y) to the polyline pts.
func distToPath(x, y float64, pts [][2]float64) float64 {
	best := math.Inf(1)
	for i := 1; i < len(pts); i++ {
		a, b := pts[i-1], pts[i]
		dx, dy := b[0]-a[0], b[1]-a[1]
		t := 0.0
		if l2 := dx*dx + dy*dy; l2 > 0 {
			t = max(0, min(1, ((x-a[0])*dx+(y-a[1])*dy)/l2))
		}
		best = min(best, math.Hypot(x-a[0]-t*dx, y-a[1]-t*dy))
	}
	return best
}

// withKey adds a key under the picture: a sample of each outline the
// picture uses, with its words, and the frame of a failed declared
// emphasis when it is drawn.
func withKey(img *image.RGBA, c report.Chart) *image.RGBA {
	type entry struct {
		draw  func(out *image.RGBA, x, y int)
		words string
	}
	var rows []entry
	used := map[string]bool{}
	for _, m := range c.Marks {
		used[m.Verdict] = true
	}
	for _, st := range report.VerdictStyles {
		if !used[st.Verdict] {
			continue
		}
		k := inkOf(st.Verdict)
		rows = append(rows, entry{func(out *image.RGBA, x, y int) {
			rectOutline(out, x, y, x+18, y+9, k.width, k.dash, k.c)
		}, st.Words})
	}
	if em := c.Emphasis; em != nil && !em.Inferred && !em.Holds["normal"] {
		alert := opaque(report.Ink.Alert)
		rows = append(rows, entry{func(out *image.RGBA, x, y int) {
			rectOutline(out, x, y, x+18, y+9, 2, []int{4, 3}, alert)
		}, "declared emphasis that does not stand out"})
	}
	const rowH = 16
	b := img.Bounds()
	width := max(b.Dx(), 320)
	out := image.NewRGBA(image.Rect(0, 0, width, b.Dy()+len(rows)*rowH+8))
	draw.Draw(out, out.Bounds(), image.NewUniform(color.RGBA{0xff, 0xff, 0xff, 0xff}), image.Point{}, draw.Src)
	draw.Draw(out, b, img, b.Min, draw.Src)
	ink := opaque(report.Ink.Ink)
	for i, r := range rows {
		y := b.Dy() + 4 + i*rowH
		r.draw(out, 6, y+3)
		d := font.Drawer{Dst: out, Src: image.NewUniform(ink), Face: basicfont.Face7x13,
			Dot: fixed.P(32, y+12)}
		d.DrawString(r.words)
	}
	return out
}
