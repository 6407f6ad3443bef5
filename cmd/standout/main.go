// Command standout checks whether the emphasis of web charts works at a
// glance: it reads every inline SVG chart of a page, finds its data marks,
// and judges colour, contrast and colour-vision-deficiency safety.
//
// Usage:
//
//	standout check [--json] FILE…     marks of every chart in HTML or SVG files
//	standout palette [flags] COLOUR…  a palette's differences for every reader
//	standout demo                     the whole check on the built-in example
//	standout extension DIR            a ready-to-load browser extension
//
// Exit codes: 0 clean, 1 findings at or above --fail-on, 2 bad usage or
// unreadable input.
package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"standout/internal/report"
)

// caution is the statement of the check's limits.
const caution = report.Caution

func main() {
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}

func run(args []string, stdout, stderr io.Writer) int {
	if len(args) == 0 {
		usage(stderr)
		return 2
	}
	switch args[0] {
	case "check":
		return runCheck(args[1:], stdout, stderr)
	case "palette":
		return runPalette(args[1:], stdout, stderr)
	case "demo":
		return runDemo(args[1:], stdout, stderr)
	case "extension":
		return runExtension(args[1:], stdout, stderr)
	case "help", "-h", "--help":
		usage(stdout)
		return 0
	}
	fmt.Fprintf(stderr, "standout: unknown command %q\n", args[0])
	usage(stderr)
	return 2
}

func usage(w io.Writer) {
	fmt.Fprintln(w, `usage: standout COMMAND [flags] [args]

commands:
  check FILE…         list the data marks of every chart in HTML or SVG files
  palette COLOUR…     check a palette for every reader before a chart exists
  demo                run the whole check on the built-in example page
  extension DIR       write a ready-to-load browser extension folder

Run "standout COMMAND -h" for a command's flags.`)
}

// parseFlags parses flags that may come before or after the arguments.
func parseFlags(fs *flag.FlagSet, args []string) error {
	var rest []string
	for {
		if err := fs.Parse(args); err != nil {
			if errors.Is(err, flag.ErrHelp) {
				return err
			}
			return err
		}
		if fs.NArg() == 0 {
			break
		}
		rest = append(rest, fs.Arg(0))
		args = fs.Args()[1:]
	}
	return fs.Parse(append([]string{"--"}, rest...))
}
