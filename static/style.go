package static

import (
	"math"
	"strconv"
	"strings"

	"github.com/tdewolff/parse/v2/css"
	"golang.org/x/net/html"
)

// The properties the cascade resolves. Everything else is ignored.
const (
	pFill = iota
	pStroke
	pFillOpacity
	pStrokeOpacity
	pOpacity
	pStrokeWidth
	pDisplay
	pVisibility
	pColor
	pFontSize
	pFontWeight
	pStopColor
	pStopOpacity
	pBackgroundColor
	pBackground
	pBackgroundImage
	pWidth
	pHeight
	pColorScheme
	pClipPath
	pOverflow
	nProps
)

var propIndex = map[string]int{
	"fill": pFill, "stroke": pStroke, "fill-opacity": pFillOpacity, "stroke-opacity": pStrokeOpacity,
	"opacity": pOpacity, "stroke-width": pStrokeWidth, "display": pDisplay, "visibility": pVisibility,
	"color": pColor, "font-size": pFontSize, "font-weight": pFontWeight,
	"stop-color": pStopColor, "stop-opacity": pStopOpacity,
	"background-color": pBackgroundColor, "background": pBackground,
	"color-scheme": pColorScheme, "background-image": pBackgroundImage, "width": pWidth, "height": pHeight,
	"clip-path": pClipPath, "overflow": pOverflow,
}

// inherited marks the properties that inherit by default (SVG 2 property
// index; CSS 2 for color, font-size, visibility).
var inherited = [nProps]bool{
	pFill: true, pStroke: true, pFillOpacity: true, pStrokeOpacity: true, pStrokeWidth: true,
	pVisibility: true, pColor: true, pFontSize: true, pFontWeight: true,
	pColorScheme: true,
}

// initial values (SVG 2, CSS 2; color's initial value is CanvasText, black
// in a light colour scheme).
var initial = [nProps]string{
	pFill: "black", pStroke: "none", pFillOpacity: "1", pStrokeOpacity: "1", pOpacity: "1",
	pStrokeWidth: "1", pDisplay: "inline", pVisibility: "visible", pColor: "black",
	pFontSize: "16px", pFontWeight: "400", pStopColor: "black", pStopOpacity: "1",
	pBackgroundColor: "transparent", pBackground: "", pColorScheme: "normal",
	pBackgroundImage: "none", pWidth: "auto", pHeight: "auto", pClipPath: "none",
}

// computed is the computed style of one element: for each property its
// value after cascade, inheritance, var() and light-dark() substitution.
// Paints keep currentColor as a keyword; it is resolved against Color.
type computed struct {
	v      [nProps]string
	custom map[string]string // custom properties, shared with the parent until one is declared
}

// cascader resolves styles for a document.
type cascader struct {
	rules    []rule
	problems *[]string
	// dark is the reader's preference (prefers-color-scheme).
	dark bool
	// meta is the page's <meta name="color-scheme"> content, the schemes
	// an element of color-scheme normal is drawn in.
	meta string
	// backgroundURLs is whether a rule sets a background image by url():
	// without one, no element's style need be computed to find charts
	// drawn as CSS background images.
	backgroundURLs bool
	// budget bounds the selector tests of the whole build.
	budget matchBudget
}

type prio struct {
	important bool
	level     int // 0 presentation attribute, 1 author sheet, 2 style attribute
	spec      int
	order     int
}

func (a prio) less(b prio) bool {
	if a.important != b.important {
		return !a.important
	}
	if a.important && a.level != b.level {
		// Among !important declarations the style attribute still wins.
		return a.level < b.level
	}
	if a.level != b.level {
		return a.level < b.level
	}
	if a.spec != b.spec {
		return a.spec < b.spec
	}
	return a.order < b.order
}

// presentation lists the SVG presentation attributes the cascade reads.
var presentation = []string{"fill", "stroke", "fill-opacity", "stroke-opacity", "opacity", "stroke-width",
	"display", "visibility", "color", "font-size", "font-weight", "clip-path", "mask", "stop-color", "stop-opacity", "pointer-events", "overflow"}

// compute returns n's computed style given its parent's (nil for the root).
// Inline-style parse errors are recorded as problems.
func (c *cascader) compute(n *html.Node, parent *computed, name string) *computed {
	var d declared
	c.declare(&d, n, name)
	out := &computed{}
	if parent != nil {
		out.custom = parent.custom
	}
	// light-dark() takes the element's used colour scheme (CSS Color 5
	// §7), so color-scheme (never itself a light-dark()) comes first.
	out.v[pColorScheme] = c.value(&d, pColorScheme, parent, out.custom, false)
	dark := c.usedDark(out.v[pColorScheme])
	if d.customs != nil {
		m := make(map[string]string, len(d.customs)+len(out.custom))
		for k, v := range out.custom {
			m[k] = v
		}
		for k, v := range d.customs {
			m[k] = v
		}
		// Custom properties may refer to each other; resolve now.
		for k, v := range m {
			if strings.Contains(v, "(") {
				m[k] = substitute(v, m, keepScheme, 0)
			}
		}
		out.custom = m
	}
	for i := 0; i < nProps; i++ {
		if i != pColorScheme {
			out.v[i] = c.value(&d, i, parent, out.custom, dark)
		}
	}
	if d.set[pFontSize] {
		base := 16.0
		if parent != nil {
			base = fontSize(parent.v[pFontSize], 16)
		}
		out.v[pFontSize] = strconv.FormatFloat(fontSize(out.v[pFontSize], base), 'g', -1, 64) + "px"
	}
	if d.set[pFontWeight] {
		base := 400.0
		if parent != nil {
			base = fontWeight(parent.v[pFontWeight], 400)
		}
		out.v[pFontWeight] = strconv.FormatFloat(fontWeight(out.v[pFontWeight], base), 'g', -1, 64)
	}
	return out
}

// declared holds, per property, the winning declaration so far and its
// priority, and the custom properties declared on the element.
type declared struct {
	value      [nProps]string
	have       [nProps]prio
	set        [nProps]bool
	customs    map[string]string
	customPrio map[string]prio
}

// put records a declaration if it wins over what is there.
func (d *declared) put(dc decl, p prio) {
	if strings.HasPrefix(dc.prop, "--") {
		if d.customs == nil {
			d.customs, d.customPrio = map[string]string{}, map[string]prio{}
		}
		if old, ok := d.customPrio[dc.prop]; !ok || old.less(p) || old == p {
			d.customs[dc.prop], d.customPrio[dc.prop] = dc.value, p
		}
		return
	}
	i, ok := propIndex[dc.prop]
	if !ok {
		return
	}
	if !d.set[i] || d.have[i].less(p) || d.have[i] == p {
		d.value[i], d.have[i], d.set[i] = dc.value, p, true
	}
}

// declare collects n's declarations in cascade order: presentation
// attributes, then style sheet rules, then the style attribute.
func (c *cascader) declare(d *declared, n *html.Node, name string) {
	isSVG := n.Namespace == "svg"
	var style string
	for _, a := range n.Attr {
		if a.Namespace != "" {
			continue
		}
		if a.Key == "style" {
			style = a.Val
			continue
		}
		if isSVG {
			for _, pa := range presentation {
				if a.Key == pa {
					d.put(decl{prop: pa, value: strings.TrimSpace(a.Val)}, prio{level: 0})
				}
			}
		}
	}
	for _, r := range c.rules {
		if r.sel.Match(n) {
			for _, dc := range r.decls {
				d.put(dc, prio{important: dc.important, level: 1, spec: r.spec, order: r.order})
			}
		}
	}
	if style != "" {
		ds, err := parseDecls(style)
		if err != nil {
			*c.problems = append(*c.problems, name+": style attribute has a CSS error, the rest of it is ignored: "+firstLine(err.Error()))
		}
		for i, dc := range ds {
			d.put(dc, prio{important: dc.important, level: 2, order: i})
		}
	}
}

// value is property i's computed value: the declared one with var() and
// light-dark() substituted, or the inherited or initial one (CSS
// Cascading 4 §7: unset, inherit, initial, revert).
func (c *cascader) value(d *declared, i int, parent *computed, custom map[string]string, dark bool) string {
	v := d.value[i]
	if d.set[i] && strings.Contains(v, "(") {
		v = substitute(v, custom, schemeOf(dark), 0)
	}
	lv := strings.ToLower(v)
	switch {
	case !d.set[i] || lv == "unset" || v == "":
		if inherited[i] && parent != nil {
			return parent.v[i]
		}
		return initial[i]
	case lv == "inherit":
		if parent != nil {
			return parent.v[i]
		}
		return initial[i]
	case lv == "initial" || lv == "revert" || lv == "revert-layer":
		return initial[i]
	}
	return v
}

// declaresBackgroundURL says whether a rule's background or
// background-image holds a url() (or a var(), which may).
func (c *cascader) declaresBackgroundURL() bool {
	for _, r := range c.rules {
		for _, d := range r.decls {
			if (d.prop == "background" || d.prop == "background-image") && (strings.Contains(d.value, "url(") || strings.Contains(d.value, "var(")) {
				return true
			}
		}
	}
	return false
}

// maxSubstituted bounds a value with its var() references substituted:
// longer, it is invalid at computed-value time. Each reference may double
// a value (--a: var(--b) var(--b)), so a chain of 16 would otherwise
// build 65,536 copies and read them again at every element that uses it,
// which a hostile page could use to stall the reader. Real custom
// properties, data: URLs included, are far shorter.
const maxSubstituted = 64 << 10

// scheme is how substitute treats light-dark().
type scheme int8

const (
	lightScheme scheme = iota
	darkScheme
	keepScheme
)

func schemeOf(dark bool) scheme {
	if dark {
		return darkScheme
	}
	return lightScheme
}

// usedDark says whether an element of that color-scheme is drawn dark
// (CSS Color Adjustment 1 §2): when its schemes (the page's <meta
// name="color-scheme"> for normal) include dark and either leave out
// light or the reader prefers dark.
func (c *cascader) usedDark(scheme string) bool {
	s := strings.ToLower(strings.TrimSpace(scheme))
	if s == "normal" || s == "" {
		s = c.meta
	}
	light, dark := false, false
	for _, w := range strings.Fields(s) {
		light = light || w == "light"
		dark = dark || w == "dark"
	}
	return dark && (!light || c.dark)
}

// substitute replaces var(--x, fallback) and light-dark(a, b) in a value.
// References to undefined properties without a fallback make the value
// invalid at computed-value time, which is returned as "" (unset).
//
// In a custom property's own value (keepScheme) light-dark() stays, its
// arguments substituted: it is resolved where the property is used, in
// that element's colour scheme (CSS Color 5 §7; a custom property's
// computed value is its tokens, CSS Variables 1 §2).
func substitute(v string, custom map[string]string, sc scheme, depth int) string {
	if depth > 16 || len(v) > maxSubstituted {
		return ""
	}
	toks := tokens(v)
	var b strings.Builder
	for i := 0; i < len(toks); i++ {
		if b.Len() > maxSubstituted {
			return ""
		}
		t := toks[i]
		if t.tt != css.FunctionToken {
			b.WriteString(t.s)
			continue
		}
		fn := strings.ToLower(t.s)
		if fn != "var(" && fn != "light-dark(" {
			b.WriteString(t.s)
			continue
		}
		args, next := callArgs(toks, i+1)
		i = next - 1
		if fn == "light-dark(" {
			if len(args) != 2 {
				return ""
			}
			switch sc {
			case keepScheme:
				b.WriteString("light-dark(" + substitute(str(args[0]), custom, sc, depth+1) + ", " + substitute(str(args[1]), custom, sc, depth+1) + ")")
			case darkScheme:
				b.WriteString(substitute(str(args[1]), custom, sc, depth+1))
			default:
				b.WriteString(substitute(str(args[0]), custom, sc, depth+1))
			}
			continue
		}
		name := str(args[0])
		if val, ok := custom[name]; ok && val != "" {
			b.WriteString(substitute(val, custom, sc, depth+1))
			continue
		}
		if len(args) >= 2 {
			fb := make([]token, 0)
			for k, a := range args[1:] {
				if k > 0 {
					fb = append(fb, token{css.CommaToken, ","})
				}
				fb = append(fb, a...)
			}
			b.WriteString(substitute(str(fb), custom, sc, depth+1))
			continue
		}
		return ""
	}
	return b.String()
}

// callArgs collects a function's arguments from toks[from:] up to its
// closing parenthesis, split at its own commas, and returns them with the
// index past that parenthesis.
func callArgs(toks []token, from int) ([][]token, int) {
	depth := 1
	var args [][]token
	var cur []token
	j := from
	for ; j < len(toks) && depth > 0; j++ {
		switch toks[j].tt {
		case css.FunctionToken, css.LeftParenthesisToken:
			depth++
		case css.RightParenthesisToken:
			depth--
			if depth == 0 {
				continue
			}
		case css.CommaToken:
			if depth == 1 {
				args = append(args, cur)
				cur = nil
				continue
			}
		}
		cur = append(cur, toks[j])
	}
	return append(args, cur), j
}

// str joins tokens, trimmed.
func str(ts []token) string {
	var s strings.Builder
	for _, t := range ts {
		s.WriteString(t.s)
	}
	return strings.TrimSpace(s.String())
}

// fontSize resolves a font-size value in px against the parent's size.
func fontSize(v string, parent float64) float64 {
	v = strings.TrimSpace(strings.ToLower(v))
	keywords := map[string]float64{"xx-small": 9, "x-small": 10, "small": 13, "medium": 16, "large": 18, "x-large": 24, "xx-large": 32}
	if k, ok := keywords[v]; ok {
		return k
	}
	if l, ok := length(v, parent); ok && l >= 0 {
		return l
	}
	return parent
}

// fontWeight resolves a font-weight value to a number within [1, 1000]
// against the parent's weight (CSS Fonts 4 §2.2, whose table maps bolder
// and lighter); anything else keeps the parent's.
func fontWeight(v string, parent float64) float64 {
	switch v = strings.TrimSpace(strings.ToLower(v)); v {
	case "normal":
		return 400
	case "bold":
		return 700
	case "bolder":
		switch {
		case parent < 350:
			return 400
		case parent < 550:
			return 700
		case parent < 900:
			return 900
		}
		return parent
	case "lighter":
		switch {
		case parent < 100:
			return parent
		case parent < 550:
			return 100
		case parent < 750:
			return 400
		}
		return 700
	}
	if w, err := strconv.ParseFloat(v, 64); err == nil && w >= 1 && w <= 1000 {
		return w
	}
	return parent
}

// length parses a CSS/SVG length in px; percentages and em resolve against
// ref. A unitless number is user units (px).
func length(v string, ref float64) (float64, bool) {
	v = strings.TrimSpace(strings.ToLower(v))
	units := []struct {
		u string
		f float64
	}{{"px", 1}, {"pt", 96.0 / 72}, {"pc", 16}, {"in", 96}, {"cm", 96 / 2.54}, {"mm", 96 / 25.4}, {"q", 96 / 101.6}, {"rem", 16}, {"em", ref}, {"ex", ref / 2}, {"%", ref / 100}}
	for _, u := range units {
		if strings.HasSuffix(v, u.u) {
			x, err := strconv.ParseFloat(strings.TrimSpace(v[:len(v)-len(u.u)]), 64)
			if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
				return 0, false
			}
			return x * u.f, true
		}
	}
	x, err := strconv.ParseFloat(v, 64)
	if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
		return 0, false
	}
	return x, true
}

// number01 parses an opacity-like value (number or percentage), clamped
// to [0, 1]; bad values give def.
func number01(v string, def float64) float64 {
	v = strings.TrimSpace(v)
	pct := strings.HasSuffix(v, "%")
	x, err := strconv.ParseFloat(strings.TrimSuffix(v, "%"), 64)
	if err != nil || math.IsNaN(x) {
		return def
	}
	if pct {
		x /= 100
	}
	return min(max(x, 0), 1)
}
