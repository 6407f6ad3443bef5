//go:build !(js && wasm)

package testkit

import (
	"os/exec"
	"testing"
)

// Node finds Node.js for a test that runs the extension's scripts or its
// core under it. A developer machine without it skips the test; under
// CI=true its absence fails the test.
func Node(t testing.TB) string {
	t.Helper()
	node, err := exec.LookPath("node")
	Needs(t, "Node", err)
	return node
}
