package perception

// AdjustedRandIndex compares two partitions of the same items given as
// label slices (Hubert & Arabie 1985, "Comparing partitions", J.
// Classification 2(1), 193–218):
//
//	ARI = [Σ_ij C(n_ij,2) − E] / [½(Σ_i C(a_i,2) + Σ_j C(b_j,2)) − E]
//	E   = Σ_i C(a_i,2)·Σ_j C(b_j,2) / C(n,2)
//
// with n_ij the contingency table and a_i, b_j its margins. It is 1 for
// identical partitions up to relabelling, about 0 for chance agreement,
// and may be negative. When the denominator is 0 (both partitions trivial
// in the same way, or n < 2) it returns 1, as scikit-learn does.
func AdjustedRandIndex(a, b []int) float64 {
	if len(a) != len(b) {
		panic("perception: AdjustedRandIndex of partitions of different lengths")
	}
	n := len(a)
	if n < 2 {
		return 1
	}
	// Dense labels 0..k−1 (as partitions here have) use flat tables; a
	// contingency table much larger than n is counted row by row instead.
	ka, kb := maxLabel(a)+1, maxLabel(b)+1
	var sij, sa, sb float64
	switch {
	case ka > 0 && kb > 0 && ka*kb > 4*n+64:
		sij, sa, sb = pairsByRows(a, b, ka, kb)
	case ka > 0 && kb > 0:
		sij, sa, sb = pairsByTable(a, b, ka, kb)
	default:
		sij, sa, sb = pairsByMap(a, b)
	}
	return ariFrom(sij, sa, sb, pairs(n))
}

// pairs is x choose 2.
func pairs(x int) float64 { return float64(x) * float64(x-1) / 2 }

// pairsByRows counts the pairs together in both partitions (sij), in a
// (sa) and in b (sb) row by row: the items grouped by their label in a (a
// counting sort), and each group's labels in b counted in one scratch
// row, cleared as it is read.
func pairsByRows(a, b []int, ka, kb int) (sij, sa, sb float64) {
	ra, rb := make([]int32, ka+1), make([]int32, kb)
	for k := range a {
		ra[a[k]+1]++
		rb[b[k]]++
	}
	for i := range ka {
		sa += pairs(int(ra[i+1]))
		ra[i+1] += ra[i]
	}
	for _, v := range rb {
		sb += pairs(int(v))
	}
	byA := make([]int32, len(a))
	next := append([]int32(nil), ra[:ka]...)
	for k := range a {
		byA[next[a[k]]] = int32(k)
		next[a[k]]++
	}
	row := make([]int32, kb)
	for i := range ka {
		items := byA[ra[i]:ra[i+1]]
		for _, k := range items {
			row[b[k]]++
		}
		for _, k := range items {
			if c := row[b[k]]; c > 0 {
				sij += pairs(int(c))
				row[b[k]] = 0
			}
		}
	}
	return sij, sa, sb
}

// pairsByTable counts the pairs with a flat contingency table.
func pairsByTable(a, b []int, ka, kb int) (sij, sa, sb float64) {
	t := make([]int32, ka*kb)
	ra, rb := make([]int32, ka), make([]int32, kb)
	for k := range a {
		t[a[k]*kb+b[k]]++
		ra[a[k]]++
		rb[b[k]]++
	}
	for _, v := range t {
		sij += pairs(int(v))
	}
	for _, v := range ra {
		sa += pairs(int(v))
	}
	for _, v := range rb {
		sb += pairs(int(v))
	}
	return sij, sa, sb
}

// pairsByMap counts the pairs of partitions with any labels.
func pairsByMap(a, b []int) (sij, sa, sb float64) {
	type pair struct{ x, y int }
	nij := map[pair]int{}
	ai, bj := map[int]int{}, map[int]int{}
	for k := range a {
		nij[pair{a[k], b[k]}]++
		ai[a[k]]++
		bj[b[k]]++
	}
	for _, v := range nij {
		sij += pairs(v)
	}
	for _, v := range ai {
		sa += pairs(v)
	}
	for _, v := range bj {
		sb += pairs(v)
	}
	return sij, sa, sb
}

// ariFrom finishes the index from the pair counts: Σ C(n_ij,2), Σ C(a_i,2),
// Σ C(b_j,2) and C(n,2).
func ariFrom(sij, sa, sb, pairs float64) float64 {
	e := sa * sb / pairs
	den := (sa+sb)/2 - e
	if den == 0 {
		return 1
	}
	return (sij - e) / den
}

func maxLabel(v []int) int {
	m := -1
	for _, x := range v {
		if x < 0 {
			return -2 // negative labels: not dense
		}
		if x > m {
			m = x
		}
	}
	return m
}
