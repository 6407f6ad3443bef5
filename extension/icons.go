package extension

import (
	"bytes"
	"image"
	"image/color"
	"image/png"
	"math"

	"standout/internal/report"
	"standout/perception/colour"
)

//go:generate go run gen_icons.go

// IconSizes are the toolbar and store icon sizes, in px.
var IconSizes = []int{16, 32, 48, 128}

// Icon draws the extension's icon at a size: on a rounded tile of the
// panel's wash, a three-by-three grid of quiet dots, one of which, larger
// and in the colour of a mark that stands out, carries the overlay's
// corner notch. Drawn with 4×4 supersampling so small sizes stay smooth.
func Icon(size int) *image.RGBA {
	const ss = 4
	tile := rgb(report.Ink.Wash)
	edge := rgb(report.Ink.Rule)
	quiet := rgb("#9b97a4")
	pops := rgb(report.StyleOf("pops").Colour)
	out := image.NewRGBA(image.Rect(0, 0, size, size))
	s := float64(size)
	for y := 0; y < size; y++ {
		for x := 0; x < size; x++ {
			var acc [4]float64
			for sy := 0; sy < ss; sy++ {
				for sx := 0; sx < ss; sx++ {
					u, v := (float64(x)+(float64(sx)+0.5)/ss)/s, (float64(y)+(float64(sy)+0.5)/ss)/s
					c, a := iconAt(u, v, tile, edge, quiet, pops)
					acc[0] += float64(c.R) * a
					acc[1] += float64(c.G) * a
					acc[2] += float64(c.B) * a
					acc[3] += a
				}
			}
			n := float64(ss * ss)
			if acc[3] > 0 {
				out.SetRGBA(x, y, color.RGBA{uint8(acc[0]/n + 0.5), uint8(acc[1]/n + 0.5), uint8(acc[2]/n + 0.5), uint8(255*acc[3]/n + 0.5)})
			}
		}
	}
	return out
}

// iconAt is the icon's colour and coverage at (u, v) in [0, 1]².
func iconAt(u, v float64, tile, edge, quiet, pops color.RGBA) (color.RGBA, float64) {
	// The rounded tile, with a thin edge.
	r := 0.2
	dx, dy := max(r-u, u-(1-r), 0), max(r-v, v-(1-r), 0)
	d := math.Hypot(dx, dy)
	if d > r {
		return color.RGBA{}, 0
	}
	c := tile
	if d > r-0.045 || u < 0.03 || u > 0.97 || v < 0.03 || v > 0.97 {
		c = edge
	}
	for i := 0; i < 9; i++ {
		cx, cy := 0.25+0.25*float64(i%3), 0.25+0.25*float64(i/3)
		rad := 0.075
		if i == 5 {
			rad = 0.12
			// The overlay's notch: a right triangle at the top right.
			if u > cx+0.11 && v < cy-0.11 && (u-(cx+0.11))+(cy-0.11-v) < 0.1 {
				return pops, 1
			}
		}
		if math.Hypot(u-cx, v-cy) <= rad {
			if i == 5 {
				return pops, 1
			}
			return quiet, 1
		}
	}
	return c, 1
}

func rgb(hex string) color.RGBA {
	r, g, b := colour.MustHex(hex).RGB8()
	return color.RGBA{r, g, b, 0xff}
}

// IconPNG is the icon at a size, encoded.
func IconPNG(size int) []byte {
	var b bytes.Buffer
	if err := png.Encode(&b, Icon(size)); err != nil {
		panic(err) // encoding an in-memory RGBA image cannot fail
	}
	return b.Bytes()
}
