package colour

import (
	"errors"
	"math"
	"strconv"
)

// Deficiency names a type of colour-vision deficiency.
type Deficiency int

// The deficiency types Standout simulates, at a severity within [0, 1]
// (1 is dichromacy). Protan and Deutan use Machado et al. (2009). Tritan
// uses Brettel, Viénot & Mollon's (1997) tritanope, blended with normal
// vision below severity 1 (brettel.go): Machado's tritanomaly is only a
// rough approximation. Achromat is a luminance greyscale: every colour
// becomes the grey of its relative luminance. It is not a model of rod
// monochromacy (whose spectral sensitivity and acuity differ), only a
// check of what survives without hue.
const (
	Normal Deficiency = iota
	Protan
	Deutan
	Tritan
	Achromat
)

// Deficiencies lists the simulated types in report order.
var Deficiencies = []Deficiency{Protan, Deutan, Tritan, Achromat}

var deficiencyNames = [...]string{"normal", "protan", "deutan", "tritan", "achromat"}

// String returns the report key: "normal", "protan", "deutan", "tritan" or
// "achromat".
func (d Deficiency) String() string {
	if d < 0 || int(d) >= len(deficiencyNames) {
		return "Deficiency(" + strconv.Itoa(int(d)) + ")"
	}
	return deficiencyNames[d]
}

// ParseDeficiency is the inverse of String.
func ParseDeficiency(s string) (Deficiency, error) {
	for i, n := range deficiencyNames {
		if n == s {
			return Deficiency(i), nil
		}
	}
	return 0, errors.New("colour: unknown vision type " + strconv.Quote(s) + " (want normal, protan, deutan, tritan or achromat)")
}

// Matrix is a row-major 3×3 matrix acting on linear RGB column vectors.
type Matrix [9]float64

// Apply multiplies m by the column vector c.
func (m *Matrix) Apply(c LinearRGB) LinearRGB {
	return LinearRGB{
		m[0]*c.R + m[1]*c.G + m[2]*c.B,
		m[3]*c.R + m[4]*c.G + m[5]*c.B,
		m[6]*c.R + m[7]*c.G + m[8]*c.B,
	}
}

// Identity is the 3×3 identity matrix.
var Identity = Matrix{1, 0, 0, 0, 1, 0, 0, 0, 1}

// achromatMatrix maps every colour to the grey of equal relative luminance
// in linear light: R = G = B = Y with the WCAG/IEC weights
// (0.2126, 0.7152, 0.0722). This is the usual rod-monochromat model; it is a
// design choice, not a fitted model of any observer.
var achromatMatrix = Matrix{
	0.2126, 0.7152, 0.0722,
	0.2126, 0.7152, 0.0722,
	0.2126, 0.7152, 0.0722,
}

// MachadoMatrix returns the Machado, Oliveira & Fernandes (2009) matrix for
// an anomalous trichromacy of the given type and severity. Severity is
// clamped to [0, 1]; between the published tenths the matrix is
// interpolated linearly element by element (as colorspacious does;
// colour-science extrapolates from the next interval and culori snaps to the
// nearest tenth, both of which disagree with the published values off the
// grid). At every multiple of 0.1 the published matrix is returned exactly.
// Achromat returns the luminance matrix whatever the severity is, blended
// with identity by severity. Normal returns identity.
func MachadoMatrix(d Deficiency, severity float64) Matrix {
	s := clamp01(severity)
	if math.IsNaN(severity) {
		s = 0
	}
	switch d {
	case Protan, Deutan, Tritan:
	case Achromat:
		var m Matrix
		for i := range m {
			m[i] = (1-s)*Identity[i] + s*achromatMatrix[i]
		}
		return m
	default:
		return Identity
	}
	t := &machadoTables[d-Protan]
	x := s * 10
	i := int(math.Floor(x + 1e-9))
	if i >= 10 {
		return Matrix(t[10])
	}
	f := x - float64(i)
	if f < 1e-9 {
		return Matrix(t[i])
	}
	var m Matrix
	for k := range m {
		m[k] = (1-f)*t[i][k] + f*t[i+1][k]
	}
	return m
}

// Simulate returns c as a reader with deficiency d at the given severity
// would see it, by the Machado et al. (2009) model (Tritan: Brettel et al.
// 1997; Achromat: luminance only), applied in linear light: decode, multiply, clamp to [0, 1], encode.
// The matrices are built from display-primary spectra and cone
// fundamentals, which are linear-light quantities; colorspacious and R's
// colorspace (since 2.0-3) apply them in linear RGB, culori applies them to
// gamma-encoded values. Standout follows the model's linear definition.
func Simulate(d Deficiency, severity float64, c SRGB) SRGB {
	switch d {
	case Normal:
		return c
	case Tritan:
		s := clamp01(severity)
		if s != s { // NaN
			s = 0
		}
		m := brettelTritan.At(SRGBToLinear(c), s)
		return SimulateWith(&m, c)
	}
	m := MachadoMatrix(d, severity)
	return SimulateWith(&m, c)
}

// SimulateWith applies a linear-RGB matrix to an encoded colour, clamping in
// linear light before encoding again.
func SimulateWith(m *Matrix, c SRGB) SRGB {
	l := m.Apply(SRGBToLinear(c))
	return LinearToSRGB(LinearRGB{clamp01(l.R), clamp01(l.G), clamp01(l.B)})
}
