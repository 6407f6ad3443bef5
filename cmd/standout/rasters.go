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
// sees them at severity, boxes in page CSS px. A declared emphasis in it,
// --emphasis box:… or the box of an element the emphasis selector
// matches (selected), is checked.
func rasterRegions(us []report.Unchecked, shots map[string][]byte, severity float64, box *[4]float64, selected [][4]float64) {
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
			u.Emphasis = report.EmphasisAt(u, *box)
		}
		// An element the emphasis selector matches, laid over the chart:
		// the first one whose centre lies in it.
		for _, b := range selected {
			if u.Emphasis != nil {
				break
			}
			u.Emphasis = report.EmphasisAt(u, b)
		}
	}
}

// pageRegions maps regions of a chart's w×h pixels into its box in the
// page.
func pageRegions(rs []saliency.Region, w, h int, box [4]float64) []report.Region {
	out := make([]report.Region, len(rs))
	for i, r := range rs {
		out[i] = report.Region{Box: r.Box, Salience: r.Salience}
	}
	return report.PlaceRegions(out, float64(w), float64(h), box)
}

// toSaliency converts a decoded image to the model's RGB planes.
func toSaliency(img image.Image) *saliency.Image {
	b := img.Bounds()
	n := image.NewNRGBA(image.Rect(0, 0, b.Dx(), b.Dy()))
	draw.Draw(n, n.Bounds(), img, b.Min, draw.Src)
	return saliency.FromRGBA(n.Pix, b.Dx(), b.Dy())
}
