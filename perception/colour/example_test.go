package colour_test

import (
	"fmt"

	"standout/perception/colour"
)

func ExampleDeltaE2000() {
	// Sharma, Wu & Dalal (2005), Table 1, pair 17.
	fmt.Printf("%.4f\n", colour.DeltaE2000(colour.Lab{L: 50, A: 2.5, B: 0}, colour.Lab{L: 73, A: 25, B: -18}))
	// Output: 27.1492
}

func ExampleContrastRatio() {
	fmt.Printf("%.2f\n", colour.ContrastRatio(colour.MustHex("#767676"), colour.MustHex("#ffffff")))
	fmt.Println(colour.MeetsNonText(colour.MustHex("#949494"), colour.MustHex("#ffffff")))
	// Output:
	// 4.54
	// true
}

func ExampleSimulate() {
	// A red and a green that normal vision tells apart easily, as a
	// deuteranope sees them (Machado et al. 2009, severity 1).
	red, green := colour.MustHex("#c23a2e"), colour.MustHex("#3b9a3f")
	r, g := colour.Simulate(colour.Deutan, 1, red), colour.Simulate(colour.Deutan, 1, green)
	fmt.Println(r.Hex(), g.Hex())
	fmt.Printf("ΔE00 normal %.1f, deutan %.1f\n",
		colour.DeltaE2000(colour.SRGBToLab(red), colour.SRGBToLab(green)),
		colour.DeltaE2000(colour.SRGBToLab(r), colour.SRGBToLab(g)))
	// Output:
	// #837629 #918446
	// ΔE00 normal 64.5, deutan 6.3
}
