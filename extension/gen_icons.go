//go:build ignore

// gen_icons writes extension/icons/*.png from extension.Icon.
package main

import (
	"fmt"
	"log"
	"os"

	"standout/extension"
)

func main() {
	if err := os.MkdirAll("icons", 0o755); err != nil {
		log.Fatal(err)
	}
	for _, s := range extension.IconSizes {
		if err := os.WriteFile(fmt.Sprintf("icons/%d.png", s), extension.IconPNG(s), 0o644); err != nil {
			log.Fatal(err)
		}
	}
}
