// Package perception predicts what a reader's early vision does with the
// marks of a chart: which marks pop out and through which feature channel,
// which can be found only by a serial search for a conjunction of
// features, which blend in, whether grouping cues agree, and what of this
// survives colour-vision deficiency. It then says what to change.
//
// The model follows the published findings summarised in the project's
// REFERENCES: salience is a mark's feature contrast against the other
// marks, near and far, in units of that channel's noticeable difference,
// weighed against the spread among the other marks (Nothdurft 1993;
// Duncan & Humphreys 1989). A mark unique only as a combination of
// features shared by others is a conjunction target (Treisman & Gelade
// 1980). Every threshold is a field of Params with its source, or marked
// provisional where no published number exists.
//
// The package imports no HTML, CSS or syscall/js code. Its input is a list
// of marks with painted colours and geometry in CSS px.
package perception
