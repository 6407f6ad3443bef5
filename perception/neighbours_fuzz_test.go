package perception

import (
	"math"
	"slices"
	"testing"
)

// fuzzPoints reads points from data, three bytes each: x and y as
// signed bytes, each scaled by one of four scales the third byte picks
// (so that crowds of points a hundredth of a pixel apart lie beside
// points 10,000 px away, and equal bytes make ties), and a group, 0–2,
// from its top bits.
func fuzzPoints(data []byte) (x, y []float64, group []int) {
	scales := [4]float64{0.01, 1, 100, 1e4}
	for p := 0; p+3 <= len(data) && len(x) < 600; p += 3 {
		b := data[p : p+3]
		x = append(x, float64(int8(b[0]))*scales[b[2]&3])
		y = append(y, float64(int8(b[1]))*scales[b[2]>>2&3])
		group = append(group, int(b[2]>>4)%3)
	}
	return x, y, group
}

// The grid, the tree and the index the analysis builds answer the
// k-nearest search as a sort of all distances does (nearest first,
// lowest index first at equal distances); their near covers every
// point within the radius; their mixedWithin lists every point with a
// point of another group within it; and a line through the first few
// points joins every point within its tolerance, as a scan does.
func FuzzNeighbours(f *testing.F) {
	f.Add(byte(8), byte(2), []byte{1, 1, 0, 1, 1, 0, 2, 2, 0x10, 3, 3, 0x20})
	f.Add(byte(3), byte(0), []byte{0, 0, 5, 0, 0, 5, 0, 0, 5, 0, 0, 0x15, 127, 127, 15, 128, 128, 15})
	f.Add(byte(5), byte(9), []byte("a lattice of bytes, a lattice of bytes, many ties here"))
	f.Fuzz(func(t *testing.T, k, reach byte, data []byte) {
		x, y, group := fuzzPoints(data)
		n := len(x)
		kk := 1 + int(k)%12
		r := float64(reach) * float64(reach) / 4
		g := newGrid(x, y, 0.5+float64(k%8))
		tr := newKDTree(x, y)
		ix := newIndex(x, y, 2)
		indexes := map[string]pointIndex{"grid": {grid: g}, "tree": {grid: g, tree: tr}, "index": ix}
		for i := 0; i < n; i++ {
			want := bruteNearest(x, y, i, kk)
			for name, ix := range indexes {
				got := ix.knnInto(i, kk, make([]int, 0, kk), make([]float64, 0, kk))
				if !slices.Equal(got, want) {
					t.Fatalf("%s: %d nearest of point %d (%v, %v): %v, want %v", name, kk, i, x[i], y[i], got, want)
				}
			}
		}
		groupOf := func(i int) int { return group[i] }
		for name, ix := range indexes {
			mixed := make([]bool, n)
			for _, j := range ix.mixedWithin(r, groupOf) {
				mixed[j] = true
			}
			for i := 0; i < n; i++ {
				seen := make([]bool, n)
				ix.near(x[i], y[i], r, func(j int) { seen[j] = true })
				for j := 0; j < n; j++ {
					if math.Hypot(x[j]-x[i], y[j]-y[i]) > r {
						continue
					}
					if !seen[j] {
						t.Fatalf("%s: near (%v, %v), radius %v, left out point %d (%v, %v)", name, x[i], y[i], r, j, x[j], y[j])
					}
					if group[j] != group[i] && !mixed[i] {
						t.Fatalf("%s: mixedWithin(%v) left out point %d, with point %d of another group within reach", name, r, i, j)
					}
				}
			}
		}
		line := &Mark{MinPx: float64(k % 4)}
		for _, i := range []int{0, 1, 2, 3, 1, 0} {
			if i < n {
				line.Vertices = append(line.Vertices, [2]float64{x[i], y[i]})
			}
		}
		uf := connectedGroups([]*Mark{line}, x, y, r/8)
		tol := line.MinPx/2 + r/8
		for i := 0; i < n; i++ {
			on := false
			for s := 0; s+1 < len(line.Vertices); s++ {
				on = on || segDist(x[i], y[i], line.Vertices[s], line.Vertices[s+1]) <= tol
			}
			// Point 0 is the line's first vertex: the points on the line
			// are joined with it, and no other is.
			if on != (len(line.Vertices) > 1 && uf.find(i) == uf.find(0)) {
				t.Fatalf("a line through %v, tolerance %v: point %d (%v, %v) on it %v, joined otherwise", line.Vertices, tol, i, x[i], y[i], on)
			}
		}
	})
}
