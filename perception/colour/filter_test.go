package colour

import (
	"os"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestFilterModuleCommitted(t *testing.T) {
	got, err := os.ReadFile("../../extension/cvd-filters.js")
	require.NoError(t, err, "run go generate ./perception/colour")
	assert.Equal(t, string(FilterModule()), string(got), "extension/cvd-filters.js is stale: run go generate ./perception/colour")
}

func TestFeColorMatrixRoundTrip(t *testing.T) {
	// The 20 values parse back to exactly the matrix the analysis uses.
	m := MachadoMatrix(Deutan, 0.7)
	f := strings.Fields(FeColorMatrix(m))
	require.Len(t, f, 20)
	idx := []int{0, 1, 2, 5, 6, 7, 10, 11, 12}
	for k, i := range idx {
		v, err := strconv.ParseFloat(f[i], 64)
		require.NoError(t, err)
		assert.Equal(t, m[k], v)
	}
	assert.Equal(t, []string{"0", "0", "0", "1", "0"}, f[15:])
}
