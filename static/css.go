package static

import (
	"fmt"
	"strings"

	"github.com/andybalholm/cascadia"
	"github.com/tdewolff/parse/v2"
	"github.com/tdewolff/parse/v2/css"
)

// decl is one declaration: a property and its value as written.
type decl struct {
	prop      string
	value     string
	important bool
}

// rule is a style rule with one selector of its selector list.
type rule struct {
	sel   cascadia.Sel
	spec  int // specificity packed as a·2²⁰ + b·2¹⁰ + c
	order int
	decls []decl
}

// parseSheet parses a style sheet with tdewolff/parse's CSS parser. Rules
// inside @media are kept unless the media query mentions only print, or
// asks for the other colour scheme (prefers-color-scheme; dark is the
// scheme read in); there is no layout to test other queries against.
// Other at-rules (@font-face, @keyframes, …) are skipped. Selectors
// cascadia cannot compile, and parse errors, are returned as problems; the
// rules that did parse are kept.
func parseSheet(text string, order *int, where string, budget *matchBudget, dark bool) ([]rule, []string) {
	sp := sheetParser{p: css.NewParser(parse.NewInputString(text), false), order: order, where: where, budget: budget}
	for {
		gt, _, data := sp.p.Next()
		switch gt {
		case css.ErrorGrammar:
			if err := sp.p.Err(); err != nil && err.Error() != "EOF" {
				sp.problems = append(sp.problems, fmt.Sprintf("%s: CSS error, the rest of the style sheet is ignored: %s", where, firstLine(err.Error())))
			}
			return sp.rules, sp.problems
		case css.BeginAtRuleGrammar:
			name := strings.ToLower(string(data))
			ok := false
			if name == "@media" || name == "@supports" || name == "@layer" || name == "@container" {
				ok = name != "@media" || mediaMatches(strings.ToLower(joinTokens(sp.p.Values())), dark)
			}
			sp.stack = append(sp.stack, ok)
		case css.EndAtRuleGrammar:
			if len(sp.stack) > 0 {
				sp.stack = sp.stack[:len(sp.stack)-1]
			}
		case css.BeginRulesetGrammar, css.QualifiedRuleGrammar:
			sp.selectors(joinTokens(sp.p.Values()))
			sp.inRule = gt == css.BeginRulesetGrammar
		case css.DeclarationGrammar, css.CustomPropertyGrammar:
			if sp.inRule {
				if d, ok := makeDecl(string(data), sp.p.Values(), gt == css.CustomPropertyGrammar); ok {
					sp.decls = append(sp.decls, d)
				}
			}
		case css.EndRulesetGrammar:
			sp.endRule()
		}
	}
}

// mediaMatches says whether a media query list holds on a screen in the
// colour scheme: some query of the comma-separated list does. A query for
// print only does not; one that tests the colour scheme (Media Queries 5
// §11.5, prefers-color-scheme) holds for the scheme it names, or, after
// "not", for the other; any other holds (there is no layout to test
// widths against).
func mediaMatches(list string, dark bool) bool {
	for _, q := range strings.Split(list, ",") {
		q = strings.TrimSpace(q)
		if strings.Contains(q, "print") && !strings.Contains(q, "screen") && !strings.Contains(q, "all") {
			continue
		}
		i := strings.Index(q, "prefers-color-scheme")
		if i < 0 {
			return true
		}
		rest := strings.TrimLeft(q[i+len("prefers-color-scheme"):], " :")
		wantDark := strings.HasPrefix(rest, "dark")
		if !wantDark && !strings.HasPrefix(rest, "light") {
			return true // a value we do not know: keep the rules
		}
		if strings.HasPrefix(q, "not ") {
			wantDark = !wantDark
		}
		if wantDark == dark {
			return true
		}
	}
	return false
}

// sheetParser is the state of one parseSheet: the rules so far, the open
// at-rules (whether each one's contents apply), and the rule being read.
type sheetParser struct {
	p        *css.Parser
	order    *int
	where    string
	budget   *matchBudget
	rules    []rule
	problems []string
	stack    []bool
	cur      []cascadia.Sel
	decls    []decl
	zero     bool // the rule's selectors are :where(…): zero specificity
	inRule   bool
}

func (sp *sheetParser) applies() bool {
	for _, s := range sp.stack {
		if !s {
			return false
		}
	}
	return true
}

// selectors compiles a rule's selector list.
func (sp *sheetParser) selectors(text string) {
	sp.cur, sp.zero, sp.decls = sp.cur[:0], false, nil
	group, err := compileGroup(text, sp.budget)
	if err != nil {
		// cascadia lacks :where(); a selector list made only of
		// :where(…) wrappers matches like its contents with zero
		// specificity (Selectors 4 §4.4).
		if inner, ok := unwrapWhere(text); ok {
			if g2, err2 := compileGroup(inner, sp.budget); err2 == nil {
				group, err, sp.zero = g2, nil, true
			}
		}
	}
	if err != nil {
		sp.problems = append(sp.problems, fmt.Sprintf("%s: selector %q is not supported and its rule is ignored (%v)", sp.where, clip(text, 80), err))
	}
	for _, s := range group {
		sp.cur = append(sp.cur, s)
	}
}

// endRule keeps a finished rule, one per selector, if it applies.
func (sp *sheetParser) endRule() {
	if sp.inRule && sp.applies() && len(sp.decls) > 0 {
		for _, s := range sp.cur {
			spec := s.Specificity()
			if sp.zero {
				spec = cascadia.Specificity{}
			}
			*sp.order++
			sp.rules = append(sp.rules, rule{sel: s, spec: spec[0]<<20 | spec[1]<<10 | spec[2], order: *sp.order, decls: sp.decls})
		}
	}
	sp.inRule = false
}

// parseDecls parses the declarations of a style attribute.
func parseDecls(text string) ([]decl, error) {
	var out []decl
	p := css.NewParser(parse.NewInputString(text), true)
	for {
		gt, _, data := p.Next()
		switch gt {
		case css.ErrorGrammar:
			if err := p.Err(); err != nil && err.Error() != "EOF" {
				return out, err
			}
			return out, nil
		case css.DeclarationGrammar, css.CustomPropertyGrammar:
			if d, ok := makeDecl(string(data), p.Values(), gt == css.CustomPropertyGrammar); ok {
				out = append(out, d)
			}
		}
	}
}

func makeDecl(prop string, vals []css.Token, custom bool) (decl, bool) {
	if custom {
		v := joinTokens(vals)
		imp := false
		if t := strings.TrimSpace(v); strings.HasSuffix(strings.ToLower(t), "!important") {
			v, imp = strings.TrimSpace(t[:len(t)-len("!important")]), true
		}
		return decl{prop: prop, value: strings.TrimSpace(v), important: imp}, true
	}
	imp := false
	n := len(vals)
	for n > 0 && vals[n-1].TokenType == css.WhitespaceToken {
		n--
	}
	if n >= 2 && vals[n-1].TokenType == css.IdentToken && strings.EqualFold(string(vals[n-1].Data), "important") &&
		vals[n-2].TokenType == css.DelimToken && string(vals[n-2].Data) == "!" {
		imp = true
		n -= 2
	}
	v := strings.TrimSpace(joinTokens(vals[:n]))
	if v == "" {
		return decl{}, false
	}
	return decl{prop: strings.ToLower(prop), value: v, important: imp}, true
}

func joinTokens(vals []css.Token) string {
	var b strings.Builder
	for _, v := range vals {
		if v.TokenType == css.CommentToken {
			continue
		}
		if v.TokenType == css.WhitespaceToken {
			b.WriteByte(' ')
			continue
		}
		b.Write(v.Data)
	}
	return b.String()
}

func firstLine(s string) string {
	if i := strings.IndexByte(s, '\n'); i >= 0 {
		return s[:i]
	}
	return s
}

func clip(s string, n int) string {
	if len(s) <= n {
		return s
	}
	return s[:n] + "…"
}

// unwrapWhere turns ":where(a b),:where(c)" into "a b,c". It reports false
// when any part of the list is not a single :where(…).
func unwrapWhere(sel string) (string, bool) {
	var parts []string
	depth, start := 0, 0
	for i := 0; i < len(sel); i++ {
		switch sel[i] {
		case '(':
			depth++
		case ')':
			depth--
		case ',':
			if depth == 0 {
				parts = append(parts, sel[start:i])
				start = i + 1
			}
		}
	}
	parts = append(parts, sel[start:])
	for i, p := range parts {
		p = strings.TrimSpace(p)
		if !strings.HasPrefix(p, ":where(") || !strings.HasSuffix(p, ")") {
			return "", false
		}
		parts[i] = p[len(":where(") : len(p)-1]
	}
	return strings.Join(parts, ","), true
}
