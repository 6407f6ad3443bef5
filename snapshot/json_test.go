package snapshot_test

import (
	"encoding/json"
	"errors"
	"os"
	"path/filepath"
	"runtime"
	"standout/snapshot"
	"standout/static"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// normalised makes empty and nil slices alike, which the JSON form does
// not tell apart.
func normalised(s snapshot.Snapshot) snapshot.Snapshot {
	if len(s.Problems) == 0 {
		s.Problems = nil
	}
	if len(s.Selected) == 0 {
		s.Selected = nil
	}
	nodes := make([]snapshot.Node, len(s.Nodes))
	for i, n := range s.Nodes {
		if len(n.Geom) == 0 {
			n.Geom = nil
		}
		if len(n.BBox) == 0 {
			n.BBox = nil
		}
		for _, p := range []*snapshot.Paint{&n.Fill, &n.Stroke} {
			if len(p.Stops) == 0 {
				p.Stops = nil
			}
		}
		nodes[i] = n
	}
	s.Nodes = nodes
	if len(s.Nodes) == 0 {
		s.Nodes = nil
	}
	return s
}

func TestSnapshotJSONRoundTripFixtures(t *testing.T) {
	// Every fixture's snapshots survive encoding and decoding unchanged,
	// and the scanner reads what encoding/json reads.
	files, _ := filepath.Glob("../testdata/*.*")
	corpus, _ := filepath.Glob("../../shared/corpus/*/*.svg")
	files = append(files, corpus...)
	require.NotEmpty(t, files)
	for _, f := range files {
		t.Run(filepath.Base(f), func(t *testing.T) {
			if strings.HasSuffix(f, ".golden") {
				return
			}
			data, err := os.ReadFile(f)
			require.NoError(t, err)
			p, err := static.Build(strings.NewReader(string(data)), static.Options{Source: f})
			require.NoError(t, err)
			for _, s := range p.Charts {
				b, err := json.Marshal(s)
				require.NoError(t, err, f)
				var fast snapshot.Snapshot
				require.NoError(t, json.Unmarshal(b, &fast), f)
				assert.Equal(t, normalised(s), normalised(fast), f)
				slow, err := snapshot.DecodeByReflection(b)
				require.NoError(t, err, f)
				assert.Equal(t, normalised(slow), normalised(fast), f)
			}
		})
	}
}

// TestSnapshotJSONRecords decodes a document written by hand from the
// format's documentation (snapshotjson.go): the names derived from the
// parent, the CTM inherited when a record has none, the tables, and null
// read as 0.
func TestSnapshotJSONRecords(t *testing.T) {
	in := `{"v":2,"source":"page","path":"frame0/svg1","box":[1,2,3,4],"bg":4294967295,"sel":[2],"problems":["a\u00e9"],
	"tags":["svg","g","circle","path"],
	"paints":[0,0,0, 1,4278190335,0, 2,255,2,16711935,65535],
	"strs":["M0,0L1,1","a label","custom/name"],
	"nodes":[
	  -1,0,0,1,0, 0,0, 1,1,1,1, 2,0,0,2,10,20,
	  0,1,3,0,0, 1,0, 0.5,1,1,1,
	  1,2,-1,2,1, 2,1, 1,1,null,2, 3,5,6,7,
	  1,3,7,44,0, 1,0, 1,1,1,1, 1,2,3,4, 0,1,
	  0,2,0,80,2, 0,0, 1,1,1,1, 1,2,
	  0,2,9,130, 3,9,8,7
	]}`
	var s snapshot.Snapshot
	require.NoError(t, json.Unmarshal([]byte(in), &s))
	assert.Equal(t, snapshot.SnapshotVersion, s.Version)
	assert.Equal(t, [4]float64{1, 2, 3, 4}, s.Box)
	assert.Equal(t, uint32(0xffffffff), s.Background)
	assert.Equal(t, []int32{2}, s.Selected)
	assert.Equal(t, []string{"aé"}, s.Problems)
	require.Len(t, s.Nodes, 6)
	root, g, c, p, named, same := s.Nodes[0], s.Nodes[1], s.Nodes[2], s.Nodes[3], s.Nodes[4], s.Nodes[5]
	assert.Equal(t, "frame0/svg1", root.Name)
	assert.Equal(t, [6]float64{2, 0, 0, 2, 10, 20}, root.CTM)
	assert.Equal(t, "frame0/svg1/g3", g.Name)
	assert.Equal(t, root.CTM, g.CTM, "no CTM in the record: the parent's")
	assert.Equal(t, snapshot.Paint{Kind: snapshot.PaintColour, RGBA: 0xff0000ff}, g.Fill)
	assert.Equal(t, 0.5, g.FillOpacity)
	assert.Equal(t, "frame0/svg1/g3>circle", c.Name)
	assert.Equal(t, snapshot.Hidden, c.Flags)
	assert.Equal(t, snapshot.Paint{Kind: snapshot.PaintServer, RGBA: 255, Stops: []uint32{0xff00ff, 0xffff}}, c.Fill)
	assert.Equal(t, 0.0, c.Opacity, "null reads as 0")
	assert.Equal(t, 2.0, c.StrokeWidth)
	assert.Equal(t, []float64{5, 6, 7}, c.Geom)
	assert.Equal(t, "frame0/svg1/g3/path7", p.Name)
	assert.Equal(t, []float64{1, 2, 3, 4}, p.BBox)
	assert.Equal(t, "M0,0L1,1", p.D)
	assert.Equal(t, "a label", p.Label)
	assert.Equal(t, "custom/name", named.Name)
	assert.Equal(t, "a label", named.Text)
	assert.Equal(t, "frame0/svg1/circle9", same.Name)
	assert.Equal(t, []float64{9, 8, 7}, same.Geom)
	assert.Equal(t, []any{named.Flags, named.Fill, named.Stroke, named.FillOpacity, named.StrokeOpacity, named.Opacity, named.StrokeWidth},
		[]any{same.Flags, same.Fill, same.Stroke, same.FillOpacity, same.StrokeOpacity, same.Opacity, same.StrokeWidth}, "has 128: the previous record's style")

	// What json.Marshal writes decodes to the same snapshot.
	b, err := json.Marshal(s)
	require.NoError(t, err)
	var again snapshot.Snapshot
	require.NoError(t, json.Unmarshal(b, &again))
	assert.Equal(t, normalised(s), normalised(again))
}

// A record may take a style written out before by its index among the
// styles written out (has 512): a scatter's marks alternate a few styles.
// The encoder writes each distinct style out once, and the decoder reads
// the references back to the same snapshot.
func TestSnapshotJSONStyleRefs(t *testing.T) {
	in := `{"v":2,"path":"svg0","tags":["svg","circle"],"paints":[0,0,0, 1,4278190335,0, 1,16711935,0],
	"nodes":[
	  -1,0,0,0, 0,0,0, 1,1,1,0,
	  0,1,0,2, 0,1,0, 1,1,1,0, 3,1,1,3,
	  0,1,1,2, 0,2,0, 0.5,1,1,0, 3,2,2,3,
	  0,1,2,514, 1, 3,3,3,3,
	  0,1,3,514, 2, 3,4,4,3,
	  0,1,4,130, 3,5,5,3
	]}`
	var s snapshot.Snapshot
	require.NoError(t, json.Unmarshal([]byte(in), &s))
	require.Len(t, s.Nodes, 6)
	style := func(n snapshot.Node) []any {
		return []any{n.Flags, n.Fill, n.Stroke, n.FillOpacity, n.StrokeOpacity, n.Opacity, n.StrokeWidth}
	}
	assert.Equal(t, style(s.Nodes[1]), style(s.Nodes[3]), "style 1: the first circle's")
	assert.Equal(t, style(s.Nodes[2]), style(s.Nodes[4]), "style 2: the second circle's")
	assert.Equal(t, style(s.Nodes[4]), style(s.Nodes[5]), "has 128 after a reference: the previous record's")
	assert.NotEqual(t, style(s.Nodes[1]), style(s.Nodes[2]))

	// The encoder writes three styles out and refers to them after.
	c := snapshot.Snapshot{Version: snapshot.SnapshotVersion, Path: "svg0", Nodes: []snapshot.Node{{Parent: -1, Tag: "svg", Name: "svg0"}}}
	for i := 0; i < 300; i++ {
		c.Nodes = append(c.Nodes, snapshot.Node{Parent: 0, Tag: "circle", Name: "svg0/circle" + strconv.Itoa(i), Geom: []float64{float64(i), 1, 3},
			Fill: snapshot.Paint{Kind: snapshot.PaintColour, RGBA: uint32(0x11223300 + i%3*0x10000 + 0xff)}, FillOpacity: 1, StrokeOpacity: 1, Opacity: 1})
	}
	b, err := json.Marshal(c)
	require.NoError(t, err)
	var wire struct{ Nodes []float64 }
	require.NoError(t, json.Unmarshal(b, &wire))
	// The root writes its CTM (a zero matrix) and the first style.
	assert.Len(t, wire.Nodes, 4+7+6+3*(4+7+4)+297*(4+1+4), "each style written out once")
	var again snapshot.Snapshot
	require.NoError(t, json.Unmarshal(b, &again))
	assert.Equal(t, normalised(c), normalised(again))
	oracle, err := snapshot.DecodeByReflection(b)
	require.NoError(t, err)
	assert.Equal(t, normalised(again), normalised(oracle))
}

// A child's name field may say "the next one" (NameNext, −2): the k one
// more than its parent's last child named by a k. The encoder writes it
// wherever it holds, so that an element added or taken away leaves every
// other record as it was, and a reading after the edit crosses as a patch
// of the last (extension/patch.js).
func TestSnapshotJSONNameNext(t *testing.T) {
	in := `{"v":2,"path":"svg0","tags":["svg","g","circle"],"paints":[0,0,0],"strs":["own"],
	"nodes":[
	  -1,0,0,0, 0,0,0, 1,1,1,0,
	  0,1,-2,128,
	  1,2,-2,128,
	  1,2,-2,128,
	  1,2,-1,128,
	  1,2,0,192,0,
	  1,2,-2,128,
	  0,1,-2,128,
	  1,2,5,128,
	  1,2,-2,128,
	  7,2,-2,128
	]}`
	var s snapshot.Snapshot
	require.NoError(t, json.Unmarshal([]byte(in), &s))
	var names []string
	for _, n := range s.Nodes {
		names = append(names, n.Name)
	}
	assert.Equal(t, []string{"svg0", "svg0/g0", "svg0/g0/circle0", "svg0/g0/circle1", "svg0/g0>circle", "own",
		"svg0/g0/circle2", "svg0/g1", "svg0/g0/circle5", "svg0/g0/circle6", "svg0/g1/circle0"}, names,
		"−2 follows the parent's last k; content a <use> makes and written names leave it")

	// A scatter of ten circles, and the same with one added third: the
	// records of the other ten are the same numbers.
	scatter := func(n, added int) []float64 {
		c := rootOnly()
		for i := 0; i < n; i++ {
			x := float64(i)
			if added >= 0 && i > added {
				x--
			} else if i == added {
				x = 99
			}
			c.Nodes = append(c.Nodes, snapshot.Node{Parent: 0, Tag: "circle", Name: "svg0/circle" + strconv.Itoa(i), Geom: []float64{x, 1, 3},
				Fill: snapshot.Paint{Kind: snapshot.PaintColour, RGBA: 0x112233ff}, FillOpacity: 1, StrokeOpacity: 1, Opacity: 1})
		}
		return wireRecords(t, c)
	}
	before, after := scatter(10, -1), scatter(11, 3)
	const head, rec = 4 + 7 + 6, 4 + 7 + 4 // the root's record; the first circle's
	cut := head + rec + 2*(4+4)            // where the added circle's record begins
	require.Len(t, after, len(before)+4+4)
	assert.Equal(t, before[:cut], after[:cut])
	assert.Equal(t, before[cut:], after[cut+8:], "the records after the added circle changed")
	assert.Equal(t, []float64{0, 1, snapshot.NameNext, 130, 3, 99, 1, 3}, after[cut:cut+8])
}

// rootOnly is a snapshot of a root <svg> alone, for a test to add to.
func rootOnly() snapshot.Snapshot {
	return snapshot.Snapshot{Version: snapshot.SnapshotVersion, Path: "svg0", Nodes: []snapshot.Node{{Parent: -1, Tag: "svg", Name: "svg0"}}}
}

// wireRecords encodes c and returns its "nodes" records, having checked
// that the encoding decodes to c again.
func wireRecords(t *testing.T, c snapshot.Snapshot) []float64 {
	t.Helper()
	b, err := json.Marshal(c)
	require.NoError(t, err)
	var wire struct{ Nodes []float64 }
	require.NoError(t, json.Unmarshal(b, &wire))
	var back snapshot.Snapshot
	require.NoError(t, json.Unmarshal(b, &back))
	assert.Equal(t, normalised(c), normalised(back))
	return wire.Nodes
}

// A string field may say "a new string" (StrNext, −1): the one after the
// highest a field has named. The encoder writes it for every string of
// its own, so that an added path leaves the other paths' records as they
// were (a class many records share keeps its index).
func TestSnapshotJSONStrNext(t *testing.T) {
	in := `{"v":2,"path":"svg0","tags":["svg","path","title"],"paints":[0,0,0],"strs":["M0 0h1","bars","M1 0h1","M2 0h1","a title"],
	"nodes":[
	  -1,0,0,0, 0,0,0, 1,1,1,0,
	  -2,1,-2,392, -1,-1,
	  0,1,-2,392, -1,1,
	  0,1,-2,392, -1,1,
	  -2,2,-2,144, -1
	]}`
	var s snapshot.Snapshot
	require.NoError(t, json.Unmarshal([]byte(in), &s))
	var got [][3]string
	for _, n := range s.Nodes[1:] {
		got = append(got, [3]string{n.D, n.Class, n.Text})
	}
	assert.Equal(t, [][3]string{{"M0 0h1", "bars", ""}, {"M1 0h1", "bars", ""}, {"M2 0h1", "bars", ""}, {"", "", "a title"}}, got,
		"−1 after a class named again: the string after the highest named")
	assert.Equal(t, []int32{-1, 0, 0, 0, 3}, []int32{s.Nodes[0].Parent, s.Nodes[1].Parent, s.Nodes[2].Parent, s.Nodes[3].Parent, s.Nodes[4].Parent},
		"parent −2: the record just before")
	assert.Equal(t, "svg0/path2/title0", s.Nodes[4].Name)

	paths := func(n, added int) []float64 {
		c := rootOnly()
		for i := 0; i < n; i++ {
			d := "M" + strconv.Itoa(i) + " 0h1"
			if added >= 0 && i > added {
				d = "M" + strconv.Itoa(i-1) + " 0h1"
			} else if i == added {
				d = "M9 9h1"
			}
			c.Nodes = append(c.Nodes, snapshot.Node{Parent: 0, Tag: "path", Name: "svg0/path" + strconv.Itoa(i), D: d,
				Fill: snapshot.Paint{Kind: snapshot.PaintColour, RGBA: 0x112233ff}, FillOpacity: 1, StrokeOpacity: 1, Opacity: 1})
		}
		return wireRecords(t, c)
	}
	before, after := paths(6, -1), paths(7, 2)
	cut := (4 + 7 + 6) + (4 + 7 + 1) + 1*(4+1) // the root, the first path, the second
	require.Len(t, after, len(before)+5)
	assert.Equal(t, before[:cut], after[:cut])
	assert.Equal(t, before[cut:], after[cut+5:], "the records after the added path changed")
}

// "styles" is a table of styles a record may name as written before,
// ahead of those the records write out: a reader keeps it from one
// reading to the next, so that a style new to the chart takes the next
// entry and leaves the other records' numbers alone.
func TestSnapshotJSONStyles(t *testing.T) {
	in := `{"v":2,"path":"svg0","tags":["svg","circle"],"paints":[0,0,0, 1,4286611711,0, 1,2155905279,0],
	"styles":[0,1,0,1,1,1,1, 0,2,0,0.5,1,1,2],
	"nodes":[
	  -1,0,0,0, 0,0,0,1,1,1,1,
	  -2,1,0,512, 1,
	  0,1,-2,512, 0,
	  0,1,-2,512, 2,
	  0,1,-2,128
	]}`
	var s snapshot.Snapshot
	require.NoError(t, json.Unmarshal([]byte(in), &s))
	require.Len(t, s.Nodes, 5)
	type style struct {
		fill      uint32
		fo, width float64
	}
	var got []style
	for _, n := range s.Nodes {
		got = append(got, style{n.Fill.RGBA, n.FillOpacity, n.StrokeWidth})
	}
	assert.Equal(t, []style{{0, 1, 1}, {2155905279, 0.5, 2}, {4286611711, 1, 1}, {0, 1, 1}, {0, 1, 1}}, got,
		"512 names the table's styles first, then the records' own")
	without := `{"v":2,"path":"svg0","tags":["svg","circle"],"paints":[0,0,0, 1,4286611711,0, 1,2155905279,0],
	"nodes":[
	  -1,0,0,0, 0,0,0,1,1,1,1,
	  -2,1,0,0, 0,2,0,0.5,1,1,2,
	  0,1,-2,0, 0,1,0,1,1,1,1,
	  0,1,-2,512, 0,
	  0,1,-2,128
	]}`
	var w snapshot.Snapshot
	require.NoError(t, json.Unmarshal([]byte(without), &w))
	assert.Equal(t, normalised(w), normalised(s), "the same chart with its styles written in its records")
	o, err := snapshot.DecodeByReflection([]byte(in))
	require.NoError(t, err)
	assert.Equal(t, normalised(s), normalised(o), "the oracle")
}

// A styles table longer than a reader could keep and add is refused
// before it is held.
func TestSnapshotJSONStylesCapped(t *testing.T) {
	table := func(n int) string {
		return `{"v":2,"paints":[0,0,0],"styles":[` + strings.Repeat("0,", n*snapshot.StyleLen-1) + `0]}`
	}
	var s snapshot.Snapshot
	assert.ErrorContains(t, json.Unmarshal([]byte(table(2*snapshot.MaxNodes+1)), &s), "styles has more than")
	require.NoError(t, json.Unmarshal([]byte(table(3)), &s))
}

func TestSnapshotJSONErrors(t *testing.T) {
	head := `{"v":2,"path":"svg0","tags":["svg"],"paints":[0,0,0],"strs":["x"],"nodes":`
	for name, bad := range map[string]string{
		"old version":           `{"v":1,"nodes":[]}`,
		"no version":            `{"nodes":[]}`,
		"string version":        `{"v":"2"}`,
		"unclosed":              `{"v":2`,
		"not an object":         `[1]`,
		"control character":     `{"v":2,"path":"\x01"}`,
		"leading zero":          `{"v":02}`,
		"trailing data":         `{"v":2} x`,
		"box of three":          `{"v":2,"box":[1,2,3]}`,
		"bad background":        `{"v":2,"bg":-1}`,
		"bad paint kind":        `{"v":2,"paints":[7,0,0]}`,
		"paint cut short":       `{"v":2,"paints":[1,0,2,5]}`,
		"short record":          head + `[-1,0,0,0,0,0,0,1,1,1]}`,
		"parent after":          head + `[0,0,0,0,0,0,0,1,1,1,1]}`,
		"tag out of range":      head + `[-1,1,0,0,0,0,0,1,1,1,1]}`,
		"paint out of range":    head + `[-1,0,0,0,0,1,0,1,1,1,1]}`,
		"fractional index":      head + `[-1,0.5,0,0,0,0,0,1,1,1,1]}`,
		"unknown has bit":       head + `[-1,0,0,1024,0,0,0,1,1,1,1]}`,
		"first repeats style":   head + `[-1,0,0,128]}`,
		"first refers style":    head + `[-1,0,0,512,0]}`,
		"style ref too far":     head + `[-1,0,0,0,0,0,0,1,1,1,1, 0,0,0,512,1]}`,
		"two styles repeated":   head + `[-1,0,0,0,0,0,0,1,1,1,1, 0,0,0,640,0]}`,
		"unknown flag":          head + `[-1,0,0,0,4,0,0,1,1,1,1]}`,
		"string out of range":   head + `[-1,0,0,8,0,0,0,1,1,1,1,1]}`,
		"geometry too long":     head + `[-1,0,0,2,0,0,0,1,1,1,1,17]}`,
		"geometry cut short":    head + `[-1,0,0,2,0,0,0,1,1,1,1,3,1]}`,
		"string below the next": head + `[-1,0,0,8,0,0,0,1,1,1,1,-2]}`,
		"first parent before":   head + `[-2,0,0,0,0,0,0,1,1,1,1]}`,
		"parent below the prev": head + `[-1,0,0,0,0,0,0,1,1,1,1, -3,0,0,128]}`,
		"new string past strs":  head + `[-1,0,0,8,0,0,0,1,1,1,1,-1, 0,0,-2,136,-1]}`,
		"name below the next":   head + `[-1,0,0,0,0,0,0,1,1,1,1, 0,0,-3,128]}`,
		"name past the last":    head + `[-1,0,0,0,0,0,0,1,1,1,1, 0,0,2147483646,128, 0,0,-2,128, 0,0,-2,128]}`,
		"selects nothing":       `{"v":2,"sel":[0]}`,
		"styles of six":         `{"v":2,"styles":[0,0,0,1,1,1]}`,
		"styles paint too far":  `{"v":2,"paints":[0,0,0],"styles":[0,1,0,1,1,1,1]}`,
		"styles flag unknown":   `{"v":2,"paints":[0,0,0],"styles":[4,0,0,1,1,1,1]}`,
		"style ref past both":   `{"v":2,"tags":["svg"],"paints":[0,0,0],"styles":[0,0,0,1,1,1,1],"nodes":[-1,0,0,0,0,0,0,1,1,1,1, 0,0,0,512,2]}`,
	} {
		t.Run(name, func(t *testing.T) {
			var s snapshot.Snapshot
			assert.Error(t, json.Unmarshal([]byte(bad), &s), name)
			_, err := snapshot.DecodeByReflection([]byte(bad))
			assert.Error(t, err, "%s: the oracle", name)
		})
	}
}

func TestDecodePage(t *testing.T) {
	in := `{"source":"http://x/","readMs":3.5,"problems":["frame0: not readable"],"snapshots":[
	{"v":2,"path":"svg0","tags":["svg","rect"],"paints":[0,0,0,1,255,0],"strs":[],
	 "nodes":[-1,0,0,0,0,0,0,1,1,1,1, 0,1,0,2,0,1,0,1,1,1,1,6,0,0,10,20,-1,-1]}]}`
	p, err := snapshot.DecodePage([]byte(in))
	require.NoError(t, err)
	assert.Equal(t, "http://x/", p.Source)
	assert.Equal(t, []string{"frame0: not readable"}, p.Problems)
	require.Len(t, p.Snapshots, 1)
	require.Len(t, p.Snapshots[0].Nodes, 2)
	assert.Equal(t, "svg0/rect0", p.Snapshots[0].Nodes[1].Name)
	assert.Equal(t, []float64{0, 0, 10, 20, -1, -1}, p.Snapshots[0].Nodes[1].Geom)
	_, err = snapshot.DecodePage([]byte(`{"snapshots":[{"v":1}]}`))
	assert.ErrorContains(t, err, "snapshot 0")
}

func FuzzSnapshotJSON(f *testing.F) {
	f.Add([]byte(`{"v":2,"path":"svg0","box":[0,0,10,10],"bg":4294967295,"tags":["svg","circle"],"paints":[0,0,0,1,255,0],"strs":["h\u00e9"],"nodes":[-1,0,0,0,0,0,0,1,1,1,1,0,1,0,18,0,1,0,1,1,1,1,3,1,2,3,0]}`))
	f.Add([]byte(`{"v":2,"nodes":[],"problems":["a\\b"],"sel":[]}`))
	f.Add([]byte(`{"v":2,"tags":["g"],"tags":["svg"],"nodes":[-1,0,0,65,0,0,0,1,1,1,1,1,2,3,4,5,6,0],"strs":["n"],"paints":[0,0,0],"V":2}`))
	// Styles referred to by number (has 512).
	f.Add([]byte(`{"v":2,"path":"svg0","tags":["svg","circle"],"paints":[0,0,0,1,255,0],"nodes":[-1,0,0,0,0,0,0,1,1,1,0,0,1,0,2,0,1,0,1,1,1,0,3,1,1,3,0,1,1,514,0,3,2,2,3,0,1,2,642,1,3,3,3,3]}`))
	// Names that follow the last (NameNext), around a gap and <use> content.
	f.Add([]byte(`{"v":2,"path":"svg0","tags":["svg","circle"],"paints":[0,0,0],"nodes":[-1,0,0,0,0,0,0,1,1,1,1,0,1,-2,128,0,1,-2,128,0,1,7,128,0,1,-1,128,0,1,-2,128]}`))
	// New strings (StrNext) and parents just before (ParentPrev).
	f.Add([]byte(`{"v":2,"path":"svg0","tags":["svg","path","title"],"paints":[0,0,0],"strs":["M0 0h1","c","t"],"nodes":[-1,0,0,0,0,0,0,1,1,1,1,-2,1,-2,392,-1,-1,-2,2,-2,144,-1,0,1,-2,264,1]}`))
	f.Fuzz(func(t *testing.T, b []byte) {
		slow, serr := snapshot.DecodeByReflection(b)
		var fast snapshot.Snapshot
		ferr := json.Unmarshal(b, &fast)
		if (serr == nil) != (ferr == nil) {
			t.Fatalf("on %q: encoding/json says %v, the scanner %v", b, serr, ferr)
		}
		if ferr != nil {
			return
		}
		require.Equal(t, normalised(slow), normalised(fast), "decoders disagree on %q", b)
		// What decodes, encodes and decodes again to the same snapshot.
		again, err := json.Marshal(fast)
		require.NoError(t, err)
		var back snapshot.Snapshot
		require.NoError(t, json.Unmarshal(again, &back), "%s", again)
		require.Equal(t, normalised(fast), normalised(back))
	})
}

// manyChartsPage is a read-pass result with n small charts (one circle
// each), as a page of inline icons gives.
func manyChartsPage(n int) []byte {
	var b strings.Builder
	b.WriteString(`{"source":"http://icons/","snapshots":[`)
	for i := 0; i < n; i++ {
		if i > 0 {
			b.WriteByte(',')
		}
		b.WriteString(`{"v":2,"path":"svg` + strconv.Itoa(i) + `","box":[0,0,16,16],"bg":4294967295,"tags":["svg","circle"],"paints":[0,0,0,1,255,0],"strs":[],"nodes":[-1,0,0,0,0,0,0,1,1,1,1,0,1,0,2,0,1,0,1,1,1,1,3,8,8,6]}`)
	}
	b.WriteString(`],"problems":[]}`)
	return []byte(b.String())
}

// Issue 10: the decoder reserved, for every chart, room sized by the rest
// of the page, so a page of 25,000 icons cost charts × page size and
// drove the extension's core out of memory. Its cost is now linear.
func TestIssue10DecodeManyChartsLinear(t *testing.T) {
	in := manyChartsPage(25000)
	var before, after runtime.MemStats
	runtime.GC()
	runtime.ReadMemStats(&before)
	p, err := snapshot.DecodePage(in)
	runtime.ReadMemStats(&after)
	require.NoError(t, err)
	require.Len(t, p.Snapshots, 25000)
	// About 1 MB of JSON; the old decoder allocated about 9 GB here.
	assert.Less(t, after.TotalAlloc-before.TotalAlloc, uint64(40*len(in)), "bytes allocated for %d input bytes", len(in))
}

// A request beyond snapshot.MaxPageNodes is refused with a message naming the cap.
func TestIssue10DecodePageCap(t *testing.T) {
	_, err := snapshot.DecodePage(manyChartsPage(snapshot.MaxPageNodes/2 + 1))
	require.Error(t, err)
	assert.Contains(t, err.Error(), strconv.Itoa(snapshot.MaxPageNodes))
}

// FuzzDecodePage checks the page decoder, many charts at a time, against
// decoding each snapshot on its own with encoding/json's reflection.
func FuzzDecodePage(f *testing.F) {
	f.Add(manyChartsPage(3))
	f.Add([]byte(`{"snapshots":[{"v":2,"nodes":[]},{"v":2,"tags":["svg"],"paints":[0,0,0],"nodes":[-1,0,0,0,0,0,0,1,1,1,1]}],"source":"s"}`))
	f.Fuzz(func(t *testing.T, b []byte) {
		var doc struct {
			Snapshots []json.RawMessage `json:"snapshots"`
		}
		fast, ferr := snapshot.DecodePage(b)
		if json.Unmarshal(b, &doc) != nil {
			return
		}
		var want []snapshot.Snapshot
		total := 0
		var werr error
		for _, raw := range doc.Snapshots {
			s, err := snapshot.DecodeByReflection(raw)
			if err != nil {
				werr = err
				break
			}
			total += len(s.Nodes)
			want = append(want, s)
		}
		if werr == nil && total > snapshot.MaxPageNodes {
			werr = errors.New("over the cap")
		}
		if (werr == nil) != (ferr == nil) {
			t.Fatalf("on %q: one by one %v, the page decoder %v", b, werr, ferr)
		}
		if ferr != nil {
			return
		}
		require.Len(t, fast.Snapshots, len(want))
		require.Len(t, fast.Raw, len(want))
		for i := range want {
			require.Equal(t, normalised(want[i]), normalised(fast.Snapshots[i]))
			// Each snapshot's JSON as read is the value encoding/json
			// finds there.
			require.Equal(t, string(doc.Snapshots[i]), string(fast.Raw[i]))
		}
		// Knowing every other chart as read, the decoder skips those and
		// decodes the rest as before.
		known := make([]snapshot.Known, len(want))
		for i := 0; i < len(want); i += 2 {
			known[i] = snapshot.Known{Raw: string(fast.Raw[i]), Nodes: len(want[i].Nodes)}
		}
		again, err := snapshot.DecodePageKnowing(b, known)
		require.NoError(t, err)
		require.Len(t, again.Snapshots, len(want))
		for i := range want {
			require.Equal(t, string(fast.Raw[i]), string(again.Raw[i]))
			if i%2 == 0 {
				require.True(t, again.Skipped[i], "snapshot %d is known", i)
				continue
			}
			require.Equal(t, normalised(want[i]), normalised(again.Snapshots[i]))
		}
	})
}

// DecodePageKnowing skips a snapshot only where the page has the known
// JSON in that place, whole: not a known chart in another place, nor one
// that only starts as a known one does; and the known charts' nodes count
// towards the page's limit.
func TestDecodePageKnowing(t *testing.T) {
	a := `{"v":2,"path":"svg0","tags":["svg"],"paints":[0,0,0],"nodes":[-1,0,0,0,0,0,0,1,1,1,1]}`
	b := `{"v":2,"path":"svg1","tags":["svg"],"paints":[0,0,0],"nodes":[-1,0,0,0,0,0,0,1,1,1,1]}`
	page := []byte(`{"snapshots":[` + a + `,` + b + `]}`)
	p, err := snapshot.DecodePageKnowing(page, []snapshot.Known{{Raw: a, Nodes: 1}, {Raw: a, Nodes: 1}})
	require.NoError(t, err)
	assert.Equal(t, []bool{true, false}, p.Skipped)
	assert.Empty(t, p.Snapshots[0].Nodes)
	assert.Equal(t, "svg1", p.Snapshots[1].Path)
	assert.Equal(t, a, string(p.Raw[0]))

	p, err = snapshot.DecodePageKnowing(page, []snapshot.Known{{Raw: b, Nodes: 1}})
	require.NoError(t, err)
	assert.Nil(t, p.Skipped, "a known chart in another place")

	_, err = snapshot.DecodePageKnowing([]byte(`{"snapshots":[`+a+`x]}`), []snapshot.Known{{Raw: a, Nodes: 1}})
	assert.Error(t, err, "more after the known chart")

	_, err = snapshot.DecodePageKnowing(page, []snapshot.Known{{Raw: a, Nodes: snapshot.MaxPageNodes}})
	assert.ErrorContains(t, err, strconv.Itoa(snapshot.MaxPageNodes))
}
