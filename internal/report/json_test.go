package report

import (
	"bytes"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/internal/testkit"
	"standout/static"
)

// The hand-written encoder writes byte for byte what encoding/json (the
// Go standard library's, with HTML escaping off) writes for the same
// report: on the full reports of every chart in the repository's test
// pages, the generator corpus and the shared corpus, and on a report that
// sets every optional field, with nil and empty slices and maps.
func TestAppendJSONMatchesEncodingJSON(t *testing.T) {
	root := testkit.Root(t)
	var files []string
	for _, pat := range []string{"testdata/*.html", "testdata/*.svg", "testdata/generators/*/*.svg", "internal/demo/pages/*.html"} {
		m, err := filepath.Glob(filepath.Join(root, pat))
		require.NoError(t, err)
		files = append(files, m...)
	}
	require.Greater(t, len(files), 30)
	rep := &Report{Schema: "standout-report", Version: Version, Minor: Minor, Caution: Caution}
	rep.Pages = append(rep.Pages, sameAsEncodingJSON(t, files)...)
	t.Run("shared corpus", func(t *testing.T) {
		m, err := filepath.Glob(filepath.Join(testkit.Corpus(t), "*", "*.svg"))
		require.NoError(t, err)
		require.Len(t, m, 60)
		sameAsEncodingJSON(t, m)
	})
	// Every optional field, and the empty and nil forms.
	fill := "#3b6e8f"
	rep.Errors = []string{"x.html: not found", "tab\tand \u2028 and \x01"}
	rep.ViewChanges = []string{"at 360 px the emphasis blends"}
	rep.Pages = append(rep.Pages,
		Page{Source: "views", View: &View{Width: 360, Scheme: "dark"}, Charts: []Chart{}, Problems: []string{},
			Unchecked: []Unchecked{{Kind: "canvas", Name: "canvas0", Box: [4]float64{1, 2, 3e-7, 4e21},
				Regions:  []Region{{Box: [4]float64{1, 2, 3, 4}, Salience: 0.5}},
				CVD:      map[string][]Region{"protan": {{Salience: 1}}, "deutan": nil, "achromat": {}},
				Emphasis: &RasterEmphasis{Box: [4]float64{5, 6, 7, 8}, Holds: map[string]bool{"normal": true, "deutan": false}}}},
			Findings: []Finding{{ID: "no-chart-found", Severity: "warning", Message: "<none> & none"}}},
		Page{Source: "widths only", View: &View{Width: 1280}},
		Page{Source: "scheme only", View: &View{Scheme: "light"}, Charts: []Chart{{Path: "svg0", Title: "T", Anchor: "#a", Reason: "r",
			Furniture: map[string]int{}, Marks: []Mark{{ID: "m", Fill: &fill, FillStops: []string{"#000"}, Text: "t", Points: [][2]float64{{1, 2}},
				Weight: 0.25, Label: "l", Verdict: "pops", Channels: []string{}, SearchSlope: []float64{1}, SearchMs: []float64{2},
				CVD: &CVDResults{Protan: Result{Verdict: "pops", SlopeMs: []float64{3}}}}},
			Findings: []Finding{{ID: "f", Fix: &Fix{Kind: "k", CSS: "c", Rule: "r", Verified: true, Alternative: "a"}}},
			Groups:   &Groups{Partitions: []Partition{{Cue: "colour", Groups: 3}}},
			Extremes: []string{"m"}, Emphasis: &Emphasis{Marks: []string{"m"}, Inferred: true}}}},
	)
	// A chart drawn as pixels among the charts (minor 4), from the
	// unchecked entry above: source, regions, CVD and an emphasis box.
	PixelCharts(&rep.Pages[len(rep.Pages)-3])
	require.Len(t, rep.Pages[len(rep.Pages)-3].Charts, 1)
	assert.Equal(t, testkit.EncodingJSON(t, rep), string(AppendJSON(nil, rep)))
}

// sameAsEncodingJSON reads each file with the static reader and checks
// its full report's encoding; it returns the pages.
func sameAsEncodingJSON(t *testing.T, files []string) []Page {
	var out []Page
	for _, f := range files {
		data, err := os.ReadFile(f)
		require.NoError(t, err)
		built, err := static.Build(bytes.NewReader(data), static.Options{Source: filepath.Base(f)})
		require.NoError(t, err, f)
		page, err := FromSnapshots(filepath.Base(f), built.Charts, built.Problems, DefaultOptions)
		require.NoError(t, err, f)
		out = append(out, page)
		one := &Report{Schema: "standout-report", Version: Version, Minor: Minor, Pages: []Page{page}, Caution: Caution}
		assert.Equal(t, testkit.EncodingJSON(t, one), string(AppendJSON(nil, one)), f)
	}
	return out
}

// Every field of every type the report holds is written by AppendJSON: a
// field added to a type but not to the encoder would pass the comparison
// above while it is unset, so each JSON name must appear in json.go.
func TestAppendJSONKnowsEveryField(t *testing.T) {
	src, err := os.ReadFile("json.go")
	require.NoError(t, err)
	seen := map[reflect.Type]bool{}
	var visit func(reflect.Type)
	visit = func(ty reflect.Type) {
		for ty.Kind() == reflect.Pointer || ty.Kind() == reflect.Slice || ty.Kind() == reflect.Array || ty.Kind() == reflect.Map {
			ty = ty.Elem()
		}
		if ty.Kind() != reflect.Struct || seen[ty] {
			return
		}
		seen[ty] = true
		for i := 0; i < ty.NumField(); i++ {
			f := ty.Field(i)
			name, _, _ := strings.Cut(f.Tag.Get("json"), ",")
			require.NotEmpty(t, name, "%s.%s has no JSON name", ty.Name(), f.Name)
			assert.Contains(t, string(src), `"`+name+`"`, "%s.%s (%q) is not written by AppendJSON", ty.Name(), f.Name, name)
			visit(f.Type)
		}
	}
	visit(reflect.TypeFor[Report]())
	assert.Greater(t, len(seen), 12)
}
