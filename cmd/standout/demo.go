package main

import (
	"bytes"
	"fmt"
	"io"
	"io/fs"
	"net"
	"net/http"
	"os"
	"os/signal"
	"path"
	"time"

	"standout/internal/browser"
	"standout/internal/demo"
	"standout/internal/report"
)

// runDemo runs the whole check on the built-in pages: in headless Chromium
// when one is installed, else with the static reader. With --serve it
// serves the pages on a local port, to try the extension on.
func runDemo(args []string, stdout, stderr io.Writer) int {
	fl := newFlags("demo", "standout demo [flags]", "0 done; 2 bad usage, or a page that could not be served or checked", stdout, stderr)
	serve := fl.Bool("serve", false, "serve the demo pages on a local port (to try the extension) instead of checking them")
	addr := fl.String("addr", "127.0.0.1:8417", "address for --serve")
	static := fl.Bool("static", false, "use the static reader even when Chromium is installed")
	if code, ok := fl.parse(args); !ok {
		return code
	}
	sub, _ := fs.Sub(demo.Pages, "pages")
	names, err := fs.Glob(sub, "*.html")
	if err != nil || len(names) == 0 {
		fmt.Fprintln(stderr, "standout demo: no built-in pages")
		return 2
	}
	var runErr error
	switch exe, ferr := browser.Find(""); {
	case *serve:
		runErr = serveDemo(sub, names, *addr, stdout)
	case *static || ferr != nil:
		fmt.Fprintln(stdout, "Standout demo: the built-in pages (an invented newsroom scenario), read without a browser.")
		if ferr != nil && !*static {
			fmt.Fprintln(stdout, "(No Chromium found, so the static reader is used:", ferr.Error()+")")
		}
		fmt.Fprintln(stdout)
		runErr = demoStatic(sub, names, stdout)
	default:
		fmt.Fprintln(stdout, "Standout demo: the built-in pages (an invented newsroom scenario), read as rendered in headless Chromium.")
		fmt.Fprintln(stdout)
		runErr = demoInBrowser(exe, sub, names, stdout, stderr)
	}
	if runErr != nil {
		fmt.Fprintln(stderr, "standout demo:", runErr)
		return 2
	}
	if !*serve {
		fmt.Fprintln(stdout, glossaryPointer)
		fmt.Fprintln(stdout, "Caution:", report.Caution)
	}
	return 0
}

// serveDemo serves the demo pages on addr until interrupted.
func serveDemo(sub fs.FS, names []string, addr string, stdout io.Writer) error {
	l, err := net.Listen("tcp", addr)
	if err != nil {
		return err
	}
	fmt.Fprintln(stdout, "Serving the demo pages (an invented newsroom scenario):")
	for _, n := range names {
		fmt.Fprintf(stdout, "  http://%s/%s\n", l.Addr(), n)
	}
	fmt.Fprintln(stdout, "Load the extension (standout extension DIR), open a page and press the toolbar button. Ctrl-C stops.")
	srv := &http.Server{Handler: http.FileServer(http.FS(sub))}
	go func() {
		c := make(chan os.Signal, 1)
		signal.Notify(c, os.Interrupt)
		<-c
		srv.Close()
	}()
	if err := srv.Serve(l); err != nil && err != http.ErrServerClosed {
		return err
	}
	return nil
}

// demoStatic checks the demo pages with the static reader.
func demoStatic(sub fs.FS, names []string, stdout io.Writer) error {
	for _, name := range names {
		data, _ := fs.ReadFile(sub, name)
		rp, err := checkReader(name, bytes.NewReader(data), sub, report.DefaultOptions, time.Time{})
		if err != nil {
			return fmt.Errorf("%s: %w", name, err)
		}
		writeText(stdout, rp)
		fmt.Fprintln(stdout)
	}
	return nil
}

// demoInBrowser serves the pages on loopback and reads them as rendered,
// with the extension's own read pass.
func demoInBrowser(exe string, sub fs.FS, names []string, stdout, stderr io.Writer) error {
	l, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		return err
	}
	srv := &http.Server{Handler: http.FileServer(http.FS(sub))}
	go srv.Serve(l)
	defer srv.Close()
	var urls []string
	for _, n := range names {
		urls = append(urls, "http://"+l.Addr().String()+"/"+n)
	}
	progress := newProgress(stderr, len(urls))
	results, err := readInBrowser(exe, urls, browser.ReadOptions{Tabs: 2, Progress: func(done, total int, r *browser.PageResult) {
		progress.step(done, path.Base(r.URL), r.Err)
	}}, stderr)
	progress.done()
	if err != nil {
		return err
	}
	for i, r := range results {
		if r.Err != nil {
			return fmt.Errorf("%s: %w", names[i], r.Err)
		}
		rp, err := pageFromRead(path.Base(urls[i]), r, report.DefaultOptions)
		if err != nil {
			return fmt.Errorf("%s: %w", names[i], err)
		}
		writeText(stdout, rp)
		fmt.Fprintln(stdout)
	}
	return nil
}
