package perception

import (
	"math"
	"slices"
	"sort"
	"strconv"
	"strings"

	"standout/perception/colour"
)

// Severity ranks findings.
type Severity string

// Severities, lowest first.
const (
	Info    Severity = "info"
	Warning Severity = "warning"
	Error   Severity = "error"
)

// Rank orders severities: info 0, warning 1, error 2.
func (s Severity) Rank() int {
	switch s {
	case Warning:
		return 1
	case Error:
		return 2
	}
	return 0
}

// Finding is one statement about a chart.
type Finding struct {
	// ID is a stable kebab-case identifier of the rule.
	ID       string
	Severity Severity
	Marks    []int
	// Message says, in plain words, what a reader experiences and then
	// what to change.
	Message string
	// Evidence holds the numbers behind it, for those who want them.
	Evidence string
	// Source names the published finding or standard behind the rule.
	Source string
	Fix    *Fix
}

const (
	srcSearch   = "Treisman & Gelade 1980; Nothdurft 1993; Duncan & Humphreys 1989"
	srcCVD      = "Machado, Oliveira & Fernandes 2009"
	srcContrast = "WCAG 2.x SC 1.4.11 Non-text Contrast"
	srcText     = "WCAG 2.x SC 1.4.3 Contrast (Minimum)"
	srcColour   = "WCAG 2.x SC 1.4.1 Use of Color"
	srcHues     = "Ware, Information Visualization, ch. 4 (six distinct colours are easy)"
	srcGroup    = "Palmer & Rock 1994; Kubovy, Holcombe & Wagemans 1998; Hubert & Arabie 1985"
	srcND       = "Szafir 2018; Stone, Szafir & Setlur 2014"
	srcExtremes = "no published source: a design rule of the model (provisional)"
	srcScene    = "Wolfe 1994; Wolfe 2021 (one priority map over the whole display)"
)

func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}

// The messages are written without fmt, whose code is large and, on the
// extension's first check, runs unoptimised: itoa, ff and fg write what
// %d, %.Nf and %g would.
func itoa(n int) string { return strconv.Itoa(n) }

func ff(v float64, prec int) string { return strconv.FormatFloat(v, 'f', prec, 64) }

func fg(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

func visionNames(vs []colour.Deficiency) string {
	var s []string
	for _, v := range vs {
		s = append(s, v.String())
	}
	return strings.Join(s, ", ")
}

// readers names, for people, the readers of some vision types: "readers
// with protan or deutan colour vision", "readers who see the chart in
// greyscale (achromat)", or both.
func readers(vs ...colour.Deficiency) string {
	var cvd []string
	grey := false
	for _, v := range vs {
		if v == colour.Achromat {
			grey = true
		} else {
			cvd = append(cvd, v.String())
		}
	}
	var parts []string
	if len(cvd) > 0 {
		list := strings.Join(cvd, " or ")
		if len(cvd) > 2 {
			list = strings.Join(cvd[:len(cvd)-1], ", ") + " or " + cvd[len(cvd)-1]
		}
		parts = append(parts, "readers with "+list+" colour vision")
	}
	if grey {
		parts = append(parts, "readers who see the chart in greyscale (achromat)")
	}
	return strings.Join(parts, ", and ")
}

// capital upper-cases a sentence's first letter.
func capital(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}

func findings(in Input, p Params, res *Result) []Finding {
	var out []Finding
	out = append(out, emphasisFindings(in, p, res)...)
	out = append(out, extremeFindings(in, res)...)
	out = append(out, rivalFindings(in, res)...)
	out = append(out, contrastFindings(in, res)...)
	out = append(out, adjacentFindings(in)...)
	out = append(out, categoryFindings(in, p, res)...)
	out = append(out, groupingFindings(res)...)
	sort.SliceStable(out, func(i, j int) bool { return out[i].Severity.Rank() > out[j].Severity.Rank() })
	return out
}

// noEmphasisFindings are the findings of a chart with no emphasis: when
// it was to be inferred, either too many marks pop out for one of them to
// be it, or none does.
func noEmphasisFindings(in Input, res *Result) []Finding {
	if !res.Inferred || len(in.Marks) <= 1 {
		return nil
	}
	var out []Finding
	var pops []int
	for i := range in.Marks {
		if res.Marks[i][0].Verdict == Pops {
			pops = append(pops, i)
		}
	}
	switch {
	case len(pops) > 0:
		// Marks pop, but too many of them for one to be the place the
		// eye goes first (inferEmphasis): say so, not that nothing
		// stands out.
		out = append(out, Finding{ID: "too-many-pop-out", Severity: Info, Marks: pops,
			Message:  itoa(len(pops)) + " of the " + itoa(len(in.Marks)) + " marks " + plural(len(pops), "stands", "stand") + " out at a glance: too many to read as a highlight, so the eye has no one place to go first. If the chart means to highlight something, set only that apart, and let the rest share one look.",
			Evidence: itoa(len(pops)) + " of " + itoa(len(in.Marks)) + " marks differ from the rest by the pop-out margin; an emphasis is taken to be at most a third of a chart's marks.",
			Source:   srcSearch})
	default:
		out = append(out, Finding{ID: "no-standout-mark", Severity: Info,
			Message:  "Nothing in this chart draws the eye before the reader looks for it. If it means to highlight something, give that a colour, size or shape no other mark shares.",
			Evidence: "No mark or small group differs from the rest by the pop-out margin in any channel.", Source: srcSearch})
	}
	return out
}

func emphasisFindings(in Input, p Params, res *Result) []Finding {
	var out []Finding
	em := res.Emphasis
	if len(em) == 0 {
		return noEmphasisFindings(in, res)
	}
	who := "The emphasised " + plural(len(em), "mark", "marks")
	if res.Inferred {
		who = "The " + plural(len(em), "mark that differs from the rest", itoa(len(em))+" marks that differ from the rest")
	}
	normal := res.Holds[0]
	if normal {
		chans := res.Marks[em[0]][0].Channels
		var cs []string
		for _, c := range chans {
			cs = append(cs, string(c))
		}
		slope := res.Marks[em[0]][0].SlopeMs
		out = append(out, Finding{ID: "emphasis-pops", Severity: Info, Marks: em,
			Message:  who + " " + plural(len(em), "is", "are") + " what a reader sees first: " + plural(len(em), "it stands", "they stand") + " out at a glance through " + strings.Join(cs, " and ") + ".",
			Evidence: "Estimated search slope " + fg(slope[0]) + "–" + fg(slope[1]) + " ms per mark.",
			Source:   srcSearch})
		var lost []colour.Deficiency
		for vi, v := range Visions[1:] {
			if !res.Holds[vi+1] {
				lost = append(lost, v)
			}
		}
		if len(lost) > 0 {
			f := Finding{ID: "emphasis-lost-cvd", Severity: Error, Marks: em,
				Message:  capital(readers(lost...)) + " do not see " + strings.ToLower(who[:1]) + who[1:] + " stand out: to them " + plural(len(em), "it looks", "they look") + " like the other marks. Use the fix below, or add a second cue such as a direct label.",
				Evidence: "The difference that carries it falls under the pop-out margin in the simulation of " + visionNames(lost) + " vision at CVD strength " + strconv.FormatFloat(p.Severity, 'g', 2, 64) + ".",
				Source:   srcCVD + "; " + srcSearch}
			f.Fix = suggestFix(in, p, em, res)
			out = append(out, f)
		}
		return out
	}
	v := res.Marks[em[0]][0]
	best, bestS := Channel(""), 0.0
	for ci, s := range v.Salience {
		if s > bestS {
			best, bestS = Channels[ci], s
		}
	}
	why := "No feature channel separates it from the other marks"
	if best != "" && bestS > 0 {
		why = "Its strongest channel, " + string(best) + ", reaches " + ff(100*bestS, 0) + "% of what pop-out needs, given how similar the nearest other mark is and how much the others vary"
	}
	id, sev := "emphasis-lost", Error
	what := who + " does not stand out: a reader has to search for " + plural(len(em), "it", "them") + " mark by mark. Make " + plural(len(em), "it", "them") + " differ more from the rest, as the fix below does."
	if v.Verdict == Conjunction {
		id = "emphasis-by-conjunction" // no less a miss than a highlight that blends
		what = who + " can be found only by checking marks one by one: " + plural(len(em), "it shares", "they share") + " each of " + plural(len(em), "its", "their") + " features with some other marks. Give " + plural(len(em), "it", "them") + " a feature no other mark has, or mute the others, as the fix below does."
	}
	f := Finding{ID: id, Severity: sev, Marks: em, Message: what,
		Evidence: why + "; estimated " + fg(v.SlopeMs[0]) + "–" + fg(v.SlopeMs[1]) + " ms per mark, " + ff(v.SearchMs[0]/1000, 1) + "–" + ff(v.SearchMs[1]/1000, 1) + " s to find in this chart.",
		Source:   srcSearch}
	f.Fix = suggestFix(in, p, em, res)
	out = append(out, f)
	return out
}

// largeText says whether a text mark is large-scale text for WCAG 2.x
// SC 1.4.3: at least 18 point (24 CSS px), or 14 point (18.67 CSS px) and
// bold. "Bold" is taken as a font weight of 700 or more (common practice).
func largeText(m *Mark) bool { return m.Size >= 24 || m.Bold && m.Size >= 14*96/72.0-0.005 }

func contrastFindings(in Input, res *Result) []Finding {
	low, keys := lowContrast(in)
	isEm := map[int]bool{}
	for _, i := range res.Emphasis {
		isEm[i] = true
	}
	out := make([]Finding, 0, len(keys))
	for _, k := range keys {
		g := low[k]
		if in.Labelled {
			g.context = " The chart labels its marks directly, so it still reads; darken them if a reader needs to compare them by eye."
		} else if len(res.Emphasis) > 0 && res.Holds[0] {
			rest := true
			for _, i := range g.marks {
				rest = rest && !isEm[i]
			}
			if rest {
				g.context = " They are the muted rest behind a highlight that stands out, so the chart's point still reads; darken them a little if a reader needs their values."
			}
		}
		out = append(out, g.finding(k))
	}
	return out
}

// contrastKey groups marks by their colour as CSS writes it (8-bit hex)
// and, for text, by whether it is large (1 text, 2 large text).
type contrastKey [4]uint8

// lowGroup is the marks of one key below their contrast threshold.
type lowGroup struct {
	marks []int
	cr    float64
	text  bool
	large bool
	shown string // the first mark's colour as authored
	// context: the marks are labelled directly, or are the rest behind
	// an emphasis that holds. A reader still gets the chart's point, so
	// their low contrast is a warning, not an error.
	context string
}

// lowContrast finds the marks below the contrast their kind needs against
// the background: 3:1 for graphics (SC 1.4.11), 4.5:1 for text and 3:1
// for large text (SC 1.4.3). Heat-map cells are exempt as essential.
func lowContrast(in Input) (map[contrastKey]*lowGroup, []contrastKey) {
	type known struct {
		cr float64
		k  contrastKey
	}
	colours := newIndexer[colour.SRGB]()
	var cache []known
	lookup := func(c colour.SRGB) known {
		i := colours.of(c)
		if i == len(cache) {
			r, g, b := c.RGB8()
			cache = append(cache, known{colour.ContrastRatio(c, in.Background), contrastKey{r, g, b, 0}})
		}
		return cache[i]
	}
	low := map[contrastKey]*lowGroup{}
	var keys []contrastKey
	for i := range in.Marks {
		m := &in.Marks[i]
		if m.Kind == "cell" {
			continue
		}
		cr := lookup(m.Colour).cr
		if m.HasOutline {
			cr = max(cr, lookup(m.Outline).cr)
		}
		text, large := m.Kind == "text", m.Kind == "text" && largeText(m)
		need := colour.NonTextContrast
		switch {
		case large:
			need = colour.LargeTextContrast
		case text:
			need = colour.TextContrast
		}
		if cr >= need {
			continue
		}
		k := lookup(m.Colour).k
		if text {
			k[3] = 1 + boolByte(large)
		}
		a, ok := low[k]
		if !ok {
			a = &lowGroup{cr: cr, text: text, large: large, shown: m.Shown()}
			low[k] = a
			keys = append(keys, k)
		}
		a.marks = append(a.marks, i)
	}
	return low, keys
}

func boolByte(b bool) uint8 {
	if b {
		return 1
	}
	return 0
}

// finding states a group's low contrast.
func (a *lowGroup) finding(k contrastKey) Finding {
	h := a.shown
	n := len(a.marks)
	cr := ff(math.Floor(a.cr*100)/100, 2)
	if a.text {
		need := "text needs 4.5:1"
		if a.large {
			need = "large-scale text (24 px, or 18.67 px bold) needs 3:1"
		}
		return Finding{ID: "text-contrast-low", Severity: Warning, Marks: a.marks,
			Message:  itoa(n) + " text " + plural(n, "label", "labels") + " in " + h + " " + plural(n, "is", "are") + " hard to read against the background for readers with low vision or on a bright screen. Darken " + plural(n, "it", "them") + ".",
			Evidence: cr + ":1 against the background; " + need + ".",
			Source:   srcText}
	}
	sev, why := Error, " Darken "+plural(n, "it", "them")+", or label the marks directly."
	if a.context != "" {
		sev, why = Warning, a.context
	}
	return Finding{ID: "mark-contrast-low", Severity: sev, Marks: a.marks,
		Message:  itoa(n) + " " + plural(n, "mark", "marks") + " in " + h + " " + plural(n, "is", "are") + " faint against the background: readers with low vision or on a bright screen may miss " + plural(n, "it", "them") + "." + why,
		Evidence: cr + ":1 against the background; graphics needed to understand a chart need 3:1.",
		Source:   srcContrast}
}

// categoryFindings checks the categorical colours: how many, whether they
// are the only cue, and which merge for readers with CVD.
func categoryFindings(in Input, p Params, res *Result) []Finding {
	var out []Finding
	cols, nShapes := categoryColours(in, p)
	if len(cols) < 2 || len(cols) > 20 {
		return nil // one colour, or a continuous ramp
	}
	// Noticeably different categories for normal vision.
	distinct := 0
	for a := range cols {
		alone := true
		for b := 0; b < a; b++ {
			if !colour.Noticeable(colour.SRGBToLab(cols[a].c), colour.SRGBToLab(cols[b].c), cols[a].nd) {
				alone = false
			}
		}
		if alone {
			distinct++
		}
	}
	if distinct > p.MaxHues {
		out = append(out, Finding{ID: "too-many-hues", Severity: Warning,
			Message:  "Readers will struggle to tell the categories apart and to match them to a legend: there are too many colours. Merge categories, or label them directly.",
			Evidence: itoa(distinct) + " distinguishable colours as categories; beyond " + itoa(p.MaxHues) + " they are hard to tell apart.",
			Source:   srcHues})
	}
	// Categories, not a highlight: at least two colours with two or more
	// marks each.
	multi := 0
	for _, c := range cols {
		if len(c.marks) >= 2 {
			multi++
		}
	}
	if distinct >= 2 && multi >= 2 && nShapes == 1 && !in.Labelled && !luminanceApart(cols) {
		// SC 1.4.1: colour alone, unless the colours also differ by 3:1.
		out = append(out, Finding{ID: "colour-only-categories", Severity: Warning,
			Message:  "Readers who cannot tell these colours apart lose the categories: colour is the only thing that tells them apart. Add shapes, patterns or direct labels.",
			Evidence: "No shape, pattern or direct label repeats the distinction, and the colours do not differ by 3:1 in luminance.",
			Source:   srcColour})
	}
	out = mergedForCVD(cols, p, out)
	return legendFindings(in, p, out)
}

// category is one colour of the main kind of mark, with its marks and
// the noticeable difference at their size.
type category struct {
	c     colour.SRGB
	shown string // as authored (Mark.Shown) for its first mark
	marks []int
	nd    [3]float64
}

// categoryColours lists the colours of the commonest kind of mark (the
// colour of a connecting line is no category of the dots it joins), and
// counts that kind's shapes.
func categoryColours(in Input, p Params) ([]*category, int) {
	kinds := newIndexer[string]()
	var kindCount []int
	for i := range in.Marks {
		if m := &in.Marks[i]; m.Kind != "text" {
			k := kinds.of(m.Kind)
			if k == len(kindCount) {
				kindCount = append(kindCount, 0)
			}
			kindCount[k]++
		}
	}
	main, mainN := "", 0
	for k, n := range kindCount {
		if name := kinds.keys[k]; n > mainN || n == mainN && name < main {
			main, mainN = name, n
		}
	}
	colours := newIndexer[colour.SRGB]()
	var cols []*category
	shapes := newIndexer[string]()
	for i := range in.Marks {
		m := &in.Marks[i]
		if m.Kind != main {
			continue
		}
		shapes.of(m.Shape)
		c := colours.of(m.Colour)
		if c == len(cols) {
			cols = append(cols, &category{c: m.Colour, shown: m.Shown(), nd: p.ND.For(m.Type, m.MinPx, m.MaxPx)})
		}
		cols[c].marks = append(cols[c].marks, i)
	}
	return cols, len(shapes.keys)
}

// luminanceApart says whether every pair of colours differs by 3:1.
func luminanceApart(cols []*category) bool {
	for a := range cols {
		for b := a + 1; b < len(cols); b++ {
			if colour.ContrastRatio(cols[a].c, cols[b].c) < 3 {
				return false
			}
		}
	}
	return true
}

// mergedForCVD finds, per CVD type, the categories that are noticeably
// different for normal vision and not for that type.
func mergedForCVD(cols []*category, p Params, out []Finding) []Finding {
	for _, v := range Visions[1:] {
		var pairs []string
		merged := make([]bool, len(cols))
		for a := range cols {
			for b := a + 1; b < len(cols); b++ {
				la, lb := colour.SRGBToLab(cols[a].c), colour.SRGBToLab(cols[b].c)
				nd := cols[a].nd
				if !colour.Noticeable(la, lb, nd) {
					continue
				}
				sa := colour.SRGBToLab(colour.Simulate(v, p.Severity, cols[a].c))
				sb := colour.SRGBToLab(colour.Simulate(v, p.Severity, cols[b].c))
				if !colour.Noticeable(sa, sb, nd) {
					pairs = append(pairs, cols[a].shown+" and "+cols[b].shown)
					merged[a], merged[b] = true, true
				}
			}
		}
		if len(pairs) > 0 {
			out = append(out, Finding{ID: "categories-merge-cvd", Severity: Warning, Marks: categoryMarks(cols, merged),
				Message:  capital(readers(v)) + " see " + strings.Join(pairs, "; ") + " as the same colour, so they cannot tell those categories apart. Change one colour of each pair in lightness, or label the categories.",
				Evidence: "Under one noticeable difference apart at this mark size in the simulation of " + v.String() + " vision.",
				Source:   srcCVD + "; " + srcND})
		}
	}
	return out
}

// legendFindings finds, per vision type, legend swatches of one shape
// whose colours cannot be told apart.
func legendFindings(in Input, p Params, out []Finding) []Finding {
	for _, v := range Visions {
		var pairs []string
		for a := range in.Legend {
			for b := a + 1; b < len(in.Legend); b++ {
				ma, mb := in.Legend[a], in.Legend[b]
				nd := p.ND.For(ma.Type, ma.MinPx, ma.MaxPx)
				sa := colour.SRGBToLab(colour.Simulate(v, p.Severity, ma.Colour))
				sb := colour.SRGBToLab(colour.Simulate(v, p.Severity, mb.Colour))
				if ma.Colour != mb.Colour && ma.Shape == mb.Shape && !colour.Noticeable(sa, sb, nd) {
					pairs = append(pairs, ma.Shown()+" and "+mb.Shown())
				}
			}
		}
		if len(pairs) > 0 {
			out = append(out, Finding{ID: "legend-entries-merge", Severity: Warning,
				Message:  capital(readers(v)) + " cannot match the legend entries " + strings.Join(pairs, "; ") + " to the data: the swatches look alike to them. Change one colour of each pair in lightness, or label the data directly.",
				Evidence: "Under one noticeable difference apart at the swatches' size in the simulation of " + v.String() + " vision.",
				Source:   srcCVD + "; " + srcND})
		}
	}
	return out
}

func groupingFindings(res *Result) []Finding {
	var out []Finding
	important := map[[2]Cue]bool{
		{CueProximity, CueColour}: true, {CueColour, CueConnected}: true, {CueProximity, CueConnected}: true,
		{CueColour, CueShape}: true, {CueProximity, CueShape}: true,
	}
	for _, a := range res.Groups.Agreements {
		if !important[[2]Cue{a.A, a.B}] {
			continue
		}
		switch a.Relation {
		case "conflict":
			out = append(out, Finding{ID: "grouping-conflict", Severity: Warning,
				Message:  "Readers see two competing structures: the marks that look alike by " + string(a.A) + " are not the ones that group by " + string(a.B) + ". Make the two cues tell the same story, or drop one.",
				Evidence: "Adjusted Rand index " + ff(a.ARI, 2) + " between the two groupings (1 the same, 0 no more than chance).",
				Source:   srcGroup})
		case "agree":
			out = append(out, Finding{ID: "grouping-agrees", Severity: Info,
				Message:  "The groups that " + string(a.A) + " and " + string(a.B) + " make are the same: the two cues tell one story.",
				Evidence: "Adjusted Rand index " + ff(a.ARI, 2) + " between the two groupings.",
				Source:   srcGroup})
		}
	}
	return out
}

// categoryMarks lists, ascending, the marks of the categories flagged in
// which (the categories' lists are ascending and share no mark): a pass
// over a bitmap rather than a sort of every pair's marks.
func categoryMarks(cols []*category, which []bool) []int {
	end, n := 0, 0
	for c, ok := range which {
		if m := cols[c].marks; ok && len(m) > 0 {
			end, n = max(end, m[len(m)-1]+1), n+len(m)
		}
	}
	in := make([]bool, end)
	for c, ok := range which {
		if ok {
			for _, i := range cols[c].marks {
				in[i] = true
			}
		}
	}
	out := make([]int, 0, n)
	for i, ok := range in {
		if ok {
			out = append(out, i)
		}
	}
	return out
}

func dedupe(v []int) []int {
	sort.Ints(v)
	out := v[:0]
	for i, x := range v {
		if i == 0 || x != v[i-1] {
			out = append(out, x)
		}
	}
	return out
}

// maxAdjacentPairs bounds the edge comparisons of adjacentFindings, so a
// chart of many bars on one line stays fast; past it the rest are not
// compared.
const maxAdjacentPairs = 1 << 20

// adjacentFindings finds touching bars (stacked segments, bars drawn edge
// to edge) whose fills differ by less than 3:1: SC 1.4.11 asks graphics
// to contrast with adjacent colours, unless a separating line that
// contrasts with both sits between them.
func adjacentFindings(in Input) []Finding {
	pairs := touchingBars(in.Marks)
	type agg struct {
		marks []int
		cr    float64
		a, b  string
	}
	byColours := map[[2]string]*agg{}
	var keys [][2]string
	for _, pr := range pairs {
		a, b := &in.Marks[pr[0]], &in.Marks[pr[1]]
		if a.Colour == b.Colour || separated(a, b) {
			continue
		}
		cr := colour.ContrastRatio(a.Colour, b.Colour)
		if cr >= colour.NonTextContrast {
			continue
		}
		k := [2]string{a.Shown(), b.Shown()}
		if k[1] < k[0] {
			k[0], k[1] = k[1], k[0]
		}
		g, ok := byColours[k]
		if !ok {
			g = &agg{cr: cr, a: k[0], b: k[1]}
			byColours[k] = g
			keys = append(keys, k)
		}
		g.marks = append(g.marks, pr[0], pr[1])
	}
	var out []Finding
	for _, k := range keys {
		g := byColours[k]
		out = append(out, Finding{ID: "adjacent-contrast-low", Severity: Warning, Marks: dedupe(g.marks),
			Message:  "Where marks in " + g.a + " and " + g.b + " touch, readers with low vision may not see where one ends and the other begins. Add a separating line (a white stroke), or make the colours differ more in lightness.",
			Evidence: ff(math.Floor(g.cr*100)/100, 2) + ":1 between them; touching parts of a chart need 3:1, or a separating line that contrasts with both.",
			Source:   srcContrast + " (adjacent colours)"})
	}
	return out
}

// separated says whether either mark's outline contrasts by 3:1 with both
// fills: a separating line between them.
func separated(a, b *Mark) bool {
	for _, m := range []*Mark{a, b} {
		if m.HasOutline && colour.ContrastRatio(m.Outline, a.Colour) >= colour.NonTextContrast &&
			colour.ContrastRatio(m.Outline, b.Colour) >= colour.NonTextContrast {
			return true
		}
	}
	return false
}

// touchingBars lists the pairs of bars that share an edge (within half a
// pixel) along more than a pixel: one's right edge on the other's left, or
// one's bottom on the other's top.
func touchingBars(marks []Mark) [][2]int {
	type edge struct {
		i      int
		lo, hi float64
	}
	key := func(v float64) int64 { return int64(math.Round(v * 2)) }
	rights, lefts := map[int64][]edge{}, map[int64][]edge{}
	bottoms, tops := map[int64][]edge{}, map[int64][]edge{}
	for i := range marks {
		m := &marks[i]
		if m.Kind != "bar" || !(m.Box[2] > 0 && m.Box[3] > 0) {
			continue
		}
		x0, y0, x1, y1 := m.Box[0], m.Box[1], m.Box[0]+m.Box[2], m.Box[1]+m.Box[3]
		rights[key(x1)] = append(rights[key(x1)], edge{i, y0, y1})
		lefts[key(x0)] = append(lefts[key(x0)], edge{i, y0, y1})
		bottoms[key(y1)] = append(bottoms[key(y1)], edge{i, x0, x1})
		tops[key(y0)] = append(tops[key(y0)], edge{i, x0, x1})
	}
	var out [][2]int
	budget := maxAdjacentPairs
	match := func(from, to map[int64][]edge) {
		for k, es := range from {
			for dk := int64(-1); dk <= 1; dk++ {
				for _, a := range es {
					for _, b := range to[k+dk] {
						if budget--; budget < 0 {
							return
						}
						if a.i != b.i && min(a.hi, b.hi)-max(a.lo, b.lo) > 1 {
							out = append(out, [2]int{a.i, b.i})
						}
					}
				}
			}
		}
	}
	match(rights, lefts)
	match(bottoms, tops)
	sort.Slice(out, func(i, j int) bool { return out[i][0] < out[j][0] || out[i][0] == out[j][0] && out[i][1] < out[j][1] })
	return out
}

// rivalFindings names what competes with an emphasis that pops: other
// elements as colourful as it, which a reader's eye may reach first.
func rivalFindings(in Input, res *Result) []Finding {
	n := len(res.Rivals)
	if n == 0 {
		return nil
	}
	count := newIndexer[string]()
	var kinds []int
	var shown []string
	for _, i := range res.Rivals {
		k := count.of(in.Marks[i].Kind)
		if k == len(kinds) {
			kinds = append(kinds, 0)
		}
		kinds[k]++
		if s := in.Marks[i].Shown(); len(shown) < 3 && !slices.Contains(shown, s) {
			shown = append(shown, s)
		}
	}
	var what []string
	for k, c := range kinds {
		what = append(what, itoa(c)+" "+count.keys[k])
	}
	return []Finding{{ID: "emphasis-rivalled", Severity: Warning, Marks: res.Rivals,
		Message:  "A reader's eye may go first to " + plural(n, "another element", itoa(n)+" other elements") + " (" + strings.Join(what, ", ") + ", in " + strings.Join(shown, ", ") + ") rather than to the highlight: " + plural(n, "it catches", "they catch") + " the eye by colour too. Give " + plural(n, "it", "them") + " a quieter colour, or the highlight's own colour if " + plural(n, "it belongs", "they belong") + " to it.",
		Evidence: "In the chart seen as one display, " + plural(n, "it pops", "they pop") + " by hue with at least half the highlight's strength.",
		Source:   srcScene}}
}

// extremeFindings notes the data extremes: marks that stand out only by
// the value they encode. A reader looking for the highlight is not pulled
// to the longest bar the way a colour singleton pulls; the extreme is the
// data speaking, worth knowing but no rival to the emphasis.
func extremeFindings(in Input, res *Result) []Finding {
	if len(res.Extremes) == 0 {
		return nil
	}
	n := len(res.Extremes)
	return []Finding{{ID: "data-extremes", Severity: Info, Marks: res.Extremes,
		Message:  itoa(n) + " " + plural(n, "mark catches", "marks catch") + " the eye by the value " + plural(n, "it shows", "they show") + " (such as the longest or shortest bar, or a point far from the others): that is the data speaking, not a highlight. Nothing to change unless it competes with what the chart means to show.",
		Evidence: plural(n, "It stands", "They stand") + " out only in the channel that encodes the data, and " + plural(n, "is", "are") + " not counted as emphasis.",
		Source:   srcExtremes}}
}
