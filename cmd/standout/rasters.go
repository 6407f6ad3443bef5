package main

import (
	"bytes"
	"image"
	"image/png"

	"standout/internal/report"
	"standout/perception"
	"standout/perception/saliency"
)

// maxRegions is how many salient regions a chart drawn as pixels reports
// per vision type.
const maxRegions = 5

// rasterRegions fills in the salient regions of each chart drawn as
// pixels that the browser captured (shots, by name): the saliency map of
// its pixels for normal vision and again on the pixels as each CVD type
// sees them at severity, boxes in page CSS px.
func rasterRegions(us []report.Unchecked, shots map[string][]byte, severity float64, box *[4]float64) {
	for i := range us {
		u := &us[i]
		shot, ok := shots[u.Name]
		if !ok {
			continue
		}
		img, err := png.Decode(bytes.NewReader(shot))
		if err != nil {
			continue
		}
		px := toSaliency(img)
		u.Regions = pageRegions(px, u.Box)
		if len(u.Regions) == 0 {
			continue
		}
		u.CVD = map[string][]report.Region{}
		for _, v := range perception.Visions[1:] {
			u.CVD[v.String()] = pageRegions(saliency.Simulated(px, v, severity), u.Box)
		}
		if box != nil {
			u.Emphasis = emphasisIn(u, *box)
		}
	}
}

// emphasisIn checks a declared emphasis box that lies in a chart drawn as
// pixels: for each vision type, whether the strongest region covers the
// box's centre.
func emphasisIn(u *report.Unchecked, box [4]float64) *report.RasterEmphasis {
	cx, cy := box[0]+box[2]/2, box[1]+box[3]/2
	if !report.InBox(u.Box, cx, cy) {
		return nil
	}
	first := func(rs []report.Region) bool { return len(rs) > 0 && report.InBox(rs[0].Box, cx, cy) }
	e := &report.RasterEmphasis{Box: box, Holds: map[string]bool{perception.Visions[0].String(): first(u.Regions)}}
	for v, rs := range u.CVD {
		e.Holds[v] = first(rs)
	}
	return e
}

// pageRegions computes the map of px and maps its strongest regions into
// the chart's box in the page.
func pageRegions(px *saliency.Image, box [4]float64) []report.Region {
	rs := saliency.Regions(saliency.Compute(px), px.W, px.H)
	sx, sy := box[2]/float64(px.W), box[3]/float64(px.H)
	var out []report.Region
	for _, r := range rs[:min(len(rs), maxRegions)] {
		b := r.Box
		out = append(out, report.Region{Box: [4]float64{round2(box[0] + b[0]*sx), round2(box[1] + b[1]*sy), round2(b[2] * sx), round2(b[3] * sy)},
			Salience: round2(r.Salience)})
	}
	return out
}

func round2(v float64) float64 { return float64(int64(v*100+0.5)) / 100 }

// toSaliency converts a decoded image to the model's RGB planes, its
// alpha composited over white (a transparent canvas shows the page,
// usually white, behind it).
func toSaliency(img image.Image) *saliency.Image {
	b := img.Bounds()
	out := saliency.NewImage(b.Dx(), b.Dy())
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := b.Min.X; x < b.Max.X; x++ {
			r, g, bl, a := img.At(x, y).RGBA()
			k := (y-b.Min.Y)*out.W + (x - b.Min.X)
			white := float32(0xffff-a) / 0xffff
			out.R[k] = float32(r)/0xffff + white
			out.G[k] = float32(g)/0xffff + white
			out.B[k] = float32(bl)/0xffff + white
		}
	}
	return out
}
