package perception

import (
	"math"
	"slices"
	"sort"

	"standout/perception/colour"
)

// Visions are the vision types the analysis runs under, normal first.
var Visions = []colour.Deficiency{colour.Normal, colour.Protan, colour.Deutan, colour.Tritan, colour.Achromat}

// Result is the analysis of one chart.
type Result struct {
	// Marks[i][v] is mark i's result under Visions[v]. With
	// Params.FindingsOnly, only the emphasised marks' rows hold every
	// vision type; the others hold normal vision alone.
	Marks [][]MarkResult
	// Emphasis is the intended emphasis (given, or inferred when Inferred).
	Emphasis []int
	Inferred bool
	// Extremes are the marks that stand out, for normal vision, only
	// through the channel that encodes their data (MarkResult.Extreme):
	// reported apart, never taken for emphasis.
	Extremes []int
	// Rivals are the marks of other kinds that catch the eye by colour,
	// in the chart seen as one display, as strongly as an emphasis that
	// pops (scene.go).
	Rivals []int
	// Holds[v] says whether every emphasised mark pops under Visions[v].
	Holds    []bool
	Groups   Grouping
	Findings []Finding

	// Per kind: spatial neighbours and the vision-independent channels,
	// reused when fixes are verified.
	kinds  map[string][]int
	nbs    map[string][][]int
	reuse  map[string]*reuseData
	shares map[string]*shared
}

// Analyse runs the whole model on one chart: salience and verdicts for
// normal vision and each CVD type at p.Severity, emphasis, grouping,
// contrast checks, findings and fixes.
func Analyse(in Input, p Params) *Result {
	n := len(in.Marks)
	res := &Result{Marks: make([][]MarkResult, n), Holds: make([]bool, len(Visions))}
	rows := len(Visions)
	if p.FindingsOnly {
		rows = 1 // the emphasis's rows grow once it is known
	}
	flat := make([]MarkResult, n*rows)
	for i := range res.Marks {
		res.Marks[i] = flat[i*rows : (i+1)*rows : (i+1)*rows]
	}
	keys := res.displays(in, p)
	res.judgeVision(in, &p, keys, 0, nil)
	res.positionExtremes(in, p)
	for i := range res.Marks {
		if r := res.Marks[i][0]; r.Extreme && r.Verdict != Pops {
			res.Extremes = append(res.Extremes, i)
		}
	}
	res.Emphasis = append([]int(nil), in.Emphasis...)
	if len(res.Emphasis) == 0 {
		res.Inferred = true
		res.Emphasis = inferEmphasis(in, p, res)
	}
	// Under CVD: every mark, or (FindingsOnly) just the emphasis, whose
	// fate is what the findings report.
	var only map[string][]int
	if p.FindingsOnly {
		only = res.emphasisOnly(in, keys)
	}
	for vi := 1; vi < len(Visions); vi++ {
		res.judgeVision(in, &p, keys, vi, only)
	}
	for vi := range Visions {
		res.Holds[vi] = len(res.Emphasis) > 0
		for _, i := range res.Emphasis {
			if i < 0 || i >= n || res.Marks[i][vi].Verdict != Pops {
				res.Holds[vi] = false
			}
		}
	}
	if res.Holds[0] {
		res.Rivals = rivals(in, &p, res, sceneHue(in, &p, sceneNeeds(in, res.Emphasis)))
	}
	res.Groups = group(in, p, res.kinds, res.nbs)
	res.Findings = findings(in, p, res)
	return res
}

// displays sorts the marks into one display per kind, with each one's
// neighbours and the data its vision types share; it returns the kinds in
// order.
func (res *Result) displays(in Input, p Params) []string {
	kindIx := newIndexer[string]()
	kindOf := make([]int, len(in.Marks))
	for i, m := range in.Marks {
		kindOf[i] = kindIx.of(m.Kind)
	}
	lists := make([][]int, len(kindIx.keys))
	for i, k := range kindOf {
		lists[k] = append(lists[k], i)
	}
	res.kinds = make(map[string][]int, len(lists))
	for k, l := range lists {
		res.kinds[kindIx.keys[k]] = l
	}
	keys := append([]string(nil), kindIx.keys...)
	sort.Strings(keys)
	res.nbs, res.reuse, res.shares = map[string][][]int{}, map[string]*reuseData{}, map[string]*shared{}
	for _, k := range keys {
		res.nbs[k] = neighbours(in.Marks, res.kinds[k], p.Neighbours, p.Kept)
		res.reuse[k] = &reuseData{}
		res.shares[k] = &shared{}
	}
	return keys
}

// positionExtremes marks as data extremes the points that stand apart in
// position: a point is placed by its data, so an outlier that draws the
// eye by where it lies, far outside the cloud of the others, is the data
// speaking (Params.IsolationRatio).
func (res *Result) positionExtremes(in Input, p Params) {
	idx, nb := res.kinds["point"], res.nbs["point"]
	if len(idx) < 3 || nb == nil || p.IsolationRatio <= 0 {
		return
	}
	nn := make([]float64, len(idx))
	for j, i := range idx {
		if len(nb[j]) > 0 {
			a, b := &in.Marks[i], &in.Marks[idx[nb[j][0]]]
			nn[j] = math.Hypot(a.X-b.X, a.Y-b.Y)
		}
	}
	median := upperMedian(slices.Clone(nn))
	if median <= 0 {
		return
	}
	for j, i := range idx {
		// Far from its nearest neighbour (rare, so the hull is built only
		// then) and outside the others' hull: not a sparse edge of the
		// cloud but a point apart from it.
		if nn[j] >= p.IsolationRatio*median && outside(in.Marks, idx, j) >= p.IsolationRatio*median {
			res.Marks[i][0].Extreme = true
		}
	}
}

// outside is the distance from the mark idx[j] to the convex hull of the
// other marks idx.
func outside(all []Mark, idx []int, j int) float64 {
	pts := make([][2]float64, 0, len(idx)-1)
	for k, i := range idx {
		if k != j {
			pts = append(pts, [2]float64{all[i].X, all[i].Y})
		}
	}
	m := &all[idx[j]]
	return distanceToHull([2]float64{m.X, m.Y}, pts)
}

// judgeVision judges every display under vision type vi: every mark, or
// with only, those marks (positions within their kind's display).
func (res *Result) judgeVision(in Input, p *Params, keys []string, vi int, only map[string][]int) {
	for _, k := range keys {
		idx := res.kinds[k]
		var targets []int
		if only != nil {
			if targets = only[k]; len(targets) == 0 {
				continue
			}
		}
		d := newDisplayShared(p, in.Marks, idx, in.Background, Visions[vi], p.Severity, res.shares[k])
		d.nb, d.reuse = res.nbs[k], res.reuse[k]
		if targets != nil {
			for t, r := range d.judgeSome(targets) {
				res.Marks[idx[targets[t]]][vi] = r
			}
			continue
		}
		for j, r := range d.judge() {
			res.Marks[idx[j]][vi] = r
		}
	}
}

// emphasisOnly lists the emphasis by kind and position in its display,
// and gives each emphasis mark a row per vision type.
func (res *Result) emphasisOnly(in Input, keys []string) map[string][]int {
	n := len(in.Marks)
	only := map[string][]int{}
	pos := make([]int, n)
	for _, k := range keys {
		for j, i := range res.kinds[k] {
			pos[i] = j
		}
	}
	for _, i := range res.Emphasis {
		if i >= 0 && i < n {
			k := in.Marks[i].Kind
			only[k] = append(only[k], pos[i])
			if len(res.Marks[i]) == 1 {
				res.Marks[i] = append(append(make([]MarkResult, 0, len(Visions)), res.Marks[i][0]), make([]MarkResult, len(Visions)-1)...)
			}
		}
	}
	return only
}

// inferEmphasis picks the marks that differ from the majority: those that
// pop for normal vision in some channel while belonging to a small group
// of their kind.
func inferEmphasis(in Input, p Params, res *Result) []int {
	var out, conj []int
	for i := range in.Marks {
		switch res.Marks[i][0].Verdict {
		case Pops:
			out = append(out, i)
		case Conjunction:
			conj = append(conj, i)
		}
	}
	// A conjunction differs from the rest in no single channel: taken for
	// an emphasis only when it is a few marks (a highlight made the wrong
	// way), not whole categories of a categorical chart.
	if len(conj) <= p.SmallGroupMin {
		out = append(out, conj...)
		slices.Sort(out)
	}
	// A display where most marks "pop" has no single emphasis.
	if len(out)*3 > len(in.Marks) {
		return nil
	}
	return dataFirst(in, out)
}

// dataFirst keeps, of the marks that stand out, the data marks when there
// are any: the highlight a chart means is in its data, and text that
// stands out beside it (a coloured annotation, a label in the highlight's
// colour) is judged as context, a rival or the highlight's own label
// (scene.go), not as part of it.
func dataFirst(in Input, out []int) []int {
	data := out[:0:0]
	for _, i := range out {
		if in.Marks[i].Kind != "text" {
			data = append(data, i)
		}
	}
	if len(data) == 0 {
		return out
	}
	return data
}
