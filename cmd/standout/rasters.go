package main

import (
	"bytes"
	"image"
	"image/draw"
	"image/png"

	"standout/internal/report"
	"standout/perception"
	"standout/perception/saliency"
)

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
		perVision := saliency.PerVision(px, perception.Visions, severity, saliency.Reported)
		if u.Regions = pageRegions(perVision[0], px.W, px.H, u.Box); len(u.Regions) == 0 {
			continue
		}
		u.CVD = map[string][]report.Region{}
		for k, v := range perception.Visions[1:] {
			u.CVD[v.String()] = pageRegions(perVision[k+1], px.W, px.H, u.Box)
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

// pageRegions maps regions of a chart's w×h pixels into its box in the
// page.
func pageRegions(rs []saliency.Region, w, h int, box [4]float64) []report.Region {
	sx, sy := box[2]/float64(w), box[3]/float64(h)
	var out []report.Region
	for _, r := range rs {
		b := r.Box
		out = append(out, report.Region{Box: [4]float64{round2(box[0] + b[0]*sx), round2(box[1] + b[1]*sy), round2(b[2] * sx), round2(b[3] * sy)},
			Salience: round2(r.Salience)})
	}
	return out
}

func round2(v float64) float64 { return float64(int64(v*100+0.5)) / 100 }

// toSaliency converts a decoded image to the model's RGB planes.
func toSaliency(img image.Image) *saliency.Image {
	b := img.Bounds()
	n := image.NewNRGBA(image.Rect(0, 0, b.Dx(), b.Dy()))
	draw.Draw(n, n.Bounds(), img, b.Min, draw.Src)
	return saliency.FromRGBA(n.Pix, b.Dx(), b.Dy())
}
