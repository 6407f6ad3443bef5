package static

import (
	"testing"

	"github.com/stretchr/testify/assert"
)

// CSS Fonts Module Level 4 §2.2 (font-weight): keywords, numbers within
// [1, 1000], and the table for bolder and lighter relative to the
// inherited weight.
func TestFontWeight(t *testing.T) {
	for _, c := range []struct {
		v      string
		parent float64
		want   float64
	}{
		{"normal", 700, 400},
		{"bold", 400, 700},
		{"600", 400, 600},
		{"1", 400, 1},
		{"1000", 400, 1000},
		{"1001", 500, 500}, // invalid: the inherited weight
		{"heavy", 500, 500},
		// bolder: <350 → 400, 350–549 → 700, 550–899 → 900, ≥900 unchanged.
		{"bolder", 100, 400},
		{"bolder", 400, 700},
		{"bolder", 700, 900},
		{"bolder", 950, 950},
		// lighter: <100 unchanged, 100–549 → 100, 550–749 → 400, ≥750 → 700.
		{"lighter", 50, 50},
		{"lighter", 400, 100},
		{"lighter", 700, 400},
		{"lighter", 900, 700},
	} {
		assert.Equal(t, c.want, fontWeight(c.v, c.parent), "%s from %v", c.v, c.parent)
	}
}
