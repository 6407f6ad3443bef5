package main

import (
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"standout/perception/colour"
	"standout/static"
)

// PaletteVersion is the version of the palette --json document, and
// PaletteMinor counts the changes within it (minor 1: colours, spelled as
// everywhere else, with the former colors kept for this version).
const (
	PaletteVersion = 1
	PaletteMinor   = 1
)

type paletteColor struct {
	Input    string  `json:"input"`
	Hex      string  `json:"hex"`
	Contrast float64 `json:"contrast"`
	// MeetsNonText is SC 1.4.11: contrast ≥ 3 against the background.
	MeetsNonText bool `json:"meetsNonText"`
}

type visionPair struct {
	DeltaE2000 float64 `json:"deltaE2000"`
	Noticeable bool    `json:"noticeable"`
}

type palettePair struct {
	A      int                   `json:"a"`
	B      int                   `json:"b"`
	Vision map[string]visionPair `json:"vision"`
}

type paletteReport struct {
	Schema     string         `json:"schema"`
	Version    int            `json:"version"`
	Minor      int            `json:"minor"`
	Background string         `json:"background"`
	Severity   float64        `json:"severity"`
	Mark       string         `json:"mark"`
	SizePx     float64        `json:"sizePx"`
	Colors     []paletteColor `json:"colours"`
	// FormerColors repeats Colors under the key version 1 first used;
	// it goes in version 2.
	FormerColors []paletteColor `json:"colors"`
	Pairs        []palettePair  `json:"pairs"`
	// Collapsed lists, per vision type, the pairs that are not noticeably
	// different.
	Collapsed map[string][][2]int `json:"collapsed"`
	Caution   string              `json:"caution"`
}

var visions = []colour.Deficiency{colour.Normal, colour.Protan, colour.Deutan, colour.Tritan, colour.Achromat}

func markType(s string) (colour.MarkType, error) {
	switch s {
	case "point":
		return colour.Point, nil
	case "bar":
		return colour.Bar, nil
	case "line":
		return colour.Line, nil
	case "area":
		return colour.Area, nil
	}
	return 0, fmt.Errorf("--mark %q: want point, bar, line or area", s)
}

// checkPalette computes the palette report.
func checkPalette(inputs []string, bg colour.SRGB, severity float64, mark colour.MarkType, markName string, size float64, model colour.NDModel) (*paletteReport, error) {
	var cols []colour.SRGB
	rep := &paletteReport{Schema: "standout-palette", Version: PaletteVersion, Minor: PaletteMinor, Background: bg.Hex(), Severity: severity,
		Mark: markName, SizePx: size, Collapsed: map[string][][2]int{}, Caution: caution}
	for _, in := range inputs {
		c, err := static.ParseColor(in)
		if err != nil {
			return nil, fmt.Errorf("colour %q: not a CSS colour", in)
		}
		// Translucent colours are judged as painted over the background.
		s := colour.Over(c, 1, bg)
		cols = append(cols, s)
		cr := colour.ContrastRatio(s, bg)
		rep.Colors = append(rep.Colors, paletteColor{Input: in, Hex: s.Hex(), Contrast: cr, MeetsNonText: cr >= colour.NonTextContrast})
	}
	nd := model.For(mark, size, size*lengthRatio(mark))
	for _, v := range visions {
		rep.Collapsed[v.String()] = [][2]int{}
	}
	for i := range cols {
		for j := i + 1; j < len(cols); j++ {
			p := palettePair{A: i, B: j, Vision: map[string]visionPair{}}
			for _, v := range visions {
				a := colour.SRGBToLab(colour.Simulate(v, severity, cols[i]))
				b := colour.SRGBToLab(colour.Simulate(v, severity, cols[j]))
				vp := visionPair{DeltaE2000: colour.DeltaE2000(a, b), Noticeable: colour.Noticeable(a, b, nd)}
				p.Vision[v.String()] = vp
				if !vp.Noticeable {
					rep.Collapsed[v.String()] = append(rep.Collapsed[v.String()], [2]int{i, j})
				}
			}
			rep.Pairs = append(rep.Pairs, p)
		}
	}
	rep.FormerColors = rep.Colors
	return rep, nil
}

// lengthRatio is the long:short ratio assumed for a mark type in a
// palette check (bars are taken as 5:1).
func lengthRatio(m colour.MarkType) float64 {
	if m == colour.Bar {
		return 5
	}
	return 1
}

func runPalette(args []string, stdout, stderr io.Writer) int {
	fs := newFlags("palette", "standout palette [flags] COLOUR COLOUR…",
		"0 checked and --fail-on not met; 1 --fail-on met; 2 bad usage or a colour that is not CSS", stdout, stderr)
	bgFlag := fs.String("background", "white", "background `colour` for contrast")
	asJSON := fs.Bool("json", false, "write the versioned JSON report")
	severity := fs.Float64("cvd-severity", 1, "CVD severity within [0, 1], as in check")
	fs.Float64Var(severity, "severity", 1, "the former name of --cvd-severity, kept for one version")
	mark := fs.String("mark", "point", "mark type the colours will paint: point, bar, line or area")
	size := fs.Float64("size", 10, "mark size in CSS px (smallest dimension; stroke width for lines)")
	failOn := fs.String("fail-on", "", "exit 1 when: normal (a pair collapses for normal vision), cvd (for any vision type), contrast (a colour below 3:1), any")
	distance := fs.Float64("distance-cm", colour.DefaultViewing.DistanceCM, "viewing distance in cm")
	ppi := fs.Float64("px-per-inch", colour.DefaultViewing.CSSPxPerInch, "CSS px per physical inch")
	if code, ok := fs.parse(args); !ok {
		return code
	}
	if fs.NArg() < 2 {
		fs.Usage()
		fmt.Fprintln(stderr, "standout palette: give at least two colours")
		return 2
	}
	bgc, mt, err := paletteInputs(*bgFlag, *severity, *size, *distance, *ppi, *mark, *failOn)
	if err != nil {
		fmt.Fprintln(stderr, "standout palette:", err)
		return 2
	}
	model := colour.DefaultND
	model.Viewing = colour.Viewing{DistanceCM: *distance, CSSPxPerInch: *ppi}
	bg := colour.Over(bgc, 1, colour.SRGB{R: 1, G: 1, B: 1})
	rep, err := checkPalette(fs.Args(), bg, *severity, mt, *mark, *size, model)
	if err != nil {
		fmt.Fprintln(stderr, "standout palette:", err)
		return 2
	}
	if *asJSON {
		enc := json.NewEncoder(stdout)
		enc.SetIndent("", "  ")
		if err := enc.Encode(rep); err != nil {
			fmt.Fprintln(stderr, "standout palette:", err)
			return 2
		}
	} else {
		writePaletteText(stdout, rep)
	}
	if paletteFails(rep, *failOn) {
		return 1
	}
	return 0
}

// paletteFails says whether the report meets --fail-on's condition.
func paletteFails(rep *paletteReport, failOn string) bool {
	lowContrast := false
	for _, c := range rep.Colors {
		if !c.MeetsNonText {
			lowContrast = true
		}
	}
	anyCVD := false
	for _, v := range visions {
		if len(rep.Collapsed[v.String()]) > 0 {
			anyCVD = true
		}
	}
	switch failOn {
	case "normal":
		return len(rep.Collapsed["normal"]) > 0
	case "cvd":
		return anyCVD
	case "contrast":
		return lowContrast
	case "any":
		return anyCVD || lowContrast
	}
	return false
}

// paletteInputs validates palette's flags: the background, the ranges of
// the numbers, the mark type and --fail-on.
func paletteInputs(bgFlag string, severity, size, distance, ppi float64, mark, failOn string) (colour.RGBA, colour.MarkType, error) {
	bgc, err := static.ParseColor(bgFlag)
	if err != nil {
		return bgc, 0, fmt.Errorf("--background %q is not a CSS colour", bgFlag)
	}
	if !(severity >= 0 && severity <= 1) {
		return bgc, 0, fmt.Errorf("--cvd-severity %v is outside [0, 1]", severity)
	}
	if !(size > 0) || !(distance > 0) || !(ppi > 0) {
		return bgc, 0, fmt.Errorf("--size, --distance-cm and --px-per-inch must be positive")
	}
	mt, err := markType(mark)
	if err != nil {
		return bgc, 0, err
	}
	switch failOn {
	case "", "normal", "cvd", "contrast", "any":
	default:
		return bgc, 0, fmt.Errorf("--fail-on %q: want normal, cvd, contrast or any", failOn)
	}
	return bgc, mt, nil
}

func writePaletteText(w io.Writer, r *paletteReport) {
	fmt.Fprintf(w, "Palette of %d colours on %s, for %s marks of %s px (CVD severity %.2g)\n\n", len(r.Colors), r.Background, r.Mark, strconv.FormatFloat(r.SizePx, 'g', 4, 64), r.Severity)
	fmt.Fprintln(w, "Contrast against the background (WCAG 2.x; graphics need 3:1):")
	for i, c := range r.Colors {
		verdict := "meets 3:1"
		if !c.MeetsNonText {
			verdict = "BELOW 3:1"
		}
		fmt.Fprintf(w, "  %2d  %-22s %s  %5.2f:1  %s\n", i, clipS(c.Input, 22), c.Hex, math.Floor(c.Contrast*100)/100, verdict)
	}
	fmt.Fprintln(w, "\nCIEDE2000 between pairs, as each reader sees them (* = not noticeably different at this size):")
	fmt.Fprintf(w, "  %-7s", "pair")
	for _, v := range visions {
		fmt.Fprintf(w, " %9s", v)
	}
	fmt.Fprintln(w)
	for _, p := range r.Pairs {
		fmt.Fprintf(w, "  %2d–%-3d ", p.A, p.B)
		for _, v := range visions {
			vp := p.Vision[v.String()]
			mark := " "
			if !vp.Noticeable {
				mark = "*"
			}
			fmt.Fprintf(w, " %8.1f%s", vp.DeltaE2000, mark)
		}
		fmt.Fprintln(w)
	}
	fmt.Fprintln(w)
	any := false
	for _, v := range visions {
		c := r.Collapsed[v.String()]
		if len(c) == 0 {
			continue
		}
		any = true
		var ps []string
		for _, p := range c {
			ps = append(ps, fmt.Sprintf("%s/%s", r.Colors[p[0]].Hex, r.Colors[p[1]].Hex))
		}
		fmt.Fprintf(w, "Collapse for %s readers: %s\n", v, strings.Join(ps, ", "))
	}
	if !any {
		fmt.Fprintln(w, "Every pair stays noticeably different for every vision type modelled.")
	}
}

func clipS(s string, n int) string {
	if len([]rune(s)) <= n {
		return s
	}
	return string([]rune(s)[:n-1]) + "…"
}
