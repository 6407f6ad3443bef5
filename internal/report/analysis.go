package report

import (
	"math"
	"strconv"
	"strings"

	"standout/marks"
	"standout/perception"
	"standout/perception/colour"
	"standout/snapshot"
)

// hexCache keeps a few paints' hex forms: a chart repeats a few colours,
// and a string each is an allocation per mark.
type hexCache [16]struct {
	v uint32
	s string
}

func (c *hexCache) of(v uint32) string {
	e := &c[(v^v>>8^v>>16^v>>24)&15]
	if e.s == "" || e.v != v {
		e.v, e.s = v, snapshot.Hex(v)
	}
	return e.s
}

// ToPerception converts a walked chart into the analysis input: each mark's
// painted colour composited over the chart background, its size channel
// and geometry.
func ToPerception(ch *marks.Chart, emphasisIDs map[string]bool) perception.Input {
	bg := snapshot.Unpack(ch.Background).SRGB
	in := perception.Input{Background: bg}
	var hexes hexCache
	conv := func(m *marks.Mark) perception.Mark {
		pm := perception.Mark{ID: m.ID, Kind: string(m.Kind), Size: m.Size, Angle: m.Angle, Fold: m.Fold,
			Shape: string(m.Shape), X: m.Centroid.X, Y: m.Centroid.Y, Box: m.BBox}
		filled := m.Fill != nil && m.FillOpacity > 0 && (m.Area > 0 || m.Kind == marks.KindText)
		switch {
		case filled:
			pm.Colour = colour.Over(snapshot.Unpack(*m.Fill), m.FillOpacity*m.Opacity, bg)
			pm.Paint, pm.Alpha = hexes.of(*m.Fill), m.FillOpacity*m.Opacity
			if m.Stroke != nil && m.StrokeOpacity > 0 && m.StrokeWidth > 0 {
				pm.Outline = colour.Over(snapshot.Unpack(*m.Stroke), m.StrokeOpacity*m.Opacity, bg)
				pm.HasOutline = true
			}
		case m.Stroke != nil:
			pm.Colour = colour.Over(snapshot.Unpack(*m.Stroke), m.StrokeOpacity*m.Opacity, bg)
			pm.Paint, pm.Alpha = hexes.of(*m.Stroke), m.StrokeOpacity*m.Opacity
		default:
			pm.Colour = bg
		}
		pm.MinPx, pm.MaxPx = min(m.BBox[2], m.BBox[3]), max(m.BBox[2], m.BBox[3])
		switch m.Kind {
		case marks.KindPoint:
			pm.Type = colour.Point
			if !filled {
				pm.MinPx = max(m.StrokeWidth, 0.5)
				pm.Type = colour.Line
			}
		case marks.KindBar, marks.KindRule:
			pm.Type, pm.Length = colour.Bar, true
			if m.Kind == marks.KindRule {
				pm.Type, pm.MinPx = colour.Line, max(m.StrokeWidth, 0.5)
				// A rule connects what it passes through.
				if len(m.Vertices) >= 2 {
					for _, v := range m.Vertices {
						pm.Vertices = append(pm.Vertices, [2]float64{v.X, v.Y})
					}
				}
			}
		case marks.KindLine:
			pm.Type, pm.MinPx = colour.Line, max(m.StrokeWidth, 0.5)
			for _, v := range m.Vertices {
				pm.Vertices = append(pm.Vertices, [2]float64{v.X, v.Y})
			}
		case marks.KindText:
			pm.Type, pm.MinPx = colour.Line, max(m.Size/8, 0.5) // stroke weight of text, about an eighth of the size
			pm.Bold = m.Weight >= 700
		default:
			pm.Type = colour.Area
		}
		return pm
	}
	in.Marks = make([]perception.Mark, 0, len(ch.Marks))
	for i := range ch.Marks {
		m := &ch.Marks[i]
		in.Marks = append(in.Marks, conv(m))
		if emphasisIDs[m.ID] {
			in.Emphasis = append(in.Emphasis, i)
		}
		if m.Kind == marks.KindText {
			in.Labelled = true
		}
	}
	in.Emphasis = append(in.Emphasis, ch.Selected...)
	in.Emphasis = uniq(in.Emphasis)
	for i := range ch.Legend {
		in.Legend = append(in.Legend, conv(&ch.Legend[i]))
	}
	return in
}

func uniq(v []int) []int {
	seen := map[int]bool{}
	var out []int
	for _, x := range v {
		if !seen[x] {
			seen[x] = true
			out = append(out, x)
		}
	}
	return out
}

// Result is a mark's verdict under one vision type: the channels that
// carry its pop-out and, in the full report, its search slope.
type Result struct {
	Verdict  string    `json:"verdict"`
	Channels []string  `json:"channels"`
	SlopeMs  []float64 `json:"searchSlopeMsPerMark,omitempty"`
}

// Fix is a finding's suggested change: its kind ("recolour-emphasis" or
// "mute-others"), the CSS to apply, the margin it leaves per vision type
// in noticeable differences, and whether the re-analysis with it applied
// confirmed that the emphasis then pops out for every vision type.
type Fix struct {
	Kind string `json:"kind"`
	CSS  string `json:"css"`
	// Rule is CSS to paste: the declaration with a selector that matches
	// the marks it is for (minor 2); absent where no selector reaches the
	// chart (a shadow root).
	Rule     string             `json:"rule,omitempty"`
	Margin   map[string]float64 `json:"marginND"`
	Verified bool               `json:"verified"`
	// Alternative, when no colour works for every reader, is a second cue
	// to add (minor 2).
	Alternative string `json:"alternative,omitempty"`
}

// Finding is one problem the analysis found: its id, severity, the marks
// it concerns (by id), a message in words, the published source behind
// it, and a fix where one is known.
type Finding struct {
	ID       string   `json:"id"`
	Severity string   `json:"severity"`
	Marks    []string `json:"marks"`
	Message  string   `json:"message"`
	// Evidence holds the numbers behind the message (minor 2).
	Evidence string `json:"evidence,omitempty"`
	Source   string `json:"source"`
	Fix      *Fix   `json:"fix,omitempty"`
}

// Partition is how many groups one cue (proximity, colour or shape)
// divides the marks into.
type Partition struct {
	Cue    string `json:"cue"`
	Groups int    `json:"groups"`
}

// Agreement compares two cues' partitions: their adjusted Rand index and
// what it means ("agree", "conflict" or "partial").
type Agreement struct {
	A        string  `json:"a"`
	B        string  `json:"b"`
	ARI      float64 `json:"ari"`
	Relation string  `json:"relation"`
}

// Groups is the grouping analysis of a chart.
type Groups struct {
	Partitions []Partition `json:"partitions"`
	Agreement  []Agreement `json:"agreement"`
}

// Emphasis is the chart's emphasis: its marks (declared, or inferred
// when none was declared) and whether it pops out for each vision type.
type Emphasis struct {
	Marks    []string        `json:"marks"`
	Inferred bool            `json:"inferred"`
	Holds    map[string]bool `json:"holds"`
	// Box is, in a chart drawn as pixels (minor 4), the declared emphasis
	// box; Holds then says whether the strongest region covers its centre.
	Box *[4]float64 `json:"box,omitempty"`
}

func channelNames(cs []perception.Channel) []string {
	out := []string{}
	for _, c := range cs {
		out = append(out, string(c))
	}
	return out
}

// attachAnalysis adds the analysis to a report chart.
func attachAnalysis(rc *Chart, ch *marks.Chart, res *perception.Result) {
	for i := range rc.Marks {
		r := res.Marks[i]
		rc.Marks[i].Verdict = string(r[0].Verdict)
		rc.Marks[i].Channels = channelNames(r[0].Channels)
		rc.Marks[i].SearchSlope = []float64{r[0].SlopeMs[0], r[0].SlopeMs[1]}
		rc.Marks[i].SearchMs = []float64{r[0].SearchMs[0], r[0].SearchMs[1]}
		res := func(vi int) Result {
			return Result{Verdict: string(r[vi].Verdict), Channels: channelNames(r[vi].Channels)}
		}
		// perception.Visions is normal, protan, deutan, tritan, achromat.
		// An analysis with FindingsOnly has them for the emphasis alone.
		if len(r) == len(perception.Visions) {
			rc.Marks[i].CVD = &CVDResults{Protan: res(1), Deutan: res(2), Tritan: res(3), Achromat: res(4)}
		}
	}
	rc.Findings = Findings(ch, res)
	rc.Groups = &Groups{Partitions: []Partition{}, Agreement: []Agreement{}}
	for _, p := range res.Groups.Partitions {
		rc.Groups.Partitions = append(rc.Groups.Partitions, Partition{Cue: string(p.Cue), Groups: p.Groups})
	}
	for _, a := range res.Groups.Agreements {
		rc.Groups.Agreement = append(rc.Groups.Agreement, Agreement{A: string(a.A), B: string(a.B), ARI: math.Round(a.ARI*1000) / 1000, Relation: a.Relation})
	}
	rc.Emphasis = EmphasisOf(ch, res)
	if len(res.Extremes) > 0 {
		rc.Extremes = markIDs(ch, res.Extremes)
	}
}

// markIDs names the marks idx of ch by their ids.
func markIDs(ch *marks.Chart, idx []int) []string {
	out := []string{}
	for _, i := range idx {
		if i >= 0 && i < len(ch.Marks) {
			out = append(out, ch.Marks[i].ID)
		}
	}
	return out
}

// Findings are the analysis's findings as the report states them.
func Findings(ch *marks.Chart, res *perception.Result) []Finding {
	out := []Finding{}
	for _, f := range res.Findings {
		rf := Finding{ID: f.ID, Severity: string(f.Severity), Marks: markIDs(ch, f.Marks), Message: f.Message, Evidence: f.Evidence, Source: f.Source}
		if f.Fix != nil {
			m := map[string]float64{}
			for k, v := range f.Fix.Margin {
				m[k] = math.Round(v*100) / 100
			}
			rf.Fix = &Fix{Kind: f.Fix.Kind, CSS: f.Fix.CSS, Margin: m, Verified: f.Fix.Verified, Alternative: f.Fix.Alternative,
				Rule: RuleFor(ch, f.Fix.Marks, res.Emphasis, f.Fix.CSS)}
		}
		out = append(out, rf)
	}
	return out
}

// EmphasisOf is the analysis's emphasis as the report states it.
func EmphasisOf(ch *marks.Chart, res *perception.Result) *Emphasis {
	em := &Emphasis{Marks: markIDs(ch, res.Emphasis), Inferred: res.Inferred, Holds: map[string]bool{}}
	for vi, v := range perception.Visions {
		em.Holds[v.String()] = res.Holds[vi]
	}
	return em
}

// Summary says in one sentence how the marks fare.
func Summary(rc Chart) string {
	count := map[string]int{}
	chans := map[string]int{}
	for _, m := range rc.Marks {
		count[m.Verdict]++
		if m.Verdict == "pops" {
			for _, c := range m.Channels {
				chans[c]++
			}
		}
	}
	var parts []string
	if n := count["pops"]; n > 0 {
		var cs []string
		for _, c := range perception.Channels {
			if chans[string(c)] > 0 {
				cs = append(cs, string(c))
			}
		}
		parts = append(parts, plural(n, "mark pops out", "marks pop out")+" ("+strings.Join(cs, ", ")+")")
	}
	if n := count["conjunction"]; n > 0 {
		parts = append(parts, plural(n, "mark needs a serial search for a conjunction", "marks need a serial search for a conjunction"))
	}
	if n := count["blends"]; n > 0 {
		parts = append(parts, plural(n, "mark blends in", "marks blend in"))
	}
	return strings.Join(parts, "; ")
}

func plural(n int, one, many string) string {
	if n == 1 {
		return "1 " + one
	}
	return strconv.Itoa(n) + " " + many
}

// ScaleInput shrinks (or grows) a chart's marks by s, about the page's
// origin, as a browser scaling the whole chart would: lengths, widths and
// positions by s, areas by s².
func ScaleInput(in *perception.Input, s float64) {
	scale := func(m *perception.Mark) {
		m.MinPx, m.MaxPx, m.X, m.Y = m.MinPx*s, m.MaxPx*s, m.X*s, m.Y*s
		if m.Length || m.Kind == "line" || m.Kind == "text" {
			m.Size *= s // a length, a stroke width, a font size
		} else {
			m.Size *= s * s // an area
		}
		for i := range m.Box {
			m.Box[i] *= s
		}
		for i := range m.Vertices {
			m.Vertices[i] = [2]float64{m.Vertices[i][0] * s, m.Vertices[i][1] * s}
		}
	}
	for i := range in.Marks {
		scale(&in.Marks[i])
	}
	for i := range in.Legend {
		scale(&in.Legend[i])
	}
}
