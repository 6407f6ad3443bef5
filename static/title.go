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
func chartTitle(svg, heading *html.Node) string {
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
			var caption string
			walkNodes(p, func(c *html.Node) bool {
				if caption == "" && c.Type == html.ElementNode && c.Data == "figcaption" {
					caption = cleanTitle(textContent(c))
				}
				return caption == ""
			})
			if caption != "" {
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
