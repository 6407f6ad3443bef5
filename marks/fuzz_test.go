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
	for _, s := range []string{"M0,0L10,10Z", "m1 1h2v2h-2z", "M0,0C1,1 2,2 3,3S4,4 5,5Q6,6 7,7T8,8A5,5,30,1,0,9,9", "M2.7,0A2.7,2.7,0,1,1,-2.7,0A2.7,2.7,0,1,1,2.7,0", "M0 0 1e3-1e-3.5.5", "M0,0A1e308,1e308,0,1,1,1,1",
		"M 50 50 L 150 50 C 150 105 105 150 50 150 Z", "M 10 0 L 90 0 Q 100 0 100 10 L 100 50 Q 100 60 90 60 Z",
		"M1,0A1,1,0,1,1,0.99995,-0.01", "M0 0a2 2 0 1 1 0 .1M9 9a2 2 0 1 1 0 .1M20 5a2 2 0 1 1 0 .1Z"} {
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
			return
		}
		if !ok {
			return
		}
		if g.Shape == ShapeWedge && !(g.Angle >= 0 && g.Angle < 360) {
			t.Fatalf("wedge angle %v from %q", g.Angle, d)
		}
		// A point cloud splits into one mark per subpath, each inside
		// the whole outline's box.
		if pointCloud(&DefaultHeuristics, &g) {
			nd := snapshot.Node{Tag: "path", D: d, CTM: snapshot.IdentityMatrix}
			ms := cloudMarks(nil, &cand{n: &nd, g: g, fillA: 1, kind: KindPoint}, &paintSlab{})
			if len(ms) != len(g.Subpaths) {
				t.Fatalf("%d marks for %d subpaths from %q", len(ms), len(g.Subpaths), d)
			}
			b := g.BBox
			for _, m := range ms {
				mb := m.BBox
				if mb[0] < b[0]-1e-6 || mb[1] < b[1]-1e-6 || mb[0]+mb[2] > b[0]+b[2]+1e-6 || mb[1]+mb[3] > b[1]+b[3]+1e-6 {
					t.Fatalf("cloud point %v outside %v from %q", mb, b, d)
				}
			}
		}
	})
}
