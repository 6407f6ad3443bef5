package marks

import (
	"fmt"
	"math"
	"standout/internal/svgnum"
)

// Point is a position in some coordinate system.
type Point struct{ X, Y float64 }

// Subpath is a flattened piece of a path: its vertices in order, and
// whether it was closed with Z.
type Subpath struct {
	Pts    []Point
	Closed bool
}

// PathInfo says what the path data held, beyond its outline.
type PathInfo struct {
	// Curves counts C, S, Q, T and A segments; Lines counts L, H, V.
	Curves, Lines int
	// Arcs counts A segments.
	Arcs int
}

// Flattening tolerances. Curves are split into straight segments: cubic
// and quadratic Béziers into curveSteps pieces, and arcs into one piece per
// arcStepDeg degrees of sweep (at least 2). With 4° steps the area of a
// flattened circle is within 0.05% of πr².
const (
	curveSteps = 16
	arcStepDeg = 4.0
)

// maxPathPoints caps the number of flattened vertices of one path, so a
// hostile path cannot exhaust memory; ParsePath reports an error past it.
const maxPathPoints = 4 << 20

// ParsePath parses SVG path data (SVG 1.1 §8.3 and Appendix F.6 for arcs)
// and flattens it into subpaths in the path's user units. Every command is
// supported, absolute and relative, with implicit repetition. As SVG 1.1
// §F.2 requires, rendering stops at the first error: the subpaths before
// it are returned together with the error.
func ParsePath(d string) ([]Subpath, PathInfo, error) {
	var subs []Subpath
	var info PathInfo
	sc := svgnum.Scanner{S: d}
	var cur, start, ctrl Point
	var lastCmd byte
	var sub *Subpath
	total := 0
	emit := func(p Point) error {
		if sub == nil {
			subs = append(subs, Subpath{Pts: []Point{cur}})
			sub = &subs[len(subs)-1]
		}
		sub.Pts = append(sub.Pts, p)
		total++
		if total > maxPathPoints {
			return fmt.Errorf("marks: path data flattens to more than %d points", maxPathPoints)
		}
		return nil
	}
	nums := func(k int) ([]float64, bool) {
		var out [7]float64
		for i := 0; i < k; i++ {
			sc.SkipSep()
			v, ok := sc.Number()
			if !ok {
				return nil, false
			}
			out[i] = v
		}
		return out[:k], true
	}
	flag := func() (float64, bool) {
		sc.SkipSep()
		if sc.Done() {
			return 0, false
		}
		switch sc.S[sc.I] {
		case '0':
			sc.I++
			return 0, true
		case '1':
			sc.I++
			return 1, true
		}
		return 0, false
	}
	errAt := func(what string) error {
		return fmt.Errorf("marks: path data: %s at offset %d", what, sc.I)
	}
	for {
		sc.SkipSpace()
		if sc.Done() {
			closeLoops(subs)
			return subs, info, nil
		}
		c := sc.S[sc.I]
		var cmd byte
		if c >= 'A' && c <= 'Z' || c >= 'a' && c <= 'z' {
			cmd = c
			sc.I++
		} else {
			if lastCmd == 0 || lastCmd == 'Z' || lastCmd == 'z' {
				return subs, info, errAt(fmt.Sprintf("expected a command, found %q", c))
			}
			cmd = lastCmd
			// An implicit repeat of moveto is a lineto.
			if cmd == 'M' {
				cmd = 'L'
			} else if cmd == 'm' {
				cmd = 'l'
			}
		}
		if lastCmd == 0 && cmd != 'M' && cmd != 'm' {
			return subs, info, errAt("path data must start with a moveto")
		}
		rel := cmd >= 'a'
		up := cmd &^ 0x20
		base := Point{}
		if rel {
			base = cur
		}
		switch up {
		case 'M':
			a, ok := nums(2)
			if !ok {
				return subs, info, errAt("bad moveto")
			}
			cur = Point{base.X + a[0], base.Y + a[1]}
			start = cur
			subs = append(subs, Subpath{Pts: []Point{cur}})
			sub = &subs[len(subs)-1]
			ctrl = cur
		case 'L', 'H', 'V':
			var p Point
			switch up {
			case 'L':
				a, ok := nums(2)
				if !ok {
					return subs, info, errAt("bad lineto")
				}
				p = Point{base.X + a[0], base.Y + a[1]}
			case 'H':
				a, ok := nums(1)
				if !ok {
					return subs, info, errAt("bad horizontal lineto")
				}
				p = Point{base.X + a[0], cur.Y}
			case 'V':
				a, ok := nums(1)
				if !ok {
					return subs, info, errAt("bad vertical lineto")
				}
				p = Point{cur.X, base.Y + a[0]}
			}
			if err := emit(p); err != nil {
				return subs, info, err
			}
			info.Lines++
			cur, ctrl = p, p
		case 'C', 'S', 'Q', 'T':
			var p0, p1, p2, p3 Point
			p0 = cur
			cubic := up == 'C' || up == 'S'
			reflect := Point{2*cur.X - ctrl.X, 2*cur.Y - ctrl.Y}
			switch up {
			case 'C':
				a, ok := nums(6)
				if !ok {
					return subs, info, errAt("bad curveto")
				}
				p1 = Point{base.X + a[0], base.Y + a[1]}
				p2 = Point{base.X + a[2], base.Y + a[3]}
				p3 = Point{base.X + a[4], base.Y + a[5]}
			case 'S':
				a, ok := nums(4)
				if !ok {
					return subs, info, errAt("bad smooth curveto")
				}
				p1 = cur
				if l := lastCmd &^ 0x20; l == 'C' || l == 'S' {
					p1 = reflect
				}
				p2 = Point{base.X + a[0], base.Y + a[1]}
				p3 = Point{base.X + a[2], base.Y + a[3]}
			case 'Q':
				a, ok := nums(4)
				if !ok {
					return subs, info, errAt("bad quadratic curveto")
				}
				p1 = Point{base.X + a[0], base.Y + a[1]}
				p3 = Point{base.X + a[2], base.Y + a[3]}
			case 'T':
				a, ok := nums(2)
				if !ok {
					return subs, info, errAt("bad smooth quadratic curveto")
				}
				p1 = cur
				if l := lastCmd &^ 0x20; l == 'Q' || l == 'T' {
					p1 = reflect
				}
				p3 = Point{base.X + a[0], base.Y + a[1]}
			}
			for k := 1; k <= curveSteps; k++ {
				t := float64(k) / curveSteps
				u := 1 - t
				var q Point
				if cubic {
					q = Point{
						u*u*u*p0.X + 3*u*u*t*p1.X + 3*u*t*t*p2.X + t*t*t*p3.X,
						u*u*u*p0.Y + 3*u*u*t*p1.Y + 3*u*t*t*p2.Y + t*t*t*p3.Y,
					}
				} else {
					q = Point{u*u*p0.X + 2*u*t*p1.X + t*t*p3.X, u*u*p0.Y + 2*u*t*p1.Y + t*t*p3.Y}
				}
				if err := emit(q); err != nil {
					return subs, info, err
				}
			}
			info.Curves++
			if cubic {
				ctrl = p2
			} else {
				ctrl = p1
			}
			cur = p3
		case 'A':
			a, ok := nums(3)
			if !ok {
				return subs, info, errAt("bad arc")
			}
			large, ok1 := flag()
			sweep, ok2 := flag()
			e, ok3 := nums(2)
			if !ok1 || !ok2 || !ok3 {
				return subs, info, errAt("bad arc")
			}
			p := Point{base.X + e[0], base.Y + e[1]}
			for _, q := range arcPoints(cur, a[0], a[1], a[2], large != 0, sweep != 0, p) {
				if err := emit(q); err != nil {
					return subs, info, err
				}
			}
			info.Curves++
			info.Arcs++
			cur, ctrl = p, p
		case 'Z':
			if sub != nil {
				sub.Closed = true
			}
			cur, ctrl = start, start
			sub = nil
		default:
			return subs, info, errAt(fmt.Sprintf("unknown command %q", cmd))
		}
		lastCmd = cmd
	}
}

// closeLoops marks subpaths whose last point returns to the first as
// closed: they enclose the same area and, but for the line join at the
// start, draw the same outline.
func closeLoops(subs []Subpath) {
	for i := range subs {
		s := &subs[i]
		if s.Closed || len(s.Pts) < 3 {
			continue
		}
		a, b := s.Pts[0], s.Pts[len(s.Pts)-1]
		scale := max(math.Abs(a.X)+math.Abs(a.Y), 1)
		if math.Abs(a.X-b.X) <= 1e-9*scale && math.Abs(a.Y-b.Y) <= 1e-9*scale {
			s.Closed = true
		}
	}
}

// arcPoints flattens an elliptical arc from p0 to p1 (excluding p0) by the
// endpoint-to-centre conversion of SVG 1.1 §F.6.5, with the out-of-range
// radius corrections of §F.6.6.
func arcPoints(p0 Point, rx, ry, phiDeg float64, large, sweep bool, p1 Point) []Point {
	if p0 == p1 {
		return nil // §F.6.2: identical endpoints omit the arc
	}
	rx, ry = math.Abs(rx), math.Abs(ry)
	if rx == 0 || ry == 0 {
		return []Point{p1} // §F.6.2: a zero radius is a straight line
	}
	sinPhi, cosPhi := math.Sincos(phiDeg * math.Pi / 180)
	// Step 1: (x1′, y1′).
	dx, dy := (p0.X-p1.X)/2, (p0.Y-p1.Y)/2
	x1 := cosPhi*dx + sinPhi*dy
	y1 := -sinPhi*dx + cosPhi*dy
	// §F.6.6: scale radii up if too small.
	if lambda := x1*x1/(rx*rx) + y1*y1/(ry*ry); lambda > 1 {
		s := math.Sqrt(lambda)
		rx, ry = rx*s, ry*s
	}
	// Step 2: (cx′, cy′).
	num := rx*rx*ry*ry - rx*rx*y1*y1 - ry*ry*x1*x1
	den := rx*rx*y1*y1 + ry*ry*x1*x1
	co := 0.0
	if den > 0 && num > 0 {
		co = math.Sqrt(num / den)
	}
	if large == sweep {
		co = -co
	}
	cx1, cy1 := co*rx*y1/ry, -co*ry*x1/rx
	// Step 3: (cx, cy).
	cx := cosPhi*cx1 - sinPhi*cy1 + (p0.X+p1.X)/2
	cy := sinPhi*cx1 + cosPhi*cy1 + (p0.Y+p1.Y)/2
	// Step 4: θ1 and Δθ.
	ang := func(ux, uy, vx, vy float64) float64 {
		return math.Atan2(ux*vy-uy*vx, ux*vx+uy*vy)
	}
	th1 := ang(1, 0, (x1-cx1)/rx, (y1-cy1)/ry)
	dth := ang((x1-cx1)/rx, (y1-cy1)/ry, (-x1-cx1)/rx, (-y1-cy1)/ry)
	if !sweep && dth > 0 {
		dth -= 2 * math.Pi
	} else if sweep && dth < 0 {
		dth += 2 * math.Pi
	}
	n := int(math.Ceil(math.Abs(dth) * 180 / math.Pi / arcStepDeg))
	if n < 2 {
		n = 2
	}
	if n > 1<<16 || math.IsNaN(dth) {
		n = 2
	}
	out := make([]Point, 0, n)
	for k := 1; k < n; k++ {
		t := th1 + dth*float64(k)/float64(n)
		st, ct := math.Sincos(t)
		out = append(out, Point{cx + rx*ct*cosPhi - ry*st*sinPhi, cy + rx*ct*sinPhi + ry*st*cosPhi})
	}
	return append(out, p1)
}

// ParsePoints parses the points attribute of <polyline> and <polygon>
// (SVG 1.1 §9.7.1). An odd count is an error; the points before it are
// returned, as browsers render them.
func ParsePoints(s string) ([]Point, error) {
	sc := svgnum.Scanner{S: s}
	var pts []Point
	for {
		sc.SkipSep()
		if sc.Done() {
			return pts, nil
		}
		x, ok := sc.Number()
		if !ok {
			return pts, fmt.Errorf("marks: points: bad number at offset %d", sc.I)
		}
		sc.SkipSep()
		y, ok := sc.Number()
		if !ok {
			return pts, fmt.Errorf("marks: points: odd number of coordinates or bad number at offset %d", sc.I)
		}
		pts = append(pts, Point{x, y})
		if len(pts) > maxPathPoints {
			return pts, fmt.Errorf("marks: points: more than %d points", maxPathPoints)
		}
	}
}
