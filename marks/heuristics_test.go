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
	"LabelGroupMin":    {"observable-plot/anscombeQuartet.svg", "observable-plot/athletesHeightWeight.svg", "observable-plot/athletesSample.svg", "observable-plot/differenceY.svg", "observable-plot/explicitSymbol.svg", "observable-plot/gistempAnomaly.svg", "observable-plot/hexbin.svg", "observable-plot/letterFrequencyWheel.svg", "observable-plot/metroUnemployment.svg", "observable-plot/metroUnemploymentHighlight.svg", "observable-plot/mobyDickLetterPosition.svg", "observable-plot/penguinSpeciesGradient.svg", "observable-plot/usCongressAgeGender.svg", "observable-plot/usPopulationStateAgeGrouped.svg", "observable-plot/varColor.svg", "vega-lite/arc_pie.svg", "vega-lite/area_gradient.svg", "vega-lite/bar.svg", "vega-lite/bar_1d.svg", "vega-lite/bar_1d_binned.svg", "vega-lite/bar_grouped.svg", "vega-lite/bar_tooltip_filter.svg", "vega-lite/boxplot_2D_vertical.svg", "vega-lite/interactive_brush.svg", "vega-lite/interactive_paintbrush_color_nearest.svg", "vega-lite/layer_line_co2_concentration.svg", "vega-lite/line.svg", "vega-lite/line_color.svg", "vega-lite/point_1d.svg", "vega-lite/point_2d.svg", "vega-lite/point_angle_windvector.svg", "vega-lite/point_bubble.svg", "vega-lite/point_color.svg", "vega-lite/point_color_with_shape.svg", "vega-lite/point_href.svg", "vega-lite/point_shape_custom.svg", "vega-lite/rect_heatmap.svg", "vega-lite/rect_heatmap_weather.svg", "vega-lite/stacked_area.svg", "vega-lite/stacked_bar_normalize.svg", "vega-lite/stacked_bar_weather.svg", "vega-lite/text_scatterplot_colored.svg", "vega-lite/tick_dot.svg", "vega-lite/trellis_anscombe.svg"},
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
