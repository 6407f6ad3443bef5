package report

// VerdictStyle is how the overlay (extension/overlay.js) and the annotated
// PNG (standout check --png) draw the marks of one verdict. The visual
// language is redundant for readers with CVD: each verdict differs in line
// width and dash and in a corner mark, not in colour alone. The overlay's
// copy is generated from VerdictStyles (extension/constants.js).
type VerdictStyle struct {
	// Verdict is the report's verdict name.
	Verdict string
	// Letter is the verdict's one-letter code in the overlay's digest.
	Letter string
	// Colour is the outline's colour, #rrggbb.
	Colour string
	// Width is the outline's width in CSS px.
	Width float64
	// Dash is the outline's dash pattern in px (on, off); nil is solid.
	Dash []float64
	// Corner is the mark drawn at each outline's top-right corner: a
	// filled triangle ("notch"), a ring ("ring") or none ("").
	Corner string
	// Halo draws a white line under the outline in the overlay. The marks
	// that blend in, usually nearly all of them, go without: halos and
	// dashes on thousands of outlines cost the browser's software
	// rasteriser hundreds of milliseconds a frame.
	Halo bool
	// Words says what the verdict means, in the panel's key.
	Words string
}

// VerdictStyles are the verdicts' styles, the strongest first.
var VerdictStyles = []VerdictStyle{
	{Verdict: "pops", Letter: "p", Colour: "#0d5e6e", Width: 2.5, Corner: "notch", Halo: true,
		Words: "stands out at a glance"},
	{Verdict: "conjunction", Letter: "c", Colour: "#a34a0c", Width: 2, Dash: []float64{7, 3}, Corner: "ring", Halo: true,
		Words: "found only by a slow search (a conjunction of features)"},
	{Verdict: "blends", Letter: "b", Colour: "#5b5866", Width: 1,
		Words: "blends in"},
}

// StyleOf returns the style of a verdict; an unknown one is drawn as
// blending in.
func StyleOf(verdict string) VerdictStyle {
	for _, s := range VerdictStyles {
		if s.Verdict == verdict {
			return s
		}
	}
	return VerdictStyles[len(VerdictStyles)-1]
}

// Ink is the panel's palette, Standout's own: dark ink on warm paper, a
// blue for focus and for the finding under the pointer, a red for errors.
// Every text colour meets WCAG 2.x SC 1.4.3 (4.5:1) on Paper and Wash, and
// Focus meets SC 1.4.11 (3:1) against both (TestInkContrast).
var Ink = struct {
	Ink, Paper, Wash, Rule, Quiet, Focus, Highlight, Alert string
}{
	Ink:       "#1d1b24", // text, borders, the pressed button
	Paper:     "#ffffff", // the panel, halos behind outlines
	Wash:      "#f2f0ec", // buttons and code
	Rule:      "#d7d3cc", // thin separators
	Quiet:     "#46424f", // the caution's small print
	Focus:     "#2a58a6", // keyboard focus
	Highlight: "#23498b", // the marks of the finding under the pointer
	Alert:     "#a32530", // the error panel's border
}
