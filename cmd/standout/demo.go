package main

import (
	"bytes"
	"embed"
	"flag"
	"fmt"
	"io"
	"io/fs"
	"standout/internal/report"
)

//go:embed demo/*.html
var demoPages embed.FS

func runDemo(args []string, stdout, stderr io.Writer) int {
	fl := flag.NewFlagSet("demo", flag.ContinueOnError)
	fl.SetOutput(stderr)
	if err := parseFlags(fl, args); err != nil {
		return 2
	}
	names, err := fs.Glob(demoPages, "demo/*.html")
	if err != nil || len(names) == 0 {
		fmt.Fprintln(stderr, "standout demo: no built-in pages")
		return 2
	}
	fmt.Fprintln(stdout, "Standout demo: the built-in example pages (an invented newsroom scenario), read without a browser.")
	fmt.Fprintln(stdout)
	for _, name := range names {
		data, _ := demoPages.ReadFile(name)
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
