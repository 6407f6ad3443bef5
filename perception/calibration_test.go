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
	{"D'Zmura 1991; Bauer, Jolicœur & Cowan 1996 (separability)", "target 40 ΔE along a* from distractors at b* = ±20", func() []Mark {
		return twoHues(labColour(60, 40, 0))
	}, 14, Pops},
	{"Bauer, Jolicœur & Cowan 1996 (flanked; REFERENCES §5.7)", "target between distractors at b* = ±20", func() []Mark {
		return twoHues(labColour(60, 0, 0))
	}, 14, Blends},
	{"Perceptual and Motor Skills 69(2), 1989, Gabor search; REFERENCES §5.2 DERIVED band (≥ 30°, homogeneous: pop-out-capable)", "line 30° from homogeneous vertical lines", func() []Mark {
		return orientedDisplay(func(i int, m *Mark) {
			if i == 13 {
				m.Angle = 60
			}
		})
	}, 13, Pops},
	{"Perceptual and Motor Skills 69(2), 1989, Gabor search; REFERENCES §5.2 DERIVED band (< 15°: not pop-out)", "line 10° from homogeneous vertical lines", func() []Mark {
		return orientedDisplay(func(i int, m *Mark) {
			if i == 13 {
				m.Angle = 80
			}
		})
	}, 13, Blends},
	{"Julesz 1981; Treisman 1982 (from memory; texture segregation)", "one of a set of 20 red marks among 80 grey", func() []Mark {
		return gridDisplay(100, 13, func(i int, m *Mark) {
			if i%5 == 0 {
				m.Colour = colour.MustHex("#c2441f")
			}
		})
	}, 15, Pops},
	{"Nothdurft 1991 (REFERENCES §5.2, EXACT: texture segmentation from orientation contrast)", "one of a set of 20 lines at 45° among 80 vertical", func() []Mark {
		return orientedDisplay(func(i int, m *Mark) {
			if i%5 == 0 {
				m.Angle = 45
			}
		})
	}, 15, Pops},
	{"no rest to stand out from (provisional: GroupShareMax)", "one of 50 red marks among 50 grey", func() []Mark {
		return gridDisplay(100, 13, func(i int, m *Mark) {
			if i%2 == 0 {
				m.Colour = colour.MustHex("#c2441f")
			}
		})
	}, 16, Blends},
	{"Duncan & Humphreys 1989 (heterogeneity; the rule is provisional)", "one of three colours of three bars each", func() []Mark {
		cols := []colour.SRGB{colour.MustHex("#2f5d8a"), colour.MustHex("#d9622b"), colour.MustHex("#e8a33d")}
		return gridDisplay(9, 29, func(i int, m *Mark) { m.Colour = cols[i%3] })
	}, 4, Blends},
}

// twoHues is half the marks at b* = −20 and half at b* = +20 (L* 60), with
// mark 14 in the target colour.
func twoHues(target colour.SRGB) []Mark {
	d1, d2 := labColour(60, 0, -20), labColour(60, 0, 20)
	return gridDisplay(30, 17, func(i int, m *Mark) {
		m.Colour = d1
		if i%2 == 1 {
			m.Colour = d2
		}
		if i == 14 {
			m.Colour = target
		}
	})
}

// orientedDisplay is 100 line segments, vertical unless set otherwise.
func orientedDisplay(set func(i int, m *Mark)) []Mark {
	return gridDisplay(100, 31, func(i int, m *Mark) {
		m.Shape, m.Fold, m.Angle = "bar", 2, 90
		set(i, m)
	})
}

func labColour(l, a, b float64) colour.SRGB {
	return colour.LabToSRGB(colour.Lab{L: l, A: a, B: b}).Clamped()
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
