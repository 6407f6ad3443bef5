// Package marks is the walk: it decides from geometry, structure and
// repetition alone what each element of a snapshot.Snapshot is, a data
// mark (of which kind and shape), a legend swatch, or chart furniture
// (Walk), and measures each element's outline (Measure, ParsePath). The
// walk is the same code for static snapshots and for those the
// extension's read pass takes from the live page. Its thresholds are
// named, with their reasons, in heuristics.go.
package marks
