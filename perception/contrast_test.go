package perception

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/perception/colour"
)

func findingIDs(fs []Finding) []string {
	var ids []string
	for _, f := range fs {
		ids = append(ids, f.ID)
	}
	return ids
}

// WCAG 2.x SC 1.4.3: text needs 4.5:1 against its background, large-scale
// text (at least 18 pt, 24 CSS px) 3:1. Grey #8a8a8a on white is about
// 3.45:1: enough for 24 px text, not for 14 px text.
func TestLargeTextContrast(t *testing.T) {
	grey := colour.MustHex("#8a8a8a")
	white := colour.MustHex("#ffffff")
	cr := colour.ContrastRatio(grey, white)
	require.InDelta(t, 3.5, cr, 0.1)
	text := func(px float64) Input {
		return Input{Background: white, Marks: []Mark{
			{ID: "t", Kind: "text", Type: colour.Line, Colour: grey, Size: px, MinPx: px / 8, MaxPx: px},
			{ID: "b", Kind: "bar", Type: colour.Bar, Colour: colour.MustHex("#2d5c9e"), Size: 40, MinPx: 20, MaxPx: 40, Box: [4]float64{0, 0, 20, 40}},
		}}
	}
	t.Run("24 px", func(t *testing.T) {
		assert.NotContains(t, findingIDs(Analyse(text(24), DefaultParams).Findings), "text-contrast-low")
	})
	// Large scale is also "14 point and bold" (WCAG 2.x, definition of
	// large scale text): 14 pt is 18.67 CSS px.
	t.Run("19 px bold", func(t *testing.T) {
		in := text(19)
		in.Marks[0].Bold = true
		assert.NotContains(t, findingIDs(Analyse(in, DefaultParams).Findings), "text-contrast-low")
	})
	t.Run("19 px regular", func(t *testing.T) {
		assert.Contains(t, findingIDs(Analyse(text(19), DefaultParams).Findings), "text-contrast-low")
	})
	t.Run("18 px bold", func(t *testing.T) {
		in := text(18)
		in.Marks[0].Bold = true
		assert.Contains(t, findingIDs(Analyse(in, DefaultParams).Findings), "text-contrast-low", "under 14 pt")
	})
	t.Run("14 px", func(t *testing.T) {
		fs := Analyse(text(14), DefaultParams).Findings
		require.Contains(t, findingIDs(fs), "text-contrast-low")
		for _, f := range fs {
			if f.ID == "text-contrast-low" {
				assert.Contains(t, f.Evidence, "4.5:1")
			}
		}
	})
}

// WCAG 2.x SC 1.4.11 asks parts of graphics to contrast 3:1 with adjacent
// colours; a separating line that contrasts with both sides meets it
// (W3C, Understanding SC 1.4.11, on adjacent colours). Two stacked
// segments at about 1.2:1 touch: flagged without a separating stroke, not
// with a white one.
func TestAdjacentSegmentsContrast(t *testing.T) {
	lower, upper := colour.MustHex("#3d6fb0"), colour.MustHex("#4f7cb8")
	cr := colour.ContrastRatio(lower, upper)
	require.InDelta(t, 1.2, cr, 0.1)
	white := colour.MustHex("#ffffff")
	stack := func(stroke bool) Input {
		seg := func(id string, c colour.SRGB, y, h float64) Mark {
			m := Mark{ID: id, Kind: "bar", Type: colour.Bar, Colour: c, Size: h, Length: true, MinPx: 30, MaxPx: h, Box: [4]float64{10, y, 30, h}}
			if stroke {
				m.Outline, m.HasOutline = white, true
			}
			return m
		}
		return Input{Background: white, Marks: []Mark{seg("upper", upper, 20, 40), seg("lower", lower, 60, 50)}}
	}
	t.Run("touching", func(t *testing.T) {
		fs := Analyse(stack(false), DefaultParams).Findings
		require.Contains(t, findingIDs(fs), "adjacent-contrast-low")
	})
	t.Run("white separating stroke", func(t *testing.T) {
		assert.NotContains(t, findingIDs(Analyse(stack(true), DefaultParams).Findings), "adjacent-contrast-low")
	})
	t.Run("a gap between them", func(t *testing.T) {
		in := stack(false)
		in.Marks[0].Box[1] -= 2 // the upper segment ends 2 px above the lower
		assert.NotContains(t, findingIDs(Analyse(in, DefaultParams).Findings), "adjacent-contrast-low")
	})
}
