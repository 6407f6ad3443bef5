package report

import (
	"io"
	"strconv"
	"strings"
)

// put writes parts to w one after the other. The report's formats are
// written without fmt: the overlay core links this package, and fmt's
// printing would add to what every press downloads and compiles. As with
// fmt.Fprintf, a failing writer is the caller's to notice.
func put(w io.Writer, parts ...string) {
	for _, p := range parts {
		_, _ = io.WriteString(w, p)
	}
}

// WriteMarkdown writes a report for a ticket: per chart, what stands out,
// the findings in sentences, suggested fixes as CSS, and the cautions.
// pngs optionally maps a chart ("source#path") to an image file to embed.
func WriteMarkdown(w io.Writer, r *Report, pngs map[string]string) {
	put(w, "# Standout report\n\n")
	for _, p := range r.Pages {
		put(w, "## ", mdEscape(p.Source), "\n\n")
		for _, pr := range p.Problems {
			put(w, "- Note: ", mdEscape(pr), "\n")
		}
		for _, f := range p.Findings {
			put(w, "- ", string(f.Severity), ": ", mdEscape(f.Message), " (", mdCode(f.ID), ")\n")
		}
		if len(p.Problems)+len(p.Findings) > 0 {
			put(w, "\n")
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
				put(w, "### ", mdEscape(c.Title), " (", mdCode(c.Path), ")\n\n")
			} else {
				put(w, "### Chart ", mdCode(c.Path), "\n\n")
			}
			if img, ok := pngs[p.Source+"#"+c.Path]; ok {
				put(w, "![Chart ", mdEscape(c.Path), " with Standout's outlines](", img, ")\n\n")
			}
			put(w, strconv.Itoa(len(c.Marks)), " data marks. At a glance: ", orNone(Summary(c)), ".\n\n")
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
				put(w, how, ": ", strings.Join(marks, ", "), ". Stands out for: ", orNone(strings.Join(ok, ", ")), ". Lost for: ", orNone(strings.Join(lost, ", ")), ".\n\n")
			}
			if len(c.Findings) == 0 {
				put(w, "No findings.\n\n")
				continue
			}
			put(w, "| level | what a reader meets, and what to change | evidence | rule | source |\n| --- | --- | --- | --- | --- |\n")
			for _, f := range c.Findings {
				put(w, "| ", string(f.Severity), " | ", mdCell(f.Message), " | ", mdCell(f.Evidence), " | ", mdCode(f.ID), " | ", mdCell(f.Source), " |\n")
			}
			put(w, "\n")
			writeFixes(w, c.Findings)
		}
		if charts == 0 {
			put(w, "No charts found.\n\n")
		}
	}
	writeKey(w)
	put(w, "> ", r.Caution, "\n")
}

// writePixelChart writes a chart drawn as pixels: where the eye is
// predicted to go first, for each vision type.
func writePixelChart(w io.Writer, c Chart) {
	put(w, "### Chart ", mdCode(c.Path), " (", string(c.Source), ", judged by its pixels)\n\n")
	for _, l := range PixelLines(c) {
		put(w, l, "\n\n")
	}
}

func margins(m map[string]float64) string {
	var s []string
	for _, v := range []string{"normal", "protan", "deutan", "tritan", "achromat"} {
		if x, ok := m[v]; ok {
			s = append(s, v+" "+strconv.FormatFloat(x, 'f', 1, 64))
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
		put(w, "Suggested fix for ", mdCode(f.ID), " (", state, "):\n\n```css\n", strings.ReplaceAll(TerminalSafe(css), "`", "'"), "\n```\n\n")
		put(w, what, ". Smallest difference to any other mark, in noticeable-difference units: ", margins(f.Fix.Margin), ".\n\n")
		if f.Fix.Alternative != "" {
			put(w, mdCell(f.Fix.Alternative), "\n\n")
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
	put(w, "Finding the emphasis takes up to about ", trimFloat(curve.At(float64(max(curve.N, 1)))/1000), " s among these ", strconv.Itoa(curve.N),
		" marks, and would take ", trimFloat(curve.At(1000)/1000), " s among 1,000: ", how, " (an estimate from published search times, not a measurement).\n\n")
	if plot != "" {
		put(w, "![Estimated time to find the emphasis as the number of marks grows](", plot, ")\n\n")
	}
}
