package static

import (
	"strings"

	"golang.org/x/net/html"
)

// maxTitleRunes bounds a chart's title: a name, not a paragraph.
const maxTitleRunes = 120

// chartTitle is what a reader would call the chart: its aria-label, its
// own <title>, the <figcaption> of the <figure> that holds it, or the
// nearest heading before it (heading, found in the one walk over the
// document), in that order; the read pass, extension/reader.js, looks in
// the same places. Empty when none says.
func (b *builder) chartTitle(svg, heading *html.Node) string {
	if t := cleanTitle(attr(svg, "aria-label")); t != "" {
		return t
	}
	for c := svg.FirstChild; c != nil; c = c.NextSibling {
		if c.Type == html.ElementNode && strings.EqualFold(c.Data, "title") {
			if t := cleanTitle(textContent(c)); t != "" {
				return t
			}
		}
	}
	for p := svg.Parent; p != nil; p = p.Parent {
		if p.Type == html.ElementNode && p.Data == "figure" {
			if caption := b.captionOf(p); caption != "" {
				return caption
			}
			break
		}
	}
	if heading == nil {
		return ""
	}
	return cleanTitle(textContent(heading))
}

// captionOf is a figure's caption: the text of its first <figcaption>,
// searched once per figure, so a figure of many charts costs one walk.
func (b *builder) captionOf(fig *html.Node) string {
	if c, ok := b.captions[fig]; ok {
		return c
	}
	var caption string
	walkNodes(fig, func(c *html.Node) bool {
		if caption == "" && c.Type == html.ElementNode && c.Data == "figcaption" {
			caption = cleanTitle(textContent(c))
		}
		return caption == ""
	})
	if b.captions == nil {
		b.captions = map[*html.Node]string{}
	}
	b.captions[fig] = caption
	return caption
}

// isHeading says whether n is an HTML h1–h6.
func isHeading(n *html.Node) bool {
	return n.Type == html.ElementNode && n.Namespace == "" && len(n.Data) == 2 && n.Data[0] == 'h' && n.Data[1] >= '1' && n.Data[1] <= '6'
}

// cleanTitle collapses white space and bounds the length.
func cleanTitle(s string) string {
	s = strings.Join(strings.Fields(s), " ")
	if r := []rune(s); len(r) > maxTitleRunes {
		s = string(r[:maxTitleRunes])
	}
	return s
}
