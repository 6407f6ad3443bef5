package perception

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/perception/colour"
)

// A scatter of grey points with one red highlight, and around it the
// chart's other elements: black axis labels and, depending on the case,
// an annotation. Guided Search keeps one priority map over the whole
// display (Wolfe 1994, from memory; Wolfe 2021, REFERENCES §5.6): an
// element of another kind as colourful as the highlight competes with it.
func sceneDisplay(annotation string) Input {
	red := colour.MustHex("#c8321e")
	marks := gridDisplay(40, 11, func(i int, m *Mark) {
		if i == 17 {
			m.Colour = red
		}
	})
	for i := 0; i < 6; i++ {
		marks = append(marks, Mark{ID: "label", Kind: "text", Type: colour.Line, Size: 12, MinPx: 1.5, MaxPx: 30,
			X: float64(i) * 20, Y: 120, Colour: colour.MustHex("#222222")})
	}
	if annotation != "" {
		marks = append(marks, Mark{ID: "note", Kind: "text", Type: colour.Line, Size: 12, MinPx: 1.5, MaxPx: 60,
			X: 60, Y: -20, Colour: colour.MustHex(annotation)})
	}
	return Input{Marks: marks, Background: colour.MustHex("#ffffff")}
}

func TestSceneRivalByColour(t *testing.T) {
	in := sceneDisplay("#1f8a3c") // a green annotation
	res := Analyse(in, DefaultParams)
	require.Equal(t, []int{17}, res.Emphasis, "the red point is the emphasis")
	require.True(t, res.Holds[0])
	note := len(in.Marks) - 1
	assert.Equal(t, []int{note}, res.Rivals, "the green annotation competes with the red highlight")
	var ids []string
	for _, f := range res.Findings {
		ids = append(ids, f.ID)
	}
	assert.Contains(t, ids, "emphasis-rivalled")
}

func TestSceneNoRival(t *testing.T) {
	for name, note := range map[string]string{
		"no annotation":                 "",
		"annotation in the highlight's": "#c8321e",
		"annotation in black":           "#111111",
	} {
		t.Run(name, func(t *testing.T) {
			res := Analyse(sceneDisplay(note), DefaultParams)
			require.Equal(t, []int{17}, res.Emphasis)
			assert.Empty(t, res.Rivals)
			for _, f := range res.Findings {
				assert.NotEqual(t, "emphasis-rivalled", f.ID)
			}
		})
	}
}

func TestSceneLegendTakesPart(t *testing.T) {
	// A legend swatch is part of the scene: a scatter whose only other
	// colourful element is a swatch in the highlight's colour has no rival.
	in := sceneDisplay("")
	in.Legend = []Mark{{ID: "swatch", Kind: "point", Type: colour.Point, Size: 78.5, MinPx: 10, MaxPx: 10, X: 200, Y: 0, Colour: colour.MustHex("#c8321e")}}
	res := Analyse(in, DefaultParams)
	assert.Equal(t, []int{17}, res.Emphasis)
	assert.Empty(t, res.Rivals)
	scene := sceneHue(in, &DefaultParams, nil)
	require.Len(t, scene, len(in.Marks), "one salience per mark, the legend being context")
	assert.GreaterOrEqual(t, scene[17], 1.0, "the red point pops by hue among every element")
}
