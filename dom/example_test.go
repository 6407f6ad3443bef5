package dom_test

import (
	"fmt"
	"strings"

	"standout/dom"
)

func ExampleBuild() {
	page := `<html><body><svg width="120" height="60">
	  <rect x="10" y="20" width="20" height="40" fill="#999"/>
	  <rect x="40" y="10" width="20" height="50" fill="#999"/>
	  <rect x="70" y="0" width="20" height="60" fill="#c2410c"/>
	</svg></body></html>`
	p, err := dom.Build(strings.NewReader(page), dom.Options{Source: "example"})
	if err != nil {
		panic(err)
	}
	ch, err := dom.Walk(&p.Charts[0])
	if err != nil {
		panic(err)
	}
	for _, m := range ch.Marks {
		fmt.Println(m.ID, m.Kind, m.Shape, dom.Hex(*m.Fill), m.Size)
	}
	// Output:
	// svg0/rect0 bar square #999999 40
	// svg0/rect1 bar square #999999 50
	// svg0/rect2 bar square #c2410c 60
}

func ExampleParseColor() {
	for _, s := range []string{"rebeccapurple", "#0f766e80", "rgb(255 0 0 / 25%)", "hsl(120, 100%, 25%)"} {
		c, err := dom.ParseColor(s)
		if err != nil {
			panic(err)
		}
		fmt.Printf("%s → %s alpha %.2f\n", s, c.SRGB.Hex(), c.A)
	}
	// Output:
	// rebeccapurple → #663399 alpha 1.00
	// #0f766e80 → #0f766e alpha 0.50
	// rgb(255 0 0 / 25%) → #ff0000 alpha 0.25
	// hsl(120, 100%, 25%) → #008000 alpha 1.00
}

func ExampleMeasure() {
	// A circle drawn as two arcs, the way several libraries draw symbols.
	g, _, _ := dom.Measure(&dom.Node{Tag: "path", D: "M5,0A5,5,0,1,1,-5,0A5,5,0,1,1,5,0Z", CTM: dom.IdentityMatrix})
	fmt.Printf("%s, area %.1f (πr² = 78.5)\n", g.Shape, g.Area)
	// Output: circle, area 78.5 (πr² = 78.5)
}
