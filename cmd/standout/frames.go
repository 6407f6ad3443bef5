package main

import (
	"fmt"

	"standout/internal/browser"
	"standout/snapshot"
)

// mergeFrames adds to a page what the read pass read in its frames of
// other origins (snapshot.PageJSON.MergeFrame).
func mergeFrames(pg *snapshot.PageJSON, frames []browser.FrameRead) error {
	for _, f := range frames {
		fp, err := snapshot.DecodePage([]byte(f.JSON))
		if err != nil {
			return fmt.Errorf("the read pass returned bad data for %s: %w", f.Prefix, err)
		}
		pg.MergeFrame(fp, f.Prefix, f.Dx, f.Dy)
	}
	return nil
}
