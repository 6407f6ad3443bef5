package report

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// A chart drawn as pixels is listed among the page's charts once its
// pixels were judged, and only then; its unchecked entry stays.
func TestPixelChartsListJudgedOnly(t *testing.T) {
	p := Page{Source: "p", Charts: []Chart{{Path: "svg0", Source: "svg", IsChart: true}}, Unchecked: []Unchecked{
		{Kind: "canvas", Name: "canvas0", Box: [4]float64{0, 0, 400, 300}},
		{Kind: "image", Name: "img0", Box: [4]float64{0, 300, 400, 300},
			Regions:  []Region{{Box: [4]float64{10, 320, 30, 90}, Salience: 1}},
			CVD:      map[string][]Region{"deutan": {{Box: [4]float64{10, 320, 30, 90}, Salience: 1}}},
			Emphasis: &RasterEmphasis{Box: [4]float64{12, 330, 20, 60}, Holds: map[string]bool{"normal": true, "deutan": true}}},
	}}
	PixelCharts(&p)
	require.Len(t, p.Charts, 2)
	require.Len(t, p.Unchecked, 2)
	c := p.Charts[1]
	assert.Equal(t, "img0", c.Path)
	assert.Equal(t, "image", c.Source)
	assert.True(t, c.DrawnAsPixels())
	assert.False(t, p.Charts[0].DrawnAsPixels())
	assert.True(t, c.IsChart)
	assert.Equal(t, p.Unchecked[1].Regions, c.Regions)
	assert.Equal(t, p.Unchecked[1].CVD, c.CVD)
	require.NotNil(t, c.Emphasis)
	assert.Equal(t, [4]float64{12, 330, 20, 60}, *c.Emphasis.Box)
	assert.NotNil(t, c.Emphasis.Marks, "an empty list, as JSON writes it, not null")
	assert.Equal(t, []Unchecked{p.Unchecked[0]}, Unjudged(p.Unchecked))
}

// PixelLines tells apart, per vision type, a strongest region that is the
// normal one's (intersection over union at least 0.5, the criterion of the
// PASCAL VOC detection benchmark, Everingham et al. 2010, from memory), a
// wider one that still covers its centre, and one elsewhere.
func TestPixelLinesPerVision(t *testing.T) {
	first := [4]float64{100, 100, 40, 120}
	c := Chart{Source: "canvas", Regions: []Region{{Box: first, Salience: 1}}, CVD: map[string][]Region{
		"protan":   {{Box: [4]float64{102, 104, 40, 116}, Salience: 1}},
		"deutan":   {{Box: [4]float64{20, 40, 240, 260}, Salience: 1}},
		"tritan":   {{Box: [4]float64{300, 100, 40, 120}, Salience: 1}},
		"achromat": {},
	}}
	lines := PixelLines(c)
	require.Len(t, lines, 4)
	assert.Contains(t, lines[0], "the 40×120 px at 100, 100")
	assert.Equal(t, "There too for: protan.", lines[1])
	assert.Equal(t, "Spread wider, over it and its surround, for deutan: the 240×260 px at 20, 40.", lines[2])
	assert.Equal(t, "Elsewhere for tritan to the 40×120 px at 300, 100; achromat to no region at all.", lines[3])

	box := [4]float64{110, 150, 20, 20}
	c.Emphasis = &Emphasis{Marks: []string{}, Box: &box, Holds: map[string]bool{"normal": true, "protan": true, "tritan": false}}
	lines = PixelLines(c)
	assert.Equal(t, "Declared emphasis, the 20×20 px at 110, 150: reached first for: normal, protan. Not for: tritan.", lines[len(lines)-1])
	assert.Empty(t, PixelLines(Chart{Source: "canvas"}), "no regions, nothing to say")
}

func TestOverlap(t *testing.T) {
	a := [4]float64{0, 0, 10, 10}
	assert.InDelta(t, 1, overlap(a, a), 1e-12)
	assert.InDelta(t, 0, overlap(a, [4]float64{10, 0, 10, 10}), 1e-12, "touching boxes share no area")
	assert.InDelta(t, 25.0/175, overlap(a, [4]float64{5, 5, 10, 10}), 1e-12)
}
