package perception

import (
	"testing"

	"github.com/stretchr/testify/assert"

	"standout/perception/colour"
)

// calibration is the table of published results the model must
// reproduce: one row per paper and condition, with the verdict the result
// implies for the target. Rows whose expectation is a design choice say
// "provisional" in their source. The fuller tests of each effect (search
// time, asymmetry of spread, contrast rules) are beside it in this
// package.
var calibration = []struct {
	source, condition string
	display           func() []Mark
	target            int
	want              Verdict
}{
	{"Treisman & Gelade 1980", "colour feature target among two distractor types", func() []Mark {
		return gridDisplay(30, 30, func(i int, m *Mark) {
			m.Colour, m.Shape = halfAndHalf(i)
			if i == 15 {
				m.Colour = blue
			}
		})
	}, 15, Pops},
	{"Treisman & Gelade 1980", "colour × shape conjunction target", func() []Mark {
		return gridDisplay(30, 30, func(i int, m *Mark) {
			m.Colour, m.Shape = halfAndHalf(i)
			if i == 15 {
				m.Colour, m.Shape = green, "triangle"
			}
		})
	}, 15, Conjunction},
	{"Duncan & Humphreys 1989", "target far from homogeneous distractors", func() []Mark {
		return gridDisplay(30, 11, func(i int, m *Mark) {
			m.Colour = colour.LabToSRGB(colour.LChToLab(colour.LCh{L: 60, C: 50, H: 250})).Clamped()
			if i == 13 {
				m.Colour = colour.LabToSRGB(colour.LChToLab(colour.LCh{L: 60, C: 50, H: 130})).Clamped()
			}
		})
	}, 13, Pops},
	{"Duncan & Humphreys 1989 (similarity; the 15° is the model's, provisional)", "target 15° of hue from homogeneous distractors", func() []Mark {
		return gridDisplay(30, 11, func(i int, m *Mark) {
			m.Colour = colour.LabToSRGB(colour.LChToLab(colour.LCh{L: 60, C: 50, H: 250})).Clamped()
			if i == 13 {
				m.Colour = colour.LabToSRGB(colour.LChToLab(colour.LCh{L: 60, C: 50, H: 235})).Clamped()
			}
		})
	}, 13, Blends},
	{"luminance step (provisional margin: LightnessMargin)", "#5a5a5a among #808080 at 10 px: half the luminance, ΔL* ≈ 15", func() []Mark {
		return gridDisplay(30, 7, func(i int, m *Mark) {
			if i == 13 {
				m.Colour = colour.MustHex("#5a5a5a")
			}
		})
	}, 13, Pops},
	{"Szafir 2018 (ground; provisional margin: GroundMargin)", "#f6f6f6 dot on white among blue dots", func() []Mark {
		return gridDisplay(30, 5, func(i int, m *Mark) {
			m.Colour = blue
			if i == 13 {
				m.Colour = colour.MustHex("#f6f6f6")
			}
		})
	}, 13, Blends},
	{"Wolfe & Horowitz 2017 (size guides)", "one point with four times the area of the others", func() []Mark {
		return gridDisplay(30, 3, func(i int, m *Mark) {
			if i == 13 {
				m.Size, m.MinPx, m.MaxPx = 78.5*4, 20, 20
			}
		})
	}, 13, Pops},
}

// halfAndHalf is Treisman & Gelade's two distractor types: brown triangles
// and green squares.
func halfAndHalf(i int) (colour.SRGB, string) {
	if i%2 == 0 {
		return brown, "triangle"
	}
	return green, "square"
}

func TestCalibration(t *testing.T) {
	for _, row := range calibration {
		t.Run(row.source+": "+row.condition, func(t *testing.T) {
			assert.Equal(t, row.want, analyseTarget(t, row.display(), row.target).Verdict)
		})
	}
}
