package colour

// WCAG 2.x thresholds for contrast ratios. The ratios must not be rounded
// before comparison: 2.999:1 does not meet 3:1 (Understanding SC 1.4.11).
const (
	// NonTextContrast is SC 1.4.11 Non-text Contrast (Level AA): 3:1 for
	// graphical objects required to understand the content.
	NonTextContrast = 3.0
	// TextContrast is SC 1.4.3 Contrast (Minimum) (Level AA): 4.5:1 for text.
	TextContrast = 4.5
	// LargeTextContrast is SC 1.4.3 for large-scale text (at least 18 pt,
	// or 14 pt bold): 3:1.
	LargeTextContrast = 3.0
)

// RelativeLuminance is WCAG 2.x relative luminance (Understanding WCAG,
// definition "relative luminance"):
//
//	L = 0.2126 R + 0.7152 G + 0.0722 B
//
// with R, G, B the linear channels (decoded with the 0.04045 threshold).
// These 4-decimal weights are the normative ones; they differ from the Y row
// of the exact sRGB matrix by about 1e-5. The input is clamped to [0, 1].
// The result is within [0, 1].
func RelativeLuminance(c SRGB) float64 {
	l := SRGBToLinear(c.Clamped())
	return 0.2126*l.R + 0.7152*l.G + 0.0722*l.B
}

// ContrastRatio is the WCAG 2.x contrast ratio (L1 + 0.05)/(L2 + 0.05), with
// L1 the lighter of the two relative luminances. It is within [1, 21] and is
// not rounded.
func ContrastRatio(x, y SRGB) float64 {
	a, b := RelativeLuminance(x), RelativeLuminance(y)
	if a < b {
		a, b = b, a
	}
	return (a + 0.05) / (b + 0.05)
}

// MeetsNonText reports whether a graphical object of colour fg against bg
// meets SC 1.4.11 (3:1).
func MeetsNonText(fg, bg SRGB) bool { return ContrastRatio(fg, bg) >= NonTextContrast }

// MeetsText reports whether text of colour fg against bg meets SC 1.4.3,
// 4.5:1, or 3:1 when large is true.
func MeetsText(fg, bg SRGB, large bool) bool {
	if large {
		return ContrastRatio(fg, bg) >= LargeTextContrast
	}
	return ContrastRatio(fg, bg) >= TextContrast
}
