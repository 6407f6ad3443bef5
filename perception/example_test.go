package perception_test

import (
	"fmt"

	"standout/perception"
	"standout/perception/colour"
)

func ExampleAnalyse() {
	// Nine grey dots and one orange dot in a row.
	var marks []perception.Mark
	for i := 0; i < 10; i++ {
		c := colour.MustHex("#8a8a8a")
		if i == 4 {
			c = colour.MustHex("#c4521a")
		}
		marks = append(marks, perception.Mark{Kind: "point", Type: colour.Point, Colour: c, Size: 78.5,
			MinPx: 10, MaxPx: 10, Shape: "circle", X: float64(i) * 20, Y: 10})
	}
	r := perception.Analyse(perception.Input{Marks: marks, Background: colour.MustHex("#ffffff")}, perception.DefaultParams)
	fmt.Println("mark 4:", r.Marks[4][0].Verdict, r.Marks[4][0].Channels)
	fmt.Println("mark 0:", r.Marks[0][0].Verdict)
	fmt.Println("inferred emphasis:", r.Emphasis)
	for vi, v := range perception.Visions {
		fmt.Printf("%s: %v\n", v, r.Holds[vi])
	}
	// The orange is only a little darker than the grey, so a reader who
	// sees lightness alone loses it.
	//
	// Output:
	// mark 4: pops [hue]
	// mark 0: blends
	// inferred emphasis: [4]
	// normal: true
	// protan: true
	// deutan: true
	// tritan: true
	// achromat: false
}

func ExampleAdjustedRandIndex() {
	// The scikit-learn docstring's example: 4/7.
	fmt.Printf("%.4f\n", perception.AdjustedRandIndex([]int{0, 0, 1, 2}, []int{0, 0, 1, 1}))
	// Output: 0.5714
}
