package dom

import (
	"fmt"
	"math"
	"strings"
)

// Matrix is a 2-D affine transform (a b c d e f), mapping (x, y) to
// (a·x + c·y + e, b·x + d·y + f), as in SVG 1.1 §7.4.
type Matrix [6]float64

// IdentityMatrix is the identity transform.
var IdentityMatrix = Matrix{1, 0, 0, 1, 0, 0}

// Mul returns m·n: n is applied first, then m.
func (m Matrix) Mul(n Matrix) Matrix {
	return Matrix{
		m[0]*n[0] + m[2]*n[1],
		m[1]*n[0] + m[3]*n[1],
		m[0]*n[2] + m[2]*n[3],
		m[1]*n[2] + m[3]*n[3],
		m[0]*n[4] + m[2]*n[5] + m[4],
		m[1]*n[4] + m[3]*n[5] + m[5],
	}
}

// Apply maps a point.
func (m Matrix) Apply(x, y float64) (float64, float64) {
	return m[0]*x + m[2]*y + m[4], m[1]*x + m[3]*y + m[5]
}

// Det is the determinant, the factor by which areas scale.
func (m Matrix) Det() float64 { return m[0]*m[3] - m[1]*m[2] }

// ParseTransform parses an SVG transform list (SVG 1.1 §7.6, with the
// CSS Transforms 1 relaxations of separators): matrix, translate, scale,
// rotate (with optional centre), skewX and skewY. An empty list is the
// identity. Any error invalidates the whole list, as browsers do.
func ParseTransform(s string) (Matrix, error) {
	m := IdentityMatrix
	sc := numScanner{s: s}
	for {
		sc.skipSep()
		if sc.done() {
			return m, nil
		}
		start := sc.i
		for !sc.done() && (sc.s[sc.i] >= 'a' && sc.s[sc.i] <= 'z' || sc.s[sc.i] >= 'A' && sc.s[sc.i] <= 'Z') {
			sc.i++
		}
		name := sc.s[start:sc.i]
		sc.skipSpace()
		if sc.done() || sc.s[sc.i] != '(' {
			return IdentityMatrix, fmt.Errorf("dom: transform %q: expected '(' after %q at offset %d", clip(s, 60), name, sc.i)
		}
		sc.i++
		var args []float64
		for {
			sc.skipSep()
			if sc.done() {
				return IdentityMatrix, fmt.Errorf("dom: transform %q: missing ')'", clip(s, 60))
			}
			if sc.s[sc.i] == ')' {
				sc.i++
				break
			}
			v, ok := sc.number()
			if !ok {
				return IdentityMatrix, fmt.Errorf("dom: transform %q: bad number at offset %d", clip(s, 60), sc.i)
			}
			args = append(args, v)
			if len(args) > 6 {
				return IdentityMatrix, fmt.Errorf("dom: transform %q: too many arguments to %s", clip(s, 60), name)
			}
		}
		var t Matrix
		n := len(args)
		switch strings.ToLower(name) {
		case "matrix":
			if n != 6 {
				return IdentityMatrix, fmt.Errorf("dom: transform %q: matrix takes 6 numbers", clip(s, 60))
			}
			copy(t[:], args)
		case "translate":
			if n != 1 && n != 2 {
				return IdentityMatrix, fmt.Errorf("dom: transform %q: translate takes 1 or 2 numbers", clip(s, 60))
			}
			t = Matrix{1, 0, 0, 1, args[0], 0}
			if n == 2 {
				t[5] = args[1]
			}
		case "scale":
			if n != 1 && n != 2 {
				return IdentityMatrix, fmt.Errorf("dom: transform %q: scale takes 1 or 2 numbers", clip(s, 60))
			}
			sy := args[0]
			if n == 2 {
				sy = args[1]
			}
			t = Matrix{args[0], 0, 0, sy, 0, 0}
		case "rotate":
			if n != 1 && n != 3 {
				return IdentityMatrix, fmt.Errorf("dom: transform %q: rotate takes 1 or 3 numbers", clip(s, 60))
			}
			sn, cs := math.Sincos(args[0] * math.Pi / 180)
			t = Matrix{cs, sn, -sn, cs, 0, 0}
			if n == 3 {
				cx, cy := args[1], args[2]
				t = Matrix{1, 0, 0, 1, cx, cy}.Mul(t).Mul(Matrix{1, 0, 0, 1, -cx, -cy})
			}
		case "skewx":
			if n != 1 {
				return IdentityMatrix, fmt.Errorf("dom: transform %q: skewX takes 1 number", clip(s, 60))
			}
			t = Matrix{1, 0, math.Tan(args[0] * math.Pi / 180), 1, 0, 0}
		case "skewy":
			if n != 1 {
				return IdentityMatrix, fmt.Errorf("dom: transform %q: skewY takes 1 number", clip(s, 60))
			}
			t = Matrix{1, math.Tan(args[0] * math.Pi / 180), 0, 1, 0, 0}
		default:
			return IdentityMatrix, fmt.Errorf("dom: transform %q: unknown function %q", clip(s, 60), name)
		}
		m = m.Mul(t)
	}
}

// numScanner reads SVG numbers (SVG 1.1 path and transform grammar:
// optional sign, digits with an optional fraction, optional exponent;
// "1.5.5" is two numbers and "1-2" is two numbers). It rejects NaN and
// infinities, which the grammar does not allow.
type numScanner struct {
	s string
	i int
}

func (sc *numScanner) done() bool { return sc.i >= len(sc.s) }

func (sc *numScanner) skipSpace() {
	for sc.i < len(sc.s) {
		switch sc.s[sc.i] {
		case ' ', '\t', '\n', '\r', '\f':
			sc.i++
		default:
			return
		}
	}
}

func (sc *numScanner) skipSep() {
	sc.skipSpace()
	if sc.i < len(sc.s) && sc.s[sc.i] == ',' {
		sc.i++
		sc.skipSpace()
	}
}

func (sc *numScanner) number() (float64, bool) {
	s, i := sc.s, sc.i
	start := i
	if i < len(s) && (s[i] == '+' || s[i] == '-') {
		i++
	}
	digits := 0
	for i < len(s) && s[i] >= '0' && s[i] <= '9' {
		i++
		digits++
	}
	if i < len(s) && s[i] == '.' {
		i++
		for i < len(s) && s[i] >= '0' && s[i] <= '9' {
			i++
			digits++
		}
	}
	if digits == 0 {
		return 0, false
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		j := i + 1
		if j < len(s) && (s[j] == '+' || s[j] == '-') {
			j++
		}
		k := j
		for k < len(s) && s[k] >= '0' && s[k] <= '9' {
			k++
		}
		if k > j {
			i = k
		}
	}
	v, err := parseFloat(s[start:i])
	if err != nil || math.IsInf(v, 0) || math.IsNaN(v) {
		return 0, false
	}
	sc.i = i
	return v, true
}
