// Package colour holds the colour science that every Standout judgement
// rests on: sRGB encoding, CIE XYZ and CIELAB under D65, CIEDE2000, WCAG 2.x
// contrast, compositing as browsers do it, colour-vision-deficiency (CVD)
// simulation and a size-dependent noticeable-difference model.
//
// Each colour space or encoding has its own type, and conversions are named
// XToY, so that passing gamma-encoded values where linear light is expected
// is a compile error rather than a silent bug:
//
//	SRGB ──SRGBToLinear──▶ LinearRGB ──LinearRGBToXYZ──▶ XYZ ──XYZToLab──▶ Lab ──LabToLCh──▶ LCh
//
// The white point is D65 throughout. CSS lab() and several libraries use D50
// Lab; values from those must not be compared with the values here.
//
// Numeric functions are total: out-of-range input is clamped where the
// documentation says so and NaN propagates. They never return errors and never
// panic on data.
package colour
