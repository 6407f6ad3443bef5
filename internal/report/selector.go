package report

import (
	"slices"
	"strconv"
	"strings"

	"standout/marks"
)

// Rule is a CSS rule that applies decl to the marks ids of a chart whose
// root <svg> the selector anchor matches: each mark by :nth-child steps
// from the root, as its id records them (svg0/g1/rect5 is the sixth child
// of the second child of the root). Marks that are content a <use>
// instantiates are reached through their <use>, from which the content
// inherits. Runs of neighbouring siblings share one selector,
// :nth-child(n+a):nth-child(-n+b). Empty without an anchor.
func Rule(anchor, chartPath string, ids []string, decl string) string {
	if anchor == "" || len(ids) == 0 {
		return ""
	}
	type group struct {
		parent, tag string
		ks          []int
	}
	var groups []*group
	at := map[string]*group{}
	for _, id := range ids {
		rest, ok := strings.CutPrefix(id, chartPath)
		if !ok {
			return ""
		}
		rest, _, _ = strings.Cut(rest, ">")
		steps := strings.Split(strings.TrimPrefix(rest, "/"), "/")
		if rest == "" {
			continue // the root itself
		}
		sel := anchor
		var tag string
		var k int
		for i, s := range steps {
			t, n, ok := splitStep(s)
			if !ok {
				return ""
			}
			if i == len(steps)-1 {
				tag, k = t, n
				break
			}
			sel += " > " + t + ":nth-child(" + strconv.Itoa(n+1) + ")"
		}
		key := sel + " > " + tag
		g := at[key]
		if g == nil {
			g = &group{parent: sel, tag: tag}
			at[key] = g
			groups = append(groups, g)
		}
		g.ks = append(g.ks, k+1)
	}
	var sels []string
	for _, g := range groups {
		slices.Sort(g.ks)
		g.ks = slices.Compact(g.ks)
		var parts []string
		for i := 0; i < len(g.ks); {
			j := i
			for j+1 < len(g.ks) && g.ks[j+1] == g.ks[j]+1 {
				j++
			}
			a, b := strconv.Itoa(g.ks[i]), strconv.Itoa(g.ks[j])
			switch {
			case i == j:
				parts = append(parts, ":nth-child("+a+")")
			default:
				parts = append(parts, ":nth-child(n+"+a+"):nth-child(-n+"+b+")")
			}
			i = j + 1
		}
		for _, p := range parts {
			sels = append(sels, g.parent+" > "+g.tag+p)
		}
	}
	if len(sels) == 0 {
		return ""
	}
	return strings.Join(sels, ",\n") + " { " + decl + "; }"
}

// splitStep splits a path step such as "rect5" into its tag and index.
func splitStep(s string) (string, int, bool) {
	i := len(s)
	for i > 0 && s[i-1] >= '0' && s[i-1] <= '9' {
		i--
	}
	if i == 0 || i == len(s) {
		return "", 0, false
	}
	n, err := strconv.Atoi(s[i:])
	return s[:i], n, err == nil
}

// plainClass says whether a class is usable in a selector as .name
// without escaping: an optional "-", a letter or "_", then letters,
// digits, "_" and "-". (No regexp: the package would double the core's
// share of the .wasm.)
func plainClass(c string) bool {
	c = strings.TrimPrefix(c, "-")
	for i, r := range c {
		letter := r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z' || r == '_'
		if !letter && (i == 0 || !(r >= '0' && r <= '9' || r == '-')) {
			return false
		}
	}
	return c != ""
}

// RuleFor is the CSS rule for a fix: by the author's own classes where one
// class picks exactly the fix's marks among the chart's marks and legend
// swatches (for a mute fix, possibly with :not() of a class only the
// emphasis has: .bar:not(.hero)), else by Rule's structural selectors. A
// class the chart's furniture shares is restyled with the marks; the
// author knows their classes, and the rule says which it uses.
//
// The declaration is !important: charts often paint marks in inline style
// attributes, which a rule in a style sheet must outweigh to apply.
func RuleFor(ch *marks.Chart, fix, emphasis []int, decl string) string {
	if ch.Anchor == "" || len(fix) == 0 {
		return ""
	}
	decl += " !important"
	if sel := classSelector(ch, fix, emphasis); sel != "" {
		return ch.Anchor + " " + sel + " { " + decl + "; }"
	}
	return Rule(ch.Anchor, ch.Path, markIDs(ch, fix), decl)
}

// classSelector finds the class selector RuleFor prefers, or "".
func classSelector(ch *marks.Chart, fix, emphasis []int) string {
	inFix, inEm := map[int]bool{}, map[int]bool{}
	for _, i := range fix {
		inFix[i] = true
	}
	for _, i := range emphasis {
		inEm[i] = true
	}
	all := append(append([]marks.Mark(nil), ch.Marks...), ch.Legend...)
	shared := func(idx []int) []string {
		var out []string
		for k, i := range idx {
			if i < 0 || i >= len(ch.Marks) {
				return nil
			}
			cs := classesOf(ch.Marks[i])
			if k == 0 {
				out = cs
				continue
			}
			out = slices.DeleteFunc(out, func(c string) bool { return !slices.Contains(cs, c) })
		}
		return out
	}
	// holders says whether every mark or swatch with class c is allowed.
	holders := func(c string, allowed func(int) bool) bool {
		for i, m := range all {
			if slices.Contains(classesOf(m), c) && !allowed(i) {
				return false
			}
		}
		return true
	}
	for _, c := range shared(fix) {
		if holders(c, func(i int) bool { return inFix[i] }) {
			return "." + c
		}
	}
	for _, c := range shared(fix) {
		if !holders(c, func(i int) bool { return inFix[i] || inEm[i] }) {
			continue
		}
		for _, h := range shared(emphasis) {
			if holders(h, func(i int) bool { return inEm[i] }) {
				return "." + c + ":not(." + h + ")"
			}
		}
	}
	return ""
}

// classesOf lists a mark's classes that a selector can name plainly, in
// order.
func classesOf(m marks.Mark) []string {
	var out []string
	for _, c := range strings.Fields(m.Class) {
		if plainClass(c) && !slices.Contains(out, c) {
			out = append(out, c)
		}
	}
	return out
}
