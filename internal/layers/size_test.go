package layers

import (
	"go/ast"
	"go/parser"
	"go/token"
	"io/fs"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/stretchr/testify/require"

	"standout/internal/testkit"
)

// Longest lengths of a function, in lines: a function longer than this
// does more than one thing a reader can hold at once.
const (
	maxGoLines = 80
	maxJSLines = 100
)

func TestFunctionLength(t *testing.T) {
	root := testkit.Root(t)
	long := map[string]int{}
	fset := token.NewFileSet()
	err := filepath.WalkDir(root, func(p string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if d.IsDir() && (d.Name() == "node_modules" || strings.HasPrefix(d.Name(), ".")) {
			return filepath.SkipDir
		}
		rel, _ := filepath.Rel(root, p)
		switch {
		case strings.HasSuffix(p, "_test.go") || !strings.HasSuffix(p, ".go") && !strings.HasSuffix(p, ".js"):
		case strings.HasSuffix(p, ".go"):
			f, err := parser.ParseFile(fset, p, nil, parser.ParseComments)
			if err != nil {
				return err
			}
			if ast.IsGenerated(f) {
				return nil
			}
			for _, decl := range f.Decls {
				if fd, ok := decl.(*ast.FuncDecl); ok && fd.Body != nil {
					if n := fset.Position(fd.End()).Line - fset.Position(fd.Pos()).Line + 1; n > maxGoLines {
						long[rel+" "+fd.Name.Name] = n
					}
				}
			}
		case strings.HasPrefix(rel, "extension/") && !strings.Contains(rel, "/test/") && !strings.HasSuffix(rel, ".mjs"):
			src, err := os.ReadFile(p)
			if err != nil {
				return err
			}
			for name, n := range jsFunctions(string(src)) {
				if n > maxJSLines {
					long[rel+" "+name] = n
				}
			}
		}
		return nil
	})
	require.NoError(t, err)
	for fn, n := range long {
		t.Errorf("%s is %d lines long: split it", fn, n)
	}
}

// The starts of a script's functions: declarations, class methods and
// arrow functions bound to a name.
var (
	jsFunc   = regexp.MustCompile(`^(\s*)(?:async\s+)?function\s+(\w+)\s*\(`)
	jsMethod = regexp.MustCompile(`^(\s*)(?:async\s+|static\s+|get\s+)?(\w+)\s*\([^()]*\)\s*\{\s*$`)
	jsArrow  = regexp.MustCompile(`^(\s*)(?:const|let)\s+(\w+)\s*=\s*(?:async\s*)?\([^()]*\)\s*=>\s*\{\s*$`)
)

var jsKeywords = map[string]bool{"if": true, "for": true, "while": true, "switch": true, "catch": true, "function": true, "with": true}

// jsFunctions measures a script's named functions, each from its line to
// the line at its indentation that closes it.
func jsFunctions(src string) map[string]int {
	out := map[string]int{}
	lines := strings.Split(src, "\n")
	for i, l := range lines {
		m := jsFunc.FindStringSubmatch(l)
		if m == nil {
			m = jsArrow.FindStringSubmatch(l)
		}
		if m == nil {
			if m = jsMethod.FindStringSubmatch(l); m != nil && jsKeywords[m[2]] {
				m = nil
			}
		}
		if m == nil {
			continue
		}
		for j := i + 1; j < len(lines); j++ {
			if strings.HasPrefix(lines[j], m[1]+"}") {
				out[m[2]] = j - i + 1
				break
			}
		}
	}
	return out
}
