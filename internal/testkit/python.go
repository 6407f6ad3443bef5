package testkit

import (
	"os"
	"os/exec"
	"testing"
)

// Python finds Debian's python3 with the module a test compares against:
// probe is Python that fails without it, pkg the Debian package that
// brings it. A developer machine without it skips the test; under CI=true
// (where .ci/run installs pkg) its absence fails the test.
func Python(t testing.TB, probe, pkg string) string {
	t.Helper()
	py := "/usr/bin/python3"
	if _, err := os.Stat(py); err != nil {
		py = "python3"
	}
	Needs(t, pkg+" (apt-get install "+pkg+")", exec.Command(py, "-c", probe).Run())
	return py
}
