package main

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"time"

	"standout/internal/browser"
	"standout/internal/report"
	"standout/perception"
	"standout/perception/colour"
	"standout/static"
)

// checkFlags are check's flags, parsed and validated.
type checkFlags struct {
	args               []string
	asJSON, useBrowser bool
	chromium           string
	tabs               int
	pngDir, mdDir      string
	timeout            time.Duration
	failRank           int // -1: never fail on findings
	opt                report.Options
	// views are the widths and schemes each page is read in (--widths,
	// --scheme); one zero view reads it as the browser is.
	views []browser.View
}

// parseCheckFlags reads check's flags; an error has been written to
// stderr when it returns nil.
func parseCheckFlags(args []string, stdout, stderr io.Writer) (*checkFlags, int) {
	fs := newFlags("check", "standout check [flags] FILE|URL…",
		"0 every page was checked and no finding reached --fail-on; 1 a finding reached --fail-on; 2 bad usage, or a page that could not be read or checked", stdout, stderr)
	cf := &checkFlags{failRank: -1}
	fs.BoolVar(&cf.asJSON, "json", false, "write the versioned JSON report")
	emphasis := fs.String("emphasis", "", "the intended emphasis: mark ids (comma-separated), a CSS selector, or box:x,y,w,h in page px (the marks it holds; in a chart drawn as pixels, where the eye should go first, or with --browser an element laid over it that the selector matches)")
	severity := fs.Float64("cvd-severity", 1, "CVD severity within [0, 1] for the re-analysis")
	distance := fs.Float64("distance-cm", colour.DefaultViewing.DistanceCM, "viewing distance in cm")
	ppi := fs.Float64("px-per-inch", colour.DefaultViewing.CSSPxPerInch, "CSS px per physical inch")
	failOn := fs.String("fail-on", "", "exit 1 when a finding reaches this severity: info, warning or error")
	fs.BoolVar(&cf.useBrowser, "browser", false, "load each page or file in headless Chromium and read it as rendered")
	fs.StringVar(&cf.chromium, "chromium", "", "path to the Chromium binary (default: $STANDOUT_CHROMIUM, then known paths)")
	fs.IntVar(&cf.tabs, "tabs", 2, "pages loaded at once with --browser")
	fs.StringVar(&cf.pngDir, "png", "", "with --browser, write an annotated PNG per chart into this folder")
	fs.StringVar(&cf.mdDir, "md", "", "write a Markdown report per page into this folder")
	fs.DurationVar(&cf.timeout, "timeout", 60*time.Second, "the longest one page may take to load and check")
	widths := fs.String("widths", "", "with --browser, viewport widths in CSS px to read each page at, comma-separated (e.g. 360,768,1280)")
	schemes := fs.String("scheme", "", "colour schemes to read each page in: light, dark or light,dark (the static reader resolves light-dark(), custom properties and prefers-color-scheme rules for each; --browser emulates the scheme)")
	if code, ok := fs.parse(args); !ok {
		return nil, code
	}
	var err error
	if cf.views, err = parseViews(*widths, *schemes); err != nil {
		fmt.Fprintln(stderr, "standout check:", err)
		return nil, 2
	}
	cf.args = fs.Args()
	bad := func(msg string) (*checkFlags, int) {
		fmt.Fprintln(stderr, "standout check:", msg)
		return nil, 2
	}
	switch {
	case fs.NArg() == 0:
		fs.Usage()
		return nil, 2
	case cf.pngDir != "" && !cf.useBrowser:
		return bad("--png needs --browser (the static reader has no rendering)")
	case *widths != "" && !cf.useBrowser:
		return bad("--widths needs --browser (the static reader has no viewport)")
	case cf.timeout <= 0:
		return bad("--timeout must be positive, for example 30s or 2m")
	case cf.tabs < 1 || cf.tabs > 32:
		return bad("--tabs must be within 1–32")
	}
	switch *failOn {
	case "":
	case "info", "warning", "error":
		cf.failRank = perception.Severity(*failOn).Rank()
	default:
		return bad(fmt.Sprintf("--fail-on %q: want info, warning or error", *failOn))
	}
	set := report.Settings{Severity: *severity, DistanceCM: *distance, PxPerInch: *ppi}
	if b, isBox, err := report.ParseBox(*emphasis); isBox {
		if err != nil {
			return bad(err.Error())
		}
		set.EmphasisBox = &b
	} else {
		set.EmphasisIDs, set.EmphasisSelector = report.SplitEmphasis(*emphasis)
	}
	opt, err := set.Options()
	if err != nil {
		return bad(err.Error())
	}
	cf.opt = opt
	return cf, 0
}

func runCheck(args []string, stdout, stderr io.Writer) int {
	cf, code := parseCheckFlags(args, stdout, stderr)
	if cf == nil {
		return code
	}
	rep := report.Report{Schema: "standout-report", Version: report.Version, Minor: report.Minor, Caution: report.Caution}
	progress := newProgress(stderr, len(cf.args))
	var shots [][]byte
	var failed []string
	if cf.useBrowser {
		var err error
		if shots, failed, err = checkInBrowser(cf, &rep, progress, stderr); err != nil {
			fmt.Fprintln(stderr, "standout check:", err)
			return 2
		}
	} else {
		shots, failed = checkStatic(cf, &rep, progress)
	}
	progress.done()
	rep.Errors = failed
	rep.ViewChanges = report.ViewChanges(&rep)
	if err := emphasisFound(cf, &rep); err != nil {
		fmt.Fprintln(stderr, "standout check:", err)
		return 2
	}
	if err := writeCheck(cf, &rep, shots, stdout, stderr); err != nil {
		fmt.Fprintln(stderr, "standout check:", err)
		return 2
	}
	for _, f := range failed {
		fmt.Fprintf(stderr, "standout check: %s\n", f)
	}
	unchecked := 0
	for _, p := range rep.Pages {
		unchecked += len(report.Unjudged(p.Unchecked))
	}
	switch {
	case len(failed) > 0:
		return 2
	case cf.failRank >= 0 && unchecked > 0:
		// Nothing read is no pass: a gate fails on charts it could not see.
		fmt.Fprintf(stderr, "standout check: %d chart(s) drawn as pixels (canvas, image or object) were not checked; --fail-on counts them as failures\n", unchecked)
		return 1
	case cf.failRank >= 0 && reaches(&rep, cf.failRank):
		return 1
	}
	return 0
}

// checkInBrowser reads every page in headless Chromium and reports the
// ones it could read into rep; the others are named in failed.
func checkInBrowser(cf *checkFlags, rep *report.Report, progress *progress, stderr io.Writer) (shots [][]byte, failed []string, err error) {
	exe, err := browser.Find(cf.chromium)
	if err != nil {
		return nil, nil, err
	}
	local, err := newLocalPages()
	if err != nil {
		return nil, nil, err
	}
	defer local.Close()
	// Pages that cannot be found are named; the others are read.
	var urls, names []string
	for _, a := range cf.args {
		u := a
		if !webURL(a) {
			if u, err = local.url(a); err != nil {
				failed = append(failed, fmt.Sprintf("%s: %v", a, err))
				continue
			}
		}
		urls, names = append(urls, u), append(names, a)
	}
	o := browser.ReadOptions{Tabs: cf.tabs, Screenshot: cf.pngDir != "", Rasters: true, Emphasis: cf.opt.Selector, Timeout: cf.timeout, Views: cf.views,
		Progress: func(done, total int, r *browser.PageResult) { progress.step(done, r.URL, r.Err) }}
	results, err := readInBrowser(exe, urls, o, stderr)
	if err != nil {
		return nil, nil, err
	}
	for j, r := range results {
		name := names[j%len(names)]
		if r.View != (browser.View{}) {
			name += " (" + report.View(r.View).String() + ")"
		}
		if r.Err != nil {
			failed = append(failed, fmt.Sprintf("%s: %v", name, r.Err))
			continue
		}
		rp, err := pageFromRead(names[j%len(names)], r, cf.opt)
		if err != nil {
			failed = append(failed, fmt.Sprintf("%s: %v", name, err))
			continue
		}
		if r.View != (browser.View{}) {
			v := report.View(r.View)
			rp.View = &v
		}
		rep.Pages = append(rep.Pages, rp)
		shots = append(shots, r.Screenshot)
	}
	return shots, failed, nil
}

// checkStatic reads every file with the static reader.
// With --scheme, each file is read once per colour scheme: light-dark(),
// custom properties and @media (prefers-color-scheme) rules resolve for
// it.
func checkStatic(cf *checkFlags, rep *report.Report, progress *progress) (shots [][]byte, failed []string) {
	views := cf.views
	if len(views) == 0 {
		views = []browser.View{{}}
	}
	for i, name := range cf.args {
		var err error
		for _, v := range views {
			opt := cf.opt
			opt.Dark = v.Scheme == "dark"
			var rp report.Page
			if rp, err = checkOneFile(name, opt, cf.timeout); err != nil {
				failed = append(failed, fmt.Sprintf("%s: %v", name, err))
				break
			}
			if v.Scheme != "" {
				rp.View = &report.View{Scheme: v.Scheme}
			}
			rep.Pages = append(rep.Pages, rp)
			shots = append(shots, nil)
		}
		progress.step(i+1, name, err)
	}
	return shots, failed
}

// writeCheck writes the artifacts, the report (JSON or text) and, for
// several pages or any failure, the summary.
func writeCheck(cf *checkFlags, rep *report.Report, shots [][]byte, stdout, stderr io.Writer) error {
	if cf.pngDir != "" || cf.mdDir != "" {
		pngs, mds, err := writeArtifacts(rep, shots, cf.pngDir, cf.mdDir)
		if err != nil {
			return err
		}
		// Say where the files went, on standard error beside the progress.
		if cf.pngDir != "" {
			fmt.Fprintf(stderr, "standout check: wrote %d annotated PNG(s) to %s\n", pngs, cf.pngDir)
		}
		if cf.mdDir != "" {
			fmt.Fprintf(stderr, "standout check: wrote %d Markdown report(s) to %s\n", mds, cf.mdDir)
		}
	}
	summary := stdout
	if cf.asJSON {
		summary = stderr
		enc := json.NewEncoder(stdout)
		enc.SetIndent("", " ")
		if err := enc.Encode(rep); err != nil {
			return err
		}
	} else {
		for _, p := range rep.Pages {
			writeText(stdout, p)
		}
		if len(rep.ViewChanges) > 0 {
			fmt.Fprintln(stdout, "What changes from one view to another:")
			for _, l := range rep.ViewChanges {
				fmt.Fprintf(terminalWriter{stdout}, "  %s\n", l)
			}
		}
		if len(rep.Pages) > 0 {
			fmt.Fprintln(stdout, glossaryPointer)
		}
	}
	// A summary of nothing checked says nothing the error does not.
	if (len(cf.args) > 1 || len(rep.Errors) > 0) && len(rep.Pages) > 0 {
		writeSummary(summary, rep, len(cf.args))
	}
	return nil
}

// emphasisFound checks that an --emphasis given names something: mark ids
// that all exist, or a selector that matches a mark of some chart. An
// emphasis that matches nothing would otherwise be replaced, silently, by
// the inferred one.
func emphasisFound(cf *checkFlags, rep *report.Report) error {
	if len(rep.Pages) == 0 {
		return nil // the pages' own errors say why
	}
	if cf.opt.Box != nil {
		for _, p := range rep.Pages {
			for _, c := range p.Charts {
				if c.Emphasis != nil && !c.Emphasis.Inferred {
					return nil
				}
			}
			for _, u := range p.Unchecked {
				if u.Emphasis != nil {
					return nil
				}
			}
		}
		return fmt.Errorf("--emphasis box %v holds no mark's centre and lies in no chart drawn as pixels", *cf.opt.Box)
	}
	if cf.opt.Selector != "" {
		for _, p := range rep.Pages {
			for _, c := range p.Charts {
				if c.Emphasis != nil && !c.Emphasis.Inferred {
					return nil
				}
			}
		}
		return fmt.Errorf("--emphasis %q matches no mark of any chart", cf.opt.Selector)
	}
	var missing []string
	for id := range cf.opt.IDs {
		found := false
		for _, p := range rep.Pages {
			for _, c := range p.Charts {
				for _, m := range c.Marks {
					found = found || m.ID == id
				}
			}
		}
		if !found {
			missing = append(missing, id)
		}
	}
	if len(missing) > 0 {
		sort.Strings(missing)
		return fmt.Errorf("--emphasis names marks that no chart has: %s", strings.Join(missing, ", "))
	}
	return nil
}

// reaches says whether a finding of the report reaches the rank.
func reaches(rep *report.Report, rank int) bool {
	for _, p := range rep.Pages {
		for _, f := range p.Findings {
			if perception.Severity(f.Severity).Rank() >= rank {
				return true
			}
		}
		for _, c := range p.Charts {
			for _, f := range c.Findings {
				if perception.Severity(f.Severity).Rank() >= rank {
					return true
				}
			}
		}
	}
	return false
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
	deadline := time.Now().Add(timeout)
	opt.Expired = func() bool { return time.Now().After(deadline) }
	// Style sheets the page links by a relative path are read from its
	// folder, through an os.Root: no path can leave it.
	var sheets fs.FS
	if root, err := os.OpenRoot(filepath.Dir(name)); err == nil {
		defer root.Close()
		sheets = root.FS()
	}
	return checkReader(name, f, sheets, opt, deadline)
}

// checkReader builds, walks and analyses every chart of one file with the
// static reader; sheets holds the files beside it, for linked style
// sheets. The builder stops at deadline, when it is set.
func checkReader(name string, r io.Reader, sheets fs.FS, opt report.Options, deadline time.Time) (report.Page, error) {
	page, err := static.Build(r, static.Options{Source: name, Select: opt.Selector, Deadline: deadline, Sheets: sheets, Dark: opt.Dark})
	if err != nil {
		return report.Page{}, err
	}
	rp, err := report.FromSnapshots(name, page.Charts, page.Problems, opt)
	rp.Unchecked = report.UncheckedOf(page.Rasters)
	report.PageFindings(&rp)
	return rp, err
}

// parseViews turns --widths and --scheme into the views to read each page
// in: every width with every scheme, in the order given.
func parseViews(widths, schemes string) ([]browser.View, error) {
	ws := []int{0}
	if widths != "" {
		ws = ws[:0]
		for _, f := range strings.Split(widths, ",") {
			w, err := strconv.Atoi(strings.TrimSpace(f))
			if err != nil || w < 200 || w > 4000 {
				return nil, fmt.Errorf("--widths %q: want CSS px widths within 200–4000, comma-separated, such as 360,1280", widths)
			}
			ws = append(ws, w)
		}
	}
	ss := []string{""}
	if schemes != "" {
		ss = ss[:0]
		for _, f := range strings.Split(schemes, ",") {
			switch s := strings.TrimSpace(f); s {
			case "light", "dark":
				ss = append(ss, s)
			default:
				return nil, fmt.Errorf("--scheme %q: want light, dark or light,dark", schemes)
			}
		}
	}
	var out []browser.View
	for _, w := range ws {
		for _, s := range ss {
			out = append(out, browser.View{Width: w, Scheme: s})
		}
	}
	return out, nil
}
