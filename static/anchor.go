package static

import (
	"regexp"
	"strconv"
	"strings"

	"golang.org/x/net/html"
)

// plainIdent is an id usable in a selector as #id without escaping.
var plainIdent = regexp.MustCompile(`^[A-Za-z_][A-Za-z0-9_-]*$`)

// anchor is a CSS selector that matches the chart's <svg> and nothing else
// in its document, for fixes an author can paste: its id; else its
// aria-label; else a path of :nth-child steps from the nearest ancestor
// with an id, or from body. The extension's read pass builds the same one
// (reader.js anchorOf).
func (b *builder) anchor(svg *html.Node) string {
	if b.standalone && svg.Parent != nil && svg.Parent.Type == html.DocumentNode {
		return ":root" // an SVG document's own root
	}
	if id := attr(svg, "id"); plainIdent.MatchString(id) && b.idCount[id] == 1 {
		return "#" + id
	}
	if l := attr(svg, "aria-label"); l != "" && len(l) <= 120 && b.labelCount[l] == 1 {
		return `svg[aria-label="` + cssString(l) + `"]`
	}
	var steps []string
	for n := svg; n != nil && n.Type == html.ElementNode; n = n.Parent {
		if n.Data == "body" || n.Data == "html" {
			steps = append(steps, n.Data)
			break
		}
		if id := attr(n, "id"); n != svg && plainIdent.MatchString(id) && b.idCount[id] == 1 {
			steps = append(steps, "#"+id)
			break
		}
		k := 1
		for s := n.PrevSibling; s != nil; s = s.PrevSibling {
			if s.Type == html.ElementNode {
				k++
			}
		}
		steps = append(steps, n.Data+":nth-child("+strconv.Itoa(k)+")")
	}
	for i, j := 0, len(steps)-1; i < j; i, j = i+1, j-1 {
		steps[i], steps[j] = steps[j], steps[i]
	}
	return strings.Join(steps, " > ")
}

// cssString escapes a value for a double-quoted CSS string.
func cssString(s string) string {
	return strings.NewReplacer(`\`, `\\`, `"`, `\"`, "\n", `\a `).Replace(s)
}

// standaloneSVG says whether data is an SVG document: its first element,
// after any XML declaration, comments and doctype, is <svg>.
func standaloneSVG(data []byte) bool {
	s := strings.TrimSpace(string(data[:min(len(data), 1<<16)]))
	for {
		switch {
		case strings.HasPrefix(s, "<?"):
			s = skipPast(s, "?>")
		case strings.HasPrefix(s, "<!--"):
			s = skipPast(s, "-->")
		case strings.HasPrefix(strings.ToLower(s), "<!doctype"):
			s = skipPast(s, ">")
		default:
			return len(s) > 4 && strings.EqualFold(s[:4], "<svg") && strings.ContainsRune(" \t\r\n>/", rune(s[4]))
		}
	}
}

func skipPast(s, end string) string {
	if i := strings.Index(s, end); i >= 0 {
		return strings.TrimSpace(s[i+len(end):])
	}
	return ""
}
