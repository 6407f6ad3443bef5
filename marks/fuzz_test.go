package marks

import (
	"math"
	"testing"

	"standout/snapshot"
)

func finite(vs ...float64) bool {
	for _, v := range vs {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return false
		}
	}
	return true
}

func FuzzPath(f *testing.F) {
	for _, s := range []string{"M0,0L10,10Z", "m1 1h2v2h-2z", "M0,0C1,1 2,2 3,3S4,4 5,5Q6,6 7,7T8,8A5,5,30,1,0,9,9", "M2.7,0A2.7,2.7,0,1,1,-2.7,0A2.7,2.7,0,1,1,2.7,0", "M0 0 1e3-1e-3.5.5", "M0,0A1e308,1e308,0,1,1,1,1"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, d string) {
		if len(d) > 1<<16 {
			return
		}
		subs, _, _ := ParsePath(d)
		for _, s := range subs {
			for _, p := range s.Pts {
				if !finite(p.X, p.Y) {
					t.Fatalf("non-finite point %v from %q", p, d)
				}
			}
		}
		g, ok, _ := Measure(&snapshot.Node{Tag: "path", D: d, CTM: snapshot.IdentityMatrix})
		if ok && (!finite(g.Area, g.Centroid.X, g.Centroid.Y, g.Angle) || g.Area < 0) {
			// Coordinates near the float64 limit may overflow in products;
			// only inputs of ordinary magnitude must give finite measures.
			big := false
			for _, s := range subs {
				for _, p := range s.Pts {
					if math.Abs(p.X) > 1e150 || math.Abs(p.Y) > 1e150 {
						big = true
					}
				}
			}
			if !big {
				t.Fatalf("bad measure %+v from %q", g, d)
			}
		}
	})
}
