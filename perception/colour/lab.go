package colour

import "math"

// Lab is CIE 1976 L*a*b* relative to the D65 white of this package. L is
// within [0, 100] for sRGB colours; a and b are unbounded (roughly ±128
// for sRGB).
type Lab struct{ L, A, B float64 }

// LCh is the cylindrical form of Lab: chroma C = √(a² + b²) ≥ 0 and hue H in
// degrees within [0, 360).
type LCh struct{ L, C, H float64 }

// XYZToLab converts XYZ (D65, Y = 1 for white) to CIELAB (CIE 15:2004 §8.2.1):
//
//	L* = 116 f(Y/Yn) − 16,  a* = 500 (f(X/Xn) − f(Y/Yn)),  b* = 200 (f(Y/Yn) − f(Z/Zn))
//	f(t) = t^(1/3) if t > ε, else (κ t + 16)/116,  ε = 216/24389, κ = 24389/27
//
// Written here rather than taken from a colour library, so that the core
// in the extension links no library it would carry for three formulas;
// lab_test.go holds it to go-colorful's conversion.
func XYZToLab(c XYZ) Lab {
	fy := labF(c.Y / D65.Y)
	return Lab{116*fy - 16, 500 * (labF(c.X/D65.X) - fy), 200 * (fy - labF(c.Z/D65.Z))}
}

// LabToXYZ is the inverse of XYZToLab (CIE 15:2004 §8.2.1.2).
func LabToXYZ(c Lab) XYZ {
	fy := (c.L + 16) / 116
	return XYZ{D65.X * labFInv(fy+c.A/500), D65.Y * labFInv(fy), D65.Z * labFInv(fy-c.B/200)}
}

// Lab's companding function f and its inverse, with δ = 6/29: ε = δ³, and
// (κ t + 16)/116 = t/(3δ²) + 4/29.
const labDelta = 6.0 / 29.0

func labF(t float64) float64 {
	if t > labDelta*labDelta*labDelta {
		return math.Cbrt(t)
	}
	return t/(3*labDelta*labDelta) + 4.0/29.0
}

func labFInv(t float64) float64 {
	if t > labDelta {
		return t * t * t
	}
	return 3 * labDelta * labDelta * (t - 4.0/29.0)
}

// SRGBToLab converts gamma-encoded sRGB to CIELAB (D65).
func SRGBToLab(c SRGB) Lab { return XYZToLab(LinearRGBToXYZ(SRGBToLinear(c))) }

// LabToSRGB converts CIELAB (D65) to gamma-encoded sRGB, unclamped.
func LabToSRGB(c Lab) SRGB { return LinearToSRGB(XYZToLinearRGB(LabToXYZ(c))) }

// LabToLCh converts Lab to its cylindrical form. The hue of a neutral colour
// (C = 0) is 0.
func LabToLCh(c Lab) LCh {
	h := math.Atan2(c.B, c.A) * 180 / math.Pi
	if h < 0 {
		h += 360
	}
	return LCh{c.L, math.Hypot(c.A, c.B), h}
}

// LChToLab is the inverse of LabToLCh.
func LChToLab(c LCh) Lab {
	s, co := math.Sincos(c.H * math.Pi / 180)
	return Lab{c.L, c.C * co, c.C * s}
}
