package main

import (
	"fmt"
	"io"
	"sort"
	"standout/internal/report"
	"strings"
)

// terminalWriter passes what is written through TerminalSafe. Each Write
// must hold whole UTF-8 sequences, as fmt.Fprintf's do.
type terminalWriter struct{ w io.Writer }

func (t terminalWriter) Write(p []byte) (int, error) {
	if _, err := io.WriteString(t.w, report.TerminalSafe(string(p))); err != nil {
		return 0, err
	}
	return len(p), nil
}

// writeText lists each chart with its marks grouped by kind, shape and
// colour.
// glossaryPointer ends a text report: where its words are explained.
const glossaryPointer = "What these words mean: run standout glossary (the same text is docs/glossary.md)."

func writeText(w io.Writer, p report.Page) {
	w = terminalWriter{w} // page-derived text carries no escape sequences
	if p.View != nil {
		fmt.Fprintf(w, "%s (%s): %d drawing(s)\n", p.Source, p.View, len(p.Charts))
	} else {
		fmt.Fprintf(w, "%s: %d drawing(s)\n", p.Source, len(p.Charts))
	}
	for _, pr := range p.Problems {
		fmt.Fprintf(w, "  note: %s\n", pr)
	}
	for _, n := range report.UncheckedNotes(report.Unjudged(p.Unchecked)) {
		fmt.Fprintf(w, "  note: %s\n", n)
	}
	for _, f := range p.Findings {
		fmt.Fprintf(w, "  [%s] %s\n", f.Severity, f.Message)
	}
	for _, c := range p.Charts {
		if !c.IsChart {
			fmt.Fprintf(w, "  %s: not a chart (%s)\n", c.Path, c.Reason)
			continue
		}
		if c.DrawnAsPixels() {
			fmt.Fprintf(w, "  %s: a chart drawn as pixels (%s), %.0f×%.0f px, judged by its pixels\n", c.Name(), c.Source, c.Box[2], c.Box[3])
			for _, l := range report.PixelLines(c) {
				fmt.Fprintf(w, "    %s\n", l)
			}
			continue
		}
		fmt.Fprintf(w, "  %s: %d data marks, %.0f×%.0f px on %s\n", c.Name(), len(c.Marks), c.Box[2], c.Box[3], c.Background)
		type key struct{ kind, shape, fill, stroke string }
		groups := map[key]int{}
		for _, m := range c.Marks {
			// A shape is a feature of points; a bar's "square" outline
			// class would only confuse.
			shape := m.Shape
			if m.Kind != "point" {
				shape = ""
			}
			k := key{m.Kind, shape, "none", "none"}
			if m.Fill != nil {
				k.fill = *m.Fill
			}
			if m.Stroke != nil {
				k.stroke = *m.Stroke
			}
			groups[k]++
		}
		keys := make([]key, 0, len(groups))
		for k := range groups {
			keys = append(keys, k)
		}
		sort.Slice(keys, func(i, j int) bool {
			if groups[keys[i]] != groups[keys[j]] {
				return groups[keys[i]] > groups[keys[j]]
			}
			return fmt.Sprint(keys[i]) < fmt.Sprint(keys[j])
		})
		for _, k := range keys {
			fmt.Fprintf(w, "    %5d %-6s %-8s fill %-8s stroke %s\n", groups[k], k.kind, k.shape, k.fill, k.stroke)
		}
		if len(c.Legend) > 0 {
			fmt.Fprintf(w, "    legend: %d entries\n", len(c.Legend))
		}
		var furn []string
		for k, v := range c.Furniture {
			furn = append(furn, fmt.Sprintf("%s %d", k, v))
		}
		sort.Strings(furn)
		if len(furn) > 0 {
			fmt.Fprintf(w, "    set aside: %s\n", strings.Join(furn, ", "))
		}
		for _, pr := range c.Problems {
			fmt.Fprintf(w, "    note: %s\n", pr)
		}
		if sum := report.Summary(c); sum != "" {
			fmt.Fprintf(w, "    at a glance: %s.\n", sum)
		}
		writeFindings(w, c.Findings)
	}
}

// writeRule prints a fix's CSS rule, its selectors one per line; a long
// list is cut after a few, the JSON and Markdown reports holding it whole.
func writeRule(w io.Writer, f *report.Fix) {
	if f.Rule == "" {
		fmt.Fprintf(w, "            %s;\n", f.CSS)
		return
	}
	const most = 4
	lines := strings.Split(f.Rule, "\n")
	if len(lines) <= most {
		for _, l := range lines {
			fmt.Fprintf(w, "            %s\n", l)
		}
		return
	}
	for _, l := range lines[:most-1] {
		fmt.Fprintf(w, "            %s\n", l)
	}
	fmt.Fprintf(w, "            … %d more selectors (the JSON and Markdown reports hold the whole rule)\n", len(lines)-most)
	fmt.Fprintf(w, "            %s\n", lines[len(lines)-1])
}

// writeFindings prints each finding: what a reader meets and what to
// change, the evidence with its source, and the fix to paste.
func writeFindings(w io.Writer, findings []report.Finding) {
	for _, f := range findings {
		fmt.Fprintf(w, "    [%s] %s\n", f.Severity, f.Message)
		if f.Evidence != "" {
			fmt.Fprintf(w, "        evidence: %s (%s)\n", f.Evidence, f.Source)
		}
		if f.Fix != nil {
			state := "checked: the emphasis then pops out for every vision type"
			if !f.Fix.Verified {
				state = "not enough on its own: colour alone cannot make it pop for every reader"
			}
			what := "recolour the emphasis"
			if f.Fix.Kind == "mute-others" {
				what = "mute the other marks"
			}
			fmt.Fprintf(w, "        fix: %s (%s):\n", what, state)
			writeRule(w, f.Fix)
			if f.Fix.Alternative != "" {
				fmt.Fprintf(w, "        or: %s\n", f.Fix.Alternative)
			}
		}
	}
}
