package marks_test

import (
	"fmt"
	"strings"

	"standout/marks"
	"standout/snapshot"
	"standout/static"
)

func ExampleWalk() {
	page := `<html><body><svg width="120" height="60">
	  <rect x="10" y="20" width="20" height="40" fill="#999"/>
	  <rect x="40" y="10" width="20" height="50" fill="#999"/>
	  <rect x="70" y="0" width="20" height="60" fill="#b8572e"/>
	</svg></body></html>`
	p, err := static.Build(strings.NewReader(page), static.Options{Source: "example"})
	if err != nil {
		panic(err)
	}
	ch, err := marks.Walk(&p.Charts[0])
	if err != nil {
		panic(err)
	}
	for _, m := range ch.Marks {
		fmt.Println(m.ID, m.Kind, m.Shape, snapshot.Hex(*m.Fill), m.Size)
	}
	// Output:
	// svg0/rect0 bar square #999999 40
	// svg0/rect1 bar square #999999 50
	// svg0/rect2 bar square #b8572e 60
}

func ExampleMeasure() {
	// A circle drawn as two arcs, the way several libraries draw symbols.
	g, _, _ := marks.Measure(&snapshot.Node{Tag: "path", D: "M5,0A5,5,0,1,1,-5,0A5,5,0,1,1,5,0Z", CTM: snapshot.IdentityMatrix})
	fmt.Printf("%s, area %.1f (πr² = 78.5)\n", g.Shape, g.Area)
	// Output: circle, area 78.5 (πr² = 78.5)
}
