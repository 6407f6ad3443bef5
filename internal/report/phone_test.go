package report

import (
	"fmt"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/static"
)

// A chart 1,200 px wide, scaled to a 360 px phone without re-laying out:
// its dots shrink to under a third, and the size-dependent noticeable
// difference (Szafir 2018; Stone, Szafir & Setlur 2014) grows as marks
// shrink, so a muted highlight that stands out on the desktop blends on
// the phone.
func TestPhoneWidthScalesTheChart(t *testing.T) {
	var b strings.Builder
	b.WriteString(`<!doctype html><body><svg width="1200" height="400">`)
	for i := 0; i < 48; i++ {
		fill, em := "#8f8b97", ""
		if i == 17 {
			fill, em = "#5f7396", " data-standout-emphasis"
		}
		fmt.Fprintf(&b, `<circle cx="%d" cy="%d" r="20" fill="%s"%s/>`, 60+(i%12)*95, 60+(i/12)*90, fill, em)
	}
	b.WriteString(`</svg></body>`)
	page, err := static.Build(strings.NewReader(b.String()), static.Options{Source: "t"})
	require.NoError(t, err)
	desk, err := FromSnapshots("t", page.Charts, nil, DefaultOptions)
	require.NoError(t, err)
	require.True(t, desk.Charts[0].Emphasis.Holds["normal"], "on the desktop the highlight stands out")
	set := DefaultSettings
	set.PhoneWidth = 360
	opt, err := set.Options()
	require.NoError(t, err)
	phone, err := FromSnapshots("t", page.Charts, nil, opt)
	require.NoError(t, err)
	assert.False(t, phone.Charts[0].Emphasis.Holds["normal"], "on the phone it blends")
	// The report keeps the page's own geometry; only the judgement scales.
	assert.Equal(t, desk.Charts[0].Marks[0].BBox, phone.Charts[0].Marks[0].BBox)

	set.PhoneWidth = 50
	_, err = set.Options()
	assert.ErrorContains(t, err, "phone width 50 px")
}
