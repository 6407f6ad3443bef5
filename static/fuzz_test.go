package static

import (
	"bytes"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"standout/marks"
	"standout/snapshot"
	"strings"
	"testing"
)

// Seeds come from every fixture in testdata/ plus the cases below. Each
// target checks a property, not just the absence of a panic.

func seedFiles(f *testing.F) [][]byte {
	var out [][]byte
	files, _ := filepath.Glob("../testdata/*.*")
	// The generator corpus brings glyph references, Bézier wedges, open
	// arcs under matrix(...) and compound paths; the smaller files keep
	// fuzzing fast.
	gen, _ := filepath.Glob("../testdata/generators/*/*.svg")
	for _, p := range append(files, gen...) {
		if strings.HasSuffix(p, ".golden") {
			continue
		}
		if b, err := os.ReadFile(p); err == nil && len(b) <= 32<<10 {
			out = append(out, b)
		}
	}
	return out
}

func finite(vs ...float64) bool {
	for _, v := range vs {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return false
		}
	}
	return true
}

func FuzzTransform(f *testing.F) {
	for _, s := range []string{"translate(1,2)", "rotate(45 1 1) scale(2)", "matrix(1 0 0 1 0 0)", "skewX(30)skewY(-10)", "translate(1-2)"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		m, err := ParseTransform(s)
		if err != nil {
			if m != snapshot.IdentityMatrix {
				t.Fatalf("error %v but matrix %v", err, m)
			}
			return
		}
		// Each parsed number is finite; products of a few may overflow
		// only for huge inputs, which the grammar allows.
		_ = m
	})
}

func FuzzColor(f *testing.F) {
	for _, s := range []string{"red", "#abc", "#aabbccdd", "rgb(1 2 3 / 50%)", "hsla(120deg, 50%, 50%, .3)", "transparent", "rgb(300,-5,1e3)"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		c, err := ParseColor(s)
		if err != nil {
			return
		}
		for _, v := range []float64{c.R, c.G, c.B, c.A} {
			if !(v >= 0 && v <= 1) {
				t.Fatalf("%q parsed to out-of-range %+v", s, c)
			}
		}
		// The packed form round-trips through snapshot.Hex.
		if h := snapshot.Hex(snapshot.RGBA(c)); len(h) != 7 || h[0] != '#' {
			t.Fatalf("bad hex %q", h)
		}
	})
}

func FuzzStyle(f *testing.F) {
	for _, s := range []string{"fill: red; stroke: var(--x, blue) !important", "--a: 1; fill: var(--a)", "fill: light-dark(red, blue)", "fill:;;;", "}{"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		if len(s) > 1<<14 {
			return
		}
		doc := `<svg width="100" height="100"><style>.a{` + s + `}</style><circle class="a" cx="5" cy="5" r="4" style="` + strings.ReplaceAll(s, `"`, "") + `"/></svg>`
		p, err := Build(strings.NewReader(doc), Options{Source: "fuzz"})
		if err != nil {
			t.Fatalf("style %q: %v", s, err)
		}
		for _, ch := range p.Charts {
			for _, n := range ch.Nodes {
				if !(n.FillOpacity >= 0 && n.FillOpacity <= 1 && n.Opacity >= 0 && n.Opacity <= 1 && n.StrokeWidth >= 0) {
					t.Fatalf("style %q gave node %+v", s, n)
				}
			}
		}
	})
}

func FuzzDocument(f *testing.F) {
	for _, b := range seedFiles(f) {
		f.Add(b)
	}
	f.Add([]byte(`<svg><g><circle r="NaN"/><rect width="Infinity" height="1"/><path d="M0,0L1e400,0"/>`))
	f.Add([]byte(`<svg viewBox="0 0 0 0"><use href="#a" id="a"/></svg>`))
	f.Add([]byte(`<svg><g transform="scale(1e300)"><g transform="scale(1e300)"><circle r="1"/></g></g></svg>`))
	f.Add([]byte(`<svg xmlns:xlink="http://www.w3.org/1999/xlink"><defs><path id="g" d="M0 0L5 0L5 7Z"/></defs><g transform="translate(5 20) scale(1 -1)"><use xlink:href="#g"/><use xlink:href="#g" x="6"/></g><use xlink:href="#g" x="NaN"/></svg>`))
	f.Add([]byte(`<svg><path d="M1,0A1,1,0,1,1,0.99995,-0.01" fill="red" transform="matrix(9,0,0,9,40,40)"/><path fill="#000" d="M0 0a2 2 0 1 1 0 .1M9 9a2 2 0 1 1 0 .1M20 5a2 2 0 1 1 0 .1"/></svg>`))
	f.Add([]byte(`<svg><path d="M 50 50 L 150 50 C 150 105 105 150 50 150 Z" fill="#3b6e8f"/><path d="M 50 50 L 50 150 C -5 150 -50 105 -50 50 Z"/></svg>`))
	// Colour schemes: a light-dark() kept in a custom property, nested
	// color-scheme, the page's meta, and broken forms of each.
	f.Add([]byte(`<html style="color-scheme: light dark"><head><meta name="color-scheme" content="dark only"><style>:root{--a:light-dark(var(--b,#123),light-dark(#fff,));--b:var(--a)}</style></head><body><figure style="color-scheme:dark"><svg><rect width="9" height="9" style="fill:var(--a)"/><rect width="9" height="9" style="fill:light-dark(#000)"/></svg></figure></body></html>`))
	// Clip regions: by attribute and by rule, with transforms that
	// overflow, lengths that are no numbers, and two that do not meet.
	f.Add([]byte(`<style>.p{clip-path:url('#c')}</style><svg><defs><clipPath id="c" transform="scale(1e300)"><rect width="1e300" height="NaN"/></clipPath><clipPath id="d"><rect x="5" width="2" height="2"/></clipPath></defs><g class="p" transform="scale(1e300)"><g clip-path="url(#d)"><circle r="3"/></g></g><g clip-path="url(#missing)"><rect width="3" height="3"/></g></svg>`))
	f.Fuzz(func(t *testing.T, b []byte) {
		if len(b) > 1<<18 {
			return
		}
		p, err := Build(bytes.NewReader(b), Options{Source: "fuzz"})
		if err != nil {
			return
		}
		// Snapshots cross to JavaScript as JSON, which has no NaN or
		// infinity: they must always encode.
		if _, err := json.Marshal(p.Charts); err != nil {
			t.Fatalf("snapshot does not encode: %v", err)
		}
		for i := range p.Charts {
			ch, err := marks.Walk(&p.Charts[i])
			if err != nil {
				t.Fatalf("walk: %v", err)
			}
			for _, m := range ch.Marks {
				if !finite(m.BBox[0], m.BBox[1], m.BBox[2], m.BBox[3], m.Angle, m.Opacity) {
					t.Fatalf("mark %s has non-finite geometry %+v", m.ID, m)
				}
				if m.Opacity < 0 || m.Opacity > 1 {
					t.Fatalf("mark %s opacity %v", m.ID, m.Opacity)
				}
			}
		}
	})
}
