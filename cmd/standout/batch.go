package main

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"image/png"
	"io"
	"os"
	"os/signal"
	"path/filepath"
	"regexp"
	"strings"
	"syscall"

	"standout/extension"
	"standout/internal/browser"
	"standout/internal/report"
	"standout/snapshot"
)

// progress reports a batch on stderr: a rewritten line on a terminal,
// plain lines otherwise.
type progress struct {
	w     io.Writer
	tty   bool
	total int
	shown bool
}

func newProgress(w io.Writer, total int) *progress {
	p := &progress{w: w, total: total}
	if f, ok := w.(*os.File); ok {
		if st, err := f.Stat(); err == nil && st.Mode()&os.ModeCharDevice != 0 {
			p.tty = true
		}
	}
	return p
}

func (p *progress) step(done int, name string, err error) {
	if p.total < 2 {
		return
	}
	state := "checked"
	if err != nil {
		state = "FAILED"
	}
	if p.tty {
		fmt.Fprintf(p.w, "\r\033[K[%d/%d] %s %s", done, p.total, state, clipS(name, 60))
		p.shown = true
		return
	}
	fmt.Fprintf(p.w, "[%d/%d] %s %s\n", done, p.total, state, name)
}

func (p *progress) done() {
	if p.tty && p.shown {
		fmt.Fprint(p.w, "\r\033[K")
	}
}

// writeSummary prints the batch's totals: pages, charts, marks, findings
// by severity.
func writeSummary(w io.Writer, r *report.Report, asked int) {
	charts, marks := 0, 0
	sev := map[string]int{}
	for _, p := range r.Pages {
		for _, c := range p.Charts {
			if !c.IsChart {
				continue
			}
			charts++
			marks += len(c.Marks)
			for _, f := range c.Findings {
				sev[f.Severity]++
			}
		}
	}
	fmt.Fprintln(w)
	fmt.Fprintln(w, "| pages checked | pages failed | charts | marks | errors | warnings | info |")
	fmt.Fprintln(w, "| ---: | ---: | ---: | ---: | ---: | ---: | ---: |")
	fmt.Fprintf(w, "| %d | %d | %d | %d | %d | %d | %d |\n", len(r.Pages), len(r.Errors), charts, marks, sev["error"], sev["warning"], sev["info"])
}

var unsafeName = regexp.MustCompile(`[^A-Za-z0-9._-]+`)

// fileStem makes a file name from a page's source.
func fileStem(src string) string {
	s := src
	if !strings.Contains(s, "://") {
		s = filepath.Base(s) // a file: its name is enough
	}
	s = strings.TrimPrefix(strings.TrimPrefix(s, "https://"), "http://")
	s = strings.Trim(unsafeName.ReplaceAllString(s, "-"), "-")
	if len(s) > 80 {
		s = s[len(s)-80:]
	}
	if s == "" {
		s = "page"
	}
	return s
}

// writeArtifacts writes the annotated PNGs (one per chart) and the
// Markdown reports (one per page).
func writeArtifacts(r *report.Report, shots [][]byte, pngDir, mdDir string) (pngs, mds int, err error) {
	err = writeArtifactFiles(r, shots, pngDir, mdDir, &pngs, &mds)
	return pngs, mds, err
}

// writeArtifactFiles writes the PNGs and the Markdown, counting them.
func writeArtifactFiles(r *report.Report, shots [][]byte, pngDir, mdDir string, nPNG, nMD *int) error {
	for _, d := range []string{pngDir, mdDir} {
		if d != "" {
			if err := os.MkdirAll(d, 0o755); err != nil {
				return err
			}
		}
	}
	for i, p := range r.Pages {
		stem := fmt.Sprintf("%02d-%s", i+1, fileStem(p.Source))
		if p.View != nil {
			stem += "-" + fileStem(p.View.String())
		}
		// The Markdown names a local page by its path from the report's
		// folder; its pictures are keyed by the same name.
		shown := p
		if rel := relativeTo(mdDir, p.Source); mdDir != "" && rel != "" {
			shown.Source = rel
		}
		pngs := map[string]string{}
		if pngDir != "" && i < len(shots) && shots[i] != nil {
			img, err := png.Decode(bytes.NewReader(shots[i]))
			if err != nil {
				return fmt.Errorf("%s: screenshot: %w", p.Source, err)
			}
			for _, c := range p.Charts {
				if !c.IsChart {
					continue
				}
				name := filepath.Join(pngDir, stem+"-"+strings.ReplaceAll(c.Path, "/", "-")+".png")
				f, err := os.Create(name)
				if err != nil {
					return err
				}
				err = png.Encode(f, annotate(img, c))
				if cerr := f.Close(); err == nil {
					err = cerr
				}
				if err != nil {
					return err
				}
				*nPNG++
				rel := name
				if mdDir != "" {
					if r, err := filepath.Rel(mdDir, name); err == nil {
						rel = r
					}
				}
				pngs[shown.Source+"#"+c.Path] = filepath.ToSlash(rel)
			}
		}
		if mdDir != "" {
			if err := writePageMarkdown(r, shown, stem, mdDir, pngs); err != nil {
				return err
			}
			*nMD++
		}
	}
	return nil
}

// readInBrowser starts a headless Chromium with a fresh profile and reads
// urls with the extension's own read pass. Chromium keeps its sandbox
// unless it cannot have it (run as root), or it does not start with it;
// either is said on stderr. An interrupt or termination stops the browser
// and removes the profile before the error returns.
func readInBrowser(exe string, urls []string, o browser.ReadOptions, stderr io.Writer) ([]browser.PageResult, error) {
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
	defer stop()
	o.Reader = extension.Reader()
	read := func(noSandbox bool) ([]browser.PageResult, error) {
		udd, err := os.MkdirTemp("", "standout-profile-")
		if err != nil {
			return nil, err
		}
		defer browser.RemoveProfile(udd)
		// The allocator's context is not ctx: an interrupt closes the
		// browser through o.Stop, which lets it tidy up, rather than
		// killing it.
		bctx, cancel := browser.NewAllocator(context.Background(), browser.Options{Exec: exe, UserDataDir: udd, NoSandbox: noSandbox})
		defer cancel()
		o.Stop = ctx
		return browser.ReadPages(bctx, urls, o), nil
	}
	note := browser.SandboxNote()
	if note != "" {
		fmt.Fprintln(stderr, "standout:", note)
	}
	res, err := read(note != "")
	if err == nil && note == "" && len(res) > 0 && errors.Is(res[0].Err, browser.ErrStart) {
		fmt.Fprintln(stderr, "standout: Chromium did not start with its sandbox; running it without (", res[0].Err, ")")
		res, err = read(true)
	}
	if ctx.Err() != nil {
		return nil, errors.New("interrupted; the browser was stopped and its profile removed")
	}
	return res, err
}

// pageFromRead walks and analyses what the read pass returned for a page,
// decoded with the snapshot decoder the extension's core uses.
func pageFromRead(name string, r browser.PageResult, opt report.Options) (report.Page, error) {
	pg, err := snapshot.DecodePage([]byte(r.JSON))
	if err != nil {
		return report.Page{}, fmt.Errorf("the read pass returned bad data: %w", err)
	}
	if err := mergeFrames(pg, r.Frames); err != nil {
		return report.Page{}, err
	}
	rp, err := report.FromSnapshots(name, pg.Snapshots, pg.Problems, opt)
	rp.Unchecked = report.UncheckedOf(pg.Rasters)
	rasterRegions(rp.Unchecked, r.Rasters, opt.Params.Severity, opt.Box, r.EmphasisBoxes)
	report.PixelCharts(&rp)
	report.PageFindings(&rp)
	return rp, err
}

// relativeTo is the path of a local page from dir, with forward slashes;
// empty for an address or when no relative path exists.
func relativeTo(dir, source string) string {
	if strings.Contains(source, "://") {
		return ""
	}
	abs, err := filepath.Abs(source)
	if err != nil {
		return ""
	}
	absDir, err := filepath.Abs(dir)
	if err != nil {
		return ""
	}
	rel, err := filepath.Rel(absDir, abs)
	if err != nil {
		return ""
	}
	return filepath.ToSlash(rel)
}

// writePageMarkdown writes one page's Markdown report into mdDir, with the
// search-time plots beside it; p is the page as the report names it, and
// pngs maps its charts to their pictures.
func writePageMarkdown(r *report.Report, p report.Page, stem, mdDir string, pngs map[string]string) error {
	for _, c := range p.Charts {
		curve, ok := report.CurveOf(c)
		if !c.IsChart || !ok {
			continue
		}
		name := stem + "-" + strings.ReplaceAll(c.Path, "/", "-") + "-search.svg"
		if err := os.WriteFile(filepath.Join(mdDir, name), []byte(report.SearchPlotSVG(curve)), 0o644); err != nil {
			return err
		}
		pngs[report.SearchPlotKey+p.Source+"#"+c.Path] = name
	}
	var b bytes.Buffer
	one := report.Report{Schema: r.Schema, Version: r.Version, Minor: r.Minor, Pages: []report.Page{p}, Caution: r.Caution}
	report.WriteMarkdown(&b, &one, pngs)
	if err := os.WriteFile(filepath.Join(mdDir, stem+".md"), b.Bytes(), 0o644); err != nil {
		return err
	}
	return nil
}
