package marks

import (
	"math"
	"standout/snapshot"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func node(tag string, geom []float64, d string, ctm snapshot.Matrix) *snapshot.Node {
	return &snapshot.Node{Tag: tag, Geom: geom, D: d, CTM: ctm}
}

func TestAnalyticAreas(t *testing.T) {
	// Analytic areas: πr², πab, w·h; flattened outlines within 0.1% (arcs
	// are split every 4°, whose inscribed polygon loses 0.05% of a circle).
	const rel = 1e-3
	g, ok, _ := Measure(node("circle", []float64{10, 20, 5}, "", snapshot.IdentityMatrix))
	require.True(t, ok)
	assert.InDelta(t, math.Pi*25, g.Area, 1e-9)
	assert.Equal(t, [4]float64{5, 15, 10, 10}, g.BBox)
	assert.Equal(t, ShapeCircle, g.Shape)
	g, _, _ = Measure(node("ellipse", []float64{0, 0, 4, 2}, "", snapshot.Matrix{2, 0, 0, 2, 0, 0}))
	assert.InDelta(t, math.Pi*8*4, g.Area, 1e-9)
	g, _, _ = Measure(node("rect", []float64{1, 2, 30, 40, 0, 0}, "", snapshot.IdentityMatrix))
	assert.InDelta(t, 1200, g.Area, 1e-9)
	assert.Equal(t, ShapeSquare, g.Shape)
	// A circle as two arcs (how several generators draw point symbols).
	g, _, err := Measure(node("path", nil, "M5,0A5,5,0,1,1,-5,0A5,5,0,1,1,5,0Z", snapshot.IdentityMatrix))
	require.NoError(t, err)
	assert.InEpsilon(t, math.Pi*25, g.Area, rel)
	assert.Equal(t, ShapeCircle, g.Shape)
	// Relative commands, implicit repeats, H and V.
	g, _, _ = Measure(node("path", nil, "m0 0 h10 v10 h-10 z", snapshot.IdentityMatrix))
	assert.InDelta(t, 100, g.Area, 1e-9)
	g, _, _ = Measure(node("path", nil, "M0,0 10,0 10,10 0,10Z", snapshot.IdentityMatrix))
	assert.InDelta(t, 100, g.Area, 1e-9)
	// A rotated ellipse arc (half of an ellipse with a = 20, b = 10).
	g, _, _ = Measure(node("path", nil, "M-20,0 A20,10 0 0 1 20,0 Z", snapshot.IdentityMatrix))
	assert.InEpsilon(t, math.Pi*20*10/2, g.Area, rel)
	// A cubic approximating a quarter circle (kappa = 0.5523, from memory):
	// the area is within 0.1% of πr²/4 + the triangle.
	g, _, _ = Measure(node("path", nil, "M0,0 L10,0 C10,5.523 5.523,10 0,10 Z", snapshot.IdentityMatrix))
	assert.InEpsilon(t, math.Pi*100/4, g.Area, 2e-3)
}

func TestArcImplementationNotes(t *testing.T) {
	// SVG 1.1 Appendix F.6.5: the four arcs through (0,0)-(10,0) with
	// rx = ry = 10 have centres at (5, ±8.66); large-arc and sweep choose
	// among them. F.6.6: a radius too small is scaled up until the arc
	// just fits (a half circle).
	mid := func(d string) Point {
		subs, _, err := ParsePath(d)
		require.NoError(t, err)
		// The arc's topmost point (smallest y).
		best := subs[0].Pts[0]
		for _, p := range subs[0].Pts {
			if p.Y < best.Y {
				best = p
			}
		}
		return best
	}
	// Small arc, sweep 1 (clockwise in y-down): bulges to negative y.
	// The flattened arc has a vertex every 4° or so, so the extreme is
	// found within r·(1 − cos 2°) ≈ 0.006 in y and r·sin 2° ≈ 0.35 in x.
	p := mid("M0,0 A10,10 0 0 1 10,0")
	assert.InDelta(t, 5, p.X, 0.4)
	assert.InDelta(t, -(10 - math.Sqrt(75)), p.Y, 0.05)
	// Large arc, sweep 1: through the far side, bottom of the circle centred at (5, 8.66).
	p = mid("M0,0 A10,10 0 1 1 10,0")
	assert.InDelta(t, 5, p.X, 0.4)
	assert.InDelta(t, -(10 + math.Sqrt(75)), p.Y, 0.05)
	// Radii scaled up: a half circle of radius 5.
	p = mid("M0,0 A1,1 0 0 1 10,0")
	assert.InDelta(t, 5, p.X, 0.4)
	assert.InDelta(t, -5, p.Y, 0.05)
	// Zero radius is a straight line (F.6.2).
	subs, _, err := ParsePath("M0,0 A0,5 0 0 1 10,0")
	require.NoError(t, err)
	assert.Equal(t, []Point{{0, 0}, {10, 0}}, subs[0].Pts)
}

func TestPathErrors(t *testing.T) {
	// SVG 1.1 §F.2: render up to the first error.
	subs, _, err := ParsePath("M0,0 L10,0 L10,10 X 5,5")
	assert.Error(t, err)
	require.Len(t, subs, 1)
	assert.Len(t, subs[0].Pts, 3)
	_, _, err = ParsePath("L0,0")
	assert.Error(t, err)
	_, _, err = ParsePath("M0,0 L NaN,1")
	assert.Error(t, err)
}

func TestShapeClasses(t *testing.T) {
	cases := []struct {
		d     string
		shape Shape
		angle float64
	}{
		{"M0,-10L8.66,5L-8.66,5Z", ShapeTriangle, 0},
		{"M0,10L8.66,-5L-8.66,-5Z", ShapeTriangle, 60},
		{"M-5,-5h10v10h-10Z", ShapeSquare, 0},
		{"M10,0L0,10L-10,0L0,-10Z", ShapeDiamond, 0},
		{"M-2,-6h4v4h4v4h-4v4h-4v-4h-4v-4h4Z", ShapeCross, 0},
		{"M0,-10L2.35,-3.24L9.51,-3.09L3.8,1.24L5.88,8.09L0,4L-5.88,8.09L-3.8,1.24L-9.51,-3.09L-2.35,-3.24Z", ShapeStar, 0},
		{"M0,0L10,0A10,10,0,0,1,0,10Z", ShapeWedge, 45},
	}
	for _, c := range cases {
		t.Run(c.d, func(t *testing.T) {
			g, ok, err := Measure(node("path", nil, c.d, snapshot.IdentityMatrix))
			require.True(t, ok, c.d)
			require.NoError(t, err)
			assert.Equal(t, c.shape, g.Shape, c.d)
			assert.InDelta(t, c.angle, g.Angle, 1.5, c.d)
		})
	}
	// Rotation by a transform shows in the angle, modulo the symmetry.
	g, _, _ := Measure(node("path", nil, "M0,-10L8.66,5L-8.66,5Z", snapshot.Matrix{math.Cos(0.5), math.Sin(0.5), -math.Sin(0.5), math.Cos(0.5), 0, 0}))
	assert.InDelta(t, 0.5*180/math.Pi, g.Angle, 0.5)
}

// A circle or an ellipse in a rotated or skewed space has the box of the
// shape itself (SVG 2 §8.9 asks for "the tightest fitting rectangle"), not
// the looser box of its transformed box: checked against 3,600 points of
// the transformed ellipse.
func TestEllipseBoxIsTheShapes(t *testing.T) {
	c, s := math.Cos(math.Pi/4), math.Sin(math.Pi/4)
	for _, m := range []snapshot.Matrix{
		{c, s, -s, c, 190, 0},      // rotate(45 …)
		{0.5, 0.2, 0.7, 1.5, 3, 4}, // skew and scale
		{0.25 * c, 0.25 * s, -0.25 * s, 0.25 * c, 50, 50},
	} {
		g, ok, err := Measure(node("ellipse", []float64{1, 2, 10, 4}, "", m))
		require.NoError(t, err)
		require.True(t, ok)
		minX, minY, maxX, maxY := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
		for i := 0; i < 3600; i++ {
			a := float64(i) * math.Pi / 1800
			x, y := m.Apply(1+10*math.Cos(a), 2+4*math.Sin(a))
			minX, maxX, minY, maxY = min(minX, x), max(maxX, x), min(minY, y), max(maxY, y)
		}
		want := [4]float64{minX, minY, maxX - minX, maxY - minY}
		for i := range want {
			assert.InDelta(t, want[i], g.BBox[i], 1e-4*max(want[2], want[3]), "matrix %v, box %d: %v against %v", m, i, g.BBox, want)
		}
	}
	// Rotated by 45°, the width is 2√((10 cos 45°)² + (4 sin 45°)²) = 2√58
	// (analytic).
	g, _, _ := Measure(node("ellipse", []float64{0, 0, 10, 4}, "", snapshot.Matrix{c, s, -s, c, 0, 0}))
	assert.InDelta(t, 2*math.Sqrt(58), g.BBox[2], 1e-9)
}
