package perception

import (
	"math"
	"slices"

	"standout/perception/colour"
)

// The scene is the whole chart as one display: marks of every kind, text,
// rules and legend swatches, all seen at once. Feature contrasts within a
// kind (a bar's length against other bars') decide each mark's verdict;
// colour is the one channel every element shares, and Guided Search's
// priority map is one map over the whole field (Wolfe 1994, from memory;
// Wolfe 2021, REFERENCES §5.6). So each element's hue salience is also
// measured among every element of the chart, and an element of another
// kind that catches the eye by colour as strongly as the emphasis is a
// rival to it: a red annotation beside a red highlight, a saturated legend
// beside a muted one.

// sceneHue is the hue salience of the marks need (nil: every mark), under
// normal vision, in the display of all the chart's elements (Input.Marks
// and Input.Legend), indexed like Input.Marks; nil when the chart has one
// kind of mark and no legend, where the scene is the kind's own display.
func sceneHue(in Input, p *Params, need []int) []float64 {
	n := len(in.Marks)
	if n < 2 || (len(in.Legend) == 0 && oneKind(in.Marks)) {
		return nil
	}
	all := in.Marks
	if len(in.Legend) > 0 {
		all = append(slices.Clip(in.Marks), in.Legend...)
	}
	idx := make([]int, len(all))
	for i := range idx {
		idx[i] = i
	}
	if need == nil {
		need = idx[:n]
	}
	d := newDisplayShared(p, all, idx, in.Background, colour.Normal, 1, nil)
	j := judging{d: d, nb: neighboursOf(all, need, p.Neighbours), chromaRef: medianChroma(d), contrastRef: medianContrast(d)}
	j.stats[hueAt], j.stats[lightnessAt] = d.stats(Hue), d.stats(Lightness)
	out := make([]float64, n)
	for _, k := range need {
		if d.seen(k) {
			out[k], _ = j.hueAndLightness(k)
		}
	}
	return out
}

// neighboursOf lists the k nearest of all for the marks need alone,
// indexed like all; the others' lists stay nil.
func neighboursOf(all []Mark, need []int, k int) [][]int {
	if len(all) < 2 || k <= 0 {
		return nil
	}
	xs, ys := make([]float64, len(all)), make([]float64, len(all))
	for i := range all {
		xs[i], ys[i] = all[i].X, all[i].Y
	}
	g := newIndex(xs, ys, max(2, float64(k)/2))
	nb := make([][]int, len(all))
	ds := make([]float64, 0, k)
	for _, i := range need {
		nb[i] = g.knnInto(i, k, make([]int, 0, k), ds[:0])
	}
	return nb
}

// sceneNeeds lists the marks whose scene salience rivals needs: the
// emphasis and every mark of another kind.
func sceneNeeds(in Input, em []int) []int {
	kinds := map[string]bool{}
	for _, e := range em {
		kinds[in.Marks[e].Kind] = true
	}
	need := append([]int(nil), em...)
	for i := range in.Marks {
		if !kinds[in.Marks[i].Kind] {
			need = append(need, i)
		}
	}
	return need
}

func oneKind(ms []Mark) bool {
	for i := range ms {
		if ms[i].Kind != ms[0].Kind {
			return false
		}
	}
	return true
}

// rivals are the marks of other kinds than the emphasis's that pop by hue
// in the scene with at least Params.RivalShare of the strength with which
// the emphasis catches the eye (its strongest channel within its kind, or
// its hue in the scene), and
// whose colour is not the emphasis's own (a direct label or legend entry
// in the highlight colour belongs to the highlight).
func rivals(in Input, p *Params, res *Result, scene []float64) []int {
	if scene == nil || len(res.Emphasis) == 0 || !res.Holds[0] {
		return nil
	}
	kinds := map[string]bool{}
	weakest := math.Inf(1)
	var own []colour.Lab
	for _, e := range res.Emphasis {
		m := &in.Marks[e]
		kinds[m.Kind] = true
		own = append(own, colour.SRGBToLab(m.Colour))
		top := scene[e]
		for _, s := range res.Marks[e][0].Salience {
			top = max(top, s)
		}
		weakest = min(weakest, top)
	}
	var out []int
	for i, s := range scene {
		m := &in.Marks[i]
		if s < 1 || s < p.RivalShare*weakest || kinds[m.Kind] || slices.Contains(res.Emphasis, i) {
			continue
		}
		lab, nd := colour.SRGBToLab(m.Colour), p.ND.For(m.Type, m.MinPx, m.MaxPx)
		mine := false
		for _, o := range own {
			// Within one noticeable difference: the same colour.
			mine = mine || colour.NDUnits(lab, o, nd) < 1
		}
		if !mine {
			out = append(out, i)
		}
	}
	return out
}
