package main

import (
	"encoding/json"
	"flag"
	"fmt"
	"io"
	"os"
	"strings"

	"standout/dom"
	"standout/internal/report"
	"standout/perception"
	"standout/perception/colour"
)

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
	opt := report.DefaultOptions
	opt.Params.Severity = *severity
	opt.Params.ND.Viewing = colour.Viewing{DistanceCM: *distance, CSSPxPerInch: *ppi}
	if e := strings.TrimSpace(*emphasis); e != "" {
		if looksLikeIDs(e) {
			opt.IDs = map[string]bool{}
			for _, id := range strings.Split(e, ",") {
				opt.IDs[strings.TrimSpace(id)] = true
			}
		} else {
			opt.Selector = e
		}
	}
	rep := report.Report{Schema: "standout-report", Version: report.Version, Caution: report.Caution}
	var all [][]*dom.Chart
	for _, name := range fs.Args() {
		f, err := os.Open(name)
		if err != nil {
			fmt.Fprintf(stderr, "standout check: %v\n", err)
			return 2
		}
		rp, charts, err := report.CheckFile(name, f, opt)
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
			report.WriteText(stdout, p, all[i])
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
