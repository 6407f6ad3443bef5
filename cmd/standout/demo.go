package main

import (
	"bytes"
	"flag"
	"fmt"
	"io"
	"io/fs"
	"standout/internal/demo"
	"standout/internal/report"
)

func runDemo(args []string, stdout, stderr io.Writer) int {
	fl := flag.NewFlagSet("demo", flag.ContinueOnError)
	fl.SetOutput(stderr)
	if err := parseFlags(fl, args); err != nil {
		return 2
	}
	names, err := fs.Glob(demo.Pages, "pages/*.html")
	if err != nil || len(names) == 0 {
		fmt.Fprintln(stderr, "standout demo: no built-in pages")
		return 2
	}
	fmt.Fprintln(stdout, "Standout demo: the built-in example pages (an invented newsroom scenario), read without a browser.")
	fmt.Fprintln(stdout)
	for _, name := range names {
		data, _ := demo.Pages.ReadFile(name)
		rp, charts, err := report.CheckFile(name, bytes.NewReader(data), report.DefaultOptions)
		if err != nil {
			fmt.Fprintf(stderr, "standout demo: %s: %v\n", name, err)
			return 2
		}
		report.WriteText(stdout, rp, charts)
		fmt.Fprintln(stdout)
	}
	fmt.Fprintln(stdout, "Caution:", report.Caution)
	return 0
}
