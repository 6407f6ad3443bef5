package extension

import (
	"flag"
	"fmt"
	"os"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"golang.org/x/net/html"

	"standout/internal/demo"
)

var updatePanel = flag.Bool("update", false, "rewrite the panel's golden files")

// panelText is the panel's text as a reader reads it: one line per block
// (headings, paragraphs, findings, the rule to paste, glossary entries).
func panelText(t *testing.T, overlay string) string {
	doc, err := html.Parse(strings.NewReader(overlay))
	require.NoError(t, err)
	block := map[string]bool{"h2": true, "h3": true, "p": true, "li": true, "pre": true, "summary": true, "dt": true, "dd": true, "button": true, "div": true, "select": true}
	var b strings.Builder
	var walk func(n *html.Node, in bool)
	walk = func(n *html.Node, in bool) {
		if n.Type == html.ElementNode {
			for _, a := range n.Attr {
				if a.Key == "class" && strings.Contains(" "+a.Val+" ", " panel ") {
					in = true
				}
			}
			switch {
			case n.Data == "style":
				return
			case n.Data == "svg":
				// A picture reads as its label.
				for _, a := range n.Attr {
					if in && a.Key == "aria-label" {
						b.WriteString("\n[" + a.Val + "]\n")
					}
				}
				return
			}
		}
		if in && n.Type == html.TextNode {
			b.WriteString(n.Data)
		}
		for c := n.FirstChild; c != nil; c = c.NextSibling {
			walk(c, in)
		}
		if in && n.Type == html.ElementNode && block[n.Data] {
			b.WriteString("\n")
		}
	}
	walk(doc, false)
	var lines []string
	for _, l := range strings.Split(b.String(), "\n") {
		if l = strings.TrimSpace(l); l != "" {
			lines = append(lines, l)
		}
	}
	return strings.Join(lines, "\n") + "\n"
}

// The panel on each demo page is a golden file: chart names from titles,
// findings in plain words with their evidence, fixes as rules to paste,
// the search-time plot's words, the glossary. Regenerate with
// go test ./extension -run PanelGolden -update, and review the diff.
func TestE2EPanelGolden(t *testing.T) {
	h := newHarness(t)
	for _, name := range []string{"harbour-ferries", "gullsand-night-boats"} {
		t.Run(name, func(t *testing.T) {
			page, err := demo.Pages.ReadFile("pages/" + name + ".html")
			require.NoError(t, err)
			h.showPage(string(page))
			got := panelText(t, h.overlayHTML())
			golden := "testdata/panel-" + name + ".golden"
			if *updatePanel {
				require.NoError(t, os.WriteFile(golden, []byte(got), 0o644))
			}
			want, err := os.ReadFile(golden)
			require.NoError(t, err, "run go test ./extension -run PanelGolden -update")
			assert.Equal(t, string(want), got)
			h.escape()
			h.waitState("")
		})
	}
}

// A page whose only chart is a canvas is not a silent pass in the panel
// either: it names the chart it could not check.
func TestE2EPanelNamesPixelCharts(t *testing.T) {
	h := newHarness(t)
	h.showPage(`<!doctype html><html><body><canvas width="480" height="200"></canvas><img alt="" width="16" height="16"></body></html>`)
	ov := h.overlayHTML()
	assert.Contains(t, ov, "Note: canvas0, a canvas 480×200 px, was not checked")
	assert.NotContains(t, ov, "img0", "an icon is no chart")
}

// The panel judges the charts as on a 360 px phone without touching the
// reader's window: a muted highlight that stands out in a 1,200 px chart
// blends once the chart is scaled to the phone's width (Szafir 2018: small
// marks need bigger colour differences), and the panel says what it did
// and what it cannot do (a re-layout, the other colour scheme).
func TestE2EPanelJudgesAsOnAPhone(t *testing.T) {
	h := newHarness(t)
	var b strings.Builder
	b.WriteString(`<!doctype html><html><body style="margin:0"><svg width="1200" height="400">`)
	for i := 0; i < 48; i++ {
		fill, em := "#8f8b97", ""
		if i == 17 {
			fill, em = "#5f7396", " data-standout-emphasis"
		}
		fmt.Fprintf(&b, `<circle cx="%d" cy="%d" r="20" fill="%s"%s/>`, 60+(i%12)*95, 60+(i/12)*90, fill, em)
	}
	b.WriteString(`</svg></body></html>`)
	h.showPage(b.String())
	ov := h.overlayHTML()
	require.Contains(t, ov, "Declared emphasis (1 mark) stands out for normal: yes")
	assert.Contains(t, ov, "an extension cannot switch a page’s light or dark scheme")
	h.eval(`document.querySelector('` + hostSelector + `').removeAttribute('data-state'), ''`)
	h.chooseInOverlay("screen", 1)
	h.waitState("ready")
	ov = h.overlayHTML()
	assert.Contains(t, ov, "Judged as on a 360 px phone")
	assert.Contains(t, ov, "Declared emphasis (1 mark) stands out for normal: no")
}
