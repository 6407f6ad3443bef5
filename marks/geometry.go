package marks

import (
	"math"
	"standout/snapshot"
)

// Shape is a mark's shape class, decided from its geometry alone.
type Shape string

// Shape classes. Square covers any right-angled quadrilateral with an edge
// within a few degrees of the axes; its aspect ratio is a separate feature.
const (
	ShapeCircle   Shape = "circle"
	ShapeSquare   Shape = "square"
	ShapeDiamond  Shape = "diamond"
	ShapeTriangle Shape = "triangle"
	ShapeCross    Shape = "cross"
	ShapeStar     Shape = "star"
	ShapeWedge    Shape = "wedge"
	ShapeOther    Shape = "other"
)

// Geometry is the measured outline of one element in page CSS px.
type Geometry struct {
	// Subpaths is the flattened outline; nil for circles and ellipses,
	// which are measured analytically.
	Subpaths []Subpath
	// BBox is the box getBoundingClientRect gives an SVG shape: the
	// axis-aligned bounds, in page px, of the element's own bounding box
	// (of its outline in local user units) mapped by its CTM; x y width
	// height. For a rotated or skewed shape it is larger than the bounds
	// of the mapped outline.
	BBox [4]float64
	// Area is the enclosed area (px²); zero for open outlines.
	Area     float64
	Centroid Point
	// Length is the perimeter of closed outlines and the length of open ones.
	Length float64
	// Closed is true when every subpath is closed (or the element is a
	// closed shape).
	Closed bool
	Info   PathInfo
	// Shape, Fold and Angle: the shape class, its rotational symmetry order
	// (0 for a circle: every angle) and its orientation in degrees within
	// [0, 360/Fold), 0 being the upright form (triangle apex up, square
	// edges level, diamond vertex right, star point up, cross arms level).
	// Shapes without symmetry use the principal axis within [0, 180).
	Shape Shape
	Fold  int
	Angle float64
	// Corners counts sharp vertices of the outline (turns above 25°).
	Corners int

	local [][]Point // the outline in local user units, while measuring
}

// Measure computes the geometry of a snapshot node in page px. ok is false
// when the node has no drawable geometry (including bad attribute values).
func Measure(n *snapshot.Node) (g Geometry, ok bool, err error) {
	m := snapshot.Matrix(n.CTM)
	switch n.Tag {
	case "circle", "ellipse":
		return measureEllipse(n, m)
	case "rect", "image":
		if len(n.Geom) < 4 || !(n.Geom[2] > 0 && n.Geom[3] > 0) {
			return g, false, nil
		}
		x, y, w, h := n.Geom[0], n.Geom[1], n.Geom[2], n.Geom[3]
		pts := []Point{{x, y}, {x + w, y}, {x + w, y + h}, {x, y + h}}
		g.local = [][]Point{pts}
		g.Subpaths = []Subpath{{Pts: transformPts(m, pts), Closed: true}}
		g.Info.Lines = 4
	case "line":
		if len(n.Geom) < 4 {
			return g, false, nil
		}
		pts := []Point{{n.Geom[0], n.Geom[1]}, {n.Geom[2], n.Geom[3]}}
		g.local = [][]Point{pts}
		g.Subpaths = []Subpath{{Pts: transformPts(m, pts)}}
		g.Info.Lines = 1
	case "polyline", "polygon":
		pts, perr := ParsePoints(n.D)
		err = perr
		if len(pts) < 2 {
			return g, false, err
		}
		g.local = [][]Point{pts}
		g.Subpaths = []Subpath{{Pts: transformPts(m, pts), Closed: n.Tag == "polygon"}}
		g.Info.Lines = len(pts) - 1
	case "path":
		if ok, err = g.fromPath(n.D, m); !ok {
			return g, false, err
		}
	default:
		return g, false, nil
	}
	g.measurePolys()
	// The outline's local bounds, mapped: what the browser measures.
	minX, minY, maxX, maxY := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
	for _, s := range g.local {
		for _, p := range s {
			minX, maxX = min(minX, p.X), max(maxX, p.X)
			minY, maxY = min(minY, p.Y), max(maxY, p.Y)
		}
	}
	g.BBox = boundsOf(m, minX, minY, maxX, maxY)
	g.local = nil
	return g, true, err
}

// fromPath takes the outline from path data; false when it draws nothing.
func (g *Geometry) fromPath(d string, m snapshot.Matrix) (bool, error) {
	subs, info, err := ParsePath(d)
	g.Info = info
	for _, s := range subs {
		if len(s.Pts) >= 2 {
			g.local = append(g.local, s.Pts)
			g.Subpaths = append(g.Subpaths, Subpath{Pts: transformPts(m, s.Pts), Closed: s.Closed})
		}
	}
	return len(g.Subpaths) > 0, err
}

// measureEllipse measures a circle or an ellipse exactly, from its
// geometry rather than an outline.
func measureEllipse(n *snapshot.Node, m snapshot.Matrix) (g Geometry, ok bool, err error) {
	if len(n.Geom) < 3 {
		return g, false, nil
	}
	cx, cy := n.Geom[0], n.Geom[1]
	rx, ry := n.Geom[2], n.Geom[2]
	if n.Tag == "ellipse" {
		if len(n.Geom) < 4 {
			return g, false, nil
		}
		ry = n.Geom[3]
	}
	if !(rx > 0 && ry > 0) {
		return g, false, nil
	}
	px, py := m.Apply(cx, cy)
	// The ellipse maps to the points (px, py) + A·(cos t, sin t) with
	// A = [a c; b d]; x peaks at √(a² + c²), y at √(b² + d²): the box of
	// the shape itself, not of its transformed box, which is looser once
	// rotated.
	a, b, c, d := m[0]*rx, m[1]*rx, m[2]*ry, m[3]*ry
	hx, hy := math.Hypot(a, c), math.Hypot(b, d)
	g.BBox = [4]float64{px - hx, py - hy, 2 * hx, 2 * hy}
	g.Area = math.Pi * rx * ry * math.Abs(m.Det())
	g.Centroid = Point{px, py}
	// Semi-axes after the transform: singular values of A.
	s1, s2, ang := svd2(a, b, c, d)
	g.Length = math.Pi * (3*(s1+s2) - math.Sqrt((3*s1+s2)*(s1+3*s2))) // Ramanujan
	g.Closed = true
	if s2 > 0 && s1/s2 < 1.05 {
		g.Shape, g.Fold = ShapeCircle, 0
	} else {
		g.Shape, g.Fold, g.Angle = ShapeOther, 2, mod(ang, 180)
	}
	return g, true, nil
}

// boundsOf maps the box [x0, x1] × [y0, y1] by m and returns the bounds
// of its four corners as x y width height.
func boundsOf(m snapshot.Matrix, x0, y0, x1, y1 float64) [4]float64 {
	minX, minY, maxX, maxY := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
	for _, c := range [4][2]float64{{x0, y0}, {x1, y0}, {x1, y1}, {x0, y1}} {
		x, y := m.Apply(c[0], c[1])
		minX, maxX = min(minX, x), max(maxX, x)
		minY, maxY = min(minY, y), max(maxY, y)
	}
	return [4]float64{minX, minY, maxX - minX, maxY - minY}
}

func transformPts(m snapshot.Matrix, pts []Point) []Point {
	out := make([]Point, len(pts))
	for i, p := range pts {
		x, y := m.Apply(p.X, p.Y)
		out[i] = Point{x, y}
	}
	return out
}

// svd2 returns the singular values (s1 ≥ s2) of [[a c] [b d]] and the
// direction of the first left singular vector in degrees.
func svd2(a, b, c, d float64) (float64, float64, float64) {
	// M·Mᵀ = [[a²+c², ab+cd], [ab+cd, b²+d²]]
	p, q, r := a*a+c*c, a*b+c*d, b*b+d*d
	tr, det := p+r, p*r-q*q
	disc := math.Sqrt(max(tr*tr/4-det, 0))
	l1, l2 := tr/2+disc, max(tr/2-disc, 0)
	ang := 0.5 * math.Atan2(2*q, p-r) * 180 / math.Pi
	return math.Sqrt(l1), math.Sqrt(l2), ang
}

func mod(v, m float64) float64 {
	r := math.Mod(v, m)
	if r < 0 {
		r += m
	}
	if r >= m-1e-9 {
		r = 0
	}
	return r
}

// measurePolys computes box, area, centroid, length, shape and orientation
// from the flattened subpaths. Area uses the shoelace formula over every
// subpath (closed implicitly for filling, SVG 1.1 §11.3), summed with sign
// so that holes drawn in the opposite direction subtract; the centroid is
// area-weighted, or the length-weighted mean for open outlines.
func (g *Geometry) measurePolys() {
	minX, minY := math.Inf(1), math.Inf(1)
	maxX, maxY := math.Inf(-1), math.Inf(-1)
	var a2, cx6, cy6, length, lx, ly float64
	allClosed := true
	for _, s := range g.Subpaths {
		if !s.Closed {
			allClosed = false
		}
		pts := s.Pts
		for i, p := range pts {
			minX, maxX = min(minX, p.X), max(maxX, p.X)
			minY, maxY = min(minY, p.Y), max(maxY, p.Y)
			q := pts[(i+1)%len(pts)]
			if i+1 == len(pts) && !s.Closed {
				q = pts[0] // the fill still closes the subpath
			} else {
				seg := math.Hypot(q.X-p.X, q.Y-p.Y)
				length += seg
				lx += seg * (p.X + q.X) / 2
				ly += seg * (p.Y + q.Y) / 2
			}
			cr := p.X*q.Y - q.X*p.Y
			a2 += cr
			cx6 += (p.X + q.X) * cr
			cy6 += (p.Y + q.Y) * cr
		}
	}
	g.BBox = [4]float64{minX, minY, maxX - minX, maxY - minY}
	g.Length = length
	g.Closed = allClosed
	if allClosed && math.Abs(a2) > 1e-12 {
		g.Area = math.Abs(a2) / 2
		g.Centroid = Point{cx6 / (3 * a2), cy6 / (3 * a2)}
	} else {
		if !allClosed {
			g.Area = 0
			if a2 != 0 {
				g.Area = math.Abs(a2) / 2 // open paths still enclose what a fill would paint
			}
		}
		if length > 0 {
			g.Centroid = Point{lx / length, ly / length}
		} else {
			g.Centroid = Point{minX + (maxX-minX)/2, minY + (maxY-minY)/2}
		}
	}
	g.classify()
}

// classify decides the shape class and orientation of a single outline.
func (g *Geometry) classify() {
	g.Shape, g.Fold = ShapeOther, 2
	if len(g.Subpaths) == 0 {
		return
	}
	if !g.Closed {
		// Open strokes: two crossing segments form a cross (a plus or an ×).
		if len(g.Subpaths) == 2 && len(g.Subpaths[0].Pts) == 2 && len(g.Subpaths[1].Pts) == 2 && g.Info.Curves == 0 {
			a, b := g.Subpaths[0].Pts, g.Subpaths[1].Pts
			if segmentsCross(a[0], a[1], b[0], b[1]) {
				g.Shape, g.Fold = ShapeCross, 4
				g.Angle = foldAngle([]Point{a[0], a[1], b[0], b[1]}, g.Centroid, 4, 0)
				return
			}
		}
		g.Angle = principalAngle(g.Subpaths, g.Centroid)
		return
	}
	if len(g.Subpaths) != 1 {
		g.Angle = principalAngle(g.Subpaths, g.Centroid)
		return
	}
	pts := dedupe(g.Subpaths[0].Pts)
	if len(pts) < 3 {
		return
	}
	corners := cornerIdx(pts, 25)
	g.Corners = len(corners)
	hull := convexHullArea(pts)
	solidity := 1.0
	if hull > 0 {
		solidity = g.Area / hull
	}
	q := 0.0
	if g.Length > 0 {
		q = 4 * math.Pi * g.Area / (g.Length * g.Length)
	}
	cornerPts := make([]Point, len(corners))
	for i, k := range corners {
		cornerPts[i] = pts[k]
	}
	curved := len(pts) > len(corners)+2 && g.Info.Curves > 0
	switch {
	case len(corners) == 0 && q > 0.9:
		g.Shape, g.Fold, g.Angle = ShapeCircle, 0, 0
	case len(corners) == 3 && solidity > 0.95 && !curved:
		g.Shape, g.Fold = ShapeTriangle, 3
		g.Angle = foldAngle(cornerPts, g.Centroid, 3, -90)
	case len(corners) == 4 && solidity > 0.95 && !curved:
		if rightAngled(cornerPts) {
			a := foldAngle(cornerPts, g.Centroid, 4, 45)
			if math.Abs(a-45) < 10 && squareish(cornerPts) {
				g.Shape, g.Fold, g.Angle = ShapeDiamond, 4, mod(a-45, 90)
			} else {
				g.Shape, g.Fold = ShapeSquare, 4
				if squareish(cornerPts) {
					g.Angle = a
				} else {
					g.Fold, g.Angle = 2, principalAngle(g.Subpaths, g.Centroid)
				}
			}
		} else {
			g.Shape, g.Fold = ShapeDiamond, 2
			g.Angle = principalAngle(g.Subpaths, g.Centroid)
		}
	case len(corners) == 10 && solidity < 0.85 && !curved:
		g.Shape, g.Fold = ShapeStar, 5
		g.Angle = foldAngle(outerPts(cornerPts, g.Centroid), g.Centroid, 5, -90)
	case len(corners) == 12 && solidity < 0.9 && !curved:
		g.Shape, g.Fold = ShapeCross, 4
		g.Angle = foldAngle(cornerPts, g.Centroid, 4, 0)
	case curved && solidity > 0.95 && g.roundedRect():
	case curved && len(corners) >= 1 && len(corners) <= 4 && g.wedge(pts, corners):
	default:
		g.Angle = principalAngle(g.Subpaths, g.Centroid)
	}
}

// roundedRect classifies a solid curved outline as a rectangle with
// rounded corners, as some libraries draw bars, when it fills nine
// tenths of its box, which no wedge does (a quarter disc fills 79% of its
// box, a circle as much).
func (g *Geometry) roundedRect() bool {
	if g.Area < 0.9*g.BBox[2]*g.BBox[3] {
		return false
	}
	box := []Point{{g.BBox[0], g.BBox[1]}, {g.BBox[0] + g.BBox[2], g.BBox[1]}, {g.BBox[0] + g.BBox[2], g.BBox[1] + g.BBox[3]}}
	g.Shape, g.Fold = ShapeSquare, 4
	if !squareish(box) {
		g.Fold, g.Angle = 2, principalAngle(g.Subpaths, g.Centroid)
	}
	return true
}

// wedge classifies a curved outline with one to four corners as a wedge
// when its curves are arcs, or follow circles about one centre (Bézier
// curves drawn for arcs), pointing from the apex or the centre to the
// centroid.
func (g *Geometry) wedge(pts []Point, corners []int) bool {
	from := pts[corners[0]]
	if g.Info.Arcs == 0 {
		c, ok := circularRim(pts, corners)
		if !ok {
			return false
		}
		from = c
	}
	g.Shape, g.Fold = ShapeWedge, 1
	g.Angle = mod(math.Atan2(g.Centroid.Y-from.Y, g.Centroid.X-from.X)*180/math.Pi, 360)
	return true
}

// circularRim finds the circle that the outline's longest curved stretch
// follows, and says whether every vertex lies on it, on one other circle
// about the same centre, or at the centre: a pie wedge or a ring segment,
// however its curves are written. Vertices may stray by 3% of the radius
// (flattening, and Bézier approximations of arcs stray by 0.03%).
func circularRim(pts []Point, corners []int) (Point, bool) {
	n := len(pts)
	best, bestLen := 0, 0
	for i, k := range corners {
		next := corners[(i+1)%len(corners)]
		if l := (next - k + n) % n; l > bestLen {
			best, bestLen = k, l
		}
	}
	if bestLen < 4 {
		return Point{}, false
	}
	a, b, c := pts[best], pts[(best+bestLen/2)%n], pts[(best+bestLen)%n]
	centre, r, ok := circumcircle(a, b, c)
	if !ok {
		return Point{}, false
	}
	tol := 0.03*r + 0.5
	r2 := -1.0
	for _, p := range pts {
		d := math.Hypot(p.X-centre.X, p.Y-centre.Y)
		switch {
		case math.Abs(d-r) <= tol, d <= tol:
		case r2 < 0:
			r2 = d
		case math.Abs(d-r2) > tol:
			return Point{}, false
		}
	}
	return centre, true
}

// circumcircle is the circle through three points; false when they are
// (nearly) collinear.
func circumcircle(a, b, c Point) (Point, float64, bool) {
	d := 2 * (a.X*(b.Y-c.Y) + b.X*(c.Y-a.Y) + c.X*(a.Y-b.Y))
	scale := max(math.Hypot(b.X-a.X, b.Y-a.Y), math.Hypot(c.X-a.X, c.Y-a.Y))
	if math.Abs(d) <= 1e-9*scale*scale {
		return Point{}, 0, false
	}
	a2, b2, c2 := a.X*a.X+a.Y*a.Y, b.X*b.X+b.Y*b.Y, c.X*c.X+c.Y*c.Y
	o := Point{(a2*(b.Y-c.Y) + b2*(c.Y-a.Y) + c2*(a.Y-b.Y)) / d, (a2*(c.X-b.X) + b2*(a.X-c.X) + c2*(b.X-a.X)) / d}
	return o, math.Hypot(a.X-o.X, a.Y-o.Y), true
}

func dedupe(pts []Point) []Point {
	out := make([]Point, 0, len(pts))
	for _, p := range pts {
		if len(out) > 0 {
			q := out[len(out)-1]
			if math.Abs(p.X-q.X) < 1e-6 && math.Abs(p.Y-q.Y) < 1e-6 {
				continue
			}
		}
		out = append(out, p)
	}
	for len(out) > 1 {
		a, b := out[0], out[len(out)-1]
		if math.Abs(a.X-b.X) < 1e-6 && math.Abs(a.Y-b.Y) < 1e-6 {
			out = out[:len(out)-1]
			continue
		}
		break
	}
	return out
}

// cornerIdx returns the vertices of a closed outline where the direction
// turns by more than minDeg (collinear runs are skipped).
func cornerIdx(pts []Point, minDeg float64) []int {
	n := len(pts)
	var out []int
	for i := 0; i < n; i++ {
		p, c, q := pts[(i+n-1)%n], pts[i], pts[(i+1)%n]
		a1 := math.Atan2(c.Y-p.Y, c.X-p.X)
		a2 := math.Atan2(q.Y-c.Y, q.X-c.X)
		d := math.Abs(math.Remainder(a2-a1, 2*math.Pi)) * 180 / math.Pi
		if d > minDeg {
			out = append(out, i)
		}
	}
	return out
}

func rightAngled(c []Point) bool {
	for i := range c {
		p, q, r := c[(i+3)%4], c[i], c[(i+1)%4]
		ux, uy, vx, vy := p.X-q.X, p.Y-q.Y, r.X-q.X, r.Y-q.Y
		cos := (ux*vx + uy*vy) / (math.Hypot(ux, uy) * math.Hypot(vx, vy))
		if math.Abs(cos) > 0.1 {
			return false
		}
	}
	return true
}

func squareish(c []Point) bool {
	a := math.Hypot(c[1].X-c[0].X, c[1].Y-c[0].Y)
	b := math.Hypot(c[2].X-c[1].X, c[2].Y-c[1].Y)
	if a == 0 || b == 0 {
		return false
	}
	r := a / b
	return r > 0.8 && r < 1.25
}

// foldAngle estimates the orientation of an n-fold symmetric shape as
// arg(Σ r² e^{i n θ})/n, minus the angle of the canonical form, reduced
// modulo 360/n.
func foldAngle(pts []Point, c Point, n int, canonical float64) float64 {
	var sx, sy float64
	for _, p := range pts {
		dx, dy := p.X-c.X, p.Y-c.Y
		r2 := dx*dx + dy*dy
		t := math.Atan2(dy, dx) * float64(n)
		sx += r2 * math.Cos(t)
		sy += r2 * math.Sin(t)
	}
	a := math.Atan2(sy, sx) * 180 / math.Pi / float64(n)
	return mod(a-canonical, 360/float64(n))
}

func outerPts(pts []Point, c Point) []Point {
	var mean float64
	for _, p := range pts {
		mean += math.Hypot(p.X-c.X, p.Y-c.Y)
	}
	mean /= float64(len(pts))
	var out []Point
	for _, p := range pts {
		if math.Hypot(p.X-c.X, p.Y-c.Y) > mean {
			out = append(out, p)
		}
	}
	return out
}

// principalAngle is the direction of the major axis of the outline's
// vertex distribution (second moments, length-weighted), within [0, 180).
func principalAngle(subs []Subpath, c Point) float64 {
	// The angle does not depend on scale: measure in units of the
	// outline's extent, so that moments of huge outlines stay finite.
	k := 0.0
	for _, s := range subs {
		for _, p := range s.Pts {
			k = max(k, math.Abs(p.X-c.X), math.Abs(p.Y-c.Y))
		}
	}
	if !(k > 0) || math.IsInf(k, 0) {
		return 0
	}
	k = 1 / k
	var sxx, syy, sxy float64
	for _, s := range subs {
		for i := 0; i+1 < len(s.Pts)+boolInt(s.Closed); i++ {
			p, q := s.Pts[i], s.Pts[(i+1)%len(s.Pts)]
			mx, my := ((p.X+q.X)/2-c.X)*k, ((p.Y+q.Y)/2-c.Y)*k
			dx, dy := (q.X-p.X)*k, (q.Y-p.Y)*k
			w := math.Hypot(dx, dy)
			// Second moment of a segment about c.
			sxx += w * (mx*mx + dx*dx/12)
			syy += w * (my*my + dy*dy/12)
			sxy += w * (mx*my + dx*dy/12)
		}
	}
	return mod(0.5*math.Atan2(2*sxy, sxx-syy)*180/math.Pi, 180)
}

func boolInt(b bool) int {
	if b {
		return 1
	}
	return 0
}

func segmentsCross(a, b, c, d Point) bool {
	o := func(p, q, r Point) float64 { return (q.X-p.X)*(r.Y-p.Y) - (q.Y-p.Y)*(r.X-p.X) }
	return o(a, b, c)*o(a, b, d) < 0 && o(c, d, a)*o(c, d, b) < 0
}

// convexHullArea is the area of the convex hull (Andrew's monotone chain).
func convexHullArea(pts []Point) float64 {
	if len(pts) < 3 {
		return 0
	}
	ps := append([]Point(nil), pts...)
	sortPoints(ps)
	cross := func(o, a, b Point) float64 { return (a.X-o.X)*(b.Y-o.Y) - (a.Y-o.Y)*(b.X-o.X) }
	h := make([]Point, 0, 2*len(ps))
	for _, p := range ps {
		for len(h) >= 2 && cross(h[len(h)-2], h[len(h)-1], p) <= 0 {
			h = h[:len(h)-1]
		}
		h = append(h, p)
	}
	lo := len(h) + 1
	for i := len(ps) - 2; i >= 0; i-- {
		p := ps[i]
		for len(h) >= lo && cross(h[len(h)-2], h[len(h)-1], p) <= 0 {
			h = h[:len(h)-1]
		}
		h = append(h, p)
	}
	var a float64
	for i := 0; i+1 < len(h); i++ {
		a += h[i].X*h[i+1].Y - h[i+1].X*h[i].Y
	}
	return math.Abs(a) / 2
}
