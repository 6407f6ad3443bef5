package report

import (
	"encoding/json"
	"math"
	"math/rand"
	"slices"
	"standout/internal/jsonio"
	"standout/snapshot"
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

// The digest's lists of indices are written in runs of three or more
// consecutive ascending values, and read back as they were.
func TestIndicesInRuns(t *testing.T) {
	for _, c := range []struct {
		in   []int
		want string
	}{
		{nil, "[]"},
		{[]int{0}, "[0]"},
		{[]int{0, 1}, "[0,1]"},
		{[]int{0, 1, 2}, "[0,-2]"},
		{[]int{5, 6, 7, 9, 10, 12, 13, 14, 15}, "[5,-7,9,10,12,-15]"},
		{[]int{3, 2, 1}, "[3,2,1]"},
		{[]int{4, 4, 5, 6}, "[4,4,-6]"},
		{[]int{-1, 0, 1, 2, 25, 3}, "[0,-3]"}, // outside [0, 20) left out
	} {
		got := appendInts(nil, c.in, 20)
		assert.Equal(t, c.want, string(got), "%v", c.in)
		var back Indices
		require.NoError(t, back.UnmarshalJSON(got))
		var kept []int
		for _, x := range c.in {
			if x >= 0 && x < 20 {
				kept = append(kept, x)
			}
		}
		assert.Equal(t, append(Indices{}, kept...), back, "%s", got)
	}
	rng := rand.New(rand.NewSource(4))
	for trial := 0; trial < 200; trial++ {
		var in []int
		for x := rng.Intn(3); len(in) < 40; x += 1 + rng.Intn(3) - rng.Intn(2) {
			in = append(in, x)
		}
		var back Indices
		require.NoError(t, back.UnmarshalJSON(appendInts(nil, in, 1<<20)))
		require.Equal(t, Indices(in), back)
	}
	for _, bad := range []string{"[-3]", "[5,-6]", "[5,-4]", "[1,x]", "{}", "[0,-2000000000]", "[07]", "[+1]", "[600000]"} {
		var v Indices
		assert.Error(t, v.UnmarshalJSON([]byte(bad)), bad)
	}
}

// FuzzIndices holds the runs to a round trip: any list of indices,
// written in runs, reads back as the list (within [0, n)); and any text
// read as a list reads back the same after it is written again.
func FuzzIndices(f *testing.F) {
	f.Add([]byte{0, 1, 2, 3, 7, 8, 9, 9, 200}, "[2,-5001,7,9,10]")
	f.Add([]byte{5, 4, 3}, "[0,1]")
	f.Add([]byte{}, " [ 1 , -3 ] ")
	f.Fuzz(func(t *testing.T, raw []byte, text string) {
		var in []int
		for _, b := range raw {
			in = append(in, int(b)-8) // some below 0, left out
		}
		var kept Indices
		for _, x := range in {
			if x >= 0 && x < 240 {
				kept = append(kept, x)
			}
		}
		var back Indices
		if err := back.UnmarshalJSON(appendInts(nil, in, 240)); err != nil {
			t.Fatalf("%v: %v", in, err)
		}
		if !slices.Equal(append(Indices{}, kept...), back) {
			t.Fatalf("%v: read back %v", in, back)
		}
		var v Indices
		if v.UnmarshalJSON([]byte(text)) != nil {
			return
		}
		var again Indices
		if err := again.UnmarshalJSON(appendInts(nil, v, snapshot.MaxNodes)); err != nil || !slices.Equal(v, again) {
			t.Fatalf("%q: read %v, written and read again %v (%v)", text, v, again, err)
		}
	})
}
