package saliency

import (
	"math"
	"math/rand"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The model's operations as first written, one output pixel at a time
// with clamped reads: the oracle the fast versions in saliency.go are
// checked against (TestFastMatchesReference). Kept in a test file, so
// they never reach the .wasm.

func (p plane) at(x, y int) float32 {
	x = min(max(x, 0), p.w-1)
	y = min(max(y, 0), p.h-1)
	return p.v[y*p.w+x]
}

// refCompute is Compute with the reference operations.
func refCompute(img *Image) Map {
	return computeWith(img, refOps)
}

var refOps = ops{reduce: refReduce, centreSurround: refCentreSurround, addInto: refAddInto, gabor: func(p plane, theta float64, _ plane) plane { return refGabor(p, theta) }}

func refReduce(p plane) plane {
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

func refCentreSurround(c, s plane, opponent bool) plane {
	d := newPlane(c.w, c.h)
	for y := 0; y < c.h; y++ {
		for x := 0; x < c.w; x++ {
			sv := refSample(s, (float64(x)+0.5)*float64(s.w)/float64(c.w)-0.5, (float64(y)+0.5)*float64(s.h)/float64(c.h)-0.5)
			d.v[y*c.w+x] = contrast(c.v[y*c.w+x], sv, opponent)
		}
	}
	return d
}

func refSample(p plane, x, y float64) float32 {
	x0, y0 := int(math.Floor(x)), int(math.Floor(y))
	fx, fy := float32(x-float64(x0)), float32(y-float64(y0))
	a := p.at(x0, y0)*(1-fx) + p.at(x0+1, y0)*fx
	b := p.at(x0, y0+1)*(1-fx) + p.at(x0+1, y0+1)*fx
	return a*(1-fy) + b*fy
}

func refAddInto(dst, src plane) {
	for y := 0; y < dst.h; y++ {
		for x := 0; x < dst.w; x++ {
			dst.v[y*dst.w+x] += refSample(src, (float64(x)+0.5)*float64(src.w)/float64(dst.w)-0.5, (float64(y)+0.5)*float64(src.h)/float64(dst.h)-0.5)
		}
	}
}

func refGabor(p plane, theta float64) plane {
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

// The fast operations compute the model as the reference ones do: the
// same map, to float32 rounding, and the same regions, on charts of
// several sizes (odd ones too, whose pyramids clamp at every level), on
// the published model's test displays and on noise.
func TestFastMatchesReference(t *testing.T) {
	noise := NewImage(97, 61)
	rng := rand.New(rand.NewSource(7))
	for i := range noise.R {
		noise.R[i], noise.G[i], noise.B[i] = rng.Float32(), rng.Float32(), rng.Float32()
	}
	singleton := field(480, 400, "#ffffff")
	for k := 0; k < 42; k++ {
		c := "#5b7fa6"
		if k == 30 {
			c = "#d1495b"
		}
		fill(singleton, [4]int{40 + k%7*60, 40 + k/7*60, 16, 16}, c)
	}
	lines := field(333, 257, "#f4f1ea")
	for k := 0; k < 12; k++ {
		fill(lines, [4]int{10 + k*26, 20, 3, 200}, "#334455")
	}
	fill(lines, [4]int{150, 100, 120, 3}, "#334455")
	for name, img := range map[string]*Image{"bars 600×400": chart600x400(), "colour singleton": singleton, "orientation": lines, "noise 97×61": noise, "smallest": field(MinSize, MinSize+3, "#808080")} {
		t.Run(name, func(t *testing.T) {
			got, want := Compute(img), refCompute(img)
			require.Equal(t, want.W, got.W)
			require.Equal(t, want.H, got.H)
			var peak float32
			for _, v := range want.V {
				peak = max(peak, v)
			}
			var worst float64
			for i := range want.V {
				worst = max(worst, math.Abs(float64(want.V[i]-got.V[i])))
			}
			if peak == 0 {
				assert.Zero(t, worst, "a flat map stays flat")
				return
			}
			t.Logf("largest difference: %.2g of the peak", worst/float64(peak))
			assert.Less(t, worst/float64(peak), 1e-2)
			// Float32 sums in another order move a cell that sits on the
			// regions' threshold across it now and then: every region clear
			// of the threshold is found by both, their boxes overlapping by
			// at least half.
			wr, gr := Regions(want, img.W, img.H), Regions(got, img.W, img.H)
			require.NotEmpty(t, wr)
			assert.GreaterOrEqual(t, iou(wr[0].Box, gr[0].Box), 0.5, "the strongest region: %v against %v", gr[0].Box, wr[0].Box)
			for _, pair := range [][2][]Region{{wr, gr}, {gr, wr}} {
				for _, r := range pair[0] {
					if r.Salience < RegionShare+0.02 {
						continue
					}
					found := false
					for _, o := range pair[1] {
						found = found || iou(r.Box, o.Box) >= 0.5 && math.Abs(r.Salience-o.Salience) < 0.01
					}
					assert.True(t, found, "region %v (salience %.3f) has no match in %v", r.Box, r.Salience, pair[1])
				}
			}
		})
	}
}

// iou is the intersection over union of two boxes.
func iou(a, b [4]float64) float64 {
	w := min(a[0]+a[2], b[0]+b[2]) - max(a[0], b[0])
	h := min(a[1]+a[3], b[1]+b[3]) - max(a[1], b[1])
	if w <= 0 || h <= 0 {
		return 0
	}
	return w * h / (a[2]*a[3] + b[2]*b[3] - w*h)
}
