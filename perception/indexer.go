package perception

// indexer numbers the distinct values of a key in the order they first
// appear. A run of equal keys costs one comparison rather than a hash:
// under WebAssembly map operations are several times dearer than natively,
// and marks in document order mostly repeat the previous mark's kind,
// colour, size and shape.
type indexer[K comparable] struct {
	index map[K]int
	keys  []K
	last  int
}

func newIndexer[K comparable]() *indexer[K] {
	return &indexer[K]{index: map[K]int{}, last: -1}
}

// scanKeys is how many distinct keys are looked up by comparing each
// rather than by hashing: a chart has a few colours, kinds and shapes,
// and == is what a map's lookup compares by too (a NaN is never found).
const scanKeys = 8

// of returns k's number, numbering it if it is new.
func (x *indexer[K]) of(k K) int {
	if x.last >= 0 && x.keys[x.last] == k {
		return x.last
	}
	i, ok := -1, false
	if len(x.keys) <= scanKeys {
		for j := range x.keys {
			if x.keys[j] == k {
				i, ok = j, true
				break
			}
		}
	} else {
		i, ok = x.index[k]
	}
	if !ok {
		i = len(x.keys)
		x.index[k] = i
		x.keys = append(x.keys, k)
	}
	x.last = i
	return i
}
