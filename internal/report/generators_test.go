package report

import (
	"encoding/json"
	"os"
	"path/filepath"
	"slices"
	"sort"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/internal/testkit"
	"standout/marks"
	"standout/perception"
	"standout/snapshot"
	"standout/static"
)

// In each chart of the generator corpus (testdata/generators) that
// highlights one mark, or one group, in a colour of its own, the marks
// that pop for normal vision are exactly the highlighted ones, inferred
// without being told: no spine, legend icon or glyph pops beside them,
// and nothing of another kind rivals them. The highlight colour comes
// from each script's truth, derived from the data it plotted.
func TestGeneratorHighlightsPopAlone(t *testing.T) {
	root := filepath.Join(testkit.Root(t), "testdata", "generators")
	files, err := filepath.Glob(filepath.Join(root, "*", "truth.json"))
	require.NoError(t, err)
	checked := 0
	for _, f := range files {
		data, err := os.ReadFile(f)
		require.NoError(t, err)
		var truth struct {
			Charts map[string]struct {
				Highlight string `json:"highlight"`
			} `json:"charts"`
		}
		require.NoError(t, json.Unmarshal(data, &truth))
		names := make([]string, 0, len(truth.Charts))
		for name := range truth.Charts {
			names = append(names, name)
		}
		sort.Strings(names)
		for _, name := range names {
			want := truth.Charts[name].Highlight
			if want == "" {
				continue
			}
			checked++
			path := filepath.Join(filepath.Dir(f), name)
			t.Run(filepath.Base(filepath.Dir(f))+"/"+name, func(t *testing.T) {
				ch := walkFile(t, path)
				res := perception.Analyse(ToPerception(ch, nil), perception.DefaultParams)
				var highlighted, popping []int
				for i, m := range ch.Marks {
					if m.Fill != nil && snapshot.Hex(*m.Fill) == want {
						highlighted = append(highlighted, i)
					}
					if res.Marks[i][0].Verdict == perception.Pops {
						popping = append(popping, i)
					}
				}
				require.NotEmpty(t, highlighted)
				assert.Equal(t, highlighted, popping, "the marks that pop")
				assert.True(t, res.Inferred)
				assert.Equal(t, highlighted, slices.Sorted(slices.Values(res.Emphasis)), "the inferred emphasis")
				assert.Empty(t, res.Rivals)
			})
		}
	}
	require.GreaterOrEqual(t, checked, 6, "charts with a highlight")
}

func walkFile(t *testing.T, path string) *marks.Chart {
	t.Helper()
	f, err := os.Open(path)
	require.NoError(t, err)
	defer f.Close()
	page, err := static.Build(f, static.Options{Source: path})
	require.NoError(t, err)
	require.Len(t, page.Charts, 1)
	ch, err := marks.Walk(&page.Charts[0])
	require.NoError(t, err)
	return ch
}
