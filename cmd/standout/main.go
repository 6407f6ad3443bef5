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
	"runtime/debug"
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
	case "glossary":
		report.WriteGlossary(stdout)
		return 0
	case "help", "-h", "--help":
		usage(stdout)
		return 0
	case "version", "--version":
		fmt.Fprintln(stdout, "standout", version())
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
  glossary            explain the words the reports use

Run "standout COMMAND -h" for a command's flags and exit codes, and
"standout --version" for the version.`)
}

// version is the module's version and, when the build recorded it, the
// commit it was built from.
func version() string {
	bi, ok := debug.ReadBuildInfo()
	if !ok {
		return "(unknown)"
	}
	v := bi.Main.Version
	for _, s := range bi.Settings {
		switch s.Key {
		case "vcs.revision":
			v += " " + s.Value[:min(12, len(s.Value))]
		case "vcs.modified":
			if s.Value == "true" {
				v += " (modified)"
			}
		}
	}
	return v
}

// commandFlags is one command's flags. Its help lists them as --name, as
// the README writes them, with the command's exit codes; -h prints it to
// standard output and exits 0, bad usage prints it to standard error and
// exits 2.
type commandFlags struct {
	*flag.FlagSet
	synopsis, exits string
	stdout, stderr  io.Writer
}

func newFlags(name, synopsis, exits string, stdout, stderr io.Writer) *commandFlags {
	c := &commandFlags{FlagSet: flag.NewFlagSet(name, flag.ContinueOnError), synopsis: synopsis, exits: exits, stdout: stdout, stderr: stderr}
	c.SetOutput(io.Discard) // the flag package's own messages: ours are below
	c.Usage = func() { c.help(c.stderr) }
	return c
}

// help writes the synopsis, the flags and the exit codes.
func (c *commandFlags) help(w io.Writer) {
	fmt.Fprintln(w, "usage: "+c.synopsis)
	c.VisitAll(func(f *flag.Flag) {
		kind, usage := flag.UnquoteUsage(f)
		line := "  --" + f.Name
		if kind != "" {
			line += " " + kind
		}
		fmt.Fprintln(w, line)
		if f.DefValue != "" && f.DefValue != "false" && f.DefValue != "0" {
			usage += " (default " + f.DefValue + ")"
		}
		fmt.Fprintln(w, "      "+usage)
	})
	fmt.Fprintln(w, "exit status: "+c.exits)
}

// parse reads the flags, which may come before or after the arguments.
// It returns ok false when the command must stop with code: 0 after -h,
// 2 after bad usage (the error and the help on standard error).
func (c *commandFlags) parse(args []string) (code int, ok bool) {
	usage := c.Usage
	c.Usage = func() {} // the flag package calls it on -h and on errors; parse writes the help once
	err := parseFlags(c.FlagSet, args)
	c.Usage = usage
	switch {
	case errors.Is(err, flag.ErrHelp):
		c.help(c.stdout)
		return 0, false
	case err != nil:
		fmt.Fprintf(c.stderr, "standout %s: %v\n", c.Name(), err)
		c.help(c.stderr)
		return 2, false
	}
	return 0, true
}

// parseFlags parses flags that may come before or after the arguments.
func parseFlags(fs *flag.FlagSet, args []string) error {
	var rest []string
	for {
		if err := fs.Parse(args); err != nil {
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
