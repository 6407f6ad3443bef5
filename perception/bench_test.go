package perception

import (
	"math/rand"
	"testing"

	"standout/perception/colour"
)

// benchMarks is a scatter of n points in a few categorical colours and
// sizes, with one emphasised mark.
func benchMarks(n int) Input {
	rng := rand.New(rand.NewSource(1))
	pal := []colour.SRGB{colour.MustHex("#3b6e8f"), colour.MustHex("#d0842c"), colour.MustHex("#5a9a4e"), colour.MustHex("#9a6aa6")}
	marks := make([]Mark, n)
	for i := range marks {
		marks[i] = Mark{Kind: "point", Type: colour.Point, Colour: pal[rng.Intn(len(pal))], Size: 20 + rng.Float64()*60,
			MinPx: 6, MaxPx: 6, Shape: "circle", X: rng.Float64() * 1000, Y: rng.Float64() * 1000}
	}
	marks[n/2].Colour = colour.MustHex("#111111") // a lightness emphasis that holds for every reader
	// A chart's furniture: 40 axis labels and a legend, so that the whole
	// display (scene.go) is measured too.
	for i := 0; i < 40; i++ {
		marks = append(marks, Mark{Kind: "text", Type: colour.Line, Colour: colour.MustHex("#333333"), Size: 11,
			MinPx: 1.4, MaxPx: 24, X: float64(i%20) * 50, Y: 1010 + float64(i/20)*990})
	}
	var legend []Mark
	for i, c := range pal {
		legend = append(legend, Mark{Kind: "point", Type: colour.Point, Colour: c, Size: 40, MinPx: 6, MaxPx: 6, X: 1020, Y: float64(i) * 12})
	}
	return Input{Marks: marks, Legend: legend, Background: colour.MustHex("#ffffff"), Emphasis: []int{n / 2}}
}

// BenchmarkFix10k is the same display with an emphasis that fails for
// CVD readers, so the gamut search and its verification run too.
func BenchmarkFix10k(b *testing.B) {
	in := benchMarks(10000)
	in.Marks[5000].Colour = colour.MustHex("#d8322a")
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		Analyse(in, DefaultParams)
	}
}

func benchAnalyse(b *testing.B, n int) {
	in := benchMarks(n)
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		Analyse(in, DefaultParams)
	}
}

// BenchmarkOverlayAnalyse5k is the extension's analysis of a 5,000-mark
// chart: CVD re-analysis of the emphasis only.
func BenchmarkOverlayAnalyse5k(b *testing.B) {
	in := benchMarks(5000)
	p := DefaultParams
	p.FindingsOnly = true
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		Analyse(in, p)
	}
}

func BenchmarkAnalyse1k(b *testing.B)   { benchAnalyse(b, 1000) }
func BenchmarkAnalyse10k(b *testing.B)  { benchAnalyse(b, 10000) }
func BenchmarkAnalyse100k(b *testing.B) { benchAnalyse(b, 100000) }

// BenchmarkNeighbours5k is the k-nearest-neighbour lists of 5,000
// scattered marks, the analysis's spatial index.
func BenchmarkNeighbours5k(b *testing.B) {
	in := benchMarks(5000)
	idx := make([]int, len(in.Marks))
	for i := range idx {
		idx[i] = i
	}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		neighbours(in.Marks, idx, DefaultParams.Neighbours, nil)
	}
}

// BenchmarkAnalyseCrowded20k is a crafted page's chart: 20,000 points
// packed into 3 px, two more 20,000 px apart, which crowd a uniform
// grid's few cells (the index turns to its tree), and a line drawn
// 10,000 times back and forth over the crowd (connectedGroups).
func BenchmarkAnalyseCrowded20k(b *testing.B) {
	in := benchMarks(20000)
	rng := rand.New(rand.NewSource(2))
	for i := range in.Marks[:20000] {
		in.Marks[i].X, in.Marks[i].Y = rng.Float64()*3, rng.Float64()*3
	}
	in.Marks[0].X, in.Marks[1].X = -1e4, 1e4
	line := Mark{Kind: "line", Type: colour.Line, Colour: colour.MustHex("#333333"), MinPx: 2, MaxPx: 2, X: 1.5, Y: 1.5}
	for s := 0; s < 10000; s++ {
		line.Vertices = append(line.Vertices, [2]float64{float64(s%2) * 3, 1.5})
	}
	in.Marks = append(in.Marks, line)
	b.ReportAllocs()
	for b.Loop() {
		Analyse(in, DefaultParams)
	}
}
