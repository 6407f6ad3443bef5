package marks

import (
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"sort"
	"standout/internal/testkit"
	"testing"

	"github.com/stretchr/testify/require"
)

// generatorTruth is one chart's truth in testdata/generators: derived by
// its generator script from the data it plotted, never from the SVG.
type generatorTruth struct {
	truthChart
	LegendEntries int    `json:"legend_entries"`
	ColourBar     bool   `json:"colour_bar"`
	Highlight     string `json:"highlight"`
}

// GeneratorChart is one chart of the generator corpus.
type generatorChart struct {
	Name, Path string
	Truth      generatorTruth
}

// generatorCorpus lists testdata/generators/*/truth.json's charts, sorted
// by name (generator/file).
func generatorCorpus(t testing.TB) []generatorChart {
	root := filepath.Join(testkit.Root(t), "testdata", "generators")
	files, err := filepath.Glob(filepath.Join(root, "*", "truth.json"))
	require.NoError(t, err)
	require.NotEmpty(t, files, "no generator truth under %s", root)
	var out []generatorChart
	for _, f := range files {
		data, err := os.ReadFile(f)
		require.NoError(t, err)
		var truth struct {
			Charts map[string]generatorTruth `json:"charts"`
		}
		require.NoError(t, json.Unmarshal(data, &truth), f)
		dir := filepath.Dir(f)
		for name, tc := range truth.Charts {
			out = append(out, generatorChart{filepath.Base(dir) + "/" + name, filepath.Join(dir, name), tc})
		}
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Name < out[j].Name })
	return out
}

// TestGeneratorCorpus reads the charts of three chart libraries the
// shared corpus does not use (testdata/generators: matplotlib, ECharts,
// and D3 code of our own) against the truth their scripts derived from
// the data: discrete marks within 2% (or ±1), the exact set of data
// fills, legend entries (and colour bars) found as legends, and no axis
// line, spine or frame left among the marks. The bar is 90% of charts on
// each.
func TestGeneratorCorpus(t *testing.T) {
	charts := generatorCorpus(t)
	counts, fills, legends, clean := 0, 0, 0, 0
	for _, gc := range charts {
		ch := loadChart(t, gc.Path)
		got, cok, gotFills, wantFills, fok := judge(gc.Truth.truthChart, ch)
		// A colour bar's ramp is a legend too; without either, nothing may
		// be taken for a legend.
		// A raster ramp is set aside as an image.
		found := len(ch.Legend) > 0 || gc.Truth.ColourBar && ch.Furniture[RoleImage] > 0
		lok := len(ch.Legend) >= gc.Truth.LegendEntries && found == (gc.Truth.LegendEntries > 0 || gc.Truth.ColourBar)
		rules := 0
		for _, m := range ch.Marks {
			if m.Kind == KindRule && gc.Truth.MarksByType["rule"] == 0 {
				rules++
			}
		}
		counts += boolInt(cok)
		fills += boolInt(fok)
		legends += boolInt(lok)
		clean += boolInt(rules == 0)
		if !cok || !fok || !lok || rules > 0 {
			kinds := map[Kind]int{}
			for _, m := range ch.Marks {
				kinds[m.Kind]++
			}
			t.Logf("%s: discrete %d (%v) want %v; fills %v want %v; legend %d want %d; stray rules %d",
				gc.Name, got, kinds, gc.Truth.MarksByType, gotFills, wantFills, len(ch.Legend), gc.Truth.LegendEntries, rules)
		}
	}
	n := len(charts)
	t.Logf("of %d charts: counts %d, fills %d, legends %d, free of stray rules %d", n, counts, fills, legends, clean)
	bar := func(k int) bool { return float64(k) >= 0.9*float64(n) }
	require.True(t, bar(counts) && bar(fills) && bar(legends) && bar(clean), fmt.Sprintf("below 90%% of %d charts", n))
}
