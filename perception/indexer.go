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

// of returns k's number, numbering it if it is new.
func (x *indexer[K]) of(k K) int {
	if x.last >= 0 && x.keys[x.last] == k {
		return x.last
	}
	i, ok := x.index[k]
	if !ok {
		i = len(x.keys)
		x.index[k] = i
		x.keys = append(x.keys, k)
	}
	x.last = i
	return i
}
