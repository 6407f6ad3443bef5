package extension

import (
	"encoding/json"
	"fmt"
	"math/rand"
	"os"
	"path/filepath"
	"strings"

	"standout/static"
)

// TrainingFiles are the pages the background trains the core on after
// an install or an update when nothing has been checked yet
// (background.js: trainAtInstall), in turn, each page's JSON as the read
// pass gives it to the core: TrainingPage(false), then TrainingPage(true).
// A press made at once after the install waits for the first request
// to end, so the first is the page without a fix to search: with the
// search, a first request took 63-188 ms under Node, against 44-103
// without.
var TrainingFiles = []string{"train.json", "train-fix.json"}

// trainingPoints is the size of the training page's scatter: small, so
// that a press made while the untrained core runs the page waits little
// (an untrained core took 400–500 ms over 5,000 marks in the browser
// benchmark), and the training is many short requests.
const trainingPoints = 600

// TrainingPage is an invented page for that training: a scatter of
// trainingPoints points in four colours with one dark point set apart,
// and a bar chart of 24 labelled bars with one in its own colour, so
// that the walk's and the model's paths for points, bars and text all
// run. With fix, one more point is brown, which CVD readers lose among
// the others, so that the search for a fix that a failed emphasis
// starts runs too. Chromium keeps a module's optimised code when the
// first megabyte of it is compiled, and again only after another
// megabyte (DEVELOPERS.md): code a press runs that the training never
// ran is compiled again after every start of the worker. Left out of the
// training, the fix search took 79–106 ms of the core of the second press
// after a restart (5,000 marks, recoloured, three restarts in each of two
// runs), against 46–62 with it.
func TrainingPage(fix bool) string {
	rng := rand.New(rand.NewSource(14))
	cols := []string{"#3b6e8f", "#d0842c", "#5a9a4e", "#9a6aa6"}
	var b strings.Builder
	b.WriteString(`<!doctype html><html><body><svg width="900" height="600" aria-label="Invented scatter"><g>`)
	for i := 0; i < trainingPoints; i++ {
		c := cols[rng.Intn(len(cols))]
		switch i {
		case trainingPoints / 2:
			c = "#1d1d1d"
		case trainingPoints / 3:
			if fix {
				c = "#86705a"
			}
		}
		fmt.Fprintf(&b, `<circle cx="%.1f" cy="%.1f" r="3" fill="%s"/>`, 10+rng.Float64()*880, 10+rng.Float64()*580, c)
	}
	b.WriteString(`</g></svg><svg width="900" height="300" aria-label="Invented bars"><g>`)
	for k := 0; k < 24; k++ {
		h := 40 + rng.Float64()*200
		fill := "#7d8a99"
		if k == 9 {
			fill = "#b5473a"
		}
		fmt.Fprintf(&b, `<rect x="%d" y="%.1f" width="28" height="%.1f" fill="%s"/><text x="%d" y="290" font-size="10">w%d</text>`, 20+k*36, 270-h, h, fill, 24+k*36, k+1)
	}
	b.WriteString(`</g></svg></body></html>`)
	return b.String()
}

// readTrainingPage reads TrainingPage(fix) as the static reader does.
func readTrainingPage(fix bool) (*static.Page, error) {
	return static.Build(strings.NewReader(TrainingPage(fix)), static.Options{Source: "standout-training"})
}

// writeTrainingPages writes TrainingFiles into dir.
func writeTrainingPages(dir string) error {
	for i, name := range TrainingFiles {
		p, err := readTrainingPage(i == 1)
		if err != nil {
			return fmt.Errorf("the training page %s: %w", name, err)
		}
		b, err := json.Marshal(map[string]any{"source": p.Source, "snapshots": p.Charts})
		if err != nil {
			return err
		}
		if err := os.WriteFile(filepath.Join(dir, name), b, 0o644); err != nil {
			return err
		}
	}
	return nil
}
