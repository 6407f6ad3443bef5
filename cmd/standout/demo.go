package main

import (
	"bytes"
	"flag"
	"fmt"
	"io"
	"io/fs"
	"net"
	"net/http"
	"os"
	"os/signal"
	"path"

	"standout/internal/browser"
	"standout/internal/demo"
	"standout/internal/report"
)

// runDemo runs the whole check on the built-in pages: in headless Chromium
// when one is installed, else with the static reader. With --serve it
// serves the pages on a local port, to try the extension on.
func runDemo(args []string, stdout, stderr io.Writer) int {
	fl := flag.NewFlagSet("demo", flag.ContinueOnError)
	fl.SetOutput(stderr)
	serve := fl.Bool("serve", false, "serve the demo pages on a local port (to try the extension) instead of checking them")
	addr := fl.String("addr", "127.0.0.1:8417", "address for --serve")
	static := fl.Bool("static", false, "use the static reader even when Chromium is installed")
	if err := parseFlags(fl, args); err != nil {
		return 2
	}
	sub, _ := fs.Sub(demo.Pages, "pages")
	names, err := fs.Glob(sub, "*.html")
	if err != nil || len(names) == 0 {
		fmt.Fprintln(stderr, "standout demo: no built-in pages")
		return 2
	}
	if *serve {
		l, err := net.Listen("tcp", *addr)
		if err != nil {
			fmt.Fprintln(stderr, "standout demo:", err)
			return 2
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
			fmt.Fprintln(stderr, "standout demo:", err)
			return 2
		}
		return 0
	}
	exe, ferr := browser.Find("")
	if *static || ferr != nil {
		fmt.Fprintln(stdout, "Standout demo: the built-in pages (an invented newsroom scenario), read without a browser.")
		if ferr != nil && !*static {
			fmt.Fprintln(stdout, "(No Chromium found, so the static reader is used:", ferr.Error()+")")
		}
		fmt.Fprintln(stdout)
		for _, name := range names {
			data, _ := fs.ReadFile(sub, name)
			rp, err := checkReader(name, bytes.NewReader(data), report.DefaultOptions)
			if err != nil {
				fmt.Fprintf(stderr, "standout demo: %s: %v\n", name, err)
				return 2
			}
			writeText(stdout, rp)
			fmt.Fprintln(stdout)
		}
		fmt.Fprintln(stdout, "Caution:", report.Caution)
		return 0
	}
	// The browser path: serve the pages on loopback and read them as
	// rendered, with the extension's own read pass.
	l, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		fmt.Fprintln(stderr, "standout demo:", err)
		return 2
	}
	srv := &http.Server{Handler: http.FileServer(http.FS(sub))}
	go srv.Serve(l)
	defer srv.Close()
	var urls []string
	for _, n := range names {
		urls = append(urls, "http://"+l.Addr().String()+"/"+n)
	}
	fmt.Fprintln(stdout, "Standout demo: the built-in pages (an invented newsroom scenario), read as rendered in headless Chromium.")
	fmt.Fprintln(stdout)
	results, err := readInBrowser(exe, urls, browser.ReadOptions{Tabs: 2}, stderr)
	if err != nil {
		fmt.Fprintln(stderr, "standout demo:", err)
		return 2
	}
	for i, r := range results {
		if r.Err != nil {
			fmt.Fprintf(stderr, "standout demo: %s: %v\n", names[i], r.Err)
			return 2
		}
		rp, err := pageFromRead(path.Base(urls[i]), r, report.DefaultOptions)
		if err != nil {
			fmt.Fprintf(stderr, "standout demo: %s: %v\n", names[i], err)
			return 2
		}
		writeText(stdout, rp)
		fmt.Fprintln(stdout)
	}
	fmt.Fprintln(stdout, "Caution:", report.Caution)
	return 0
}
