package main

import (
	"encoding/json"
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"time"

	"standout/internal/browser"
	"standout/internal/report"
	"standout/perception"
	"standout/perception/colour"
	"standout/static"
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
	failRank := -1
	switch *failOn {
	case "":
	case "info", "warning", "error":
		failRank = perception.Severity(*failOn).Rank()
	default:
		fmt.Fprintf(stderr, "standout check: --fail-on %q: want info, warning or error\n", *failOn)
		return 2
	}
	set := report.Settings{Severity: *severity, DistanceCM: *distance, PxPerInch: *ppi}
	set.EmphasisIDs, set.EmphasisSelector = report.SplitEmphasis(*emphasis)
	opt, err := set.Options()
	if err != nil {
		fmt.Fprintln(stderr, "standout check:", err)
		return 2
	}
	rep := report.Report{Schema: "standout-report", Version: report.Version, Caution: report.Caution}
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
			rp, err := pageFromRead(names[i], r, opt)
			if err != nil {
				failed = append(failed, fmt.Sprintf("%s: %v", names[i], err))
				continue
			}
			rep.Pages = append(rep.Pages, rp)
			shots = append(shots, r.Screenshot)
		}
	} else {
		for i, name := range fs.Args() {
			rp, err := checkOneFile(name, opt, *timeout)
			progress.step(i+1, name, err)
			if err != nil {
				failed = append(failed, fmt.Sprintf("%s: %v", name, err))
				continue
			}
			rep.Pages = append(rep.Pages, rp)
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
		for _, p := range rep.Pages {
			writeText(stdout, p)
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
func checkOneFile(name string, opt report.Options, timeout time.Duration) (report.Page, error) {
	if webURL(name) {
		return report.Page{}, errors.New("is a URL; the static reader reads files: add --browser to load it in headless Chromium")
	}
	f, err := os.Open(name)
	if err != nil {
		return report.Page{}, err
	}
	defer f.Close()
	if st, err := f.Stat(); err == nil && st.IsDir() {
		return report.Page{}, errors.New("is a folder, not a page")
	}
	opt.Deadline = time.Now().Add(timeout)
	return checkReader(name, f, opt)
}

// checkReader builds, walks and analyses every chart of one file with the
// static reader.
func checkReader(name string, r io.Reader, opt report.Options) (report.Page, error) {
	page, err := static.Build(r, static.Options{Source: name, Select: opt.Selector, Deadline: opt.Deadline})
	if err != nil {
		return report.Page{}, err
	}
	return report.FromSnapshots(name, page.Charts, page.Problems, opt)
}
