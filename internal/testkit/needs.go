package testkit

import (
	"os"
	"testing"
)

// Needs stops a test that cannot run without what (a browser, a tool, a
// reference library) when err says it is missing: a developer machine
// skips the test; under CI=true, where .ci/run installs what every test
// needs, the test fails.
func Needs(t testing.TB, what string, err error) {
	t.Helper()
	if err == nil {
		return
	}
	if os.Getenv("CI") == "true" {
		t.Fatalf("testkit: %s is required under CI=true: %v", what, err)
	}
	t.Skipf("testkit: no %s: %v", what, err)
}
