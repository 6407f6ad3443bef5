// Package svgnum reads numbers in the grammar SVG uses for path data,
// points, transforms and viewBox.
package svgnum

import (
	"math"
	"strconv"
)

// Scanner reads SVG numbers (SVG 1.1 path and transform grammar:
// optional sign, digits with an optional fraction, optional exponent;
// "1.5.5" is two numbers and "1-2" is two numbers). It rejects NaN and
// infinities, which the grammar does not allow.
type Scanner struct {
	// S is the text and I the position of the next byte to read.
	S string
	I int
}

// Done says whether the whole text was read.
func (sc *Scanner) Done() bool { return sc.I >= len(sc.S) }

// SkipSpace skips white space.
func (sc *Scanner) SkipSpace() {
	for sc.I < len(sc.S) {
		switch sc.S[sc.I] {
		case ' ', '\t', '\n', '\r', '\f':
			sc.I++
		default:
			return
		}
	}
}

// SkipSep skips white space with at most one comma in it.
func (sc *Scanner) SkipSep() {
	sc.SkipSpace()
	if sc.I < len(sc.S) && sc.S[sc.I] == ',' {
		sc.I++
		sc.SkipSpace()
	}
}

// Number reads one number; it reports false, reading nothing, when none
// starts at the position.
func (sc *Scanner) Number() (float64, bool) {
	s, i := sc.S, sc.I
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
	v, err := strconv.ParseFloat(s[start:i], 64)
	if err != nil || math.IsInf(v, 0) || math.IsNaN(v) {
		return 0, false
	}
	sc.I = i
	return v, true
}
