package saliency

import "testing"

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
