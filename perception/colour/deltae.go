package colour

import "math"

// DeltaE76 is the CIE 1976 colour difference, the Euclidean distance in
// CIELAB:
//
//	ΔE*ab = √(ΔL*² + Δa*² + Δb*²)
//
// A difference of about 2.3 is a just-noticeable difference under laboratory
// conditions (Mahy, Van Eycken & Oosterlinck 1994).
func DeltaE76(x, y Lab) float64 {
	return math.Sqrt(sq(x.L-y.L) + sq(x.A-y.A) + sq(x.B-y.B))
}

func sq(v float64) float64 { return v * v }

// DeltaE2000 is the CIEDE2000 colour difference with kL = kC = kH = 1,
// written from Sharma, Wu & Dalal (2005), "The CIEDE2000 colour-difference
// formula: implementation notes, supplementary test data, and mathematical
// observations", Color Res. Appl. 30(1), 21–30, equations (1)–(24):
//
//	C*ᵢ = √(a*ᵢ² + b*ᵢ²),  C̄* = (C*₁ + C*₂)/2
//	G = 0.5 (1 − √(C̄*⁷/(C̄*⁷ + 25⁷)))
//	a′ᵢ = (1 + G) a*ᵢ,  C′ᵢ = √(a′ᵢ² + b*ᵢ²),  h′ᵢ = atan2(b*ᵢ, a′ᵢ) mod 360°
//	ΔL′ = L₂ − L₁,  ΔC′ = C′₂ − C′₁,  ΔH′ = 2 √(C′₁C′₂) sin(Δh′/2)
//	T = 1 − 0.17 cos(h̄′ − 30°) + 0.24 cos(2h̄′) + 0.32 cos(3h̄′ + 6°) − 0.20 cos(4h̄′ − 63°)
//	S_L = 1 + 0.015 (L̄′ − 50)²/√(20 + (L̄′ − 50)²),  S_C = 1 + 0.045 C̄′,  S_H = 1 + 0.015 C̄′ T
//	R_T = −sin(2Δθ) R_C,  Δθ = 30 exp(−((h̄′ − 275°)/25)²),  R_C = 2 √(C̄′⁷/(C̄′⁷ + 25⁷))
//	ΔE00 = √((ΔL′/S_L)² + (ΔC′/S_C)² + (ΔH′/S_H)² + R_T (ΔC′/S_C)(ΔH′/S_H))
//
// The hue branches (Δh′ and h̄′ when |h′₁ − h′₂| > 180°, and the zero-chroma
// case) follow the paper's equations (10) and (14). The result is symmetric.
func DeltaE2000(x, y Lab) float64 {
	const pow25to7 = 6103515625.0 // 25⁷
	c1 := math.Hypot(x.A, x.B)
	c2 := math.Hypot(y.A, y.B)
	cbar := (c1 + c2) / 2
	cbar7 := math.Pow(cbar, 7)
	g := 0.5 * (1 - math.Sqrt(cbar7/(cbar7+pow25to7)))
	a1p := (1 + g) * x.A
	a2p := (1 + g) * y.A
	c1p := math.Hypot(a1p, x.B)
	c2p := math.Hypot(a2p, y.B)
	h1p := hueDeg(x.B, a1p)
	h2p := hueDeg(y.B, a2p)

	dLp := y.L - x.L
	dCp := c2p - c1p
	var dhp float64
	switch {
	case c1p*c2p == 0:
		dhp = 0
	case math.Abs(h2p-h1p) <= 180:
		dhp = h2p - h1p
	case h2p-h1p > 180:
		dhp = h2p - h1p - 360
	default:
		dhp = h2p - h1p + 360
	}
	dHp := 2 * math.Sqrt(c1p*c2p) * math.Sin(rad(dhp/2))

	lbarp := (x.L + y.L) / 2
	cbarp := (c1p + c2p) / 2
	var hbarp float64
	switch {
	case c1p*c2p == 0:
		hbarp = h1p + h2p
	case math.Abs(h1p-h2p) <= 180:
		hbarp = (h1p + h2p) / 2
	case h1p+h2p < 360:
		hbarp = (h1p + h2p + 360) / 2
	default:
		hbarp = (h1p + h2p - 360) / 2
	}
	t := 1 - 0.17*math.Cos(rad(hbarp-30)) + 0.24*math.Cos(rad(2*hbarp)) +
		0.32*math.Cos(rad(3*hbarp+6)) - 0.20*math.Cos(rad(4*hbarp-63))
	dTheta := 30 * math.Exp(-sq((hbarp-275)/25))
	cbarp7 := math.Pow(cbarp, 7)
	rc := 2 * math.Sqrt(cbarp7/(cbarp7+pow25to7))
	sl := 1 + 0.015*sq(lbarp-50)/math.Sqrt(20+sq(lbarp-50))
	sc := 1 + 0.045*cbarp
	sh := 1 + 0.015*cbarp*t
	rt := -math.Sin(rad(2*dTheta)) * rc
	l, c, h := dLp/sl, dCp/sc, dHp/sh
	return math.Sqrt(l*l + c*c + h*h + rt*c*h)
}

func rad(deg float64) float64 { return deg * math.Pi / 180 }

// hueDeg is atan2(b, a) in degrees within [0, 360); 0 for a = b = 0.
func hueDeg(b, a float64) float64 {
	if a == 0 && b == 0 {
		return 0
	}
	h := math.Atan2(b, a) * 180 / math.Pi
	if h < 0 {
		h += 360
	}
	return h
}
