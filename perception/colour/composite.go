package colour

// RGBA is a non-premultiplied sRGB colour with straight alpha A within
// [0, 1], as CSS colours are written (rgb(… / α), fill-opacity).
type RGBA struct {
	SRGB
	A float64
}

// Over composites src over the opaque backdrop dst with the source-over
// operator of CSS Compositing and Blending Level 1 §5.1 (simple alpha
// compositing), in gamma-encoded sRGB as browsers composite by default
// (color-interpolation: sRGB):
//
//	co = αs·Cs + (1 − αs)·Cb
//
// alpha is multiplied into src.A first, so that a mark's fill-opacity, its
// own opacity and its groups' opacities can be passed together. Both alphas
// are clamped to [0, 1].
func Over(src RGBA, alpha float64, dst SRGB) SRGB {
	a := clamp01(src.A) * clamp01(alpha)
	s := src.SRGB.Clamped()
	return SRGB{
		a*s.R + (1-a)*dst.R,
		a*s.G + (1-a)*dst.G,
		a*s.B + (1-a)*dst.B,
	}
}

// EffectiveOpacity multiplies a chain of opacities (a mark's own and each
// ancestor group's), each clamped to [0, 1]. For a single painted shape
// this equals group-isolated compositing; overlapping children of a
// translucent group are approximated.
func EffectiveOpacity(chain ...float64) float64 {
	o := 1.0
	for _, v := range chain {
		o *= clamp01(v)
	}
	return o
}
