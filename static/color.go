package static

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/tdewolff/parse/v2"
	"github.com/tdewolff/parse/v2/css"

	"standout/perception/colour"
	"standout/snapshot"
)

// ParseColor parses a CSS <color> value of CSS Color Module Level 4: named
// colours (§6.1), transparent, #rgb, #rgba, #rrggbb, #rrggbbaa (§5.2),
// rgb()/rgba() and hsl()/hsla() in both the legacy comma syntax and the
// space syntax with an optional "/ alpha" (§5.1, §7). Keywords are
// case-insensitive. currentColor, var() and light-dark() are resolved by the
// cascade, not here. The value is tokenised with tdewolff/parse's CSS lexer.
func ParseColor(s string) (snapshot.Colour, error) {
	toks := tokens(s)
	if len(toks) == 0 {
		return snapshot.Colour{}, fmt.Errorf("static: empty colour value")
	}
	bad := func() (snapshot.Colour, error) {
		return snapshot.Colour{}, fmt.Errorf("static: %q is not a CSS colour", s)
	}
	t := toks[0]
	switch t.tt {
	case css.HashToken:
		if len(toks) != 1 {
			return bad()
		}
		c, ok := parseHash(t.s[1:])
		if !ok {
			return bad()
		}
		return c, nil
	case css.IdentToken:
		if len(toks) != 1 {
			return bad()
		}
		name := strings.ToLower(t.s)
		if name == "transparent" {
			return snapshot.Colour{A: 0}, nil
		}
		v, ok := namedColours[name]
		if !ok {
			return bad()
		}
		return snapshot.Colour{SRGB: colour.SRGB8(uint8(v>>16), uint8(v>>8), uint8(v)), A: 1}, nil
	case css.FunctionToken:
		fn := strings.ToLower(strings.TrimSuffix(t.s, "("))
		if toks[len(toks)-1].tt != css.RightParenthesisToken {
			return bad()
		}
		args, ok := splitArgs(toks[1 : len(toks)-1])
		if !ok {
			return bad()
		}
		switch fn {
		case "rgb", "rgba":
			return parseRGBFunc(s, args)
		case "hsl", "hsla":
			return parseHSLFunc(s, args)
		}
	}
	return bad()
}

type token struct {
	tt css.TokenType
	s  string
}

// tokens lexes a CSS value into tokens, dropping comments and leading or
// trailing whitespace.
func tokens(s string) []token {
	l := css.NewLexer(parse.NewInputString(s))
	var out []token
	for {
		tt, data := l.Next()
		if tt == css.ErrorToken {
			break
		}
		if tt == css.CommentToken {
			continue
		}
		out = append(out, token{tt, string(data)})
	}
	for len(out) > 0 && out[0].tt == css.WhitespaceToken {
		out = out[1:]
	}
	for len(out) > 0 && out[len(out)-1].tt == css.WhitespaceToken {
		out = out[:len(out)-1]
	}
	return out
}

func parseHash(h string) (snapshot.Colour, bool) {
	for i := 0; i < len(h); i++ {
		c := h[i]
		if !(c >= '0' && c <= '9' || c >= 'a' && c <= 'f' || c >= 'A' && c <= 'F') {
			return snapshot.Colour{}, false
		}
	}
	x := func(i, n int) float64 {
		v, _ := strconv.ParseUint(h[i:i+n], 16, 8)
		if n == 1 {
			v *= 17
		}
		return float64(v) / 255
	}
	switch len(h) {
	case 3:
		return snapshot.Colour{SRGB: colour.SRGB{R: x(0, 1), G: x(1, 1), B: x(2, 1)}, A: 1}, true
	case 4:
		return snapshot.Colour{SRGB: colour.SRGB{R: x(0, 1), G: x(1, 1), B: x(2, 1)}, A: x(3, 1)}, true
	case 6:
		return snapshot.Colour{SRGB: colour.SRGB{R: x(0, 2), G: x(2, 2), B: x(4, 2)}, A: 1}, true
	case 8:
		return snapshot.Colour{SRGB: colour.SRGB{R: x(0, 2), G: x(2, 2), B: x(4, 2)}, A: x(6, 2)}, true
	}
	return snapshot.Colour{}, false
}

// splitArgs splits function arguments into the three components and an
// optional alpha, accepting "a, b, c[, d]" and "a b c[ / d]".
func splitArgs(toks []token) ([]token, bool) {
	var vals []token
	commas, slash := 0, -1
	for _, t := range toks {
		switch t.tt {
		case css.WhitespaceToken:
		case css.CommaToken:
			commas++
		case css.DelimToken:
			if t.s != "/" || slash >= 0 {
				return nil, false
			}
			slash = len(vals)
		case css.NumberToken, css.PercentageToken, css.DimensionToken, css.IdentToken:
			vals = append(vals, t)
		default:
			return nil, false
		}
	}
	switch {
	case commas > 0 && slash >= 0:
		return nil, false
	case commas > 0 && commas != len(vals)-1:
		return nil, false
	case slash >= 0 && (slash != 3 || len(vals) != 4):
		return nil, false
	case commas == 0 && slash < 0 && len(vals) != 3:
		return nil, false
	}
	if len(vals) != 3 && len(vals) != 4 {
		return nil, false
	}
	return vals, true
}

func number(t token) (v float64, pct bool, ok bool) {
	s := t.s
	switch t.tt {
	case css.PercentageToken:
		s, pct = strings.TrimSuffix(s, "%"), true
	case css.NumberToken:
	case css.IdentToken:
		if strings.EqualFold(s, "none") { // CSS Color 4 "none" components are 0
			return 0, false, true
		}
		return 0, false, false
	default:
		return 0, false, false
	}
	v, err := strconv.ParseFloat(s, 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, false, false
	}
	return v, pct, true
}

func alpha(args []token) (float64, bool) {
	if len(args) < 4 {
		return 1, true
	}
	v, pct, ok := number(args[3])
	if !ok {
		return 0, false
	}
	if pct {
		v /= 100
	}
	return min(max(v, 0), 1), true
}

func parseRGBFunc(s string, args []token) (snapshot.Colour, error) {
	var ch [3]float64
	for i := 0; i < 3; i++ {
		v, pct, ok := number(args[i])
		if !ok {
			return snapshot.Colour{}, fmt.Errorf("static: %q is not a CSS colour", s)
		}
		if pct {
			v = v / 100
		} else {
			v = v / 255
		}
		ch[i] = min(max(v, 0), 1)
	}
	a, ok := alpha(args)
	if !ok {
		return snapshot.Colour{}, fmt.Errorf("static: %q is not a CSS colour", s)
	}
	return snapshot.Colour{SRGB: colour.SRGB{R: ch[0], G: ch[1], B: ch[2]}, A: a}, nil
}

func parseHSLFunc(s string, args []token) (snapshot.Colour, error) {
	bad := fmt.Errorf("static: %q is not a CSS colour", s)
	var h float64
	switch args[0].tt {
	case css.NumberToken:
		v, _, ok := number(args[0])
		if !ok {
			return snapshot.Colour{}, bad
		}
		h = v
	case css.DimensionToken:
		v, ok := angle(args[0].s)
		if !ok {
			return snapshot.Colour{}, bad
		}
		h = v
	default:
		return snapshot.Colour{}, bad
	}
	sat, p1, ok1 := number(args[1])
	lig, p2, ok2 := number(args[2])
	if !ok1 || !ok2 || (!p1 && args[1].tt != css.NumberToken) || (!p2 && args[2].tt != css.NumberToken) {
		return snapshot.Colour{}, bad
	}
	a, ok := alpha(args)
	if !ok {
		return snapshot.Colour{}, bad
	}
	return snapshot.Colour{SRGB: colour.HSLToSRGB(h, sat/100, lig/100), A: a}, nil
}

// angle parses a CSS <angle> dimension into degrees.
func angle(s string) (float64, bool) {
	units := []struct {
		u string
		f float64
	}{{"deg", 1}, {"grad", 0.9}, {"rad", 180 / math.Pi}, {"turn", 360}}
	ls := strings.ToLower(s)
	for _, u := range units {
		if strings.HasSuffix(ls, u.u) {
			v, err := strconv.ParseFloat(ls[:len(ls)-len(u.u)], 64)
			if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
				return 0, false
			}
			return v * u.f, true
		}
	}
	return 0, false
}
