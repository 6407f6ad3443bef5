package extension

import (
	"os"
	"os/exec"
	"regexp"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/internal/testkit"
)

func TestConstantsFileIsCurrent(t *testing.T) {
	got, err := os.ReadFile(ConstantsFile)
	require.NoError(t, err)
	assert.Equal(t, string(Constants()), string(got), "extension/constants.js is stale: run go generate ./extension")
}

func TestNoHandCopyOfTheWireFormat(t *testing.T) {
	// The read pass and the overlay take the wire format's numbers, the
	// limits and the verdicts' styles from constants.js alone: none of
	// them is declared again by hand.
	for _, f := range []string{"reader.js", "overlay.js", "background.js"} {
		src, err := os.ReadFile(f)
		require.NoError(t, err)
		for _, name := range []string{"SNAPSHOT_VERSION", "MAX_CHART_NODES", "MAX_PAGE_NODES", "MAX_USE_NODES", "HAS_CTM", "HAS_GEOM", "HAS_BBOX",
			"HAS_D", "HAS_TEXT", "HAS_LABEL", "HAS_NAME", "HAS_SAME_STYLE", "HAS_STYLE_REF", "NOT_RENDERED", "GEOM", "VERDICTS", "STYLE_FILL"} {
			decl := regexp.MustCompile(`(?m)^\s*(const|let|var)\s+` + name + `\s*=`)
			assert.False(t, decl.Match(src), "%s declares %s by hand", f, name)
		}
		// The overlay writes no colour by hand: it takes the verdicts' and
		// the panel's from report.VerdictStyles and report.Ink.
		if f != "overlay.js" {
			continue
		}
		assert.NotRegexp(t, `#[0-9a-fA-F]{3}\b|#[0-9a-fA-F]{6}\b`, string(src), "%s writes a colour by hand", f)
	}
}

// runNode runs a script in Node and returns what it printed. Without Node
// the test skips on a developer machine and fails under CI=true.
func runNode(t *testing.T, script string) string {
	t.Helper()
	cmd := exec.Command(testkit.Node(t), "--input-type=commonjs", "-")
	cmd.Stdin = strings.NewReader(script)
	out, err := cmd.CombinedOutput()
	require.NoError(t, err, "%s", out)
	return string(out)
}
