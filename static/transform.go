package static

import (
	"fmt"
	"math"
	"standout/internal/svgnum"
	"standout/snapshot"
	"strings"
)

// ParseTransform parses an SVG transform list (SVG 1.1 §7.6, with the
// CSS Transforms 1 relaxations of separators): matrix, translate, scale,
// rotate (with optional centre), skewX and skewY. An empty list is the
// identity. Any error invalidates the whole list, as browsers do.
func ParseTransform(s string) (snapshot.Matrix, error) {
	m := snapshot.IdentityMatrix
	sc := svgnum.Scanner{S: s}
	for {
		sc.SkipSep()
		if sc.Done() {
			return m, nil
		}
		start := sc.I
		for !sc.Done() && (sc.S[sc.I] >= 'a' && sc.S[sc.I] <= 'z' || sc.S[sc.I] >= 'A' && sc.S[sc.I] <= 'Z') {
			sc.I++
		}
		name := sc.S[start:sc.I]
		sc.SkipSpace()
		if sc.Done() || sc.S[sc.I] != '(' {
			return snapshot.IdentityMatrix, fmt.Errorf("static: transform %q: expected '(' after %q at offset %d", clip(s, 60), name, sc.I)
		}
		sc.I++
		var args []float64
		for {
			sc.SkipSep()
			if sc.Done() {
				return snapshot.IdentityMatrix, fmt.Errorf("static: transform %q: missing ')'", clip(s, 60))
			}
			if sc.S[sc.I] == ')' {
				sc.I++
				break
			}
			v, ok := sc.Number()
			if !ok {
				return snapshot.IdentityMatrix, fmt.Errorf("static: transform %q: bad number at offset %d", clip(s, 60), sc.I)
			}
			args = append(args, v)
			if len(args) > 6 {
				return snapshot.IdentityMatrix, fmt.Errorf("static: transform %q: too many arguments to %s", clip(s, 60), name)
			}
		}
		var t snapshot.Matrix
		n := len(args)
		switch strings.ToLower(name) {
		case "matrix":
			if n != 6 {
				return snapshot.IdentityMatrix, fmt.Errorf("static: transform %q: matrix takes 6 numbers", clip(s, 60))
			}
			copy(t[:], args)
		case "translate":
			if n != 1 && n != 2 {
				return snapshot.IdentityMatrix, fmt.Errorf("static: transform %q: translate takes 1 or 2 numbers", clip(s, 60))
			}
			t = snapshot.Matrix{1, 0, 0, 1, args[0], 0}
			if n == 2 {
				t[5] = args[1]
			}
		case "scale":
			if n != 1 && n != 2 {
				return snapshot.IdentityMatrix, fmt.Errorf("static: transform %q: scale takes 1 or 2 numbers", clip(s, 60))
			}
			sy := args[0]
			if n == 2 {
				sy = args[1]
			}
			t = snapshot.Matrix{args[0], 0, 0, sy, 0, 0}
		case "rotate":
			if n != 1 && n != 3 {
				return snapshot.IdentityMatrix, fmt.Errorf("static: transform %q: rotate takes 1 or 3 numbers", clip(s, 60))
			}
			sn, cs := math.Sincos(args[0] * math.Pi / 180)
			t = snapshot.Matrix{cs, sn, -sn, cs, 0, 0}
			if n == 3 {
				cx, cy := args[1], args[2]
				t = snapshot.Matrix{1, 0, 0, 1, cx, cy}.Mul(t).Mul(snapshot.Matrix{1, 0, 0, 1, -cx, -cy})
			}
		case "skewx":
			if n != 1 {
				return snapshot.IdentityMatrix, fmt.Errorf("static: transform %q: skewX takes 1 number", clip(s, 60))
			}
			t = snapshot.Matrix{1, 0, math.Tan(args[0] * math.Pi / 180), 1, 0, 0}
		case "skewy":
			if n != 1 {
				return snapshot.IdentityMatrix, fmt.Errorf("static: transform %q: skewY takes 1 number", clip(s, 60))
			}
			t = snapshot.Matrix{1, math.Tan(args[0] * math.Pi / 180), 0, 1, 0, 0}
		default:
			return snapshot.IdentityMatrix, fmt.Errorf("static: transform %q: unknown function %q", clip(s, 60), name)
		}
		m = m.Mul(t)
	}
}
