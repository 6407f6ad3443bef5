package colour

import (
	"encoding/json"
	"math"
	"math/rand"
	"os"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The checks below derive from the definition in Brettel, Viénot & Mollon
// (1997), J. Opt. Soc. Am. A 14(10): a tritanope's colour is the stimulus
// projected along the S axis (L and M kept) onto one of two half-planes
// through the neutral axis and the 485 nm or 660 nm anchor. No library the
// registries carry implements the model (REFERENCES §10), so the oracle is
// the geometry the paper states, with the anchors' colour-matching values
// from the npm package spectral-color.

func TestTritanAnchorsAreTheCIETable(t *testing.T) {
	// Source: spectral-color 0.1.0, cmfs.CIE_1931_2DEG, written by
	// testdata/cie1931-anchors.mjs.
	raw, err := os.ReadFile("testdata/cie1931-anchors.json")
	require.NoError(t, err)
	var table struct {
		NM map[string][3]float64 `json:"nm"`
	}
	require.NoError(t, json.Unmarshal(raw, &table))
	assert.Equal(t, table.NM["485"], [3]float64{cie1931At485.X, cie1931At485.Y, cie1931At485.Z})
	assert.Equal(t, table.NM["660"], [3]float64{cie1931At660.X, cie1931At660.Y, cie1931At660.Z})
}

func lmsOf(c LinearRGB) [3]float64 {
	x := LinearRGBToXYZ(c)
	return vec(smithPokorny, x.X, x.Y, x.Z)
}

func inGamut(c LinearRGB) bool {
	for _, v := range []float64{c.R, c.G, c.B} {
		if v < 0 || v > 1 {
			return false
		}
	}
	return true
}

func TestTritanProjectsAlongS(t *testing.T) {
	rng := rand.New(rand.NewSource(1997))
	checked := 0
	for i := 0; i < 5000; i++ {
		in := LinearRGB{rng.Float64(), rng.Float64(), rng.Float64()}
		m := brettelTritan.At(in, 1)
		out := m.Apply(in)
		if !inGamut(out) {
			continue // clamped to the display: no longer the projection
		}
		checked++
		a, b := lmsOf(in), lmsOf(out)
		// L and M are kept: the projection runs along S.
		require.InDelta(t, a[0], b[0], 1e-9)
		require.InDelta(t, a[1], b[1], 1e-9)
		// A dichromat's colour is its own simulation.
		again := brettelTritan.At(out, 1)
		back := again.Apply(out)
		require.InDelta(t, out.R, back.R, 1e-9)
		require.InDelta(t, out.G, back.G, 1e-9)
		require.InDelta(t, out.B, back.B, 1e-9)
	}
	assert.Greater(t, checked, 2500, "most random colours stay in gamut")
}

func TestTritanSurfaceIsTwoHalfPlanes(t *testing.T) {
	neutral := lmsOf(LinearRGB{1, 1, 1})
	anchors := []XYZ{cie1931At485, cie1931At660}
	rng := rand.New(rand.NewSource(7))
	for i := 0; i < 2000; i++ {
		in := LinearRGB{rng.Float64(), rng.Float64(), rng.Float64()}
		w := brettelTritan.wingOf(in)
		m := brettelTritan.At(in, 1)
		q := lmsOf(m.Apply(in))
		a := anchors[w]
		n := crossV(neutral, vec(smithPokorny, a.X, a.Y, a.Z))
		// On the plane through the neutral axis and its wing's anchor …
		require.InDelta(t, 0, (n[0]*q[0]+n[1]*q[1]+n[2]*q[2])/math.Sqrt(n[0]*n[0]+n[1]*n[1]+n[2]*n[2]), 1e-9)
	}
	// … and the anchors lie on opposite sides of the plane that picks the
	// wing, so each wing is a half-plane, not a whole one.
	side := func(x XYZ) float64 {
		l := vec(xyzToLinear, x.X, x.Y, x.Z)
		return brettelTritan.side[0]*l[0] + brettelTritan.side[1]*l[1] + brettelTritan.side[2]*l[2]
	}
	assert.Greater(t, side(cie1931At485), 0.0)
	assert.Less(t, side(cie1931At660), 0.0)
}

func TestTritanKeepsNeutralsAndAnchors(t *testing.T) {
	for _, hex := range []string{"#000000", "#404040", "#808080", "#c8c8c8", "#ffffff"} {
		assert.Equal(t, hex, Simulate(Tritan, 1, MustHex(hex)).Hex(), "a grey looks the same to a tritanope")
	}
	// The monochromatic anchors are seen alike by trichromats and
	// tritanopes: each is fixed by its wing's projection (in LMS, as they
	// lie outside the sRGB gamut).
	for w, a := range []XYZ{cie1931At485, cie1931At660} {
		l := vec(xyzToLinear, a.X, a.Y, a.Z)
		in := LinearRGB{l[0], l[1], l[2]}
		require.Equal(t, w, brettelTritan.wingOf(in))
		m := brettelTritan.wing[w]
		out := m.Apply(in)
		want, got := lmsOf(in), lmsOf(out)
		for k := range want {
			assert.InDelta(t, want[k], got[k], 1e-9)
		}
	}
}

func TestTritanConfusionLine(t *testing.T) {
	// Colours that differ only in their S-cone response lie on one
	// tritan confusion line: a tritanope sees them alike.
	rgbToLMS := matMul(smithPokorny, linearToXYZ)
	lmsToRGB := invert3(rgbToLMS)
	base := lmsOf(LinearRGB{0.3, 0.4, 0.2})
	var got []SRGB
	for _, dS := range []float64{-0.002, 0, 0.002} {
		l := vec(lmsToRGB, base[0], base[1], base[2]+dS)
		in := LinearRGB{l[0], l[1], l[2]}
		require.True(t, inGamut(in))
		got = append(got, Simulate(Tritan, 1, LinearToSRGB(in)))
	}
	assert.NotEqual(t, LinearToSRGB(LinearRGB{0.3, 0.4, 0.2}).Hex(), got[0].Hex(), "the simulation changes the colour")
	for _, g := range got[1:] {
		assert.InDelta(t, got[0].R, g.R, 1e-6)
		assert.InDelta(t, got[0].G, g.G, 1e-6)
		assert.InDelta(t, got[0].B, g.B, 1e-6)
	}
}

func TestTritanSeverityBlends(t *testing.T) {
	c := MustHex("#2a6fa8")
	assert.Equal(t, c, Simulate(Tritan, 0, c))
	assert.Equal(t, c, Simulate(Tritan, math.NaN(), c))
	full, half := SRGBToLinear(Simulate(Tritan, 1, c)), SRGBToLinear(Simulate(Tritan, 0.5, c))
	in := SRGBToLinear(c)
	assert.InDelta(t, (in.R+full.R)/2, half.R, 1e-9)
	assert.InDelta(t, (in.G+full.G)/2, half.G, 1e-9)
	assert.InDelta(t, (in.B+full.B)/2, half.B, 1e-9)
}

func TestTritanAgreesWithAnotherDerivation(t *testing.T) {
	// From memory: libDaltonLens's Brettel (1997) tritan matrices, derived
	// with other cone fundamentals and sRGB white as the neutral point, so
	// agreement is expected to about 0.01, not exactly. Its wing 1 is the
	// 660 nm one.
	w660 := Matrix{1.01277, 0.13548, -0.14826, -0.01243, 0.86812, 0.14431, 0.07589, 0.80500, 0.11911}
	w485 := Matrix{0.93678, 0.18979, -0.12657, 0.06154, 0.81526, 0.12320, -0.37562, 1.12767, 0.24796}
	sep := [3]float64{0.03901, -0.02788, -0.01113}
	for i := range w660 {
		assert.InDelta(t, w485[i], brettelTritan.wing[0][i], 0.015, "485 nm wing, element %d", i)
		assert.InDelta(t, w660[i], brettelTritan.wing[1][i], 0.015, "660 nm wing, element %d", i)
	}
	norm := func(v [3]float64) [3]float64 {
		l := math.Sqrt(v[0]*v[0] + v[1]*v[1] + v[2]*v[2])
		return [3]float64{v[0] / l, v[1] / l, v[2] / l}
	}
	a, b := norm(sep), norm(brettelTritan.side)
	for k := range a {
		assert.InDelta(t, -a[k], b[k], 0.02, "the separating plane, opposite orientation")
	}
}
