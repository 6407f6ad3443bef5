package static

import (
	"errors"
	"fmt"
	"strings"
	"time"

	"github.com/andybalholm/cascadia"
	"golang.org/x/net/html"
)

// Selector matching in bounded time.
//
// cascadia matches a complex selector by backtracking: for "g g g" it
// tries every ancestor for the middle compound and, for each, every
// ancestor of that for the first. A page with a few hundred nested
// elements and one rule of a dozen descendant combinators then takes
// longer than the age of the universe. Here a complex selector is split
// into its compound selectors (each matched by cascadia, which needs no
// backtracking for a compound) and the chain is matched with memoisation
// per element and compound position (Selectors Level 4 §16 defines the
// combinators; the memo is common practice for matching them):
//
//	match(n, i) = compound[i] matches n, and for i > 0:
//	  ' '  some ancestor a has match(a, i−1)
//	  '>'  the parent p has match(p, i−1)
//	  '+'  the previous element sibling s has match(s, i−1)
//	  '~'  some previous element sibling s has match(s, i−1)
//
// so each (element, position) is decided once. A compound whose
// pseudo-class argument has a combinator (":not(g g)") is refused, since
// cascadia would backtrack through it within one test. Every test is also
// counted against a budget shared by the whole build, which watches the
// build's deadline too.

// MaxSelectorSteps bounds the compound-selector tests of one build. A
// 5,000-mark chart with a hundred rules takes well under a million.
const MaxSelectorSteps = 50_000_000

// matchBudget counts selector steps for one build and watches its
// deadline. Once either runs out, every further test fails at once, so
// the build finishes quickly and reports why (err).
type matchBudget struct {
	steps    int
	limit    int       // 0: MaxSelectorSteps
	deadline time.Time // zero: none
	err      error
}

func (b *matchBudget) spend() bool {
	if b == nil {
		return true
	}
	if b.err != nil {
		return false
	}
	b.steps++
	limit := b.limit
	if limit == 0 {
		limit = MaxSelectorSteps
	}
	if b.steps > limit {
		b.err = fmt.Errorf("the page's style sheets need more than %d selector tests; the static reader stops rather than hang (try --browser)", limit)
		return false
	}
	if b.steps&1023 == 0 && !b.deadline.IsZero() && time.Now().After(b.deadline) {
		b.err = errTimeLimit
		return false
	}
	return true
}

func (b *matchBudget) exceeded() bool { return b != nil && b.err != nil }

// errTimeLimit says that a build ran past Options.Deadline.
var errTimeLimit = errors.New("the static reader ran past its time limit (see --timeout)")

// chainSel is a complex selector as a chain of compounds joined by
// combinators, matched with a memo. It satisfies cascadia.Sel.
type chainSel struct {
	whole  cascadia.Sel
	parts  []cascadia.Sel
	combs  []byte // combs[i] joins parts[i] and parts[i+1]
	budget *matchBudget
	// memo holds, per element, two bits per position: decided, matched.
	memo map[*html.Node]uint64
}

// maxChain is the most compounds a memoised chain holds (two memo bits
// each in a uint64).
const maxChain = 32

func (c *chainSel) Specificity() cascadia.Specificity { return c.whole.Specificity() }
func (c *chainSel) String() string                    { return c.whole.String() }
func (c *chainSel) PseudoElement() string             { return "" }

// Match reports whether n matches the whole chain.
func (c *chainSel) Match(n *html.Node) bool {
	return c.at(n, len(c.parts)-1)
}

func (c *chainSel) at(n *html.Node, i int) bool {
	if n == nil || n.Type != html.ElementNode {
		return false
	}
	memoised := i < len(c.parts)-1 // the last position is asked once per element anyway
	if memoised {
		if m, ok := c.memo[n]; ok && m&(1<<(2*i)) != 0 {
			return m&(2<<(2*i)) != 0
		}
	}
	ok := c.budget.spend() && c.parts[i].Match(n) && c.rest(n, i)
	if memoised {
		if c.memo == nil {
			c.memo = map[*html.Node]uint64{}
		}
		m := c.memo[n] | 1<<(2*i)
		if ok {
			m |= 2 << (2 * i)
		}
		c.memo[n] = m
	}
	return ok
}

// rest checks what lies left of position i, given that parts[i] matches n.
func (c *chainSel) rest(n *html.Node, i int) bool {
	if i == 0 {
		return true
	}
	switch c.combs[i-1] {
	case '>':
		return c.at(n.Parent, i-1)
	case ' ':
		for a := n.Parent; a != nil; a = a.Parent {
			if c.at(a, i-1) {
				return true
			}
			if c.budget.exceeded() {
				return false
			}
		}
	case '+':
		return c.at(prevElement(n), i-1)
	case '~':
		for s := prevElement(n); s != nil; s = prevElement(s) {
			if c.at(s, i-1) {
				return true
			}
			if c.budget.exceeded() {
				return false
			}
		}
	}
	return false
}

func prevElement(n *html.Node) *html.Node {
	for s := n.PrevSibling; s != nil; s = s.PrevSibling {
		if s.Type == html.ElementNode {
			return s
		}
	}
	return nil
}

// compileGroup parses a selector list with cascadia and turns each of its
// complex selectors into a memoised chain drawing on budget. Selectors
// whose matching cascadia would have to backtrack through (a complex
// selector inside :not(), :is(), :where() or :has(), or a chain longer
// than maxChain) are refused with an error, so that no single test can
// run unbounded.
func compileGroup(text string, budget *matchBudget) (cascadia.SelectorGroup, error) {
	group, err := cascadia.ParseGroup(text)
	if err != nil {
		return nil, err
	}
	if strings.Contains(text, "/*") {
		// cascadia skips comments; the splitter does not know them.
		return nil, errors.New("the static reader does not match selectors with comments inside")
	}
	namespaced := false
	topLevel(text, func(i int) { namespaced = namespaced || text[i] == '|' })
	if namespaced {
		// Namespace prefixes ("svg|rect"), which cascadia reads in a
		// way of its own; HTML style sheets rarely have them.
		return nil, errors.New("the static reader does not match namespace prefixes in selectors")
	}
	texts := splitTopLevel(text, ',')
	if len(texts) != len(group) {
		return nil, fmt.Errorf("selector list %q could not be split into its selectors", clip(text, 60))
	}
	for i, s := range group {
		ch, err := compileChain(texts[i], s, budget)
		if err != nil {
			return nil, err
		}
		group[i] = ch
	}
	return group, nil
}

// errNotChain says that a selector is not a plain chain of compounds.
var errNotChain = errors.New("the static reader matches only selectors whose combinators stand outside :not(), :is(), :where() and :has(), with at most 32 compounds")

// compileChain splits one complex selector into compounds and
// combinators.
func compileChain(text string, whole cascadia.Sel, budget *matchBudget) (cascadia.Sel, error) {
	var parts []cascadia.Sel
	var combs []byte
	pending := byte(0)
	for _, tok := range tokensOfChain(text) {
		if len(tok) == 1 && strings.ContainsRune(" >+~", rune(tok[0])) {
			if tok[0] != ' ' || pending == 0 {
				pending = tok[0]
			}
			continue
		}
		if len(parts) > 0 {
			combs = append(combs, pending)
		} else if pending != 0 && pending != ' ' {
			return nil, errNotChain // a relative selector
		}
		pending = 0
		if complexArgument(tok) {
			return nil, errNotChain
		}
		p, err := cascadia.Parse(tok)
		if err != nil {
			p = nil // kept only if the chain is this one compound
		}
		parts = append(parts, p)
	}
	if len(parts) == 0 || (pending != 0 && pending != ' ') || len(parts) > maxChain {
		return nil, errNotChain
	}
	if len(parts) == 1 {
		// A compound needs no backtracking: match it as cascadia parsed
		// it (its grammar reads a few odd compounds apart differently).
		parts[0] = whole
	}
	for _, p := range parts {
		if p == nil {
			return nil, errNotChain
		}
	}
	return &chainSel{whole: whole, parts: parts, combs: combs, budget: budget}, nil
}

// selectorArgument says whether the functional pseudo-class that ends
// prefix takes selectors as its argument.
func selectorArgument(prefix string) bool {
	i := len(prefix)
	for i > 0 && (prefix[i-1] == '-' || prefix[i-1] >= 'a' && prefix[i-1] <= 'z' || prefix[i-1] >= 'A' && prefix[i-1] <= 'Z') {
		i--
	}
	switch strings.ToLower(prefix[i:]) {
	case "not", "is", "where", "has", "matches", "any", "-webkit-any", "-moz-any", "host", "host-context", "slotted":
		return true
	}
	return false
}

// complexArgument says whether a compound selector holds a functional
// pseudo-class whose argument has a combinator (":not(g circle)").
func complexArgument(compound string) bool {
	open := -1
	found := false
	topLevel(compound, func(i int) {
		switch compound[i] {
		case '(':
			open = i
		case ')':
			if open >= 0 && !found && selectorArgument(compound[:open]) {
				for _, arg := range splitTopLevel(compound[open+1:i], ',') {
					toks := tokensOfChain(arg)
					if len(toks) > 1 || (len(toks) == 1 && complexArgument(toks[0])) {
						found = true
					}
				}
			}
			open = -1
		}
	})
	return found
}

// tokensOfChain cuts a complex selector into compounds and combinator
// tokens (" ", ">", "+", "~").
func tokensOfChain(s string) []string {
	var out []string
	start := 0
	// Whitespace outside brackets and strings always separates, so a
	// token never starts or ends with any (an escaped space is part of it).
	flush := func(end int) {
		if end > start {
			out = append(out, s[start:end])
		}
	}
	topLevel(s, func(i int) {
		switch c := s[i]; c {
		case ' ', '\t', '\n', '\r', '\f', '>', '+', '~':
			flush(i)
			if c == '>' || c == '+' || c == '~' {
				out = append(out, string(c))
			} else {
				out = append(out, " ")
			}
			start = i + 1
		}
	})
	flush(len(s))
	return out
}

// splitTopLevel cuts s at the top-level bytes sep.
func splitTopLevel(s string, sep byte) []string {
	var out []string
	start := 0
	topLevel(s, func(i int) {
		if s[i] == sep {
			out = append(out, s[start:i])
			start = i + 1
		}
	})
	return append(out, s[start:])
}

// topLevel calls f with the index of each byte of s that lies outside
// brackets, parentheses, strings and escapes, and of each bracket or
// parenthesis that opens from the top level or closes back to it.
func topLevel(s string, f func(i int)) {
	depth := 0
	var quote byte
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case c == '\\':
			i = escapeEnd(s, i)
		case quote != 0:
			if c == quote {
				quote = 0
			}
		case c == '"' || c == '\'':
			quote = c
		case c == '(' || c == '[':
			if depth == 0 {
				f(i)
			}
			depth++
		case c == ')' || c == ']':
			depth--
			if depth == 0 {
				f(i)
			}
		case depth == 0:
			f(i)
		}
	}
}

// escapeEnd returns the index of the last byte of the CSS escape that
// starts with the backslash at s[i]: up to six hex digits and one
// whitespace after them, or one other character (CSS Syntax 3 §4.3.7).
func escapeEnd(s string, i int) int {
	j := i + 1
	for j < len(s) && j-i <= 6 && isHex(s[j]) {
		j++
	}
	if j == i+1 {
		return min(i+1, len(s)-1)
	}
	if j < len(s) && (s[j] == ' ' || s[j] == '\t' || s[j] == '\n' || s[j] == '\r' || s[j] == '\f') {
		return j
	}
	return j - 1
}

func isHex(c byte) bool {
	return c >= '0' && c <= '9' || c >= 'a' && c <= 'f' || c >= 'A' && c <= 'F'
}
