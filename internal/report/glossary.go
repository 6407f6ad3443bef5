package report

import (
	"io"
	"strings"
)

// Term is one entry of the glossary: the words Standout's reports use,
// said plainly for reporters and editors.
type Term struct {
	Term, Means string
}

// Glossary is the one vocabulary of the reports: the text and Markdown
// reports end with the entries they use, and docs/glossary.md is written
// from it (go test ./internal/report -run Glossary -update).
var Glossary = []Term{
	{"stands out at a glance (pops out)", "A reader's eye goes to the mark before they look for it: it differs enough from the marks around it in one feature (hue, lightness, size, orientation or shape), or in a few together. Finding it takes about as long with 10 marks as with 1,000."},
	{"found only by a slow search (conjunction)", "The mark differs from every other mark only in a combination of features that the others each have one of, so a reader has to check marks one by one. The time to find it grows with the number of marks."},
	{"blends in", "Nothing about the mark draws the eye; a reader finds it only by looking for it."},
	{"emphasis", "The marks the chart means the reader to see first: declared by the author (data-standout-emphasis, or --emphasis) or, when none is declared, inferred from the marks that stand out."},
	{"data extreme", "A mark that stands out only by the value it shows, such as the longest bar or a point far from all the others. That is the data speaking, not a highlight, and it is never taken for the emphasis."},
	{"protan, deutan, tritan", "Readers with the three kinds of colour-vision deficiency (CVD): red-weak or red-blind (protan), green-weak or green-blind (deutan, the most common: about 1 man in 16, from memory), blue-weak or blue-blind (tritan, rare). Standout simulates protan and deutan with Machado, Oliveira & Fernandes (2009) and tritan with Brettel, Viénot & Mollon's (1997) dichromat model; a simulation is a model, and readers vary."},
	{"achromat (greyscale)", "The chart with every colour replaced by the grey of its luminance: what survives without hue, as in a greyscale print. It is not a model of rod monochromacy."},
	{"CVD strength", "How strong the simulated deficiency is, from 0 (none) to 1 (full dichromacy): --cvd-severity on the command line, the slider in the panel."},
	{"noticeable difference", "The smallest colour difference that half of readers can see between two marks of a given size (Stone, Szafir & Setlur 2014; Szafir 2018). Small marks need bigger differences."},
	{"contrast ratio", "WCAG 2.x's measure of how far apart two colours are in luminance, from 1:1 (the same) to 21:1 (black on white). Graphics a reader needs and large text need 3:1 against what is next to them; other text needs 4.5:1."},
	{"finding levels: error, warning, info", "The levels follow the harm to the reader. An error means some readers will miss what the chart means to say: its highlight does not stand out at a glance, for everyone or for readers with a colour-vision deficiency, or its data marks are too faint to see and nothing labels them. A warning means reading is harder for some readers, but the chart's point gets through: categories that look alike to some readers, faint text, muted marks behind a highlight that works, something competing with the highlight. Info is worth knowing: what stands out and through what, data extremes, grouping cues that agree. A chart that could not be read at all (drawn as pixels with no pixels to judge, in a frame that could not be entered, styled by a sheet that did not load), or a page with no chart, is a warning: nothing was checked there."},
	{"most salient region (charts drawn as pixels)", "A chart drawn on a canvas or as an image has no marks to read, so Standout judges its pixels instead: a saliency map (Itti, Koch & Niebur 1998) predicts where the eye goes first, from contrasts of intensity, colour and orientation across scales. The most salient region is that place, for normal vision and, with the pixels simulated, for each colour-vision deficiency. A prediction, coarser than the verdicts on marks."},
	{"grouping cues", "What makes marks look like they belong together: nearness, common colour, common shape, lines joining them. When two cues divide the marks differently, readers see two competing structures; the adjusted Rand index measures how much two divisions agree (1 the same, 0 no more than chance). Nearness makes groups only where the gaps between them are clearly wider than the spacing within them, so a scatter whose points merely thin out here and there makes none. One mark in a colour of its own is an emphasis, not a group: a cue divides the marks only when at least two of its groups hold more than one mark."},
}

// WriteGlossary writes the glossary as Markdown.
func WriteGlossary(w io.Writer) {
	put(w, "# Glossary\n\nThe words Standout's reports use. Generated from internal/report/glossary.go.\n\n")
	for _, t := range Glossary {
		put(w, "**", t.Term, "**: ", t.Means, "\n\n")
	}
}

// writeKey writes the Markdown report's key: what the outlines in the
// pictures mean (the overlay and the PNGs draw the same styles) and the
// terms the report uses.
func writeKey(w io.Writer) {
	put(w, "## How to read this report\n\n")
	for _, s := range VerdictStyles {
		line := "a thin solid outline"
		switch {
		case len(s.Dash) > 0:
			line = "a dashed outline"
		case s.Width >= 2:
			line = "a thick solid outline"
		}
		corner := ""
		switch s.Corner {
		case "notch":
			corner = " with a filled triangle at its top right"
		case "ring":
			corner = " with a ring at its top right"
		}
		put(w, "- ", strings.ToUpper(line[:1]), line[1:], corner, " (", s.Colour, "): ", s.Words, ".\n")
	}
	put(w, "- A red dashed frame in a picture marks a declared emphasis that does not stand out.\n\n")
	for _, t := range Glossary {
		put(w, "- **", t.Term, "**: ", t.Means, "\n")
	}
	put(w, "\n")
}
