package report

import (
	"errors"
	"math"
	"strconv"
	"strings"

	"standout/internal/jsonio"
	"standout/marks"
	"standout/perception"
	"standout/snapshot"
)

// Digest is the part of a report the overlay needs, columnar so that it
// encodes and crosses to JavaScript quickly: per chart the marks' ids,
// their boxes as one flat array and their verdicts as one letter each, the
// findings with their marks as indices, and the emphasis. The core writes
// it by hand (AppendDigest); the type documents it and decodes it in tests.
//
// Its lists of indices (Indices) write a run of three or more consecutive
// ascending values as its first value and its last negated: [2,-5001] is
// 2 through 5001. A chart's marks are mostly its snapshot's nodes in
// order, and a finding about a category often names every mark of it, so
// the runs take about two fifths off the digest of a 5,000-mark scatter.
// The digest crosses to the page as the argument of an injected function,
// whose cost grows with its length: in the browser benchmark's steps a
// no-op injection took 7–9 ms with that scatter's 160 KB digest, 4–5 ms
// with 90 KB and 1–4 ms with a tiny argument. After a tab's first press
// it crosses as a patch against the digest the page holds
// (extension/patch.js).
type Digest struct {
	Pages   []DigestPage `json:"pages"`
	Caution string       `json:"caution"`
}

// DigestPage is one page of a Digest.
type DigestPage struct {
	Source   string        `json:"source"`
	Problems []string      `json:"problems"`
	Charts   []DigestChart `json:"charts"`
}

// DigestChart is one chart of a Digest.
type DigestChart struct {
	Path    string     `json:"path"`
	Title   string     `json:"title,omitempty"`
	IsChart bool       `json:"isChart"`
	Box     [4]float64 `json:"box"`
	// Nodes are the marks' snapshot nodes (the overlay names a mark by its
	// chart and node, and the core turns those into ids); Boxes holds each
	// mark's x y width height in page px, rounded to hundredths as in the
	// report; Verdicts holds one letter per mark: p pops, c conjunction, b
	// blends.
	Nodes    Indices   `json:"nodes"`
	Boxes    []float64 `json:"boxes"`
	Verdicts string    `json:"verdicts"`
	// Paths holds, for each line or rule, its mark index, its stroke
	// width and its vertices (x y, page px, at most MaxDigestPoints),
	// flat, so that the overlay outlines it along its path.
	Paths    [][]float64     `json:"paths,omitempty"`
	Findings []DigestFinding `json:"findings"`
	Emphasis *DigestEmphasis `json:"emphasis,omitempty"`
}

// Indices is a digest's list of indices, written in runs (Digest).
type Indices []int

// UnmarshalJSON reads a list written in runs (by hand: the overlay core
// links no encoding/json).
func (v *Indices) UnmarshalJSON(b []byte) error {
	s := strings.TrimSpace(string(b))
	if s == "null" {
		*v = nil
		return nil
	}
	if len(s) < 2 || s[0] != '[' || s[len(s)-1] != ']' {
		return errors.New("digest: indices are not a list")
	}
	out := Indices{}
	if s = strings.TrimSpace(s[1 : len(s)-1]); s == "" {
		*v = out
		return nil
	}
	for _, f := range strings.Split(s, ",") {
		f = strings.TrimSpace(f)
		digits := strings.TrimPrefix(f, "-")
		if digits == "" || digits[0] < '0' || digits[0] > '9' || digits[0] == '0' && len(digits) > 1 {
			return errors.New("digest: " + strconv.Quote(f) + " is not an index")
		}
		x, err := strconv.Atoi(f)
		if err != nil || x >= snapshot.MaxNodes || x <= -snapshot.MaxNodes {
			return errors.New("digest: " + strconv.Quote(f) + " is not an index of a chart's marks")
		}
		if x >= 0 {
			out = append(out, x)
			continue
		}
		if len(out) == 0 || -x < out[len(out)-1]+2 {
			return errors.New("digest: a run's end " + strconv.Itoa(x) + " follows no value it can end")
		}
		// A chart has at most snapshot.MaxNodes marks.
		if -x-out[len(out)-1] > snapshot.MaxNodes-len(out) {
			return errors.New("digest: a list of indices longer than a chart's marks can be")
		}
		for k := out[len(out)-1] + 1; k <= -x; k++ {
			out = append(out, k)
		}
	}
	*v = out
	return nil
}

// runs writes ascending values in runs (Digest).
type runs struct {
	b           []byte
	n           int // values written
	start, last int
	open        bool
}

func (w *runs) add(x int) {
	if w.open && x == w.last+1 {
		w.last = x
		return
	}
	w.flush()
	w.start, w.last, w.open = x, x, true
}

func (w *runs) put(x int) {
	if w.n > 0 {
		w.b = append(w.b, ',')
	}
	w.n++
	w.b = strconv.AppendInt(w.b, int64(x), 10)
}

func (w *runs) flush() {
	if !w.open {
		return
	}
	w.open = false
	w.put(w.start)
	switch {
	case w.last == w.start+1:
		w.put(w.last)
	case w.last > w.start+1:
		w.put(-w.last)
	}
}

// DigestFinding is a finding whose marks are indices into the chart's.
type DigestFinding struct {
	ID       string     `json:"id"`
	Severity string     `json:"severity"`
	Message  string     `json:"message"`
	Evidence string     `json:"evidence,omitempty"`
	Marks    Indices    `json:"marks"`
	Fix      *DigestFix `json:"fix,omitempty"`
}

// DigestFix is a finding's fix.
type DigestFix struct {
	Kind        string `json:"kind"`
	CSS         string `json:"css"`
	Rule        string `json:"rule,omitempty"`
	Verified    bool   `json:"verified"`
	Alternative string `json:"alternative,omitempty"`
}

// DigestEmphasis is the emphasis, by mark index, and whether it holds for
// each vision type.
type DigestEmphasis struct {
	Marks    Indices         `json:"marks"`
	Inferred bool            `json:"inferred"`
	Holds    map[string]bool `json:"holds"`
	// SearchMs and Serial are the emphasis's search curve (SearchCurve)
	// at the chart's number of marks, for the panel's plot.
	SearchMs float64 `json:"searchMs"`
	Serial   bool    `json:"serial"`
}

// verdictLetter is each verdict's letter in the digest (VerdictStyles).
var verdictLetter = func() map[perception.Verdict]byte {
	m := map[perception.Verdict]byte{}
	for _, s := range VerdictStyles {
		m[perception.Verdict(s.Verdict)] = s.Letter[0]
	}
	return m
}()

// CountMarks counts the marks of the analysed charts (to size the
// digest's buffer).
func CountMarks(as []Analysed) int {
	n := 0
	for _, a := range as {
		n += len(a.Chart.Marks)
	}
	return n
}

// AppendDigest writes the Digest of the analysed charts of one page.
func AppendDigest(b []byte, source string, problems []string, as []Analysed) []byte {
	b = AppendDigestOpen(b, source, problems)
	for ci, a := range as {
		if ci > 0 {
			b = append(b, ',')
		}
		b = AppendDigestChart(b, a)
	}
	return AppendDigestClose(b)
}

// AppendDigestOpen writes a Digest up to its first chart; the charts
// follow, each written by AppendDigestChart and separated by commas, and
// AppendDigestClose ends it.
func AppendDigestOpen(b []byte, source string, problems []string) []byte {
	b = append(b, `{"pages":[{"source":`...)
	b = jsonio.AppendString(b, source)
	b = append(b, `,"problems":`...)
	b = jsonio.AppendStrings(b, problems)
	return append(b, `,"charts":[`...)
}

// AppendDigestClose ends a Digest begun by AppendDigestOpen.
func AppendDigestClose(b []byte) []byte {
	b = append(b, `]}],"caution":`...)
	b = jsonio.AppendString(b, Caution)
	return append(b, '}')
}

// AppendDigestChart writes one chart of a Digest. It depends on the chart
// alone, so a caller may keep it and write it again for the same chart
// judged under the same options.
func AppendDigestChart(b []byte, a Analysed) []byte {
	ch := a.Chart
	b = append(b, `{"path":`...)
	b = jsonio.AppendString(b, ch.Path)
	if ch.Title != "" {
		b = append(b, `,"title":`...)
		b = jsonio.AppendString(b, ch.Title)
	}
	b = append(b, `,"isChart":`...)
	b = strconv.AppendBool(b, ch.IsChart)
	b = append(b, `,"box":`...)
	b = jsonio.AppendFloats(b, ch.Box[:])
	b = append(b, `,"nodes":[`...)
	w := runs{b: b}
	for _, m := range ch.Marks {
		w.add(m.Node)
	}
	w.flush()
	b = append(w.b, `],"boxes":[`...)
	for i, m := range ch.Marks {
		if i > 0 {
			b = append(b, ',')
		}
		for k, v := range m.BBox {
			if k > 0 {
				b = append(b, ',')
			}
			b = appendHundredths(b, v)
		}
	}
	b = append(b, ']')
	b = appendDigestPaths(b, ch)
	b = append(b, `,"verdicts":"`...)
	for i := range ch.Marks {
		v := byte('b')
		if a.Result != nil {
			if l, ok := verdictLetter[a.Result.Marks[i][0].Verdict]; ok {
				v = l
			}
		}
		b = append(b, v)
	}
	b = append(b, `","findings":`...)
	b = appendDigestFindings(b, a)
	if a.Result != nil {
		b = appendDigestEmphasis(b, a)
	}
	return append(b, '}')
}

// appendDigestFindings writes a chart's findings, their marks as indices.
func appendDigestFindings(b []byte, a Analysed) []byte {
	ch := a.Chart
	b = append(b, '[')
	if a.Result != nil {
		for fi, f := range a.Result.Findings {
			if fi > 0 {
				b = append(b, ',')
			}
			b = append(b, `{"id":`...)
			b = jsonio.AppendString(b, f.ID)
			b = append(b, `,"severity":`...)
			b = jsonio.AppendString(b, string(f.Severity))
			b = append(b, `,"message":`...)
			b = jsonio.AppendString(b, f.Message)
			if f.Evidence != "" {
				b = append(b, `,"evidence":`...)
				b = jsonio.AppendString(b, f.Evidence)
			}
			b = append(b, `,"marks":`...)
			b = appendInts(b, f.Marks, len(ch.Marks))
			if f.Fix != nil {
				b = append(b, `,"fix":{"kind":`...)
				b = jsonio.AppendString(b, f.Fix.Kind)
				b = append(b, `,"css":`...)
				b = jsonio.AppendString(b, f.Fix.CSS)
				if rule := RuleFor(ch, f.Fix.Marks, a.Result.Emphasis, f.Fix.CSS); rule != "" {
					b = append(b, `,"rule":`...)
					b = jsonio.AppendString(b, rule)
				}
				b = append(b, `,"verified":`...)
				b = strconv.AppendBool(b, f.Fix.Verified)
				if f.Fix.Alternative != "" {
					b = append(b, `,"alternative":`...)
					b = jsonio.AppendString(b, f.Fix.Alternative)
				}
				b = append(b, '}')
			}
			b = append(b, '}')
		}
	}
	return append(b, ']')
}

// appendDigestEmphasis writes a chart's emphasis, by mark index, and
// whether it holds for each vision type.
func appendDigestEmphasis(b []byte, a Analysed) []byte {
	ch := a.Chart
	b = append(b, `,"emphasis":{"marks":`...)
	b = appendInts(b, a.Result.Emphasis, len(ch.Marks))
	b = append(b, `,"inferred":`...)
	b = strconv.AppendBool(b, a.Result.Inferred)
	b = append(b, `,"holds":{`...)
	for vi, v := range perception.Visions {
		if vi > 0 {
			b = append(b, ',')
		}
		b = jsonio.AppendString(b, v.String())
		b = append(b, ':')
		b = strconv.AppendBool(b, a.Result.Holds[vi])
	}
	curve := digestCurve(a)
	b = append(b, `},"searchMs":`...)
	b = strconv.AppendFloat(b, math.Round(curve.Ms*10)/10, 'f', -1, 64)
	b = append(b, `,"serial":`...)
	b = strconv.AppendBool(b, curve.Serial)
	return append(b, '}')
}

// digestCurve is the emphasis's search curve, as CurveOf finds it in a
// report chart: its slowest emphasised mark's.
func digestCurve(a Analysed) SearchCurve {
	c := SearchCurve{N: len(a.Chart.Marks)}
	for _, i := range a.Result.Emphasis {
		if i < 0 || i >= len(a.Result.Marks) {
			continue
		}
		if r := a.Result.Marks[i][0]; r.SearchMs[1] >= c.Ms {
			c.Ms, c.Serial = r.SearchMs[1], r.Verdict != perception.Pops
		}
	}
	return c
}

// appendHundredths writes v rounded to hundredths: the same number as
// jsonio.AppendFloat(math.Round(v*100)/100), without strconv's general
// shortest-form search, which dominated the digest's encoding.
func appendHundredths(b []byte, v float64) []byte {
	n := math.Round(v * 100)
	if !(math.Abs(n) < 1<<53) {
		return jsonio.AppendFloat(b, n/100)
	}
	k := int64(n)
	if k < 0 {
		b = append(b, '-')
		k = -k
	}
	// The digits backwards into a buffer: strconv's general path costs
	// more than the few digits a box's coordinate has.
	var d [24]byte
	i := len(d)
	f := k % 100
	switch {
	case f == 0:
	case f%10 == 0:
		i -= 2
		d[i], d[i+1] = '.', byte('0'+f/10)
	default:
		i -= 3
		d[i], d[i+1], d[i+2] = '.', byte('0'+f/10), byte('0'+f%10)
	}
	k /= 100
	for {
		i--
		d[i] = byte('0' + k%10)
		if k /= 10; k == 0 {
			break
		}
	}
	return append(b, d[i:]...)
}

// appendInts writes the indices of v that lie within [0, n), in runs.
func appendInts(b []byte, v []int, n int) []byte {
	w := runs{b: append(b, '[')}
	for _, x := range v {
		if x >= 0 && x < n {
			w.add(x)
		}
	}
	w.flush()
	return append(w.b, ']')
}

// MaxDigestPoints bounds the vertices the overlay gets of one line.
const MaxDigestPoints = 200

// appendDigestPaths writes the lines' and rules' paths (DigestChart.Paths).
func appendDigestPaths(b []byte, ch *marks.Chart) []byte {
	first := true
	for i, m := range ch.Marks {
		if (m.Kind != marks.KindLine && m.Kind != marks.KindRule) || len(m.Vertices) < 2 {
			continue
		}
		if first {
			b = append(b, `,"paths":[`...)
			first = false
		} else {
			b = append(b, ',')
		}
		b = append(b, '[')
		b = strconv.AppendInt(b, int64(i), 10)
		b = append(b, ',')
		b = appendHundredths(b, max(m.StrokeWidth, 1))
		step := max(1, (len(m.Vertices)+MaxDigestPoints-1)/MaxDigestPoints)
		for k := 0; k < len(m.Vertices); k += step {
			b = appendPoint(b, m.Vertices[k])
		}
		if (len(m.Vertices)-1)%step != 0 {
			b = appendPoint(b, m.Vertices[len(m.Vertices)-1])
		}
		b = append(b, ']')
	}
	if !first {
		b = append(b, ']')
	}
	return b
}

func appendPoint(b []byte, p marks.Point) []byte {
	b = append(b, ',')
	b = appendHundredths(b, p.X)
	b = append(b, ',')
	return appendHundredths(b, p.Y)
}
