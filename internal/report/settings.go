package report

import (
	"errors"
	"math"
	"strconv"
	"strings"

	"standout/perception"
	"standout/perception/colour"
)

// Settings are a check's settings as they arrive: from the command line's
// flags or from the overlay's request. Options validates them; it is the
// one place both build a check's Options.
type Settings struct {
	// Severity is the CVD severity of the re-analysis, within [0, 1].
	Severity float64
	// DistanceCM and PxPerInch describe the viewing; zero keeps the
	// default (colour.DefaultViewing).
	DistanceCM, PxPerInch float64
	// EmphasisIDs names the intended emphasis by mark id;
	// EmphasisSelector by a CSS selector; EmphasisNodes by chart path and
	// snapshot node, as "path#node" (the overlay's picks).
	EmphasisIDs      []string
	EmphasisSelector string
	EmphasisNodes    []string
	// EmphasisBox names it by a box in page CSS px (x, y, width, height):
	// the marks whose centres it holds, and, in a chart drawn as pixels,
	// the place the eye should go first.
	EmphasisBox *[4]float64
	// FindingsOnly asks for the findings and the emphasis's CVD
	// re-analysis only (the overlay's digest), not every mark's.
	FindingsOnly bool
	// PhoneWidth, when set, judges the charts as scaled down to a phone's
	// width in CSS px (Options.PhoneWidth), within 200–1000.
	PhoneWidth float64
}

// DefaultSettings are the settings of a check nobody tuned.
var DefaultSettings = Settings{Severity: perception.DefaultParams.Severity}

// Options validates the settings into a check's Options. The error names
// the setting that is out of range.
func (s Settings) Options() (Options, error) {
	opt := DefaultOptions
	if !(s.Severity >= 0 && s.Severity <= 1) {
		return opt, errors.New("CVD severity " + num(s.Severity) + " is not within [0, 1]")
	}
	opt.Params.Severity = s.Severity
	if s.DistanceCM != 0 || s.PxPerInch != 0 {
		if !(s.DistanceCM > 0) || !(s.PxPerInch > 0) {
			return opt, errors.New("viewing distance " + num(s.DistanceCM) + " cm and " + num(s.PxPerInch) + " px per inch: both must be positive")
		}
		opt.Params.ND.Viewing = colour.Viewing{DistanceCM: s.DistanceCM, CSSPxPerInch: s.PxPerInch}
	}
	opt.Params.FindingsOnly = s.FindingsOnly
	opt.Selector = strings.TrimSpace(s.EmphasisSelector)
	for _, id := range s.EmphasisIDs {
		if id = strings.TrimSpace(id); id == "" {
			continue
		}
		if opt.IDs == nil {
			opt.IDs = map[string]bool{}
		}
		opt.IDs[id] = true
	}
	for _, pn := range s.EmphasisNodes {
		i := strings.LastIndexByte(pn, '#')
		node, err := strconv.Atoi(pn[i+1:])
		if i < 0 || err != nil || node < 0 {
			return opt, errors.New("emphasis node " + strconv.Quote(pn) + " is not path#node")
		}
		if opt.Nodes == nil {
			opt.Nodes = map[string]map[int]bool{}
		}
		if opt.Nodes[pn[:i]] == nil {
			opt.Nodes[pn[:i]] = map[int]bool{}
		}
		opt.Nodes[pn[:i]][node] = true
	}
	if b := s.EmphasisBox; b != nil {
		if !(b[2] > 0 && b[3] > 0) || !finite4(*b) {
			return opt, errors.New("emphasis box [" + num(b[0]) + " " + num(b[1]) + " " + num(b[2]) + " " + num(b[3]) + "]: want a finite x, y and a positive width and height")
		}
		opt.Box = b
	}
	if s.PhoneWidth != 0 && !(s.PhoneWidth >= 200 && s.PhoneWidth <= 1000) {
		return opt, errors.New("phone width " + num(s.PhoneWidth) + " px is not within 200–1000")
	}
	opt.PhoneWidth = s.PhoneWidth
	return opt, nil
}

// markID is the grammar of a mark id: the chart's path (within a
// frame or shadow root: after its "frame1/" or "shadow0/"), then element
// steps joined by "/" (children) and ">" (content a <use> instantiates),
// and "#k" for the k-th point of a scatter drawn as one path.
// (No regexp: the package would double the core's share of the .wasm.)
func markID(s string) bool {
	for {
		rest, ok := cutNumbered(s, "shadow")
		if !ok {
			rest, ok = cutNumbered(s, "frame")
		}
		if !ok || !strings.HasPrefix(rest, "/") {
			break
		}
		s = rest[1:]
	}
	s, ok := cutNumbered(s, "svg")
	if !ok || s == "" {
		return false
	}
	for s != "" && (s[0] == '/' || s[0] == '>') {
		i := 1
		for i < len(s) && (isLetter(s[i]) || i > 1 && (s[i] >= '0' && s[i] <= '9' || s[i] == '_' || s[i] == '-')) {
			i++
		}
		if i == 1 || !isLetter(s[1]) {
			return false
		}
		s = s[i:]
	}
	if s == "" {
		return true
	}
	_, ok = cutNumbered(s, "#")
	return ok && len(s) > 1 && strings.Trim(s[1:], "0123456789") == ""
}

func isLetter(c byte) bool { return c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' }

// cutNumbered cuts prefix and the digits after it (at least one) from s.
func cutNumbered(s, prefix string) (string, bool) {
	rest, ok := strings.CutPrefix(s, prefix)
	i := 0
	for i < len(rest) && rest[i] >= '0' && rest[i] <= '9' {
		i++
	}
	return rest[i:], ok && i > 0
}

func finite4(b [4]float64) bool {
	for _, v := range b {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return false
		}
	}
	return true
}

// ParseBox reads an emphasis box as typed: "box:x,y,w,h" in page CSS px;
// ok is false for any other text.
func ParseBox(text string) (b [4]float64, ok bool, err error) {
	rest, found := strings.CutPrefix(strings.TrimSpace(text), "box:")
	if !found {
		return b, false, nil
	}
	parts := strings.Split(rest, ",")
	if len(parts) != 4 {
		return b, true, errors.New("emphasis box " + strconv.Quote(text) + ": want box:x,y,width,height")
	}
	for i, p := range parts {
		if b[i], err = strconv.ParseFloat(strings.TrimSpace(p), 64); err != nil {
			return b, true, errors.New("emphasis box " + strconv.Quote(text) + ": " + err.Error())
		}
	}
	return b, true, nil
}

// SplitEmphasis reads an emphasis as a person types it: mark ids
// ("svg0/g1/rect2,svg0/g1/rect3", each as the report gives it) or else a
// CSS selector.
func SplitEmphasis(text string) (ids []string, selector string) {
	text = strings.TrimSpace(text)
	items := strings.Split(text, ",")
	for _, it := range items {
		if !markID(strings.TrimSpace(it)) {
			return nil, text
		}
	}
	for i := range items {
		items[i] = strings.TrimSpace(items[i])
	}
	return items, ""
}

// num writes a number as fmt's %v does (the messages here are put
// together without fmt, which the extension's overlay core does not link).
func num(f float64) string { return strconv.FormatFloat(f, 'g', -1, 64) }
