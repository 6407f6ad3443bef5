package colour

import "testing"

var sinkF float64
var sinkC SRGB

func BenchmarkDeltaE2000(b *testing.B) {
	x, y := SRGBToLab(MustHex("#1f8a6a")), SRGBToLab(MustHex("#c9611a"))
	for i := 0; i < b.N; i++ {
		sinkF = DeltaE2000(x, y)
	}
}

func BenchmarkSRGBToLab(b *testing.B) {
	c := MustHex("#6f64a8")
	for i := 0; i < b.N; i++ {
		sinkF = SRGBToLab(c).L
	}
}

func BenchmarkSimulateDeutan(b *testing.B) {
	c := MustHex("#cc3a86")
	for i := 0; i < b.N; i++ {
		sinkC = Simulate(Deutan, 0.73, c)
	}
}

// BenchmarkPerColourAllVisions is the per-mark colour cost of the analysis:
// simulate the four CVD types and convert all five colours to Lab.
func BenchmarkPerColourAllVisions(b *testing.B) {
	c := MustHex("#66a61e")
	ms := [4]Matrix{MachadoMatrix(Protan, 1), MachadoMatrix(Deutan, 1), MachadoMatrix(Tritan, 1), MachadoMatrix(Achromat, 1)}
	for i := 0; i < b.N; i++ {
		sinkF = SRGBToLab(c).L
		for k := range ms {
			sinkF += SRGBToLab(SimulateWith(&ms[k], c)).L
		}
	}
}

// BenchmarkPalette12 is the pairwise check of a 12-colour palette across
// normal vision and the four CVD types.
func BenchmarkPalette12(b *testing.B) {
	hex := []string{"#a6cee3", "#1f78b4", "#b2df8a", "#33a02c", "#fb9a99", "#e31a1c", "#fdbf6f", "#ff7f00", "#cab2d6", "#6a3d9a", "#ffff99", "#b15928"}
	var cs []SRGB
	for _, h := range hex {
		cs = append(cs, MustHex(h))
	}
	nd := DefaultND.For(Point, 10, 10)
	vis := []Deficiency{Normal, Protan, Deutan, Tritan, Achromat}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		for _, v := range vis {
			labs := make([]Lab, len(cs))
			for k, c := range cs {
				labs[k] = SRGBToLab(Simulate(v, 1, c))
			}
			for p := range labs {
				for q := p + 1; q < len(labs); q++ {
					sinkF += DeltaE2000(labs[p], labs[q])
					if Noticeable(labs[p], labs[q], nd) {
						sinkF++
					}
				}
			}
		}
	}
}
