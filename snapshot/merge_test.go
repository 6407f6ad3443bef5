package snapshot

import (
	"testing"

	"github.com/stretchr/testify/assert"
)

// A frame's chart joins the page under the frame's name, every box and
// transform moved by the frame's offset; its anchor, a selector in the
// frame's document, is dropped.
func TestMergeFrame(t *testing.T) {
	page := &PageJSON{Snapshots: []Snapshot{{Path: "svg0"}}, Problems: []string{
		"frame1 (https://desk.example/quays.html): not readable (a cross-origin frame); its charts were not checked",
		"frame10 (https://desk.example/tides.html): not readable (a cross-origin frame); its charts were not checked"}}
	frame := &PageJSON{
		Snapshots: []Snapshot{{Path: "svg0", Anchor: "#quays", Box: [4]float64{0, 0, 300, 200},
			Nodes: []Node{{Name: "svg0", CTM: IdentityMatrix}, {Name: "svg0/rect0", CTM: Matrix{1, 0, 0, 1, 20, 40}, BBox: []float64{20, 40, 24, 60}}}}},
		Rasters:  []Raster{{Tag: "canvas", Name: "canvas0", Box: [4]float64{0, 210, 300, 150}}},
		Problems: []string{"svg1: empty"},
	}
	page.MergeFrame(frame, "frame1/", 54, 34)
	assert.Len(t, page.Snapshots, 2)
	s := page.Snapshots[1]
	assert.Equal(t, "frame1/svg0", s.Path)
	assert.Empty(t, s.Anchor)
	assert.Equal(t, [4]float64{54, 34, 300, 200}, s.Box)
	assert.Equal(t, "frame1/svg0/rect0", s.Nodes[1].Name)
	assert.Equal(t, [6]float64{1, 0, 0, 1, 74, 74}, s.Nodes[1].CTM)
	assert.Equal(t, []float64{74, 74, 24, 60}, s.Nodes[1].BBox)
	assert.Equal(t, [4]float64{54, 244, 300, 150}, page.Rasters[0].Box)
	assert.Equal(t, "frame1/canvas0", page.Rasters[0].Name)
	assert.Equal(t, []string{"frame10 (https://desk.example/tides.html): not readable (a cross-origin frame); its charts were not checked",
		"frame1/: svg1: empty"}, page.Problems, "the note on frame1 goes, frame10's stays")
}
