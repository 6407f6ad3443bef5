package marks

import (
	"flag"
	"fmt"
	"os"
	"path/filepath"
	"sort"
	"standout/snapshot"
	"standout/static"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

var update = flag.Bool("update", false, "rewrite the golden files in testdata/")

// dump renders a page's charts as a readable, diffable listing: every
// snapshot node with its resolved paint and transform, then the walk's
// marks.
func dump(p *static.Page) string {
	var b strings.Builder
	for _, pr := range p.Problems {
		fmt.Fprintf(&b, "! %s\n", pr)
	}
	for i := range p.Charts {
		s := &p.Charts[i]
		fmt.Fprintf(&b, "chart %s box=%v bg=%s\n", s.Path, s.Box, snapshot.Hex(s.Background))
		for _, pr := range s.Problems {
			fmt.Fprintf(&b, "! %s\n", pr)
		}
		depth := make([]int, len(s.Nodes))
		for j, n := range s.Nodes {
			if n.Parent >= 0 {
				depth[j] = depth[n.Parent] + 1
			}
			paint := func(p snapshot.Paint) string {
				switch p.Kind {
				case snapshot.PaintNone:
					return "none"
				case snapshot.PaintServer:
					var st []string
					for _, c := range p.Stops {
						st = append(st, fmt.Sprintf("%08x", c))
					}
					return fmt.Sprintf("server(%08x; %s)", p.RGBA, strings.Join(st, " "))
				}
				return fmt.Sprintf("%08x", p.RGBA)
			}
			fmt.Fprintf(&b, "| %s<%s> %s fill=%s stroke=%s fo=%.3g so=%.3g o=%.3g sw=%.3g flags=%d ctm=[%.4g %.4g %.4g %.4g %.4g %.4g]\n",
				strings.Repeat("  ", depth[j]), n.Tag, n.Name, paint(n.Fill), paint(n.Stroke), n.FillOpacity, n.StrokeOpacity, n.Opacity, n.StrokeWidth, n.Flags,
				n.CTM[0], n.CTM[1], n.CTM[2], n.CTM[3], n.CTM[4], n.CTM[5])
		}
		ch, err := Walk(s)
		if err != nil {
			fmt.Fprintf(&b, "walk error: %v\n", err)
			continue
		}
		fmt.Fprintf(&b, "walk: chart=%v %s\n", ch.IsChart, ch.Reason)
		for _, m := range ch.Marks {
			fill := "none"
			if m.Fill != nil {
				fill = snapshot.Hex(*m.Fill)
			}
			fmt.Fprintf(&b, "  mark %s %s %s fill=%s alpha=%.3g opacity=%.3g bbox=[%.2f %.2f %.2f %.2f] area=%.2f angle=%.1f\n",
				m.ID, m.Kind, m.Shape, fill, m.FillOpacity, m.Opacity, m.BBox[0], m.BBox[1], m.BBox[2], m.BBox[3], m.Area, m.Angle)
		}
		var furn []string
		for k, v := range ch.Furniture {
			furn = append(furn, fmt.Sprintf("%s=%d", k, v))
		}
		sort.Strings(furn)
		fmt.Fprintf(&b, "  furniture %s legend=%d\n", strings.Join(furn, " "), len(ch.Legend))
	}
	return b.String()
}

func TestGolden(t *testing.T) {
	files, err := filepath.Glob("../testdata/*.html")
	require.NoError(t, err)
	svgs, _ := filepath.Glob("../testdata/*.svg")
	files = append(files, svgs...)
	require.NotEmpty(t, files)
	for _, f := range files {
		t.Run(filepath.Base(f), func(t *testing.T) {
			t.Run(filepath.Base(f), func(t *testing.T) {
				in, err := os.Open(f)
				require.NoError(t, err)
				defer in.Close()
				p, err := static.Build(in, static.Options{Source: filepath.Base(f)})
				require.NoError(t, err)
				got := dump(p)
				golden := strings.TrimSuffix(f, filepath.Ext(f)) + ".golden"
				if *update {
					require.NoError(t, os.WriteFile(golden, []byte(got), 0o644))
				}
				want, err := os.ReadFile(golden)
				require.NoError(t, err, "run go test ./marks -run Golden -update")
				assert.Equal(t, string(want), got)
				// Idempotent: building again gives the same dump.
				in2, _ := os.Open(f)
				defer in2.Close()
				p2, err := static.Build(in2, static.Options{Source: filepath.Base(f)})
				require.NoError(t, err)
				assert.Equal(t, got, dump(p2))
			})
		})
	}
}
