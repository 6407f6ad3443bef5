package main

import (
	"fmt"

	"standout/internal/browser"
	"standout/snapshot"
)

// mergeFrames adds to a page what the read pass read in its frames of
// other origins: each frame's charts and charts drawn as pixels, their
// paths and element names under the frame's prefix (frame2/svg0), their
// boxes moved into page coordinates.
func mergeFrames(pg *snapshot.PageJSON, frames []browser.FrameRead) error {
	for _, f := range frames {
		fp, err := snapshot.DecodePage([]byte(f.JSON))
		if err != nil {
			return fmt.Errorf("the read pass returned bad data for %s: %w", f.Prefix, err)
		}
		for i := range fp.Snapshots {
			s := &fp.Snapshots[i]
			s.Path = f.Prefix + s.Path
			s.Anchor = "" // a selector in the frame's document, not the page's
			s.Box[0] += f.Dx
			s.Box[1] += f.Dy
			for k := range s.Nodes {
				n := &s.Nodes[k]
				n.Name = f.Prefix + n.Name
				n.CTM[4] += f.Dx
				n.CTM[5] += f.Dy
				if len(n.BBox) == 4 {
					n.BBox[0] += f.Dx
					n.BBox[1] += f.Dy
				}
			}
			pg.Snapshots = append(pg.Snapshots, *s)
		}
		for _, r := range fp.Rasters {
			r.Name = f.Prefix + r.Name
			r.Box[0] += f.Dx
			r.Box[1] += f.Dy
			pg.Rasters = append(pg.Rasters, r)
		}
		for _, p := range fp.Problems {
			pg.Problems = append(pg.Problems, f.Prefix+": "+p)
		}
	}
	return nil
}
