package main

import (
	"bytes"
	"embed"
	"flag"
	"fmt"
	"io"
	"io/fs"
	"sort"

	"standout/dom"
	"standout/perception/colour"
)

//go:embed demo/*.html
var demoPages embed.FS

func runDemo(args []string, stdout, stderr io.Writer) int {
	fl := flag.NewFlagSet("demo", flag.ContinueOnError)
	fl.SetOutput(stderr)
	if err := parseFlags(fl, args); err != nil {
		return 2
	}
	names, err := fs.Glob(demoPages, "demo/*.html")
	if err != nil || len(names) == 0 {
		fmt.Fprintln(stderr, "standout demo: no built-in pages")
		return 2
	}
	fmt.Fprintln(stdout, "Standout demo: the built-in example pages (an invented newsroom scenario), read without a browser.")
	fmt.Fprintln(stdout)
	for _, name := range names {
		data, _ := demoPages.ReadFile(name)
		rp, charts, err := checkFile(name, bytes.NewReader(data))
		if err != nil {
			fmt.Fprintf(stderr, "standout demo: %s: %v\n", name, err)
			return 2
		}
		writeMarksText(stdout, rp, charts)
		for _, ch := range charts {
			if ch.IsChart {
				writeColourFindings(stdout, ch)
			}
		}
		fmt.Fprintln(stdout)
	}
	fmt.Fprintln(stdout, "Caution:", caution)
	return 0
}

// writeColourFindings checks the distinct colours of a chart's marks the
// way `standout palette` does, at the size of the chart's smallest marks.
func writeColourFindings(w io.Writer, ch *dom.Chart) {
	bg := dom.Unpack(ch.Background).SRGB
	type use struct {
		c    colour.SRGB
		kind dom.Kind
		size float64
		n    int
	}
	byHex := map[string]*use{}
	for _, m := range ch.Marks {
		var paint *uint32
		var alpha float64
		size := minSide(m)
		switch {
		case m.Fill != nil && m.FillOpacity > 0:
			paint, alpha = m.Fill, m.FillOpacity
		case m.Stroke != nil:
			paint, alpha, size = m.Stroke, m.StrokeOpacity, m.StrokeWidth
		default:
			continue
		}
		c := colour.Over(dom.Unpack(*paint), alpha*m.Opacity, bg)
		h := c.Hex()
		if u, ok := byHex[h]; ok {
			u.n++
			if size < u.size {
				u.size = size
			}
			continue
		}
		byHex[h] = &use{c, m.Kind, size, 1}
	}
	var hexes []string
	for h := range byHex {
		hexes = append(hexes, h)
	}
	sort.Strings(hexes)
	for _, h := range hexes {
		u := byHex[h]
		if cr := colour.ContrastRatio(u.c, bg); cr < colour.NonTextContrast {
			fmt.Fprintf(w, "    finding: %d %s mark(s) in %s have %.2f:1 contrast with the background, below the 3:1 WCAG SC 1.4.11 asks of graphics.\n", u.n, u.kind, h, cr)
		}
	}
	for i := range hexes {
		for j := i + 1; j < len(hexes); j++ {
			a, b := byHex[hexes[i]], byHex[hexes[j]]
			mt := markTypeOf(a.kind)
			size := a.size
			if b.size < size {
				size = b.size
			}
			nd := colour.DefaultND.For(mt, size, size*lengthRatio(mt))
			if !colour.Noticeable(colour.SRGBToLab(a.c), colour.SRGBToLab(b.c), nd) {
				fmt.Fprintf(w, "    finding: %s and %s are not noticeably different at this mark size, even for normal vision.\n", hexes[i], hexes[j])
				continue
			}
			var lost []string
			for _, v := range []colour.Deficiency{colour.Protan, colour.Deutan, colour.Tritan, colour.Achromat} {
				la := colour.SRGBToLab(colour.Simulate(v, 1, a.c))
				lb := colour.SRGBToLab(colour.Simulate(v, 1, b.c))
				if !colour.Noticeable(la, lb, nd) {
					lost = append(lost, v.String())
				}
			}
			if len(lost) > 0 {
				fmt.Fprintf(w, "    finding: %s and %s collapse for %v readers (Machado et al. 2009 at severity 1).\n", hexes[i], hexes[j], lost)
			}
		}
	}
}

func minSide(m dom.Mark) float64 {
	if m.BBox[2] < m.BBox[3] {
		return m.BBox[2]
	}
	return m.BBox[3]
}

func markTypeOf(k dom.Kind) colour.MarkType {
	switch k {
	case dom.KindPoint:
		return colour.Point
	case dom.KindBar, dom.KindRule:
		return colour.Bar
	case dom.KindLine:
		return colour.Line
	}
	return colour.Area
}
