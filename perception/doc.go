// Package perception predicts what a reader's early vision does with the
// marks of a chart: which marks pop out and through which feature channel,
// which can be found only by a serial search for a conjunction of
// features, which blend in, whether grouping cues agree, and what of this
// survives colour-vision deficiency. It then says what to change.
//
// The model follows the published findings summarised in the project's
// REFERENCES, in these steps:
//
//   - The ground. A mark must first be seen against the chart's
//     background, by at least one noticeable difference at its size
//     (Szafir 2018); one that is not cannot pop.
//   - Feature contrast. Within each kind of mark, salience is a mark's
//     contrast with the other marks, near and far, in units of each
//     channel's noticeable difference (Nothdurft 1993), weighed against
//     the spread among the rest (Duncan & Humphreys 1989). Colour is
//     measured along CIELAB's lightness axis and its two opponent axes,
//     a* (red–green) and b* (yellow–blue), each in its own noticeable
//     differences; a colour target flanked by the rest's colours is hard
//     to find, and one linearly separable from a few of them is judged by
//     its margin to their hull (D'Zmura 1991; Bauer, Jolicœur & Cowan
//     1996). Less of a feature among more (a paler or lower-contrast
//     target) scores lower than the reverse (Treisman & Gormican 1988).
//   - Targets and groups. A target is a minority smaller than the
//     display's largest group: a few marks, or a set of up to a third that
//     differs from a uniform rest, which segregates whole (Julesz 1981;
//     Treisman 1982). Equal groups are categories, not highlights.
//   - Pooled cues. Channels that each fall short pool into one guidance
//     signal, as Guided Search sums feature contrasts (Wolfe 1994, 2021).
//   - Conjunctions. A mark unique only as a combination of features shared
//     by others is a conjunction target, found by serial search (Treisman
//     & Gelade 1980).
//   - Data extremes. A singleton in the channel that encodes the data (a
//     bar's length, a bubble's area, a point's position far outside the
//     cloud) is the data speaking: reported apart, never emphasis.
//   - One display. Text, rules, other series and legend swatches share the
//     chart's colour display with the data marks; one of them that pops by
//     colour beside the emphasis is a rival to it.
//   - Vision types. Everything is judged again under protan and deutan
//     (Machado et al. 2009), tritan (Brettel, Viénot & Mollon 1997) and a
//     luminance greyscale.
//
// Every threshold is a field of Params with its source, or marked
// provisional where no published number exists; calibration_test.go holds
// the published results the model must reproduce.
//
// The package imports no HTML, CSS or syscall/js code. Its input is a list
// of marks with painted colours and geometry in CSS px.
package perception
