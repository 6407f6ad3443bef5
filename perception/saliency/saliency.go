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

// clamp is i held within [0, n): the planes' edges are repeated outwards.
func clamp(i, n int) int { return min(max(i, 0), n-1) }

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
func Compute(img *Image) Map { return computeWith(img, fastOps) }

// ops are the model's image operations: fastOps here, and in the tests
// the reference versions, one output pixel at a time, that check them.
type ops struct {
	reduce         func(plane) plane
	centreSurround func(c, s plane, opponent bool) plane
	addInto        func(dst, src plane)
	// gabor is the Gabor energy at an orientation; box is the plane's
	// 9×9 box sums, for the zero-mean even part.
	gabor func(p plane, theta float64, box plane) plane
}

var fastOps = ops{reduce: reduce, centreSurround: centreSurround, addInto: addInto, gabor: gabor}

func computeWith(img *Image, o ops) Map {
	if img.W < MinSize || img.H < MinSize {
		return Map{}
	}
	n := img.W * img.H
	in := newPlane(img.W, img.H)
	for i := 0; i < n; i++ {
		in.v[i] = (img.R[i] + img.G[i] + img.B[i]) / 3
	}
	rg, by := opponents(img, in)
	iPyr := pyramid(in, o.reduce)
	rgPyr, byPyr := pyramid(rg, o.reduce), pyramid(by, o.reduce)
	base := iPyr[mapLevel]
	sum := func(dst plane, pyr *[levels]plane, opponent bool) {
		for _, c := range centres {
			for _, d := range deltas {
				o.addInto(dst, normalise(o.centreSurround(pyr[c], pyr[c+d], opponent)))
			}
		}
	}

	// Intensity: |I(c) ⊖ I(s)|.
	iBar := newPlane(base.w, base.h)
	sum(iBar, &iPyr, false)
	// Colour: |(R−G)(c) ⊖ (G−R)(s)| = |RG(c) + RG(s)| with RG = R − G
	// taken signed, and the same for blue–yellow.
	cBar := newPlane(base.w, base.h)
	sum(cBar, &rgPyr, true)
	sum(cBar, &byPyr, true)
	// Orientation: Gabor energy at 0°, 45°, 90° and 135° on each level of
	// the intensity pyramid.
	var boxes [levels]plane
	for l := centres[0]; l < levels; l++ {
		boxes[l] = boxSums(iPyr[l])
	}
	oBar := newPlane(base.w, base.h)
	for _, theta := range []float64{0, 45, 90, 135} {
		var oPyr [levels]plane
		for l := centres[0]; l < levels; l++ {
			oPyr[l] = o.gabor(iPyr[l], theta, boxes[l])
		}
		orient := newPlane(base.w, base.h)
		sum(orient, &oPyr, false)
		o.addInto(oBar, normalise(orient))
	}
	s := newPlane(base.w, base.h)
	o.addInto(s, normalise(iBar))
	o.addInto(s, normalise(cBar))
	o.addInto(s, normalise(oBar))
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
func pyramid(p plane, reduce func(plane) plane) [levels]plane {
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
	b0, b1, b2 := binomial[0], binomial[1], binomial[2]
	// Blur rows while halving them, then columns; clamped reads only at
	// the edges.
	tmp := newPlane(w, p.h)
	for y := 0; y < p.h; y++ {
		row, t := p.v[y*p.w:(y+1)*p.w], tmp.v[y*w:(y+1)*w]
		for x := range t {
			c := 2 * x
			if c >= 2 && c+2 < p.w {
				t[x] = b0*row[c-2] + b1*row[c-1] + b2*row[c] + b1*row[c+1] + b0*row[c+2]
				continue
			}
			var s float32
			for k := -2; k <= 2; k++ {
				s += binomial[k+2] * row[clamp(c+k, p.w)]
			}
			t[x] = s
		}
	}
	out := newPlane(w, h)
	for y := 0; y < h; y++ {
		var rows [5][]float32
		for k := range rows {
			r := clamp(2*y+k-2, p.h)
			rows[k] = tmp.v[r*w : (r+1)*w]
		}
		o := out.v[y*w : (y+1)*w]
		for x := range o {
			o[x] = b0*rows[0][x] + b1*rows[1][x] + b2*rows[2][x] + b1*rows[3][x] + b0*rows[4][x]
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
	resample(s, c.w, c.h, func(x, y int, sv float32) { d.v[y*c.w+x] = contrast(c.v[y*c.w+x], sv, opponent) })
	return d
}

// contrast is one point's centre–surround difference: |c − s|, or for
// the opponent pairs, (R−G)(c) ⊖ (G−R)(s) = |RG(c) + RG(s)|.
func contrast(cv, sv float32, opponent bool) float32 {
	if opponent {
		return abs32(cv + sv)
	}
	return abs32(cv - sv)
}

// addInto adds src, resampled to dst's size, into dst (across-scale
// addition, ⊕).
func addInto(dst, src plane) {
	resample(src, dst.w, dst.h, func(x, y int, v float32) { dst.v[y*dst.w+x] += v })
}

// tap is where one output column (or row) reads its source: the two
// neighbouring source columns and the weight of the second.
type tap struct {
	i0, i1 int
	f      float32
}

// taps maps n output pixels onto m source pixels, centres aligned, for
// bilinear interpolation with the edges repeated outwards.
func taps(n, m int) []tap {
	out := make([]tap, n)
	for x := range out {
		p := (float64(x)+0.5)*float64(m)/float64(n) - 0.5
		x0 := int(math.Floor(p))
		out[x] = tap{clamp(x0, m), clamp(x0+1, m), float32(p - float64(x0))}
	}
	return out
}

// resample interpolates p bilinearly at each pixel of a w×h grid over the
// same area and hands each value to put, row by row.
func resample(p plane, w, h int, put func(x, y int, v float32)) {
	xs := taps(w, p.w)
	for y, ty := range taps(h, p.h) {
		r0, r1 := p.v[ty.i0*p.w:(ty.i0+1)*p.w], p.v[ty.i1*p.w:(ty.i1+1)*p.w]
		for x, tx := range xs {
			a := r0[tx.i0]*(1-tx.f) + r0[tx.i1]*tx.f
			b := r1[tx.i0]*(1-tx.f) + r1[tx.i1]*tx.f
			put(x, y, a*(1-ty.f)+b*ty.f)
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
	if x > 0 && y > 0 && x+1 < p.w && y+1 < p.h {
		up, row, down := p.v[(y-1)*p.w+x-1:(y-1)*p.w+x+2], p.v[y*p.w+x-1:y*p.w+x+2], p.v[(y+1)*p.w+x-1:(y+1)*p.w+x+2]
		return up[0] <= v && up[1] <= v && up[2] <= v && row[0] <= v && row[2] <= v && down[0] <= v && down[1] <= v && down[2] <= v
	}
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
// give none. box holds p's 9×9 box sums (boxSums).
//
// The kernel is separable: with u = i·cos θ + j·sin θ across the stripes,
// e^(−(i²+j²)/2σ²)·e^(2πiu/λ) is the product of a row filter in i and a
// column filter in j, so its real and imaginary parts are sums of two
// separable terms each (cos(a+b) = cos a cos b − sin a sin b, sin(a+b) =
// sin a cos b + cos a sin b): 18 taps a term instead of 81.
func gabor(p plane, theta float64, box plane) plane {
	const half, lambda, sigma = 4, 4.0, 2.0
	st, ct := math.Sincos(theta * math.Pi / 180)
	var cx, sx, cy, sy [2*half + 1]float32
	var mean float64 // of the even part, over the 9×9 support
	for i := -half; i <= half; i++ {
		g := math.Exp(-float64(i*i) / (2 * sigma * sigma))
		a, b := 2*math.Pi*float64(i)*ct/lambda, 2*math.Pi*float64(i)*st/lambda
		cx[i+half], sx[i+half] = float32(g*math.Cos(a)), float32(g*math.Sin(a))
		cy[i+half], sy[i+half] = float32(g*math.Cos(b)), float32(g*math.Sin(b))
	}
	for j := -half; j <= half; j++ {
		for i := -half; i <= half; i++ {
			u := float64(i)*ct + float64(j)*st
			mean += math.Exp(-float64(i*i+j*j)/(2*sigma*sigma)) * math.Cos(2*math.Pi*u/lambda)
		}
	}
	m := float32(mean / float64((2*half+1)*(2*half+1)))
	rc, rs := filterRows(p, &cx), filterRows(p, &sx)
	// Re = Cy∗(Cx∗p) − Sy∗(Sx∗p) − m·box; Im = Cy∗(Sx∗p) + Sy∗(Cx∗p).
	re, im := filterCols(rc, &cy), filterCols(rs, &cy)
	if st != 0 {
		subInto(re, filterCols(rs, &sy))
		addPlane(im, filterCols(rc, &sy))
	}
	out := newPlane(p.w, p.h)
	for k := range out.v {
		r := re.v[k] - m*box.v[k]
		out.v[k] = float32(math.Sqrt(float64(r*r + im.v[k]*im.v[k])))
	}
	return out
}

// boxSums is the sum of each pixel's 9×9 neighbourhood, edges repeated.
func boxSums(p plane) plane {
	var ones [9]float32
	for i := range ones {
		ones[i] = 1
	}
	return filterCols(filterRows(p, &ones), &ones)
}

// filterRows convolves each row of p with the 9-tap kernel k (centred),
// edges repeated.
func filterRows(p plane, k *[9]float32) plane {
	out := newPlane(p.w, p.h)
	for y := 0; y < p.h; y++ {
		row, o := p.v[y*p.w:(y+1)*p.w], out.v[y*p.w:(y+1)*p.w]
		for x := range o {
			if x >= 4 && x+4 < p.w {
				r := row[x-4 : x+5]
				o[x] = k[0]*r[0] + k[1]*r[1] + k[2]*r[2] + k[3]*r[3] + k[4]*r[4] + k[5]*r[5] + k[6]*r[6] + k[7]*r[7] + k[8]*r[8]
				continue
			}
			var s float32
			for i := -4; i <= 4; i++ {
				s += k[i+4] * row[clamp(x+i, p.w)]
			}
			o[x] = s
		}
	}
	return out
}

// filterCols convolves each column of p with the 9-tap kernel k
// (centred), edges repeated.
func filterCols(p plane, k *[9]float32) plane {
	out := newPlane(p.w, p.h)
	for y := 0; y < p.h; y++ {
		o := out.v[y*p.w : (y+1)*p.w]
		for j := -4; j <= 4; j++ {
			r, kj := clamp(y+j, p.h), k[j+4]
			row := p.v[r*p.w : (r+1)*p.w]
			for x := range o {
				o[x] += kj * row[x]
			}
		}
	}
	return out
}

func addPlane(dst, src plane) {
	for i, v := range src.v {
		dst.v[i] += v
	}
}

func subInto(dst, src plane) {
	for i, v := range src.v {
		dst.v[i] -= v
	}
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
