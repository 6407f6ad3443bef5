package static

import (
	"errors"
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
		name, args, err := transformFunc(&sc, s)
		if err != nil {
			return snapshot.IdentityMatrix, err
		}
		t, err := transformMatrix(name, args)
		if err != nil {
			return snapshot.IdentityMatrix, fmt.Errorf("static: transform %q: %w", clip(s, 60), err)
		}
		m = m.Mul(t)
	}
}

// transformFunc reads one transform function: its name and its numbers.
func transformFunc(sc *svgnum.Scanner, s string) (string, []float64, error) {
	start := sc.I
	for !sc.Done() && (sc.S[sc.I] >= 'a' && sc.S[sc.I] <= 'z' || sc.S[sc.I] >= 'A' && sc.S[sc.I] <= 'Z') {
		sc.I++
	}
	name := sc.S[start:sc.I]
	sc.SkipSpace()
	if sc.Done() || sc.S[sc.I] != '(' {
		return "", nil, fmt.Errorf("static: transform %q: expected '(' after %q at offset %d", clip(s, 60), name, sc.I)
	}
	sc.I++
	var args []float64
	for {
		sc.SkipSep()
		if sc.Done() {
			return "", nil, fmt.Errorf("static: transform %q: missing ')'", clip(s, 60))
		}
		if sc.S[sc.I] == ')' {
			sc.I++
			return name, args, nil
		}
		v, ok := sc.Number()
		if !ok {
			return "", nil, fmt.Errorf("static: transform %q: bad number at offset %d", clip(s, 60), sc.I)
		}
		args = append(args, v)
		if len(args) > 6 {
			return "", nil, fmt.Errorf("static: transform %q: too many arguments to %s", clip(s, 60), name)
		}
	}
}

// transformMatrix is the matrix of one transform function (SVG 1.1
// §7.6); names are case-insensitive.
func transformMatrix(name string, args []float64) (snapshot.Matrix, error) {
	n := len(args)
	switch lname := strings.ToLower(name); lname {
	case "matrix":
		if n != 6 {
			return snapshot.Matrix{}, errors.New("matrix takes 6 numbers")
		}
		var t snapshot.Matrix
		copy(t[:], args)
		return t, nil
	case "translate":
		if n != 1 && n != 2 {
			return snapshot.Matrix{}, errors.New("translate takes 1 or 2 numbers")
		}
		t := snapshot.Matrix{1, 0, 0, 1, args[0], 0}
		if n == 2 {
			t[5] = args[1]
		}
		return t, nil
	case "scale":
		if n != 1 && n != 2 {
			return snapshot.Matrix{}, errors.New("scale takes 1 or 2 numbers")
		}
		return snapshot.Matrix{args[0], 0, 0, args[n-1], 0, 0}, nil
	case "rotate":
		if n != 1 && n != 3 {
			return snapshot.Matrix{}, errors.New("rotate takes 1 or 3 numbers")
		}
		sn, cs := math.Sincos(args[0] * math.Pi / 180)
		t := snapshot.Matrix{cs, sn, -sn, cs, 0, 0}
		if n == 3 {
			cx, cy := args[1], args[2]
			t = snapshot.Matrix{1, 0, 0, 1, cx, cy}.Mul(t).Mul(snapshot.Matrix{1, 0, 0, 1, -cx, -cy})
		}
		return t, nil
	case "skewx", "skewy":
		if n != 1 {
			return snapshot.Matrix{}, fmt.Errorf("skew%s takes 1 number", strings.ToUpper(lname[4:]))
		}
		k := math.Tan(args[0] * math.Pi / 180)
		if lname == "skewx" {
			return snapshot.Matrix{1, 0, k, 1, 0, 0}, nil
		}
		return snapshot.Matrix{1, k, 0, 1, 0, 0}, nil
	}
	return snapshot.Matrix{}, fmt.Errorf("unknown function %q", name)
}
