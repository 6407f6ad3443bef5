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
	c2 := func(x int) float64 { return float64(x) * float64(x-1) / 2 }
	var sij, sa, sb float64
	// Dense labels 0..k−1 (as partitions here have) use flat tables; a
	// contingency table much larger than n is counted row by row instead:
	// the items grouped by their label in a (a counting sort), and each
	// group's labels in b counted in one scratch row, cleared as it is
	// read.
	ka, kb := maxLabel(a)+1, maxLabel(b)+1
	if ka > 0 && kb > 0 && ka*kb > 4*n+64 {
		ra, rb := make([]int32, ka+1), make([]int32, kb)
		for k := range a {
			ra[a[k]+1]++
			rb[b[k]]++
		}
		for i := range ka {
			sa += c2(int(ra[i+1]))
			ra[i+1] += ra[i]
		}
		for _, v := range rb {
			sb += c2(int(v))
		}
		byA := make([]int32, n)
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
					sij += c2(int(c))
					row[b[k]] = 0
				}
			}
		}
		return ariFrom(sij, sa, sb, c2(n))
	}
	if ka > 0 && kb > 0 {
		t := make([]int32, ka*kb)
		ra, rb := make([]int32, ka), make([]int32, kb)
		for k := range a {
			t[a[k]*kb+b[k]]++
			ra[a[k]]++
			rb[b[k]]++
		}
		for _, v := range t {
			sij += c2(int(v))
		}
		for _, v := range ra {
			sa += c2(int(v))
		}
		for _, v := range rb {
			sb += c2(int(v))
		}
		return ariFrom(sij, sa, sb, c2(n))
	}
	type pair struct{ x, y int }
	nij := map[pair]int{}
	ai, bj := map[int]int{}, map[int]int{}
	for k := range a {
		nij[pair{a[k], b[k]}]++
		ai[a[k]]++
		bj[b[k]]++
	}
	for _, v := range nij {
		sij += c2(v)
	}
	for _, v := range ai {
		sa += c2(v)
	}
	for _, v := range bj {
		sb += c2(v)
	}
	return ariFrom(sij, sa, sb, c2(n))
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
