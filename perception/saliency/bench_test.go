package saliency

import (
	"testing"

	"standout/perception/colour"
)

// A 600 × 400 chart: a grid of bars, one highlighted.
func chart600x400() *Image {
	img := field(600, 400, "#ffffff")
	for k := 0; k < 20; k++ {
		h := 60 + (k*53)%280
		c := "#7d8a99"
		if k == 13 {
			c = "#d1495b"
		}
		fill(img, [4]int{20 + k*28, 380 - h, 20, h}, c)
	}
	return img
}

func BenchmarkMap600x400(b *testing.B) {
	img := chart600x400()
	b.ResetTimer()
	for b.Loop() {
		Regions(Compute(img), img.W, img.H)
	}
}

// BenchmarkPerVision600x400 is what a press does for one chart drawn as
// pixels: the map for normal vision and for each CVD type's simulation.
func BenchmarkPerVision600x400(b *testing.B) {
	img := chart600x400()
	visions := []colour.Deficiency{colour.Normal, colour.Protan, colour.Deutan, colour.Tritan, colour.Achromat}
	for b.Loop() {
		PerVision(img, visions, 1, Reported)
	}
}
