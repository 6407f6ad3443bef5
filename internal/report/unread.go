package report

import (
	"strings"

	"standout/snapshot"
)

// Page-level findings: what a check could not read. None is a verdict on
// a chart; each says what to do so that the chart can be checked. The
// readers' notes are matched without regexp, which would double the
// core's share of the .wasm.

// unloadedSheet reads the static reader's note on a style sheet it did not
// load: `external style sheet "href" was not loaded…`.
func unloadedSheet(p string) (href string, ok bool) {
	rest, ok := strings.CutPrefix(p, `external style sheet "`)
	i := strings.Index(rest, `" was not loaded`)
	if !ok || i < 0 {
		return "", false
	}
	return rest[:i], true
}

// PageFindings fills in p.Findings from its charts, its charts drawn as
// pixels and its problems: a warning for each chart drawn as pixels whose
// pixels were not judged (the static reader has none), each frame that
// could not be read, each style sheet that was not loaded, and for a page
// with no chart at all.
func PageFindings(p *Page) {
	p.Findings = nil
	warn := func(id, msg string, marks ...string) {
		p.Findings = append(p.Findings, Finding{ID: id, Severity: "warning", Marks: marks, Message: msg, Source: "common practice: a check must say what it did not read"})
	}
	for _, u := range p.Unchecked {
		if len(u.Regions) == 0 {
			warn("pixels-unread", u.Name+" is a chart drawn as pixels ("+u.Kind+"), and its pixels were not judged: run check --browser, which judges where the eye goes first in those of up to 4 megapixels, or draw it as SVG.", u.Name)
		}
		if f := pixelsEmphasis(u); f != nil {
			p.Findings = append(p.Findings, *f)
		}
	}
	for _, pr := range p.Problems {
		if name, src, ok := snapshot.UnreadFrame(pr); ok {
			warn("frame-unread", "The frame "+name+" ("+src+") could not be read, so its charts were not checked: check the framed page itself, or run check --browser, which reads frames of other origins.", name)
		}
		if href, ok := unloadedSheet(pr); ok {
			warn("style-sheet-unread", "The style sheet "+href+" was not loaded, so the charts may have been read in default colours: run check --browser to read them as a browser styles them.")
		}
	}
	charts := len(p.Unchecked)
	for _, c := range p.Charts {
		if c.IsChart {
			charts++
		}
	}
	if charts == 0 && !strings.Contains(strings.Join(p.Problems, "\n"), "not readable") {
		warn("no-chart-found", "No chart was found on this page, so nothing was checked: if it has charts, they are not inline SVG, canvas or images of chart size, or they had not been drawn yet when it was read.")
	}
}

// pixelsEmphasis is the finding on a declared emphasis in a chart drawn as
// pixels that the eye does not reach first for some reader: an error when
// not even for normal vision, else a warning naming the vision types.
func pixelsEmphasis(u Unchecked) *Finding {
	e := u.Emphasis
	if e == nil {
		return nil
	}
	var lost []string
	for _, v := range []string{"normal", "protan", "deutan", "tritan", "achromat"} {
		if held, ok := e.Holds[v]; ok && !held {
			lost = append(lost, v)
		}
	}
	if len(lost) == 0 {
		return nil
	}
	f := &Finding{ID: "pixels-emphasis-lost", Severity: "warning", Marks: []string{u.Name}, Source: "Itti, Koch & Niebur 1998 (a prediction)",
		Message: "In " + u.Name + ", the strongest region of the saliency map is not the declared emphasis for: " + strings.Join(lost, ", ") + "; the eye is predicted to go elsewhere first."}
	if lost[0] == "normal" {
		f.Severity = "error"
	}
	return f
}
