package report

import (
	"strings"
	"unicode"
)

// TerminalSafe makes page-derived text safe to print on a terminal:
// control characters (C0 but tab and newline, DEL, C1), which can carry
// escape sequences that move the cursor, retitle the window or rewrite
// what was printed, and the bidirectional overrides and isolates, which
// can reorder what a line shows, each become U+FFFD.
func TerminalSafe(s string) string {
	return strings.Map(func(r rune) rune {
		switch {
		case r == '\n' || r == '\t':
			return r
		case unicode.IsControl(r), r >= 0x202a && r <= 0x202e, r >= 0x2066 && r <= 0x2069:
			return unicode.ReplacementChar
		}
		return r
	}, s)
}

var mdEscaper = strings.NewReplacer("\\", "\\\\", "`", "\\`", "*", "\\*", "_", "\\_", "[", "\\[", "]", "\\]", "<", "&lt;", ">", "&gt;",
	"#", "\\#", "|", "\\|", "!", "\\!", "\n", " ", "\r", " ")

// mdEscape neutralises Markdown and HTML in page-derived text, and keeps
// it on one line.
func mdEscape(s string) string {
	return mdEscaper.Replace(TerminalSafe(s))
}

var codeSpanText = strings.NewReplacer("\n", " ", "\r", " ", "|", "¦")

// mdCode writes s as a Markdown code span that s cannot close: the fence
// is one backtick longer than the longest run of backticks in s, with a
// space inside each end (CommonMark 0.31 §6.1). In a table cell a "|"
// would still end the cell, so it becomes "¦".
func mdCode(s string) string {
	s = codeSpanText.Replace(TerminalSafe(s))
	longest, run := 0, 0
	for i := 0; i < len(s); i++ {
		if s[i] == '`' {
			run++
			longest = max(longest, run)
		} else {
			run = 0
		}
	}
	fence := strings.Repeat("`", longest+1)
	if longest > 0 || strings.HasPrefix(s, " ") || strings.HasSuffix(s, " ") {
		return fence + " " + s + " " + fence
	}
	return fence + s + fence
}
