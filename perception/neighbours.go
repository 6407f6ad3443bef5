package perception

import (
	"math"
	"sort"
)

// grid is a uniform spatial hash of points for neighbour queries.
type grid struct {
	cell  float64
	cells map[[2]int64][]int
	x, y  []float64
}

func newGrid(x, y []float64) *grid {
	n := len(x)
	g := &grid{x: x, y: y, cells: map[[2]int64][]int{}}
	if n == 0 {
		g.cell = 1
		return g
	}
	minX, minY, maxX, maxY := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
	for i := range x {
		minX, maxX = math.Min(minX, x[i]), math.Max(maxX, x[i])
		minY, maxY = math.Min(minY, y[i]), math.Max(maxY, y[i])
	}
	// About two points per cell on average.
	area := math.Max((maxX-minX)*(maxY-minY), 1)
	g.cell = math.Max(math.Sqrt(2*area/float64(n)), 1e-3)
	for i := range x {
		k := g.key(x[i], y[i])
		g.cells[k] = append(g.cells[k], i)
	}
	return g
}

func (g *grid) key(x, y float64) [2]int64 {
	return [2]int64{int64(math.Floor(x / g.cell)), int64(math.Floor(y / g.cell))}
}

// knn returns up to k nearest other points of point i, nearest first,
// searching rings of cells outwards until the k-th distance is settled.
func (g *grid) knn(i, k int) []int {
	type cand struct {
		j int
		d float64
	}
	var cs []cand
	c := g.key(g.x[i], g.y[i])
	maxRing := int64(1 << 20)
	for r := int64(0); r < maxRing; r++ {
		for dx := -r; dx <= r; dx++ {
			for dy := -r; dy <= r; dy++ {
				if abs64(dx) != r && abs64(dy) != r {
					continue
				}
				for _, j := range g.cells[[2]int64{c[0] + dx, c[1] + dy}] {
					if j != i {
						cs = append(cs, cand{j, math.Hypot(g.x[j]-g.x[i], g.y[j]-g.y[i])})
					}
				}
			}
		}
		if len(cs) >= k {
			sort.Slice(cs, func(a, b int) bool { return cs[a].d < cs[b].d })
			// Points beyond ring r may be closer than cs[k-1] only if
			// cs[k-1].d exceeds the ring's inner radius.
			if cs[k-1].d <= float64(r)*g.cell {
				break
			}
		}
		if len(cs) == len(g.x)-1 {
			break
		}
	}
	sort.Slice(cs, func(a, b int) bool { return cs[a].d < cs[b].d })
	if len(cs) > k {
		cs = cs[:k]
	}
	out := make([]int, len(cs))
	for a, c := range cs {
		out[a] = c.j
	}
	return out
}

// within returns the points within radius r of (x, y).
func (g *grid) within(x, y, r float64) []int {
	c0 := g.key(x-r, y-r)
	c1 := g.key(x+r, y+r)
	var out []int
	if (c1[0]-c0[0]+1)*(c1[1]-c0[1]+1) > int64(4*len(g.x)+16) {
		for j := range g.x {
			if math.Hypot(g.x[j]-x, g.y[j]-y) <= r {
				out = append(out, j)
			}
		}
		return out
	}
	for cx := c0[0]; cx <= c1[0]; cx++ {
		for cy := c0[1]; cy <= c1[1]; cy++ {
			for _, j := range g.cells[[2]int64{cx, cy}] {
				if math.Hypot(g.x[j]-x, g.y[j]-y) <= r {
					out = append(out, j)
				}
			}
		}
	}
	return out
}

func abs64(v int64) int64 {
	if v < 0 {
		return -v
	}
	return v
}
