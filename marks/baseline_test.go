package marks

import (
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/static"
)

// A bar chart's baseline, drawn as a plain line the bars stand on (or
// start from, in a horizontal bar chart), is an axis, not a data mark:
// issue 15 counted "7 data marks" for 6 bars. A line that no bar touches
// stays a mark.
func TestBaselineIsAxis(t *testing.T) {
	for name, c := range map[string]struct {
		page string
		bars int
	}{
		"vertical bars on a baseline": {`<svg width="200" height="120"><g fill="#9a9a9a">
			<rect x="10" y="40" width="20" height="60"/><rect x="40" y="60" width="20" height="40"/><rect x="70" y="20" width="20" height="80"/></g>
			<line x1="0" y1="100" x2="100" y2="100" stroke="#333"/></svg>`, 3},
		"horizontal bars from an axis": {`<svg width="200" height="120"><g fill="#9a9a9a">
			<rect x="20" y="10" width="60" height="15"/><rect x="20" y="35" width="90" height="15"/><rect x="20" y="60" width="30" height="15"/></g>
			<line x1="20" y1="0" x2="20" y2="90" stroke="#333"/></svg>`, 3},
	} {
		t.Run(name, func(t *testing.T) {
			p, err := static.Build(strings.NewReader(c.page), static.Options{Source: name})
			require.NoError(t, err)
			ch, err := Walk(&p.Charts[0])
			require.NoError(t, err)
			assert.Len(t, ch.Marks, c.bars)
			assert.Equal(t, 1, ch.Furniture[RoleAxis])
		})
	}
	t.Run("a line no bar touches", func(t *testing.T) {
		page := `<svg width="200" height="120"><g fill="#9a9a9a">
			<rect x="10" y="40" width="20" height="60"/><rect x="40" y="60" width="20" height="40"/></g>
			<line x1="0" y1="20" x2="100" y2="20" stroke="#c23a2e"/></svg>`
		p, err := static.Build(strings.NewReader(page), static.Options{Source: "t"})
		require.NoError(t, err)
		ch, err := Walk(&p.Charts[0])
		require.NoError(t, err)
		assert.Len(t, ch.Marks, 3)
	})
}
