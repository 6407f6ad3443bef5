package marks

import (
	"encoding/json"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"sort"
	"standout/internal/testkit"
	"standout/snapshot"
	"standout/static"
	"strings"
	"testing"

	"github.com/stretchr/testify/require"
)

// corpusDir is shared/corpus (testkit.Corpus): a developer machine
// without it skips, CI fails.
func corpusDir(t testing.TB) string { return testkit.Corpus(t) }

type truthChart struct {
	MarksByType   map[string]int `json:"marks_by_type"`
	FillsResolved []string       `json:"fills_resolved"`
}

// discreteTruth are the truth's mark types that are one shape per datum:
// points (dot, symbol), bars (bar, rect), cells (cell) and arcs (arc).
var discreteTruth = map[string]bool{"dot": true, "symbol": true, "bar": true, "rect": true, "cell": true, "arc": true}

// knownFailures lists corpus charts the walk gets wrong, with the reason.
var knownFailures = map[string]string{
	"observable-plot/crimeanWarStacked.svg":  "6 bars have height 0 and draw nothing; the walk counts drawn marks only (66 of 72)",
	"observable-plot/waffleShapes.svg":       "waffle shapes are pattern-filled outlines of mixed geometry; some are taken for bars and points, where the truth counts none as discrete",
	"vega-lite/circle_natural_disasters.svg": "the size legend's circles overlap their neighbours' rows, so only 2 of 4 swatches are recognised and the black swatch fill leaks into the mark fills",
	"vega-lite/geo_choropleth.svg":           "26 county shapes are <path> elements without path data, which draw nothing; the truth still lists their 26 fill colours",
	"vega-lite/layer_bar_annotations.svg":    "a single annotation text is a data mark in the truth; a lone text is taken for a label",
}

func loadChart(t testing.TB, path string) *Chart {
	f, err := os.Open(path)
	require.NoError(t, err)
	defer f.Close()
	page, err := static.Build(f, static.Options{Source: path})
	require.NoError(t, err)
	require.Len(t, page.Charts, 1, path)
	ch, err := Walk(&page.Charts[0])
	require.NoError(t, err)
	return ch
}

func markFills(ch *Chart) []string {
	set := map[string]bool{}
	for _, m := range ch.Marks {
		if m.Fill == nil || m.FillOpacity == 0 && len(m.FillStops) == 0 {
			continue
		}
		if len(m.FillStops) > 0 {
			for _, s := range m.FillStops {
				set[snapshot.Hex(s)] = true
			}
			continue
		}
		set[snapshot.Hex(*m.Fill)] = true
	}
	var out []string
	for k := range set {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}

// judge compares a walked chart with its truth: the discrete marks'
// count (within 2%, or 1) and the set of fills.
func judge(tc truthChart, ch *Chart) (got int, countOK bool, gotFills, wantFills []string, fillsOK bool) {
	want := 0
	for k, v := range tc.MarksByType {
		if discreteTruth[k] {
			want += v
		}
	}
	for _, m := range ch.Marks {
		if m.Kind.Discrete() {
			got++
		}
	}
	countOK = math.Abs(float64(got-want)) <= math.Max(1, 0.02*float64(want))
	wantFills = append([]string(nil), tc.FillsResolved...)
	sort.Strings(wantFills)
	gotFills = markFills(ch)
	fillsOK = strings.Join(gotFills, ",") == strings.Join(wantFills, ",")
	return got, countOK, gotFills, wantFills, fillsOK
}

// corpusTruth reads shared/corpus/truth.json: the corpus folder and each
// chart's truth, by its path within the folder.
func corpusTruth(t testing.TB) (string, map[string]truthChart) {
	dir := corpusDir(t)
	data, err := os.ReadFile(filepath.Join(dir, "truth.json"))
	require.NoError(t, err)
	var truth struct {
		Charts map[string]truthChart `json:"charts"`
	}
	require.NoError(t, json.Unmarshal(data, &truth))
	require.NotEmpty(t, truth.Charts)
	return dir, truth.Charts
}

func TestCorpus(t *testing.T) {
	dir, charts := corpusTruth(t)
	names := make([]string, 0, len(charts))
	for k := range charts {
		names = append(names, k)
	}
	sort.Strings(names)
	countOK, fillOK := 0, 0
	var report []string
	for _, name := range names {
		tc := charts[name]
		ch := loadChart(t, filepath.Join(dir, name))
		want := 0
		for k, v := range tc.MarksByType {
			if discreteTruth[k] {
				want += v
			}
		}
		got, cok, gotFills, wantFills, fok := judge(tc, ch)
		if cok {
			countOK++
		}
		if fok {
			fillOK++
		}
		if !cok || !fok {
			kinds := map[Kind]int{}
			for _, m := range ch.Marks {
				kinds[m.Kind]++
			}
			report = append(report, fmt.Sprintf("%s: discrete %d want %d (%v, legend %d, furniture %v); fills ok=%v got %d want %d %s",
				name, got, want, kinds, len(ch.Legend), ch.Furniture, fok, len(gotFills), len(wantFills), fmt.Sprint(gotFills, " vs ", wantFills)))
		}
	}
	for _, r := range report {
		name := r[:strings.Index(r, ":")]
		if why, ok := knownFailures[name]; ok {
			t.Logf("known failure %s (%s)", r, why)
			continue
		}
		t.Errorf("%s", r)
	}
	t.Logf("counts within 2%%/±1: %d/%d; fill sets exact: %d/%d", countOK, len(names), fillOK, len(names))
	// The bar: at least 54 of the 60 files within 2% (or ±1), and
	// fill sets exact; at most 6 known failures.
	require.GreaterOrEqual(t, countOK, 54)
	require.GreaterOrEqual(t, fillOK, 54)
	require.LessOrEqual(t, len(knownFailures), 6)
}
