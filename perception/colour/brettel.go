package colour

// Brettel, Viénot & Mollon (1997), "Computerized simulation of color
// appearance for dichromats", J. Opt. Soc. Am. A 14(10), 2647–2655.
//
// A dichromat's colours form a surface of two half-planes in LMS space,
// each bounded by the neutral axis and passing through the LMS point of a
// monochromatic stimulus that trichromats and the dichromat see alike: for
// tritanopes, 485 nm and 660 nm. Every stimulus is projected, along the
// axis of the missing cone class (S for tritanopes), onto the half-plane on
// its side of the neutral axis. Standout uses it for Tritan, where Machado
// et al. (2009) offer only a rough tritanomaly.
//
// Constants:
//   - the anchors' XYZ are the CIE 1931 2° colour-matching functions at
//     485 and 660 nm, as the npm package spectral-color 0.1.0 tabulates
//     them (testdata/cie1931-anchors.json, written by
//     testdata/cie1931-anchors.mjs; a test keeps the two equal);
//   - XYZ → LMS is Smith & Pokorny's, as Viénot et al. (1999) print it
//     (vienot.go; REFERENCES §4.3 marks it MEMORY, supported by the
//     combined matrix it reproduces). Brettel et al. used Judd–Vos
//     corrected XYZ; applying the matrix to CIE 1931 XYZ, as sRGB is
//     defined, is the usual approximation.
//   - the neutral axis is the LMS of sRGB white, R = G = B = 1.
var (
	cie1931At485 = XYZ{0.05795001, 0.1693, 0.6162}
	cie1931At660 = XYZ{0.1649, 0.061, 0}

	smithPokorny = [3][3]float64{
		{0.15514, 0.54312, -0.03286},
		{-0.15514, 0.45684, 0.03286},
		{0, 0, 0.01608},
	}
)

// dichromat is a two-wing simulation in linear RGB: the matrix of each
// half-plane and the separating plane's normal that picks one.
type dichromat struct {
	wing [2]Matrix
	side [3]float64 // linear-RGB coefficients; ≥ 0 selects wing[0]
}

var brettelTritan = newTritan()

// newTritan builds the tritanope's two wings: M⁻¹·P·M per half-plane,
// where M is linear RGB → LMS and P keeps L and M and sets S on the plane
// through the neutral axis and the wing's anchor.
func newTritan() dichromat {
	rgbToLMS := matMul(smithPokorny, linearToXYZ)
	lmsToRGB := invert3(rgbToLMS)
	neutral := vec(rgbToLMS, 1, 1, 1)
	var t dichromat
	for w, anchor := range []XYZ{cie1931At485, cie1931At660} {
		n := crossV(neutral, vec(smithPokorny, anchor.X, anchor.Y, anchor.Z))
		p := [3][3]float64{{1, 0, 0}, {0, 1, 0}, {-n[0] / n[2], -n[1] / n[2], 0}}
		r := matMul(lmsToRGB, matMul(p, rgbToLMS))
		t.wing[w] = Matrix{r[0][0], r[0][1], r[0][2], r[1][0], r[1][1], r[1][2], r[2][0], r[2][1], r[2][2]}
	}
	// The plane through the neutral axis and the S axis separates the
	// wings: moving along S keeps a colour on its side of it.
	sep := crossV(neutral, [3]float64{0, 0, 1})
	a := vec(smithPokorny, cie1931At485.X, cie1931At485.Y, cie1931At485.Z)
	if sep[0]*a[0]+sep[1]*a[1]+sep[2]*a[2] < 0 {
		sep = [3]float64{-sep[0], -sep[1], -sep[2]}
	}
	// In linear RGB: sepᵀ·M.
	for j := 0; j < 3; j++ {
		t.side[j] = sep[0]*rgbToLMS[0][j] + sep[1]*rgbToLMS[1][j] + sep[2]*rgbToLMS[2][j]
	}
	return t
}

// wingOf says which half-plane a linear-RGB colour projects onto.
func (t *dichromat) wingOf(c LinearRGB) int {
	if t.side[0]*c.R+t.side[1]*c.G+t.side[2]*c.B >= 0 {
		return 0
	}
	return 1
}

// At returns the matrix that simulates c at the given severity: its
// wing's projection blended with identity, (1−s)·I + s·W.
func (t *dichromat) At(c LinearRGB, severity float64) Matrix {
	w := &t.wing[t.wingOf(c)]
	var m Matrix
	for i := range m {
		m[i] = (1-severity)*Identity[i] + severity*w[i]
	}
	return m
}

// TritanWings returns the Brettel tritanope's two wing matrices (linear
// RGB → linear RGB) and the linear-RGB normal of the plane that picks one
// (non-negative dot product: the first), for the extension's preview.
func TritanWings() (wing [2]Matrix, side [3]float64) {
	return brettelTritan.wing, brettelTritan.side
}

func vec(m [3][3]float64, a, b, c float64) [3]float64 {
	x, y, z := mul3(&m, a, b, c)
	return [3]float64{x, y, z}
}

func crossV(a, b [3]float64) [3]float64 {
	return [3]float64{a[1]*b[2] - a[2]*b[1], a[2]*b[0] - a[0]*b[2], a[0]*b[1] - a[1]*b[0]}
}
