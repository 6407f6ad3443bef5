package report

import (
	"slices"
	"strconv"
	"strings"
)

// seen is one chart as one view got it.
type seen struct {
	view  string
	chart *Chart
}

// ViewChanges says, for each page read in several views (widths and
// colour schemes), what changes from one view to another, chart by
// chart: charts drawn in some views only, a different number of marks,
// an emphasis that stands out in some views and not others (and for
// which readers), and findings met in some views only. Pages read in one
// view say nothing.
func ViewChanges(r *Report) []string {
	var sources []string
	views := map[string][]string{}
	charts := map[string]map[string][]seen{} // source → chart path → per view
	order := map[string][]string{}
	for i := range r.Pages {
		p := &r.Pages[i]
		if p.View == nil {
			continue
		}
		if _, ok := charts[p.Source]; !ok {
			sources = append(sources, p.Source)
			charts[p.Source] = map[string][]seen{}
		}
		v := p.View.String()
		views[p.Source] = append(views[p.Source], v)
		for ci := range p.Charts {
			c := &p.Charts[ci]
			if !c.IsChart {
				continue
			}
			if _, ok := charts[p.Source][c.Path]; !ok {
				order[p.Source] = append(order[p.Source], c.Path)
			}
			charts[p.Source][c.Path] = append(charts[p.Source][c.Path], seen{v, c})
		}
	}
	var out []string
	for _, src := range sources {
		if len(views[src]) < 2 {
			continue
		}
		for _, path := range order[src] {
			per := charts[src][path]
			var lines []string
			if len(per) < len(views[src]) {
				var in []string
				for _, s := range per {
					in = append(in, s.view)
				}
				lines = append(lines, "drawn only at "+strings.Join(in, "; "))
			}
			lines = append(lines, markCounts(per)...)
			lines = append(lines, emphasisAcross(per)...)
			lines = append(lines, findingsAcross(per, len(views[src]))...)
			if len(lines) == 0 {
				continue
			}
			out = append(out, src+": "+per[0].chart.Name()+": "+strings.Join(lines, "; ")+".")
		}
	}
	return out
}

// markCounts says how many marks each view has, when they differ.
func markCounts(per []seen) []string {
	var parts []string
	first, differ := -1, false
	for _, s := range per {
		v, n := s.view, len(s.chart.Marks)
		if first >= 0 && n != first {
			differ = true
		}
		first = n
		parts = append(parts, strconv.Itoa(n)+" marks at "+v)
	}
	if !differ {
		return nil
	}
	return []string{strings.Join(parts, ", ")}
}

// emphasisAcross says, when the emphasis fares differently across views,
// for whom it is lost in each.
func emphasisAcross(per []seen) []string {
	var parts []string
	var last string
	differ := false
	for i, s := range per {
		v, em := s.view, s.chart.Emphasis
		state := "no emphasis"
		if em != nil && (len(em.Marks) > 0 || em.Box != nil) {
			var lost []string
			for _, vt := range []string{"normal", "protan", "deutan", "tritan", "achromat"} {
				if !em.Holds[vt] {
					lost = append(lost, vt)
				}
			}
			state = "the emphasis stands out for every reader"
			switch {
			case slices.Contains(lost, "normal"):
				state = "the emphasis blends in for every reader"
			case len(lost) > 0:
				state = "the emphasis is lost for " + strings.Join(lost, ", ") + " readers"
			}
		}
		if i > 0 && state != last {
			differ = true
		}
		last = state
		parts = append(parts, "at "+v+" "+state)
	}
	if !differ {
		return nil
	}
	return []string{strings.Join(parts, ", ")}
}

// findingsAcross lists the findings met in some of the views only.
func findingsAcross(per []seen, nViews int) []string {
	in := map[string][]string{}
	var ids []string
	for _, s := range per {
		v, fs := s.view, s.chart.Findings
		for _, f := range fs {
			if !slices.Contains(in[f.ID], v) {
				if len(in[f.ID]) == 0 {
					ids = append(ids, f.ID)
				}
				in[f.ID] = append(in[f.ID], v)
			}
		}
	}
	var out []string
	for _, id := range ids {
		if len(in[id]) < nViews {
			out = append(out, id+" only at "+strings.Join(in[id], "; "))
		}
	}
	return out
}
