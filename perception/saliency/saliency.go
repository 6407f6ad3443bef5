// Package saliency computes a bottom-up saliency map of a chart drawn as
// pixels (a canvas, an image), where there are no marks to read: the model
// of Itti, Koch & Niebur (1998), "A model of saliency-based visual
// attention for rapid scene analysis", IEEE TPAMI 20(11):1254–1259.
//
// Nine-level Gaussian pyramids of intensity, of two colour-opponent pairs
// (red–green, blue–yellow) and of four orientations; centre–surround
// differences between centre levels c ∈ {2, 3, 4} and surround levels
// s = c + δ, δ ∈ {3, 4}; the normalisation operator N(·), which promotes
// maps with few strong peaks and suppresses maps with many comparable
// ones; conspicuity maps summed across scales at level 4; and the saliency
// map, the mean of the three normalised conspicuity maps. The most salient
// regions are its connected areas above a share of its peak.
package saliency

import (
	"math"
	"sort"
)

// Image is an RGB image, each channel in [0, 1], row by row.
type Image struct {
	W, H    int
	R, G, B []float32
}

// NewImage makes a black image.
func NewImage(w, h int) *Image {
	n := w * h
	return &Image{W: w, H: h, R: make([]float32, n), G: make([]float32, n), B: make([]float32, n)}
}

// plane is one channel at one pyramid level.
type plane struct {
	w, h int
	v    []float32
}

func newPlane(w, h int) plane { return plane{w, h, make([]float32, w*h)} }

func (p plane) at(x, y int) float32 {
	x = min(max(x, 0), p.w-1)
	y = min(max(y, 0), p.h-1)
	return p.v[y*p.w+x]
}

// Levels of the pyramids, centre levels and surround offsets (IKN 1998
// §2: σ ∈ [0..8], c ∈ {2, 3, 4}, s = c + δ, δ ∈ {3, 4}); the saliency map
// is at level 4.
const (
	levels   = 9
	mapLevel = 4
)

var (
	centres = []int{2, 3, 4}
	deltas  = []int{3, 4}
)

// MinSize is the smallest image the model runs on: level 8 of the pyramid
// must keep a pixel, and the map at level 4 a few.
const MinSize = 32

// Map is a saliency map at pyramid level 4: W×H cells, each covering
// Scale×Scale image pixels (a little less at the right and bottom edges).
type Map struct {
	W, H  int
	Scale float64
	V     []float32
}

// Compute is the Itti–Koch–Niebur saliency map of img. Images smaller
// than MinSize on a side give an empty map.
func Compute(img *Image) Map {
	if img.W < MinSize || img.H < MinSize {
		return Map{}
	}
	n := img.W * img.H
	in := newPlane(img.W, img.H)
	for i := 0; i < n; i++ {
		in.v[i] = (img.R[i] + img.G[i] + img.B[i]) / 3
	}
	rg, by := opponents(img, in)
	iPyr := pyramid(in)
	rgPyr, byPyr := pyramid(rg), pyramid(by)
	base := iPyr[mapLevel]

	// Intensity: |I(c) ⊖ I(s)|.
	iBar := newPlane(base.w, base.h)
	for _, c := range centres {
		for _, d := range deltas {
			addInto(iBar, normalise(centreSurround(iPyr[c], iPyr[c+d], false)))
		}
	}
	// Colour: |(R−G)(c) ⊖ (G−R)(s)| = |RG(c) + RG(s)| with RG = R − G
	// taken signed, and the same for blue–yellow.
	cBar := newPlane(base.w, base.h)
	for _, c := range centres {
		for _, d := range deltas {
			addInto(cBar, normalise(centreSurround(rgPyr[c], rgPyr[c+d], true)))
			addInto(cBar, normalise(centreSurround(byPyr[c], byPyr[c+d], true)))
		}
	}
	// Orientation: Gabor energy at 0°, 45°, 90° and 135° on each level of
	// the intensity pyramid.
	oBar := newPlane(base.w, base.h)
	for _, theta := range []float64{0, 45, 90, 135} {
		var oPyr [levels]plane
		for l := 0; l < levels; l++ {
			if l >= centres[0] {
				oPyr[l] = gabor(iPyr[l], theta)
			}
		}
		sum := newPlane(base.w, base.h)
		for _, c := range centres {
			for _, d := range deltas {
				addInto(sum, normalise(centreSurround(oPyr[c], oPyr[c+d], false)))
			}
		}
		addInto(oBar, normalise(sum))
	}
	s := newPlane(base.w, base.h)
	addInto(s, normalise(iBar))
	addInto(s, normalise(cBar))
	addInto(s, normalise(oBar))
	for i := range s.v {
		s.v[i] /= 3
	}
	return Map{W: s.w, H: s.h, Scale: float64(img.W) / float64(s.w), V: s.v}
}

// opponents are the colour-opponent planes R−G and B−Y (IKN 1998 §2):
// r, g, b normalised by intensity where it exceeds a tenth of its
// maximum over the image (hue is not perceivable at low luminance), then
// broadly tuned R, G, B, Y, negatives set to zero.
func opponents(img *Image, in plane) (rg, by plane) {
	rg, by = newPlane(img.W, img.H), newPlane(img.W, img.H)
	var maxI float32
	for _, v := range in.v {
		maxI = max(maxI, v)
	}
	for i, iv := range in.v {
		if iv <= maxI/10 || iv == 0 {
			continue
		}
		r, g, b := img.R[i]/iv, img.G[i]/iv, img.B[i]/iv
		R := max(0, r-(g+b)/2)
		G := max(0, g-(r+b)/2)
		B := max(0, b-(r+g)/2)
		Y := max(0, (r+g)/2-abs32(r-g)/2-b)
		rg.v[i], by.v[i] = R-G, B-Y
	}
	return rg, by
}

func abs32(v float32) float32 {
	if v < 0 {
		return -v
	}
	return v
}

// pyramid is a dyadic Gaussian pyramid: each level the one before blurred
// by the separable 5-tap binomial kernel [1 4 6 4 1]/16 (Burt & Adelson
// 1983) and subsampled by two; level 0 is the image.
func pyramid(p plane) [levels]plane {
	var out [levels]plane
	out[0] = p
	for l := 1; l < levels; l++ {
		out[l] = reduce(out[l-1])
	}
	return out
}

var binomial = [5]float32{1.0 / 16, 4.0 / 16, 6.0 / 16, 4.0 / 16, 1.0 / 16}

func reduce(p plane) plane {
	w, h := max((p.w+1)/2, 1), max((p.h+1)/2, 1)
	// Blur rows while halving them, then columns.
	tmp := newPlane(w, p.h)
	for y := 0; y < p.h; y++ {
		for x := 0; x < w; x++ {
			var s float32
			for k := -2; k <= 2; k++ {
				s += binomial[k+2] * p.at(2*x+k, y)
			}
			tmp.v[y*w+x] = s
		}
	}
	out := newPlane(w, h)
	for y := 0; y < h; y++ {
		for x := 0; x < w; x++ {
			var s float32
			for k := -2; k <= 2; k++ {
				s += binomial[k+2] * tmp.at(x, 2*y+k)
			}
			out.v[y*w+x] = s
		}
	}
	return out
}

// centreSurround is |F(c) ⊖ F(s)| brought to the map's level: the surround
// interpolated to the centre's size and subtracted point by point (for
// the opponent pairs, whose surround is the opposite pair, added), then
// resampled to level 4.
func centreSurround(c, s plane, opponent bool) plane {
	d := newPlane(c.w, c.h)
	for y := 0; y < c.h; y++ {
		for x := 0; x < c.w; x++ {
			sv := sample(s, (float64(x)+0.5)*float64(s.w)/float64(c.w)-0.5, (float64(y)+0.5)*float64(s.h)/float64(c.h)-0.5)
			cv := c.v[y*c.w+x]
			if opponent {
				// (R−G)(c) ⊖ (G−R)(s) = RG(c) − (−RG(s)).
				d.v[y*c.w+x] = abs32(cv + sv)
			} else {
				d.v[y*c.w+x] = abs32(cv - sv)
			}
		}
	}
	return d
}

// sample interpolates p bilinearly at (x, y) in its own pixel units.
func sample(p plane, x, y float64) float32 {
	x0, y0 := int(math.Floor(x)), int(math.Floor(y))
	fx, fy := float32(x-float64(x0)), float32(y-float64(y0))
	a := p.at(x0, y0)*(1-fx) + p.at(x0+1, y0)*fx
	b := p.at(x0, y0+1)*(1-fx) + p.at(x0+1, y0+1)*fx
	return a*(1-fy) + b*fy
}

// addInto adds src, resampled to dst's size, into dst (across-scale
// addition, ⊕).
func addInto(dst, src plane) {
	for y := 0; y < dst.h; y++ {
		for x := 0; x < dst.w; x++ {
			dst.v[y*dst.w+x] += sample(src, (float64(x)+0.5)*float64(src.w)/float64(dst.w)-0.5, (float64(y)+0.5)*float64(src.h)/float64(dst.h)-0.5)
		}
	}
}

// localMaxFloor: N(·) averages the local maxima of at least this share of
// the map's peak, as the model's reference code does (the Saliency
// Toolbox's maxNormalizeStd, 0.1; from memory): the ripples of blurred
// edges are not peaks that compete.
const localMaxFloor = 0.1

// normalise is IKN 1998's N(·): the map scaled to [0, 1], then multiplied
// by (1 − m̄)², m̄ the mean of its local maxima other than the global one.
// A map with one strong peak keeps it; a map with many comparable peaks
// is suppressed. A flat map is zero.
func normalise(p plane) plane {
	var hi float32
	for _, v := range p.v {
		hi = max(hi, v)
	}
	out := newPlane(p.w, p.h)
	if hi <= 1e-6 {
		return out
	}
	for i, v := range p.v {
		out.v[i] = v / hi
	}
	var sum float64
	n := 0
	top := -1
	for y := 0; y < p.h; y++ {
		for x := 0; x < p.w; x++ {
			v := out.v[y*p.w+x]
			if v < localMaxFloor || !localMax(out, x, y) {
				continue
			}
			if top < 0 && v == 1 {
				top = y*p.w + x // the global maximum, left out once
				continue
			}
			sum += float64(v)
			n++
		}
	}
	mean := float32(0)
	if n > 0 {
		mean = float32(sum / float64(n))
	}
	k := (1 - mean) * (1 - mean)
	for i := range out.v {
		out.v[i] *= k
	}
	return out
}

// localMax: no 8-neighbour of (x, y) is higher.
func localMax(p plane, x, y int) bool {
	v := p.v[y*p.w+x]
	for dy := -1; dy <= 1; dy++ {
		for dx := -1; dx <= 1; dx++ {
			nx, ny := x+dx, y+dy
			if (dx != 0 || dy != 0) && nx >= 0 && ny >= 0 && nx < p.w && ny < p.h && p.v[ny*p.w+nx] > v {
				return false
			}
		}
	}
	return true
}

// gabor is the Gabor energy of p at orientation theta (degrees): the
// magnitude of a complex Gabor filter of wavelength 4 px and envelope
// σ = 2 px on a 9×9 support, the kernel IKN 1998 take from Greenspan et
// al. (1994) in spirit; its even part has zero mean, so uniform regions
// give none.
func gabor(p plane, theta float64) plane {
	const half, lambda, sigma = 4, 4.0, 2.0
	var even, odd [2*half + 1][2*half + 1]float32
	st, ct := math.Sincos(theta * math.Pi / 180)
	var mean float64
	for j := -half; j <= half; j++ {
		for i := -half; i <= half; i++ {
			u := float64(i)*ct + float64(j)*st // across the stripes
			g := math.Exp(-float64(i*i+j*j) / (2 * sigma * sigma))
			even[j+half][i+half] = float32(g * math.Cos(2*math.Pi*u/lambda))
			odd[j+half][i+half] = float32(g * math.Sin(2*math.Pi*u/lambda))
			mean += g * math.Cos(2*math.Pi*u/lambda)
		}
	}
	mean /= float64((2*half + 1) * (2*half + 1))
	for j := range even {
		for i := range even[j] {
			even[j][i] -= float32(mean)
		}
	}
	out := newPlane(p.w, p.h)
	for y := 0; y < p.h; y++ {
		for x := 0; x < p.w; x++ {
			var re, im float32
			for j := -half; j <= half; j++ {
				for i := -half; i <= half; i++ {
					v := p.at(x+i, y+j)
					re += even[j+half][i+half] * v
					im += odd[j+half][i+half] * v
				}
			}
			out.v[y*p.w+x] = float32(math.Sqrt(float64(re*re + im*im)))
		}
	}
	return out
}

// Region is a salient area of the image: its box in image pixels and its
// peak salience, relative to the strongest region's (1).
type Region struct {
	Box      [4]float64
	Salience float64
}

// Reported is how many regions, strongest first, a report lists for each
// vision type.
const Reported = 5

// RegionShare: a region is a connected area of the map at or above this
// share of its peak. Provisional: half the peak keeps the winning
// location and those that compete with it.
const RegionShare = 0.5

// Regions lists the map's salient regions, strongest first, their boxes
// clipped to the image (w×h px). A flat map has none.
func Regions(m Map, w, h int) []Region {
	var peak float32
	for _, v := range m.V {
		peak = max(peak, v)
	}
	if peak <= 1e-6 {
		return nil
	}
	seen := make([]bool, len(m.V))
	var out []Region
	for start := range m.V {
		if seen[start] || m.V[start] < RegionShare*peak {
			continue
		}
		x0, y0, x1, y1 := m.W, m.H, -1, -1
		var top float32
		stack := []int{start}
		seen[start] = true
		for len(stack) > 0 {
			k := stack[len(stack)-1]
			stack = stack[:len(stack)-1]
			x, y := k%m.W, k/m.W
			x0, y0, x1, y1 = min(x0, x), min(y0, y), max(x1, x), max(y1, y)
			top = max(top, m.V[k])
			for _, d := range [4][2]int{{1, 0}, {-1, 0}, {0, 1}, {0, -1}} {
				nx, ny := x+d[0], y+d[1]
				if nx < 0 || ny < 0 || nx >= m.W || ny >= m.H {
					continue
				}
				if nk := ny*m.W + nx; !seen[nk] && m.V[nk] >= RegionShare*peak {
					seen[nk] = true
					stack = append(stack, nk)
				}
			}
		}
		bx0, by0 := float64(x0)*m.Scale, float64(y0)*m.Scale
		bx1, by1 := min(float64(x1+1)*m.Scale, float64(w)), min(float64(y1+1)*m.Scale, float64(h))
		out = append(out, Region{Box: [4]float64{bx0, by0, bx1 - bx0, by1 - by0}, Salience: float64(top / peak)})
	}
	sort.SliceStable(out, func(i, j int) bool { return out[i].Salience > out[j].Salience })
	return out
}
