package report

import (
	"fmt"
	"io"
	"strings"
)

// WriteMarkdown writes a report for a ticket: per chart, what stands out,
// the findings in sentences, suggested fixes as CSS, and the cautions.
// pngs optionally maps a chart ("source#path") to an image file to embed.
func WriteMarkdown(w io.Writer, r *Report, pngs map[string]string) {
	fmt.Fprintln(w, "# Standout report")
	fmt.Fprintln(w)
	for _, p := range r.Pages {
		fmt.Fprintf(w, "## %s\n\n", mdEscape(p.Source))
		for _, pr := range p.Problems {
			fmt.Fprintf(w, "- Note: %s\n", mdEscape(pr))
		}
		for _, f := range p.Findings {
			fmt.Fprintf(w, "- %s: %s (%s)\n", f.Severity, mdEscape(f.Message), mdCode(f.ID))
		}
		if len(p.Problems)+len(p.Findings) > 0 {
			fmt.Fprintln(w)
		}
		charts := 0
		for _, c := range p.Charts {
			if !c.IsChart {
				continue
			}
			charts++
			if c.DrawnAsPixels() {
				writePixelChart(w, c)
				continue
			}
			if c.Title != "" {
				fmt.Fprintf(w, "### %s (%s)\n\n", mdEscape(c.Title), mdCode(c.Path))
			} else {
				fmt.Fprintf(w, "### Chart %s\n\n", mdCode(c.Path))
			}
			if img, ok := pngs[p.Source+"#"+c.Path]; ok {
				fmt.Fprintf(w, "![Chart %s with Standout's outlines](%s)\n\n", mdEscape(c.Path), img)
			}
			fmt.Fprintf(w, "%d data marks. At a glance: %s.\n\n", len(c.Marks), orNone(Summary(c)))
			writeSearchPlot(w, c, pngs[SearchPlotKey+p.Source+"#"+c.Path])
			if c.Emphasis != nil && len(c.Emphasis.Marks) > 0 {
				var ok, lost []string
				for _, v := range []string{"normal", "protan", "deutan", "tritan", "achromat"} {
					if c.Emphasis.Holds[v] {
						ok = append(ok, v)
					} else {
						lost = append(lost, v)
					}
				}
				how := "Declared emphasis"
				if c.Emphasis.Inferred {
					how = "Emphasis (inferred)"
				}
				marks := make([]string, len(c.Emphasis.Marks))
				for i, m := range c.Emphasis.Marks {
					marks[i] = mdCode(m)
				}
				fmt.Fprintf(w, "%s: %s. Stands out for: %s. Lost for: %s.\n\n", how, strings.Join(marks, ", "), orNone(strings.Join(ok, ", ")), orNone(strings.Join(lost, ", ")))
			}
			if len(c.Findings) == 0 {
				fmt.Fprintln(w, "No findings.")
				fmt.Fprintln(w)
				continue
			}
			fmt.Fprintln(w, "| level | what a reader meets, and what to change | evidence | rule | source |")
			fmt.Fprintln(w, "| --- | --- | --- | --- | --- |")
			for _, f := range c.Findings {
				fmt.Fprintf(w, "| %s | %s | %s | %s | %s |\n", f.Severity, mdCell(f.Message), mdCell(f.Evidence), mdCode(f.ID), mdCell(f.Source))
			}
			fmt.Fprintln(w)
			writeFixes(w, c.Findings)
		}
		if charts == 0 {
			fmt.Fprintln(w, "No charts found.")
			fmt.Fprintln(w)
		}
	}
	writeKey(w)
	fmt.Fprintf(w, "> %s\n", r.Caution)
}

// writePixelChart writes a chart drawn as pixels: where the eye is
// predicted to go first, for each vision type.
func writePixelChart(w io.Writer, c Chart) {
	fmt.Fprintf(w, "### Chart %s (%s, judged by its pixels)\n\n", mdCode(c.Path), c.Source)
	for _, l := range PixelLines(c) {
		fmt.Fprintf(w, "%s\n\n", l)
	}
}

func margins(m map[string]float64) string {
	var s []string
	for _, v := range []string{"normal", "protan", "deutan", "tritan", "achromat"} {
		if x, ok := m[v]; ok {
			s = append(s, fmt.Sprintf("%s %.1f", v, x))
		}
	}
	return strings.Join(s, ", ")
}

func orNone(s string) string {
	if s == "" {
		return "none"
	}
	return s
}

func mdCell(s string) string {
	return strings.ReplaceAll(mdEscape(s), "\\#", "#")
}

// MarkdownEscape is the escaping WriteMarkdown applies to page-derived text.
func MarkdownEscape(s string) string { return mdEscape(s) }

// writeFixes writes each finding's fix: the rule to paste, whether the
// re-check confirmed it, its margins and, where no colour works for every
// reader, the second cue to add.
func writeFixes(w io.Writer, findings []Finding) {
	for _, f := range findings {
		if f.Fix == nil {
			continue
		}
		what := "Recolour the emphasised marks"
		if f.Fix.Kind == "mute-others" {
			what = "Mute the other marks"
		}
		state := "re-checked: the emphasis then stands out for every vision type"
		if !f.Fix.Verified {
			state = "not enough on its own for every reader"
		}
		css := f.Fix.Rule
		if css == "" {
			css = f.Fix.CSS + ";"
		}
		fmt.Fprintf(w, "Suggested fix for %s (%s):\n\n```css\n%s\n```\n\n", mdCode(f.ID), state, strings.ReplaceAll(TerminalSafe(css), "`", "'"))
		fmt.Fprintf(w, "%s. Smallest difference to any other mark, in noticeable-difference units: %s.\n\n", what, margins(f.Fix.Margin))
		if f.Fix.Alternative != "" {
			fmt.Fprintf(w, "%s\n\n", mdCell(f.Fix.Alternative))
		}
	}
}

// SearchPlotKey prefixes, in WriteMarkdown's map of pictures, the key of a
// chart's search-time plot.
const SearchPlotKey = "search:"

// writeSearchPlot says how long finding the emphasis takes, and how that
// grows with the number of marks, with the plot when one was written.
func writeSearchPlot(w io.Writer, c Chart, plot string) {
	curve, ok := CurveOf(c)
	if !ok {
		return
	}
	how := "it stands out, so more marks would add little"
	if curve.Serial {
		how = "a reader checks marks one by one, so the time grows with every mark added"
	}
	fmt.Fprintf(w, "Finding the emphasis takes up to about %s s among these %d marks, and would take %s s among 1,000: %s (an estimate from published search times, not a measurement).\n\n",
		trimFloat(curve.At(float64(max(curve.N, 1)))/1000), curve.N, trimFloat(curve.At(1000)/1000), how)
	if plot != "" {
		fmt.Fprintf(w, "![Estimated time to find the emphasis as the number of marks grows](%s)\n\n", plot)
	}
}
