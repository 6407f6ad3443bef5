package saliency

import "standout/perception/colour"

// Simulated is img as a reader with deficiency d at severity sees it
// (colour.Simulate per pixel; charts have few colours, so each distinct
// 8-bit colour is simulated once).
func Simulated(img *Image, d colour.Deficiency, severity float64) *Image {
	out := NewImage(img.W, img.H)
	cache := map[uint32][3]float32{}
	// A chart's pixels come in runs of one colour: the last one is kept
	// at hand rather than looked up again.
	last, v := uint32(1<<24), [3]float32{}
	for i := range img.R {
		r8, g8, b8 := to8(img.R[i]), to8(img.G[i]), to8(img.B[i])
		k := uint32(r8)<<16 | uint32(g8)<<8 | uint32(b8)
		if k != last {
			var ok bool
			if v, ok = cache[k]; !ok {
				s := colour.Simulate(d, severity, colour.SRGB8(r8, g8, b8))
				v = [3]float32{float32(s.R), float32(s.G), float32(s.B)}
				cache[k] = v
			}
			last = k
		}
		out.R[i], out.G[i], out.B[i] = v[0], v[1], v[2]
	}
	return out
}

func to8(v float32) uint8 {
	switch {
	case !(v > 0):
		return 0
	case v >= 1:
		return 255
	}
	return uint8(v*255 + 0.5)
}

// Covers says whether the region's box holds the centre of box b (both
// in the same pixels).
func (r Region) Covers(b [4]float64) bool {
	cx, cy := b[0]+b[2]/2, b[1]+b[3]/2
	return cx >= r.Box[0] && cx <= r.Box[0]+r.Box[2] && cy >= r.Box[1] && cy <= r.Box[1]+r.Box[3]
}

// FromRGBA is the image of w×h pixels given as 8-bit RGBA, not
// premultiplied, row by row (a canvas's ImageData, image.NRGBA's Pix),
// each composited over white: a transparent pixel shows the page behind
// it, taken as white. rgba must hold 4·w·h bytes.
func FromRGBA(rgba []byte, w, h int) *Image {
	img := NewImage(w, h)
	for i := 0; i < w*h; i++ {
		a := float32(rgba[4*i+3]) / 255
		img.R[i] = float32(rgba[4*i])/255*a + 1 - a
		img.G[i] = float32(rgba[4*i+1])/255*a + 1 - a
		img.B[i] = float32(rgba[4*i+2])/255*a + 1 - a
	}
	return img
}

// PerVision lists, for each vision type, the strongest n regions of img as
// a reader with it sees the image (Simulated at severity; colour.Normal
// is img as it is), in the order of visions.
func PerVision(img *Image, visions []colour.Deficiency, severity float64, n int) [][]Region {
	out := make([][]Region, len(visions))
	for k, v := range visions {
		px := img
		if v != colour.Normal {
			px = Simulated(img, v, severity)
		}
		rs := Regions(Compute(px), img.W, img.H)
		out[k] = rs[:min(len(rs), n)]
	}
	return out
}
