package static_test

import (
	"fmt"

	"standout/static"
)

func ExampleParseColor() {
	for _, s := range []string{"rebeccapurple", "#1e6e6880", "rgb(255 0 0 / 25%)", "hsl(120, 100%, 25%)"} {
		c, err := static.ParseColor(s)
		if err != nil {
			panic(err)
		}
		fmt.Printf("%s → %s alpha %.2f\n", s, c.SRGB.Hex(), c.A)
	}
	// Output:
	// rebeccapurple → #663399 alpha 1.00
	// #1e6e6880 → #1e6e68 alpha 0.50
	// rgb(255 0 0 / 25%) → #ff0000 alpha 0.25
	// hsl(120, 100%, 25%) → #008000 alpha 1.00
}
