package perception

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/perception/colour"
)

// A mute fix offers a quiet grey, never a near-black one: on a light
// emphasis the grey farthest from it would otherwise be almost black,
// making the rest louder than the emphasis (issue 15: "never near-black").
func TestMuteIsNeverNearBlack(t *testing.T) {
	marks := gridDisplay(30, 3, func(i int, m *Mark) {
		m.Colour = colour.MustHex("#c9c9c9")
		if i == 13 {
			m.Colour = colour.MustHex("#e9d36c")
		}
	})
	in := Input{Marks: marks, Background: colour.MustHex("#ffffff"), Emphasis: []int{13}}
	res := Analyse(in, DefaultParams)
	fs := newFixSearch(in, DefaultParams, []int{13})
	require.NotNil(t, fs)
	f := fs.mute(res)
	require.NotNil(t, f)
	assert.GreaterOrEqual(t, colour.SRGBToLab(f.Colour).L, float64(muteMinLightness)-0.5, f.CSS)
}
