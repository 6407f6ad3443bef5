package report

import (
	"encoding/json"
	"math"
	"math/rand"
	"standout/internal/jsonio"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestAppendHundredths(t *testing.T) {
	// The same number as strconv's shortest form of the rounded value.
	rng := rand.New(rand.NewSource(2))
	cases := []float64{0, math.Copysign(0, -1), 0.004, -0.004, 0.005, 1.5, -1.5, 12.345, 99.995, -0.07, 1e15, -3e20, math.NaN(), math.Inf(1)}
	for i := 0; i < 10000; i++ {
		cases = append(cases, (rng.Float64()-0.5)*math.Pow(10, float64(rng.Intn(12))))
	}
	for _, v := range cases {
		var got, want float64
		gs, ws := string(appendHundredths(nil, v)), string(jsonio.AppendFloat(nil, math.Round(v*100)/100))
		if ws == "null" {
			assert.Equal(t, ws, gs)
			continue
		}
		require.NoError(t, json.Unmarshal([]byte(gs), &got), gs)
		require.NoError(t, json.Unmarshal([]byte(ws), &want), ws)
		assert.Equal(t, want, got, "%v: %s vs %s", v, gs, ws)
	}
}
