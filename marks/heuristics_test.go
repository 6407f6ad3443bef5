package marks

import (
	"os"
	"path/filepath"
	"reflect"
	"runtime"
	"sort"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/snapshot"
	"standout/static"
)

// perturbed returns the heuristics with one field halved and doubled
// (an integer field at least changes by one).
func perturbed(field int) []Heuristics {
	var out []Heuristics
	for _, f := range []float64{0.5, 2} {
		h := DefaultHeuristics
		v := reflect.ValueOf(&h).Elem().Field(field)
		switch v.Kind() {
		case reflect.Float64:
			v.SetFloat(v.Float() * f)
		case reflect.Int:
			n := int64(float64(v.Int()) * f)
			if n == v.Int() {
				n += int64(f*2) - 2 // 0.5 → −1, 2 → +2
			}
			v.SetInt(n)
		}
		out = append(out, h)
	}
	return out
}

// heuristicsEvidence are, for each threshold, the corpus charts that the
// walk reads right with DefaultHeuristics and wrong with the threshold
// halved or doubled: the charts that need the value. Recomputed by
// TestHeuristicsEvidence; run it with -v to print the table.
var heuristicsEvidence = map[string][]string{
	"BackgroundChart":  {"vega-lite/bar_1d.svg"},
	"RampMinAspect":    {"vega-lite/layer_text_heatmap.svg", "vega-lite/rect_heatmap.svg"},
	"HomogeneousShare": {"observable-plot/letterFrequencyBar.svg", "observable-plot/usPopulationStateAgeGrouped.svg", "observable-plot/varColor.svg", "vega-lite/bar.svg", "vega-lite/bar_grouped.svg", "vega-lite/bar_tooltip_filter.svg", "vega-lite/stacked_bar_normalize.svg", "vega-lite/stacked_bar_weather.svg"},
	"SymbolShare":      {"observable-plot/explicitSymbol.svg", "observable-plot/symbolSetFill.svg", "vega-lite/point_color_with_shape.svg"},
	"MaxSymbolKinds":   {"observable-plot/symbolSetFill.svg"},
}

func TestHeuristicsEvidence(t *testing.T) {
	if testing.Short() || runtime.GOOS == "js" {
		t.Skip("walks the corpus about seventy times; the walk is the same code under WebAssembly")
	}
	dir, charts := corpusTruth(t)
	snaps := map[string]*snapshot.Snapshot{}
	ok := func(name string, h *Heuristics) bool {
		ch, err := WalkWith(snaps[name], h)
		require.NoError(t, err)
		_, cok, _, _, fok := judge(charts[name], ch)
		return cok && fok
	}
	var right []string
	for name := range charts {
		f, err := os.Open(filepath.Join(dir, name))
		require.NoError(t, err)
		p, err := static.Build(f, static.Options{Source: name})
		f.Close()
		require.NoError(t, err)
		snaps[name] = &p.Charts[0]
		if ok(name, &DefaultHeuristics) {
			right = append(right, name)
		}
	}
	sort.Strings(right)
	ty := reflect.TypeOf(DefaultHeuristics)
	got := map[string][]string{}
	for i := 0; i < ty.NumField(); i++ {
		name := ty.Field(i).Name
		t.Run(name, func(t *testing.T) {
			need := map[string]bool{}
			for _, h := range perturbed(i) {
				for _, c := range right {
					if !ok(c, &h) {
						need[c] = true
					}
				}
			}
			var list []string
			for c := range need {
				list = append(list, c)
			}
			sort.Strings(list)
			got[name] = list
			t.Logf("%s: %s", name, strings.Join(list, ", "))
			assert.Equal(t, heuristicsEvidence[name], list, "the corpus charts that need %s changed", name)
		})
	}
}
