package main

import (
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
)

// Help is asked for, not an error: -h exits 0 and writes to standard
// output the flags as --name (as the README writes them) and the exit
// codes; bad usage exits 2 with the help on standard error.
func TestHelpAndExitCodes(t *testing.T) {
	for _, cmd := range []string{"check", "palette", "demo", "extension"} {
		t.Run(cmd, func(t *testing.T) {
			code, out, errs := runCmd(cmd, "-h")
			assert.Equal(t, 0, code)
			assert.Empty(t, errs)
			assert.Contains(t, out, "usage: standout "+cmd)
			assert.Contains(t, out, "exit status: 0")
			assert.NotRegexp(t, `(?m)^  -[a-z]`, out, "flags are written --name")
			code, out, errs = runCmd(cmd, "--no-such-flag")
			assert.Equal(t, 2, code)
			assert.Empty(t, out)
			assert.Contains(t, errs, "no-such-flag")
			assert.Equal(t, 1, strings.Count(errs, "usage: "), "the help once")
		})
	}
	code, out, _ := runCmd("--version")
	assert.Equal(t, 0, code)
	assert.True(t, strings.HasPrefix(out, "standout "), out)
}

// An emphasis that names nothing is an error with no report, not a run
// that silently falls back to the inferred emphasis.
func TestEmphasisThatMatchesNothing(t *testing.T) {
	page := "../../testdata/cascade.html"
	code, out, errs := runCmd("check", "--emphasis", ".no-such-class", page)
	assert.Equal(t, 2, code)
	assert.Empty(t, out)
	assert.Contains(t, errs, `--emphasis ".no-such-class" matches no mark`)
	code, out, errs = runCmd("check", "--emphasis", "svg0/g9/rect99", page)
	assert.Equal(t, 2, code)
	assert.Empty(t, out)
	assert.Contains(t, errs, "svg0/g9/rect99")
}

// A page that cannot be read gets its error and nothing else: no summary
// of nothing checked.
func TestMissingPageHasNoSummary(t *testing.T) {
	code, out, errs := runCmd("check", "no-such-page.html")
	assert.Equal(t, 2, code)
	assert.Empty(t, out)
	assert.Contains(t, errs, "no-such-page.html")
	assert.NotContains(t, errs, "pages checked")
}
