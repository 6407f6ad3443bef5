package perception

import (
	"math"
	"math/rand"
	"testing"

	"github.com/stretchr/testify/assert"

	"standout/perception/colour"
)

// The indexer numbers keys as a map keyed by them would (the reference
// below: Go's map, whose keys compare with ==), whether it compares them
// in turn (few keys) or hashes them (more than scanKeys): runs, repeats
// far apart, −0 beside 0, and NaNs, each of which a map never finds.
func TestIndexerNumbersAsAMap(t *testing.T) {
	rng := rand.New(rand.NewSource(3))
	for _, distinct := range []int{1, 3, scanKeys, scanKeys + 1, 40} {
		pool := make([]colour.SRGB, distinct)
		for i := range pool {
			pool[i] = colour.SRGB{R: float64(i) / 50, G: 0.5, B: 0.25}
		}
		pool[0].G = math.Copysign(0, -1)
		for trial := 0; trial < 50; trial++ {
			x := newIndexer[colour.SRGB]()
			ref := map[colour.SRGB]int{}
			n := 0
			for step := 0; step < 300; step++ {
				var k colour.SRGB
				switch r := rng.Intn(20); {
				case r == 0:
					k = colour.SRGB{R: math.NaN()}
				case r == 1:
					k = pool[0]
					k.G = 0 // == −0
				default:
					k = pool[rng.Intn(distinct)]
				}
				want, ok := ref[k]
				if !ok {
					want = n
					ref[k] = n
					n++
				}
				assert.Equal(t, want, x.of(k), "distinct %d, trial %d, step %d, key %v", distinct, trial, step, k)
			}
			assert.Len(t, x.keys, n)
		}
	}
}
