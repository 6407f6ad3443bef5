package extension

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/internal/report"
	"standout/snapshot"
)

// The build ships the training pages as the core reads a page: the
// scatter and the bar chart, all their marks read.
func TestTrainingPageShips(t *testing.T) {
	for _, name := range TrainingFiles {
		b, err := os.ReadFile(filepath.Join(built(t), name))
		require.NoError(t, err)
		p, err := snapshot.DecodePage(b)
		require.NoError(t, err)
		assert.Equal(t, "standout-training", p.Source)
		require.Len(t, p.Snapshots, 2)
		circles, rects := 0, 0
		for _, s := range p.Snapshots {
			for _, n := range s.Nodes {
				switch n.Tag {
				case "circle":
					circles++
				case "rect":
					rects++
				}
			}
		}
		assert.Equal(t, trainingPoints, circles, name)
		assert.Equal(t, 24, rects, name)
	}
}

// The core trains on the pages the build writes.
func TestCoreTrainsOnTheTrainingPages(t *testing.T) {
	bg, err := Files.ReadFile("core.js")
	require.NoError(t, err)
	assert.Contains(t, string(bg), `['`+strings.Join(TrainingFiles, `', '`)+`']`)
}

// The training runs the paths a press runs, the search for a fix among
// them: on the second page the model finds the brown point lost for some
// readers and suggests a fix; on the first, which a press made at once
// after the install may wait for, it searches none.
func TestTrainingPageSearchesAFix(t *testing.T) {
	for _, fix := range []bool{false, true} {
		p, err := readTrainingPage(fix)
		require.NoError(t, err)
		pg, err := report.FromSnapshots("standout-training", p.Charts, nil, report.DefaultOptions)
		require.NoError(t, err)
		out := string(report.AppendJSON(nil, &report.Report{Pages: []report.Page{pg}}))
		assert.Equal(t, fix, strings.Contains(out, `"fix":{"kind":`), "a fix searched on the training page with fix %v", fix)
	}
}

// When nothing is checked after an install, the background trains the
// core on the training page (background.js: trainAtInstall) for its
// budget. The browser started again on the same profile installs the
// extension again, as Chromium does with one loaded from the command
// line, and does not train a second time; nor does it load the core, as
// nothing was checked yet, and a press works. Started a third time, after
// that press, it loads the core at once, as at any start, in the
// offscreen document the press's grant allows (background.js:
// loadAtStart; grantOffscreen). (A start that installs nothing fires
// runtime.onStartup instead, which a browser given the extension on the
// command line never does.)
func TestCoreTrainedAtInstall(t *testing.T) {
	profile, dir := t.TempDir(), builtCopy(t)
	h := newHarnessWith(t, dir, profile)
	var st training
	require.Eventually(t, func() bool { st = h.training(t); return st.Finished }, 60*time.Second, 100*time.Millisecond, "no training after the install: %+v", st)
	assert.Greater(t, st.Requests, 1, "%+v", st)
	assert.GreaterOrEqual(t, st.SpentMs, 2000.0, "training ended before its budget: %+v", st)
	// The mark of the finished training is written a moment after it ends:
	// each look starts a lookup, whose finding the next look reads.
	require.Eventually(t, func() bool {
		return h.workerValue(`caches.open('standout').then((c) => c.match('https://standout.invalid/trained'))
			.then((r) => { globalThis.markSeen = r !== undefined; }), String(globalThis.markSeen === true)`) == "true"
	}, 10*time.Second, 100*time.Millisecond, "the finished training left no mark")
	for _, pressed := range []bool{false, true} {
		h.close()
		if pressed {
			grantOffscreen(t, dir)
		}
		h = newHarnessWith(t, dir, profile)
		time.Sleep(3 * time.Second)
		if !pressed {
			assert.Empty(t, h.coreTarget(), "the core was loaded as the browser started again, with no press before")
		} else {
			require.Eventually(t, func() bool { return h.coreTarget() != "" }, 10*time.Second, 50*time.Millisecond, "no core as the browser started again after a press")
			require.Eventually(t, func() bool { return h.hostValue(`String(globalThis.standoutCore.loaded)`) == "true" }, 10*time.Second, 50*time.Millisecond)
			assert.Equal(t, "none", h.hostValue(`(({ training }) => (training ? JSON.stringify(training) : 'none'))(globalThis.standoutCore)`), "trained again after the browser started again")
		}
		h.showPage(chartPage)
		assert.Len(t, layerRects(t, h.overlayHTML())["svg0"]["pops"], 1)
	}
}

// training is the background's training as it reports it in
// standoutTraining (core.js: train), zero before any.
type training struct {
	Requests int
	SpentMs  float64
	Stops    int
	Running  bool
	Finished bool
}

func (h *harness) training(t testing.TB) training {
	var st training
	if h.workerValue(`typeof globalThis.standoutHandle`) != "function" {
		return st // no core loaded in the service worker yet
	}
	require.NoError(t, json.Unmarshal([]byte(h.coreValue(`JSON.stringify(globalThis.standoutTraining || {})`)), &st))
	return st
}
