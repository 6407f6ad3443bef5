package main

import (
	"encoding/json"
	"flag"
	"fmt"
	"io"
	"math"
	"os"
	"sort"
	"strings"

	"standout/dom"
	"standout/perception"
	"standout/perception/colour"
)

// ReportVersion is the version of the check --json document (see
// docs/report.md).
const ReportVersion = 1

type reportMark struct {
	ID          string     `json:"id"`
	Kind        string     `json:"kind"`
	Shape       string     `json:"shape"`
	Fill        *string    `json:"fill"`
	Stroke      *string    `json:"stroke"`
	FillStops   []string   `json:"fillStops,omitempty"`
	Opacity     float64    `json:"opacity"`
	FillOpacity float64    `json:"fillOpacity"`
	BBox        [4]float64 `json:"bbox"`
	Area        float64    `json:"area"`
	Angle       float64    `json:"angle"`
	Size        float64    `json:"size"`
	Text        string     `json:"text,omitempty"`
	Label       string     `json:"label,omitempty"`
	// Analysis (absent for legend swatches).
	Verdict     string                  `json:"verdict,omitempty"`
	Channels    []string                `json:"channels,omitempty"`
	SearchSlope []float64               `json:"searchSlopeMsPerMark,omitempty"`
	SearchMs    []float64               `json:"searchMsEstimate,omitempty"`
	CVD         map[string]reportResult `json:"cvd,omitempty"`
}

type reportChart struct {
	Path       string          `json:"path"`
	IsChart    bool            `json:"isChart"`
	Reason     string          `json:"reason,omitempty"`
	Box        [4]float64      `json:"box"`
	Background string          `json:"background"`
	Marks      []reportMark    `json:"marks"`
	Legend     []reportMark    `json:"legend"`
	Furniture  map[string]int  `json:"furniture"`
	Problems   []string        `json:"problems"`
	Findings   []reportFinding `json:"findings"`
	Groups     *reportGroups   `json:"groups,omitempty"`
	Emphasis   *reportEmphasis `json:"emphasis,omitempty"`
}

type reportPage struct {
	Source   string        `json:"source"`
	Charts   []reportChart `json:"charts"`
	Problems []string      `json:"problems"`
}

type report struct {
	Schema  string       `json:"schema"`
	Version int          `json:"version"`
	Pages   []reportPage `json:"pages"`
	Caution string       `json:"caution"`
}

func r2(v float64) float64 { return math.Round(v*100) / 100 }

func hexPtr(v *uint32) *string {
	if v == nil {
		return nil
	}
	s := dom.Hex(*v)
	return &s
}

func toReportMark(m dom.Mark) reportMark {
	rm := reportMark{ID: m.ID, Kind: string(m.Kind), Shape: string(m.Shape), Fill: hexPtr(m.Fill), Stroke: hexPtr(m.Stroke),
		Opacity: r2(m.Opacity * paintAlpha(m)), FillOpacity: r2(m.FillOpacity), Area: r2(m.Area), Angle: r2(m.Angle), Size: r2(m.Size),
		Text: m.Text, Label: m.Label}
	for i, v := range m.BBox {
		rm.BBox[i] = r2(v)
	}
	for _, s := range m.FillStops {
		rm.FillStops = append(rm.FillStops, dom.Hex(s))
	}
	return rm
}

// paintAlpha is the alpha of the paint that shows the mark: the fill's when
// it has one, else the stroke's.
func paintAlpha(m dom.Mark) float64 {
	if m.Fill != nil && m.FillOpacity > 0 {
		return m.FillOpacity
	}
	if m.Stroke != nil {
		return m.StrokeOpacity
	}
	return 1
}

// checkOptions are the analysis settings of a check.
type checkOptions struct {
	selector string
	ids      map[string]bool
	params   perception.Params
}

var defaultCheck = checkOptions{params: perception.DefaultParams}

// checkFile builds, walks and analyses every chart of one file.
func checkFile(name string, r io.Reader, opt checkOptions) (reportPage, []*dom.Chart, error) {
	page, err := dom.Build(r, dom.Options{Source: name, Select: opt.selector})
	if err != nil {
		return reportPage{}, nil, err
	}
	rp := reportPage{Source: name, Problems: nonNil(page.Problems), Charts: []reportChart{}}
	var charts []*dom.Chart
	for i := range page.Charts {
		ch, err := dom.Walk(&page.Charts[i])
		if err != nil {
			return reportPage{}, nil, err
		}
		charts = append(charts, ch)
		rc := reportChart{Path: ch.Path, IsChart: ch.IsChart, Reason: ch.Reason, Box: ch.Box,
			Background: dom.Hex(ch.Background), Marks: []reportMark{}, Legend: []reportMark{},
			Furniture: ch.Furniture, Problems: nonNil(ch.Problems)}
		for _, m := range ch.Marks {
			rc.Marks = append(rc.Marks, toReportMark(m))
		}
		for _, m := range ch.Legend {
			rc.Legend = append(rc.Legend, toReportMark(m))
		}
		rc.Findings = []reportFinding{}
		if ch.IsChart {
			res := perception.Analyse(toPerception(ch, opt.ids), opt.params)
			attachAnalysis(&rc, ch, res)
		}
		rp.Charts = append(rp.Charts, rc)
	}
	return rp, charts, nil
}

func nonNil(s []string) []string {
	if s == nil {
		return []string{}
	}
	return s
}

func runCheck(args []string, stdout, stderr io.Writer) int {
	fs := flag.NewFlagSet("check", flag.ContinueOnError)
	fs.SetOutput(stderr)
	asJSON := fs.Bool("json", false, "write the versioned JSON report")
	emphasis := fs.String("emphasis", "", "the intended emphasis: mark ids (comma-separated) or a CSS selector")
	severity := fs.Float64("cvd-severity", 1, "CVD severity within [0, 1] for the re-analysis")
	distance := fs.Float64("distance-cm", colour.DefaultViewing.DistanceCM, "viewing distance in cm")
	ppi := fs.Float64("px-per-inch", colour.DefaultViewing.CSSPxPerInch, "CSS px per physical inch")
	failOn := fs.String("fail-on", "", "exit 1 when a finding reaches this severity: info, warning or error")
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: standout check [flags] FILE…")
		fs.PrintDefaults()
	}
	if err := parseFlags(fs, args); err != nil {
		return 2
	}
	if fs.NArg() == 0 {
		fs.Usage()
		return 2
	}
	if !(*severity >= 0 && *severity <= 1) || !(*distance > 0) || !(*ppi > 0) {
		fmt.Fprintln(stderr, "standout check: --cvd-severity must be within [0, 1]; --distance-cm and --px-per-inch must be positive")
		return 2
	}
	failRank := -1
	switch *failOn {
	case "":
	case "info", "warning", "error":
		failRank = perception.Severity(*failOn).Rank()
	default:
		fmt.Fprintf(stderr, "standout check: --fail-on %q: want info, warning or error\n", *failOn)
		return 2
	}
	opt := defaultCheck
	opt.params.Severity = *severity
	opt.params.ND.Viewing = colour.Viewing{DistanceCM: *distance, CSSPxPerInch: *ppi}
	if e := strings.TrimSpace(*emphasis); e != "" {
		if looksLikeIDs(e) {
			opt.ids = map[string]bool{}
			for _, id := range strings.Split(e, ",") {
				opt.ids[strings.TrimSpace(id)] = true
			}
		} else {
			opt.selector = e
		}
	}
	rep := report{Schema: "standout-report", Version: ReportVersion, Caution: caution}
	var all [][]*dom.Chart
	for _, name := range fs.Args() {
		f, err := os.Open(name)
		if err != nil {
			fmt.Fprintf(stderr, "standout check: %v\n", err)
			return 2
		}
		rp, charts, err := checkFile(name, f, opt)
		f.Close()
		if err != nil {
			// No partial report: the run stops with the reason.
			fmt.Fprintf(stderr, "standout check: %s: %v\n", name, err)
			return 2
		}
		rep.Pages = append(rep.Pages, rp)
		all = append(all, charts)
	}
	if *asJSON {
		enc := json.NewEncoder(stdout)
		enc.SetIndent("", " ")
		if err := enc.Encode(rep); err != nil {
			fmt.Fprintln(stderr, "standout check:", err)
			return 2
		}
	} else {
		for i, p := range rep.Pages {
			writeMarksText(stdout, p, all[i])
		}
	}
	if failRank >= 0 {
		for _, p := range rep.Pages {
			for _, c := range p.Charts {
				for _, f := range c.Findings {
					if perception.Severity(f.Severity).Rank() >= failRank {
						return 1
					}
				}
			}
		}
	}
	return 0
}

// looksLikeIDs tells mark ids ("svg0/g1/rect2,svg0/g1/rect3") from a CSS
// selector: ids are paths with slashes and no selector punctuation.
func looksLikeIDs(s string) bool {
	return strings.Contains(s, "/") && !strings.ContainsAny(s, "#.[]:> ")
}

// writeMarksText lists each chart with its marks grouped by kind, shape and
// colour.
func writeMarksText(w io.Writer, p reportPage, charts []*dom.Chart) {
	fmt.Fprintf(w, "%s: %d drawing(s)\n", p.Source, len(p.Charts))
	for _, pr := range p.Problems {
		fmt.Fprintf(w, "  note: %s\n", pr)
	}
	for _, c := range p.Charts {
		if !c.IsChart {
			fmt.Fprintf(w, "  %s: not a chart (%s)\n", c.Path, c.Reason)
			continue
		}
		fmt.Fprintf(w, "  %s: %d data marks, %.0f×%.0f px on %s\n", c.Path, len(c.Marks), c.Box[2], c.Box[3], c.Background)
		type key struct{ kind, shape, fill, stroke string }
		groups := map[key]int{}
		for _, m := range c.Marks {
			k := key{m.Kind, m.Shape, "none", "none"}
			if m.Fill != nil {
				k.fill = *m.Fill
			}
			if m.Stroke != nil {
				k.stroke = *m.Stroke
			}
			groups[k]++
		}
		keys := make([]key, 0, len(groups))
		for k := range groups {
			keys = append(keys, k)
		}
		sort.Slice(keys, func(i, j int) bool {
			if groups[keys[i]] != groups[keys[j]] {
				return groups[keys[i]] > groups[keys[j]]
			}
			return fmt.Sprint(keys[i]) < fmt.Sprint(keys[j])
		})
		for _, k := range keys {
			fmt.Fprintf(w, "    %5d %-6s %-8s fill %-8s stroke %s\n", groups[k], k.kind, k.shape, k.fill, k.stroke)
		}
		if len(c.Legend) > 0 {
			fmt.Fprintf(w, "    legend: %d entries\n", len(c.Legend))
		}
		var furn []string
		for k, v := range c.Furniture {
			furn = append(furn, fmt.Sprintf("%s %d", k, v))
		}
		sort.Strings(furn)
		if len(furn) > 0 {
			fmt.Fprintf(w, "    set aside: %s\n", strings.Join(furn, ", "))
		}
		for _, pr := range c.Problems {
			fmt.Fprintf(w, "    note: %s\n", pr)
		}
		if sum := verdictSummary(c); sum != "" {
			fmt.Fprintf(w, "    at a glance: %s.\n", sum)
		}
		for _, f := range c.Findings {
			fmt.Fprintf(w, "    [%s] %s\n", f.Severity, f.Message)
			if f.Fix != nil {
				state := "checked: the emphasis then pops out for every vision type"
				if !f.Fix.Verified {
					state = "not enough on its own: colour alone cannot make it pop for every reader"
				}
				what := "recolour the emphasis"
				if f.Fix.Kind == "mute-others" {
					what = "mute the other marks"
				}
				fmt.Fprintf(w, "        fix: %s with `%s` (%s)\n", what, f.Fix.CSS, state)
			}
		}
	}
}

func fmtInt(n int) string { return fmt.Sprint(n) }
