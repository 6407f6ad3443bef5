package perception

import (
	"sort"

	"standout/perception/colour"
)

// Visions are the vision types the analysis runs under, normal first.
var Visions = []colour.Deficiency{colour.Normal, colour.Protan, colour.Deutan, colour.Tritan, colour.Achromat}

// Result is the analysis of one chart.
type Result struct {
	// Marks[i][v] is mark i's result under Visions[v].
	Marks [][]MarkResult
	// Emphasis is the intended emphasis (given, or inferred when Inferred).
	Emphasis []int
	Inferred bool
	// Holds[v] says whether every emphasised mark pops under Visions[v].
	Holds    []bool
	Groups   Grouping
	Findings []Finding
}

// Analyse runs the whole model on one chart: salience and verdicts for
// normal vision and each CVD type at p.Severity, emphasis, grouping,
// contrast checks, findings and fixes.
func Analyse(in Input, p Params) *Result {
	n := len(in.Marks)
	res := &Result{Marks: make([][]MarkResult, n), Holds: make([]bool, len(Visions))}
	for i := range res.Marks {
		res.Marks[i] = make([]MarkResult, len(Visions))
	}
	kinds := map[string][]int{}
	for i, m := range in.Marks {
		kinds[m.Kind] = append(kinds[m.Kind], i)
	}
	keys := make([]string, 0, len(kinds))
	for k := range kinds {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	for vi, v := range Visions {
		for _, k := range keys {
			idx := kinds[k]
			d := newDisplay(&p, in.Marks, idx, v, p.Severity)
			for j, r := range d.judge() {
				res.Marks[idx[j]][vi] = r
			}
		}
	}
	res.Emphasis = append([]int(nil), in.Emphasis...)
	if len(res.Emphasis) == 0 {
		res.Inferred = true
		res.Emphasis = inferEmphasis(in, res)
	}
	for vi := range Visions {
		res.Holds[vi] = len(res.Emphasis) > 0
		for _, i := range res.Emphasis {
			if i < 0 || i >= n || res.Marks[i][vi].Verdict != Pops {
				res.Holds[vi] = false
			}
		}
	}
	res.Groups = group(in, p)
	res.Findings = findings(in, p, res)
	return res
}

// inferEmphasis picks the marks that differ from the majority: those that
// pop for normal vision in some channel while belonging to a small group
// of their kind.
func inferEmphasis(in Input, res *Result) []int {
	var out []int
	for i := range in.Marks {
		if res.Marks[i][0].Verdict == Pops || res.Marks[i][0].Verdict == Conjunction {
			out = append(out, i)
		}
	}
	// A display where most marks "pop" has no single emphasis.
	if len(out)*3 > len(in.Marks) {
		return nil
	}
	return out
}
