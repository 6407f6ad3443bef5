package main

import (
	"encoding/json"
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"strings"
	"time"

	"standout/internal/browser"
	"standout/internal/report"
	"standout/marks"
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
	useBrowser := fs.Bool("browser", false, "load each page or file in headless Chromium and read it as rendered")
	chromium := fs.String("chromium", "", "path to the Chromium binary (default: $STANDOUT_CHROMIUM, then known paths)")
	tabs := fs.Int("tabs", 2, "pages loaded at once with --browser")
	pngDir := fs.String("png", "", "with --browser, write an annotated PNG per chart into this folder")
	mdDir := fs.String("md", "", "write a Markdown report per page into this folder")
	timeout := fs.Duration("timeout", 60*time.Second, "the longest one page may take to load and check")
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: standout check [flags] FILE|URL…")
		fs.PrintDefaults()
	}
	if err := parseFlags(fs, args); err != nil {
		return 2
	}
	if fs.NArg() == 0 {
		fs.Usage()
		return 2
	}
	if *pngDir != "" && !*useBrowser {
		fmt.Fprintln(stderr, "standout check: --png needs --browser (the static reader has no rendering)")
		return 2
	}
	if *timeout <= 0 {
		fmt.Fprintln(stderr, "standout check: --timeout must be positive, for example 30s or 2m")
		return 2
	}
	if *tabs < 1 || *tabs > 32 {
		fmt.Fprintln(stderr, "standout check: --tabs must be within 1–32")
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
	var all [][]*marks.Chart
	var shots [][]byte
	var failed []string
	progress := newProgress(stderr, len(fs.Args()))
	if *useBrowser {
		exe, err := browser.Find(*chromium)
		if err != nil {
			fmt.Fprintln(stderr, "standout check:", err)
			return 2
		}
		local, err := newLocalPages()
		if err != nil {
			fmt.Fprintln(stderr, "standout check:", err)
			return 2
		}
		defer local.Close()
		// Pages that cannot be found are named; the others are read.
		var urls, names []string
		for _, a := range fs.Args() {
			u := a
			if !webURL(a) {
				if u, err = local.url(a); err != nil {
					failed = append(failed, fmt.Sprintf("%s: %v", a, err))
					continue
				}
			}
			urls, names = append(urls, u), append(names, a)
		}
		results, err := readInBrowser(exe, urls, browser.ReadOptions{Tabs: *tabs, Screenshot: *pngDir != "", Emphasis: opt.Selector, Timeout: *timeout, Progress: func(done, total int, r *browser.PageResult) {
			progress.step(done, r.URL, r.Err)
		}}, stderr)
		if err != nil {
			fmt.Fprintln(stderr, "standout check:", err)
			return 2
		}
		for i, r := range results {
			if r.Err != nil {
				failed = append(failed, fmt.Sprintf("%s: %v", names[i], r.Err))
				continue
			}
			rp, charts, err := pageFromRead(names[i], r, opt)
			if err != nil {
				failed = append(failed, fmt.Sprintf("%s: %v", names[i], err))
				continue
			}
			rep.Pages = append(rep.Pages, rp)
			all = append(all, charts)
			shots = append(shots, r.Screenshot)
		}
	} else {
		for i, name := range fs.Args() {
			rp, charts, err := checkOneFile(name, opt, *timeout)
			progress.step(i+1, name, err)
			if err != nil {
				failed = append(failed, fmt.Sprintf("%s: %v", name, err))
				continue
			}
			rep.Pages = append(rep.Pages, rp)
			all = append(all, charts)
			shots = append(shots, nil)
		}
	}
	progress.done()
	rep.Errors = failed
	if *pngDir != "" || *mdDir != "" {
		if err := writeArtifacts(&rep, shots, *pngDir, *mdDir); err != nil {
			fmt.Fprintln(stderr, "standout check:", err)
			return 2
		}
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
	summary := stdout
	if *asJSON {
		summary = stderr
	}
	if len(fs.Args()) > 1 || len(failed) > 0 {
		writeSummary(summary, &rep, len(fs.Args()))
	}
	for _, f := range failed {
		fmt.Fprintf(stderr, "standout check: %s\n", f)
	}
	if len(failed) > 0 {
		return 2
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

// checkOneFile checks one file with the static reader within timeout.
func checkOneFile(name string, opt report.Options, timeout time.Duration) (report.Page, []*marks.Chart, error) {
	if webURL(name) {
		return report.Page{}, nil, errors.New("is a URL; the static reader reads files: add --browser to load it in headless Chromium")
	}
	f, err := os.Open(name)
	if err != nil {
		return report.Page{}, nil, err
	}
	defer f.Close()
	if st, err := f.Stat(); err == nil && st.IsDir() {
		return report.Page{}, nil, errors.New("is a folder, not a page")
	}
	opt.Deadline = time.Now().Add(timeout)
	return report.CheckFile(name, f, opt)
}

// looksLikeIDs tells mark ids ("svg0/g1/rect2,svg0/g1/rect3") from a CSS
// selector: ids are paths with slashes and no selector punctuation.
func looksLikeIDs(s string) bool {
	return strings.Contains(s, "/") && !strings.ContainsAny(s, "#.[]:> ")
}
