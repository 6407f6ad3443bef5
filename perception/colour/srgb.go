package colour

import (
	"errors"
	"math"
	"strconv"
)

// SRGB is a gamma-encoded sRGB colour (IEC 61966-2-1:1999). Each channel is
// nominally within [0, 1]; values outside that range are out of gamut and
// are kept as they are unless a function says it clamps.
type SRGB struct{ R, G, B float64 }

// LinearRGB is linear-light sRGB: the encoded values with the sRGB transfer
// function removed. Same primaries and white (D65) as SRGB.
type LinearRGB struct{ R, G, B float64 }

// decode is the sRGB EOTF, IEC 61966-2-1:1999 (also WCAG 2.x relative
// luminance, with the post-2021 threshold):
//
//	L = V/12.92                   if V ≤ 0.04045
//	L = ((V + 0.055)/1.055)^2.4   otherwise
//
// Negative input is mirrored (sign-preserving), as CSS Color 4 does for
// extended-range sRGB.
func decode(v float64) float64 {
	a := math.Abs(v)
	var l float64
	if a <= 0.04045 {
		l = a / 12.92
	} else {
		l = math.Pow((a+0.055)/1.055, 2.4)
	}
	return math.Copysign(l, v)
}

// encode is the inverse of decode, IEC 61966-2-1:1999:
//
//	V = 12.92·L                   if L ≤ 0.0031308
//	V = 1.055·L^(1/2.4) − 0.055   otherwise
func encode(l float64) float64 {
	a := math.Abs(l)
	var v float64
	if a <= 0.0031308 {
		v = 12.92 * a
	} else {
		v = 1.055*math.Pow(a, 1/2.4) - 0.055
	}
	return math.Copysign(v, l)
}

// SRGBToLinear removes the sRGB transfer function.
func SRGBToLinear(c SRGB) LinearRGB {
	return LinearRGB{decode(c.R), decode(c.G), decode(c.B)}
}

// LinearToSRGB applies the sRGB transfer function.
func LinearToSRGB(c LinearRGB) SRGB {
	return SRGB{encode(c.R), encode(c.G), encode(c.B)}
}

func clamp01(v float64) float64 {
	if v < 0 {
		return 0
	}
	if v > 1 {
		return 1
	}
	return v
}

// Clamped returns c with each channel clamped to [0, 1]. NaN becomes 0.
func (c SRGB) Clamped() SRGB {
	f := func(v float64) float64 {
		if math.IsNaN(v) {
			return 0
		}
		return clamp01(v)
	}
	return SRGB{f(c.R), f(c.G), f(c.B)}
}

// InGamut reports whether every channel lies within [0, 1] (with a
// tolerance of 1e-9 for rounding).
func (c SRGB) InGamut() bool {
	const eps = 1e-9
	in := func(v float64) bool { return v >= -eps && v <= 1+eps }
	return in(c.R) && in(c.G) && in(c.B)
}

// RGB8 returns the channels clamped to [0, 1] and rounded to 8 bits.
func (c SRGB) RGB8() (r, g, b uint8) {
	q := func(v float64) uint8 { return uint8(math.Round(clamp01(v) * 255)) }
	c = c.Clamped()
	return q(c.R), q(c.G), q(c.B)
}

// Hex returns the colour as lowercase "#rrggbb", clamped and rounded to 8 bits.
func (c SRGB) Hex() string {
	const digits = "0123456789abcdef"
	r, g, b := c.RGB8()
	return string([]byte{'#', digits[r>>4], digits[r&15], digits[g>>4], digits[g&15], digits[b>>4], digits[b&15]})
}

// SRGB8 builds an SRGB from 8-bit channels.
func SRGB8(r, g, b uint8) SRGB {
	return SRGB{float64(r) / 255, float64(g) / 255, float64(b) / 255}
}

// ParseHex parses "#rgb", "#rrggbb" (case-insensitive, '#' optional). For
// the full CSS colour syntax see package static.
func ParseHex(s string) (SRGB, error) {
	h := s
	if len(h) > 0 && h[0] == '#' {
		h = h[1:]
	}
	nib := func(c byte) (uint8, bool) {
		switch {
		case c >= '0' && c <= '9':
			return c - '0', true
		case c >= 'a' && c <= 'f':
			return c - 'a' + 10, true
		case c >= 'A' && c <= 'F':
			return c - 'A' + 10, true
		}
		return 0, false
	}
	var v [6]uint8
	switch len(h) {
	case 3, 6:
		for i := 0; i < len(h); i++ {
			n, ok := nib(h[i])
			if !ok {
				return SRGB{}, errors.New("colour: " + strconv.Quote(s) + " is not a hex colour")
			}
			v[i] = n
		}
	default:
		return SRGB{}, errors.New("colour: " + strconv.Quote(s) + " is not a hex colour")
	}
	if len(h) == 3 {
		return SRGB8(v[0]*17, v[1]*17, v[2]*17), nil
	}
	return SRGB8(v[0]<<4|v[1], v[2]<<4|v[3], v[4]<<4|v[5]), nil
}

// MustHex is ParseHex for constants in code; it panics on a malformed
// literal, which is a programmer error.
func MustHex(s string) SRGB {
	c, err := ParseHex(s)
	if err != nil {
		panic(err)
	}
	return c
}

// HSLToSRGB converts CSS hsl() coordinates (hue in degrees, saturation and
// lightness within [0, 1]) to sRGB, by the sample code of CSS Color 4 §7.1
// (hslToRgb). Hue wraps; saturation and lightness are clamped.
func HSLToSRGB(h, s, l float64) SRGB {
	h = math.Mod(h, 360)
	if h < 0 {
		h += 360
	}
	s, l = clamp01(s), clamp01(l)
	a := s * min(l, 1-l)
	f := func(n float64) float64 {
		k := math.Mod(n+h/30, 12)
		return l - a*max(-1, min(k-3, 9-k, 1))
	}
	return SRGB{f(0), f(8), f(4)}
}
