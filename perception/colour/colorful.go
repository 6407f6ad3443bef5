package colour

import (
	"math"

	colorful "github.com/lucasb-eyer/go-colorful"
)

// This file is the one adapter to github.com/lucasb-eyer/go-colorful. The
// library works on a /100 scale for Lab (L within [0, 1]); the adapter
// rescales so that the rest of the package speaks CIE units.

var whiteRef = [3]float64{D65.X, D65.Y, D65.Z}

func xyzToLab(c XYZ) Lab {
	l, a, b := colorful.XyzToLabWhiteRef(c.X, c.Y, c.Z, whiteRef)
	return Lab{l * 100, a * 100, b * 100}
}

func labToXYZ(c Lab) XYZ {
	x, y, z := colorful.LabToXyzWhiteRef(c.L/100, c.A/100, c.B/100, whiteRef)
	return XYZ{x, y, z}
}

// HSLToSRGB converts CSS hsl() coordinates (hue in degrees, saturation and
// lightness within [0, 1]) to sRGB, CSS Color 4 §7. Hue wraps.
func HSLToSRGB(h, s, l float64) SRGB {
	h = math.Mod(h, 360)
	if h < 0 {
		h += 360
	}
	c := colorful.Hsl(h, clamp01(s), clamp01(l))
	return SRGB{c.R, c.G, c.B}
}

// ToColorful converts to go-colorful's type, for callers that want its
// blending functions.
func ToColorful(c SRGB) colorful.Color { return colorful.Color{R: c.R, G: c.G, B: c.B} }
