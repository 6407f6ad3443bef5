package snapshot

import (
	"math"

	"standout/perception/colour"
)

// Colour is a colour as the snapshot stores it unpacked: non-premultiplied
// sRGB with straight alpha.
type Colour = colour.RGBA

// RGBA packs a colour as 0xRRGGBBAA, rounding each channel to 8 bits.
func RGBA(c Colour) uint32 {
	r, g, b := c.SRGB.RGB8()
	a := uint32(math.Round(min(max(c.A, 0), 1) * 255))
	return uint32(r)<<24 | uint32(g)<<16 | uint32(b)<<8 | a
}

// Unpack is the inverse of RGBA.
func Unpack(v uint32) Colour {
	return Colour{SRGB: colour.SRGB8(uint8(v>>24), uint8(v>>16), uint8(v>>8)), A: float64(uint8(v)) / 255}
}

// Hex formats a packed colour as lowercase #rrggbb, ignoring alpha.
func Hex(v uint32) string {
	const digits = "0123456789abcdef"
	var b [7]byte
	b[0] = '#'
	for i := 0; i < 6; i++ {
		b[6-i] = digits[(v>>(8+4*uint(i)))&0xf]
	}
	return string(b[:])
}
