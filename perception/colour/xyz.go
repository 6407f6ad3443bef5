package colour

// XYZ is CIE 1931 XYZ (2° observer) relative to a D65 white with Y = 1 for
// the white, so Y ranges within [0, 1] for sRGB colours.
type XYZ struct{ X, Y, Z float64 }

// D65 is the reference white, derived from the chromaticity
// (x, y) = (0.3127, 0.3290) of IEC 61966-2-1 with Y = 1, as CSS Color 4
// does: (x/y, 1, (1−x−y)/y).
var D65 = XYZ{0.3127 / 0.3290, 1, (1 - 0.3127 - 0.3290) / 0.3290}

// linearToXYZ is the sRGB → XYZ matrix derived from the sRGB primaries and
// the D65 chromaticity, as printed in CSS Color Module Level 4 §18
// ("sample code for color conversions", lin_sRGB_to_XYZ). It agrees with
// the 4-decimal IEC 61966-2-1 matrix to 1e-4 and makes white map exactly to
// D65 above.
var linearToXYZ = [3][3]float64{
	{506752.0 / 1228815, 87881.0 / 245763, 12673.0 / 70218},
	{87098.0 / 409605, 175762.0 / 245763, 12673.0 / 175545},
	{7918.0 / 409605, 87881.0 / 737289, 1001167.0 / 1053270},
}

// xyzToLinear is the inverse of linearToXYZ, CSS Color 4 §18 (XYZ_to_lin_sRGB).
var xyzToLinear = [3][3]float64{
	{12831.0 / 3959, -329.0 / 214, -1974.0 / 3959},
	{-851781.0 / 878810, 1648619.0 / 878810, 36519.0 / 878810},
	{705.0 / 12673, -2585.0 / 12673, 705.0 / 667},
}

func mul3(m *[3][3]float64, a, b, c float64) (float64, float64, float64) {
	return m[0][0]*a + m[0][1]*b + m[0][2]*c,
		m[1][0]*a + m[1][1]*b + m[1][2]*c,
		m[2][0]*a + m[2][1]*b + m[2][2]*c
}

// LinearRGBToXYZ converts linear-light sRGB to XYZ (D65).
func LinearRGBToXYZ(c LinearRGB) XYZ {
	x, y, z := mul3(&linearToXYZ, c.R, c.G, c.B)
	return XYZ{x, y, z}
}

// XYZToLinearRGB converts XYZ (D65) to linear-light sRGB, unclamped.
func XYZToLinearRGB(c XYZ) LinearRGB {
	r, g, b := mul3(&xyzToLinear, c.X, c.Y, c.Z)
	return LinearRGB{r, g, b}
}
