package colour

// Viénot, Brettel & Mollon (1999), "Digital video colourmaps for checking the
// legibility of displays by dichromats", Color Res. Appl. 24(4), 243–252.
// The dichromat's colours are projected onto a single plane in LMS space
// through black, the monitor white and the blue primary. The paper covers
// protanopes and deuteranopes only.
//
// Constants, from the paper's Fig. 2 and text (transcribed; the combined
// matrix and projection coefficients were re-derived from the published
// primaries and the Smith & Pokorny fundamentals):
//
//	linear RGB → LMS = [[17.8824, 43.5161, 4.11935],
//	                    [3.45565, 27.1554, 3.86714],
//	                    [0.0299566, 0.184309, 1.46709]]
//	protanope:   L′ = 2.02344·M − 2.52581·S
//	deuteranope: M′ = 0.494207·L + 1.24827·S
//
// The RGB is that of the paper's 1999 video monitor, close to but not
// exactly sRGB; applying it to sRGB is an approximation. The 0.992052 gamut
// pre-scaling some implementations add is not applied.
var vienotRGBToLMS = [3][3]float64{
	{17.8824, 43.5161, 4.11935},
	{3.45565, 27.1554, 3.86714},
	{0.0299566, 0.184309, 1.46709},
}

var (
	vienotProtan = vienotMatrix([3][3]float64{{0, 2.02344, -2.52581}, {0, 1, 0}, {0, 0, 1}})
	vienotDeutan = vienotMatrix([3][3]float64{{1, 0, 0}, {0.494207, 0, 1.24827}, {0, 0, 1}})
)

// VienotMatrix returns the single linear-RGB matrix M⁻¹·P·M of Viénot et
// al. (1999) for a protanope or deuteranope. Other types return identity
// and false.
func VienotMatrix(d Deficiency) (Matrix, bool) {
	switch d {
	case Protan:
		return vienotProtan, true
	case Deutan:
		return vienotDeutan, true
	}
	return Identity, false
}

func vienotMatrix(p [3][3]float64) Matrix {
	inv := invert3(vienotRGBToLMS)
	pm := matMul(p, vienotRGBToLMS)
	r := matMul(inv, pm)
	return Matrix{r[0][0], r[0][1], r[0][2], r[1][0], r[1][1], r[1][2], r[2][0], r[2][1], r[2][2]}
}

func matMul(a, b [3][3]float64) [3][3]float64 {
	var r [3][3]float64
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			for k := 0; k < 3; k++ {
				r[i][j] += a[i][k] * b[k][j]
			}
		}
	}
	return r
}

// invert3 inverts a 3×3 matrix by the adjugate. It is only called on the
// constant, well-conditioned matrix above.
func invert3(m [3][3]float64) [3][3]float64 {
	a, b, c := m[0][0], m[0][1], m[0][2]
	d, e, f := m[1][0], m[1][1], m[1][2]
	g, h, i := m[2][0], m[2][1], m[2][2]
	det := a*(e*i-f*h) - b*(d*i-f*g) + c*(d*h-e*g)
	return [3][3]float64{
		{(e*i - f*h) / det, (c*h - b*i) / det, (b*f - c*e) / det},
		{(f*g - d*i) / det, (a*i - c*g) / det, (c*d - a*f) / det},
		{(d*h - e*g) / det, (b*g - a*h) / det, (a*e - b*d) / det},
	}
}
