package main

import (
	"encoding/json"
	"fmt"
	"math/rand"
	"time"

	"standout/dom"
)

// warmUpMarks is the size of the chart a warm-up request analyses: enough
// for the engine to find the core's hot functions and compile them
// optimised, small enough to finish while the page is still being read.
const warmUpMarks = 400

// warmUp analyses an invented scatter of n circles through the whole
// request path (decode, walk, analysis, digest). The extension sends it
// right after the core starts, while the read pass runs in the page: a
// WebAssembly engine first runs code compiled without optimisation and
// optimises the functions that run often, so the page's own analysis then
// runs in optimised code instead of taking several times as long.
func warmUp(n int) []byte {
	t0 := time.Now()
	rng := rand.New(rand.NewSource(1))
	cols := []uint32{0x4c78a8ff, 0xf58518ff, 0x54a24bff, 0xb279a2ff}
	s := dom.Snapshot{Version: dom.SnapshotVersion, Source: "warm-up", Path: "svg0", Box: [4]float64{0, 0, 400, 300}, Background: 0xffffffff}
	id := [6]float64{1, 0, 0, 1, 0, 0}
	s.Nodes = append(s.Nodes,
		dom.Node{Parent: -1, Tag: "svg", Name: "svg0", CTM: id, Opacity: 1, FillOpacity: 1, StrokeOpacity: 1},
		dom.Node{Parent: 0, Tag: "g", Name: "svg0/g0", CTM: id, Opacity: 1, FillOpacity: 1, StrokeOpacity: 1})
	for i := 0; i < n; i++ {
		c := cols[rng.Intn(len(cols))]
		if i == n/2 {
			c = 0x111111ff
		}
		s.Nodes = append(s.Nodes, dom.Node{Parent: 1, Tag: "circle", Name: fmt.Sprintf("svg0/g0/circle%d", i), CTM: id,
			Geom: []float64{5 + rng.Float64()*390, 5 + rng.Float64()*290, 3}, Fill: dom.Paint{Kind: dom.PaintColour, RGBA: c},
			Opacity: 1, FillOpacity: 1, StrokeOpacity: 1})
	}
	page, err := json.Marshal(map[string]any{"source": "warm-up", "snapshots": []dom.Snapshot{s}})
	if err != nil {
		return errorResponse("warm-up: " + err.Error())
	}
	out := HandlePage([]byte(`{"type":"analyse"}`), page)
	var r Response
	if err := json.Unmarshal(out, &r); err != nil || !r.OK {
		return errorResponse(fmt.Sprintf("warm-up: the invented chart did not analyse: %v %s", err, r.Error))
	}
	b, _ := json.Marshal(Response{OK: true, Timing: map[string]float64{"warmUpMs": float64(time.Since(t0).Microseconds()) / 1000}})
	return b
}
