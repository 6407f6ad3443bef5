package marks

import (
	"errors"
	"math"
	"strconv"

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
	p := pathParser{sc: svgnum.Scanner{S: d}}
	err := p.run()
	if err == nil {
		closeLoops(p.subs)
	}
	return p.subs, p.info, err
}

// pathParser is the state of one ParsePath: the subpaths so far, the
// current point, the subpath's start and the last control point (for the
// smooth curves), with a method per command family.
type pathParser struct {
	sc               svgnum.Scanner
	subs             []Subpath
	info             PathInfo
	cur, start, ctrl Point
	lastCmd          byte
	sub              *Subpath
	total            int
}

// commandNames names the commands in errors (SVG 1.1 §8.3).
var commandNames = map[byte]string{'L': "lineto", 'H': "horizontal lineto", 'V': "vertical lineto",
	'C': "curveto", 'S': "smooth curveto", 'Q': "quadratic curveto", 'T': "smooth quadratic curveto"}

func (p *pathParser) errAt(what string) error {
	return errors.New("marks: path data: " + what + " at offset " + strconv.Itoa(p.sc.I))
}

// run reads commands until the end of the data or the first error.
func (p *pathParser) run() error {
	for {
		p.sc.SkipSpace()
		if p.sc.Done() {
			return nil
		}
		cmd, err := p.command()
		if err != nil {
			return err
		}
		base := Point{}
		if cmd >= 'a' {
			base = p.cur
		}
		switch up := cmd &^ 0x20; up {
		case 'M':
			err = p.moveTo(base)
		case 'L', 'H', 'V':
			err = p.lineTo(up, base)
		case 'C', 'S', 'Q', 'T':
			err = p.curveTo(up, base)
		case 'A':
			err = p.arcTo(base)
		case 'Z':
			p.closePath()
		default:
			err = p.errAt("unknown command " + strconv.QuoteRune(rune(cmd)))
		}
		if err != nil {
			return err
		}
		p.lastCmd = cmd
	}
}

// command reads the next command letter, or repeats the last command
// when numbers follow it (an implicit repeat of moveto is a lineto).
func (p *pathParser) command() (byte, error) {
	c := p.sc.S[p.sc.I]
	cmd := c
	if c >= 'A' && c <= 'Z' || c >= 'a' && c <= 'z' {
		p.sc.I++
	} else {
		if p.lastCmd == 0 || p.lastCmd == 'Z' || p.lastCmd == 'z' {
			return 0, p.errAt("expected a command, found " + strconv.QuoteRune(rune(c)))
		}
		cmd = p.lastCmd
		switch cmd {
		case 'M':
			cmd = 'L'
		case 'm':
			cmd = 'l'
		}
	}
	if p.lastCmd == 0 && cmd != 'M' && cmd != 'm' {
		return 0, p.errAt("path data must start with a moveto")
	}
	return cmd, nil
}

// nums reads k numbers.
func (p *pathParser) nums(k int) ([]float64, bool) {
	var out [7]float64
	for i := 0; i < k; i++ {
		p.sc.SkipSep()
		v, ok := p.sc.Number()
		if !ok {
			return nil, false
		}
		out[i] = v
	}
	return out[:k], true
}

// flag reads an arc flag: a single 0 or 1.
func (p *pathParser) flag() (float64, bool) {
	p.sc.SkipSep()
	if p.sc.Done() {
		return 0, false
	}
	switch p.sc.S[p.sc.I] {
	case '0':
		p.sc.I++
		return 0, true
	case '1':
		p.sc.I++
		return 1, true
	}
	return 0, false
}

// emit adds a flattened point to the current subpath, which starts at the
// current point if the last command closed one.
func (p *pathParser) emit(q Point) error {
	if !finitePoint(q) {
		// Sums of coordinates near the float64 limit overflow (a
		// reflected control point, a curve through them): the outline
		// stops where it can no longer be drawn.
		return errors.New("marks: path data reaches coordinates past the float64 range")
	}
	if p.sub == nil {
		p.subs = append(p.subs, Subpath{Pts: []Point{p.cur}})
		p.sub = &p.subs[len(p.subs)-1]
	}
	p.sub.Pts = append(p.sub.Pts, q)
	p.total++
	if p.total > maxPathPoints {
		return errors.New("marks: path data flattens to more than " + strconv.Itoa(maxPathPoints) + " points")
	}
	return nil
}

func (p *pathParser) moveTo(base Point) error {
	a, ok := p.nums(2)
	if !ok {
		return p.errAt("bad moveto")
	}
	p.cur = Point{base.X + a[0], base.Y + a[1]}
	p.start = p.cur
	p.subs = append(p.subs, Subpath{Pts: []Point{p.cur}})
	p.sub = &p.subs[len(p.subs)-1]
	p.ctrl = p.cur
	return nil
}

// lineTo reads L, H or V.
func (p *pathParser) lineTo(up byte, base Point) error {
	n := 1
	if up == 'L' {
		n = 2
	}
	a, ok := p.nums(n)
	if !ok {
		return p.errAt("bad " + commandNames[up])
	}
	q := Point{base.X + a[0], base.Y + a[1%n]}
	switch up {
	case 'H':
		q.Y = p.cur.Y
	case 'V':
		q = Point{p.cur.X, base.Y + a[0]}
	}
	if err := p.emit(q); err != nil {
		return err
	}
	p.info.Lines++
	p.cur, p.ctrl = q, q
	return nil
}

// curveTo reads C, S, Q or T and flattens the curve into curveSteps
// segments.
func (p *pathParser) curveTo(up byte, base Point) error {
	cubic := up == 'C' || up == 'S'
	p0, p1, p2, p3, err := p.controlPoints(up, base)
	if err != nil {
		return err
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
		if err := p.emit(q); err != nil {
			return err
		}
	}
	p.info.Curves++
	if cubic {
		p.ctrl = p2
	} else {
		p.ctrl = p1
	}
	p.cur = p3
	return nil
}

// controlPoints reads a curve's points: the smooth forms reflect the
// previous curve's last control point, if the previous command was a
// curve of the same degree.
func (p *pathParser) controlPoints(up byte, base Point) (p0, p1, p2, p3 Point, err error) {
	n := 2
	switch up {
	case 'C':
		n = 6
	case 'S', 'Q':
		n = 4
	}
	a, ok := p.nums(n)
	if !ok {
		return p0, p1, p2, p3, p.errAt("bad " + commandNames[up])
	}
	at := func(i int) Point { return Point{base.X + a[i], base.Y + a[i+1]} }
	p0 = p.cur
	reflect := Point{2*p.cur.X - p.ctrl.X, 2*p.cur.Y - p.ctrl.Y}
	last := p.lastCmd &^ 0x20
	switch up {
	case 'C':
		p1, p2, p3 = at(0), at(2), at(4)
	case 'S':
		p1, p2, p3 = p.cur, at(0), at(2)
		if last == 'C' || last == 'S' {
			p1 = reflect
		}
	case 'Q':
		p1, p3 = at(0), at(2)
	case 'T':
		p1, p3 = p.cur, at(0)
		if last == 'Q' || last == 'T' {
			p1 = reflect
		}
	}
	return p0, p1, p2, p3, nil
}

// arcTo reads an elliptical arc and flattens it (SVG 1.1 Appendix F.6).
func (p *pathParser) arcTo(base Point) error {
	a, ok := p.nums(3)
	if !ok {
		return p.errAt("bad arc")
	}
	large, ok1 := p.flag()
	sweep, ok2 := p.flag()
	e, ok3 := p.nums(2)
	if !ok1 || !ok2 || !ok3 {
		return p.errAt("bad arc")
	}
	q := Point{base.X + e[0], base.Y + e[1]}
	for _, v := range arcPoints(p.cur, a[0], a[1], a[2], large != 0, sweep != 0, q) {
		if err := p.emit(v); err != nil {
			return err
		}
	}
	p.info.Curves++
	p.info.Arcs++
	p.cur, p.ctrl = q, q
	return nil
}

func (p *pathParser) closePath() {
	if p.sub != nil {
		p.sub.Closed = true
	}
	p.cur, p.ctrl = p.start, p.start
	p.sub = nil
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
func finitePoint(p Point) bool {
	return !math.IsNaN(p.X) && !math.IsNaN(p.Y) && !math.IsInf(p.X, 0) && !math.IsInf(p.Y, 0)
}

func arcPoints(p0 Point, rx, ry, phiDeg float64, large, sweep bool, p1 Point) []Point {
	if p0 == p1 {
		return nil // §F.6.2: identical endpoints omit the arc
	}
	rx, ry = math.Abs(rx), math.Abs(ry)
	if rx == 0 || ry == 0 {
		return []Point{p1} // §F.6.2: a zero radius is a straight line
	}
	// The rotation is an angle: reduce it first, since a huge one would
	// overflow to infinity in radians.
	phiDeg = math.Mod(phiDeg, 360)
	if math.IsNaN(phiDeg) {
		phiDeg = 0
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
	if !finitePoint(Point{cx, cy}) || !finitePoint(Point{rx, ry}) {
		return []Point{p1} // magnitudes past float64: drawn as a chord
	}
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
			return pts, errors.New("marks: points: bad number at offset " + strconv.Itoa(sc.I))
		}
		sc.SkipSep()
		y, ok := sc.Number()
		if !ok {
			return pts, errors.New("marks: points: odd number of coordinates or bad number at offset " + strconv.Itoa(sc.I))
		}
		pts = append(pts, Point{x, y})
		if len(pts) > maxPathPoints {
			return pts, errors.New("marks: points: more than " + strconv.Itoa(maxPathPoints) + " points")
		}
	}
}
