package layers

import (
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"sort"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/internal/testkit"
)

// graph is the module's import graph, from go list: each package (by its
// path within the module) and what it imports.
func graph(t *testing.T) map[string][]string {
	root := testkit.Root(t)
	cmd := exec.Command("go", "list", "-f", `{{.ImportPath}}{{range .Imports}} {{.}}{{end}}`, "./...")
	cmd.Dir = root
	out, err := cmd.Output()
	require.NoError(t, err)
	g := map[string][]string{}
	for _, line := range strings.Split(strings.TrimSpace(string(out)), "\n") {
		f := strings.Fields(line)
		g[strings.TrimPrefix(f[0], "standout/")] = f[1:]
	}
	return g
}

func TestNoUpwardImport(t *testing.T) {
	for pkg, imports := range graph(t) {
		t.Run(pkg, func(t *testing.T) {
			layer, ok := Layer[pkg]
			require.True(t, ok, "%s has no layer in layers.Layer", pkg)
			for _, imp := range imports {
				if dep, ok := strings.CutPrefix(imp, "standout/"); ok {
					assert.Less(t, Layer[dep], layer, "%s (layer %d) imports %s (layer %d)", pkg, layer, dep, Layer[dep])
				}
				if only, ok := Only[imp]; ok {
					assert.Equal(t, only, pkg, "only %s may import %s", only, imp)
				}
			}
		})
	}
}

// Printed is the graph as DEVELOPERS.md prints it: per layer, top first,
// each package with the module's packages it imports.
func printed(g map[string][]string) string {
	top := 0
	for _, l := range Layer {
		top = max(top, l)
	}
	var b strings.Builder
	for l := top; l >= 0; l-- {
		var pkgs []string
		for p, pl := range Layer {
			if pl == l {
				pkgs = append(pkgs, p)
			}
		}
		sort.Strings(pkgs)
		for _, p := range pkgs {
			var deps []string
			for _, imp := range g[p] {
				if d, ok := strings.CutPrefix(imp, "standout/"); ok {
					deps = append(deps, d)
				}
			}
			sort.Strings(deps)
			if len(deps) == 0 {
				fmt.Fprintf(&b, "%d  %s\n", l, p)
				continue
			}
			fmt.Fprintf(&b, "%d  %-18s → %s\n", l, p, strings.Join(deps, ", "))
		}
	}
	return b.String()
}

func TestDevelopersGuidePrintsTheGraph(t *testing.T) {
	want := printed(graph(t))
	doc, err := os.ReadFile(filepath.Join(testkit.Root(t), "DEVELOPERS.md"))
	require.NoError(t, err)
	if os.Getenv("STANDOUT_UPDATE_DOCS") == "1" {
		t.Log("\n" + want)
	}
	assert.Contains(t, string(doc), "```text\n"+want+"```\n", "DEVELOPERS.md's dependency graph is stale; the current one:\n%s", want)
}
