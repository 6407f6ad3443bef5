package snapshot

import "strings"

// MergeFrame adds to p what a read pass read in one of its frames, f: the
// frame's charts and charts drawn as pixels, their paths and element names
// under prefix (the page's name for the frame, "frame2/"), their boxes
// moved by (dx, dy), the frame's content box origin in p's page px; and
// its problems, prefixed. A chart's anchor is a selector in the frame's
// document, not p's, and is dropped.
//
// The page's note that the frame could not be read ("frame2 (…): not
// readable …") goes: it now is.
func (p *PageJSON) MergeFrame(f *PageJSON, prefix string, dx, dy float64) {
	name := strings.TrimSuffix(prefix, "/")
	kept := p.Problems[:0]
	for _, pr := range p.Problems {
		if n, _, ok := UnreadFrame(pr); !ok || n != name {
			kept = append(kept, pr)
		}
	}
	p.Problems = kept
	for i := range f.Snapshots {
		s := &f.Snapshots[i]
		s.Path = prefix + s.Path
		s.Anchor = ""
		s.Box[0] += dx
		s.Box[1] += dy
		for k := range s.Nodes {
			n := &s.Nodes[k]
			n.Name = prefix + n.Name
			n.CTM[4] += dx
			n.CTM[5] += dy
			if len(n.BBox) == 4 {
				n.BBox[0] += dx
				n.BBox[1] += dy
			}
		}
		p.Snapshots = append(p.Snapshots, *s)
	}
	for _, r := range f.Rasters {
		r.Name = prefix + r.Name
		r.Box[0] += dx
		r.Box[1] += dy
		p.Rasters = append(p.Rasters, r)
	}
	for _, pr := range f.Problems {
		p.Problems = append(p.Problems, prefix+": "+pr)
	}
}

// UnreadFrame reads a read pass's note on a frame it could not enter,
// "frame2 (src): not readable (a cross-origin frame)…": the frame's name
// and its src attribute. (No regexp: the package would double the core's
// share of the .wasm.)
func UnreadFrame(note string) (name, src string, ok bool) {
	end := strings.Index(note, "): not readable (a cross-origin frame)")
	i := strings.Index(note, " (")
	if end < 0 || i <= 0 || i > end || strings.ContainsAny(note[:i], " \t") {
		return "", "", false
	}
	return note[:i], note[i+2 : end], true
}
