//go:build !js

package saliency

import (
	"bytes"
	"encoding/json"
	"image"
	"image/color"
	"image/png"
	"math/rand"
	"os"
	"os/exec"
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/internal/testkit"
)

// python3 with Debian's python3-opencv (4.6, its contrib saliency module):
// the maximum of OpenCV's fine-grained static saliency (Montabone & Soto
// 2010, Image and Vision Computing 28(3), §3: centre–surround differences
// of intensity at several scales, from integral images) on each PNG.
const fineGrainedScript = `
import sys, json, cv2, numpy as np
fg = cv2.saliency.StaticSaliencyFineGrained_create()
out = []
for path in sys.argv[1:]:
    ok, m = fg.computeSaliency(cv2.imread(path))
    if not ok:
        raise SystemExit("no map for " + path)
    y, x = np.unravel_index(np.argmax(m), m.shape)
    out.append([int(x), int(y)])
json.dump(out, sys.stdout)
`

// No package the registries carry implements Itti, Koch & Niebur (1998)
// itself. The nearest is OpenCV's fine-grained saliency, the model's
// intensity channel done again with other scales and without its
// normalisation N(·). So the two are compared where the published model's
// behaviour is not in doubt: on grey-level displays with one intensity
// singleton, both must put their maximum on it. (They are not compared
// map for map: without N(·) the fine-grained map keeps every repeated
// edge, and on a smooth field it peaks at the image's border.)
func TestIntensitySingletonsAgreeWithOpenCV(t *testing.T) {
	py := testkit.Python(t, "import cv2; cv2.saliency.StaticSaliencyFineGrained_create()", "python3-opencv")
	type display struct {
		name   string
		img    *Image
		target [4]int
	}
	var ds []display

	// A grid of light grey squares, one of them dark.
	img := field(480, 400, "#ffffff")
	var target [4]int
	for gy := 0; gy < 6; gy++ {
		for gx := 0; gx < 7; gx++ {
			b, c := [4]int{40 + gx*60, 40 + gy*60, 16, 16}, "#b4b4b4"
			if gx == 4 && gy == 2 {
				target, c = b, "#1e1e1e"
			}
			fill(img, b, c)
		}
	}
	ds = append(ds, display{"dark square among light ones", img, target})

	// Bars of one grey on white, one of them near black.
	img = field(640, 480, "#ffffff")
	for k := 0; k < 20; k++ {
		h := 60 + k*53%300
		b, c := [4]int{20 + k*30, 440 - h, 20, h}, "#8a8a8a"
		if k == 13 {
			target, c = b, "#1a1a1a"
		}
		fill(img, b, c)
	}
	ds = append(ds, display{"dark bar among grey bars", img, target})

	// A light square on a noisy mid-grey field.
	img = NewImage(640, 480)
	rng := rand.New(rand.NewSource(1998))
	for i := range img.R {
		v := float32(min(max(0.5+0.08*rng.NormFloat64(), 0), 1))
		v = float32(int(v*255+0.5)) / 255
		img.R[i], img.G[i], img.B[i] = v, v, v
	}
	target = [4]int{400, 100, 60, 60}
	fill(img, target, "#f2f2f2")
	ds = append(ds, display{"light square on noise", img, target})

	dir := t.TempDir()
	args := []string{"-c", fineGrainedScript}
	for i, d := range ds {
		p := filepath.Join(dir, string(rune('a'+i))+".png")
		writePNG(t, p, d.img)
		args = append(args, p)
	}
	cmd := exec.Command(py, args...)
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	out, err := cmd.Output()
	require.NoError(t, err, stderr.String())
	var peaks [][2]int
	require.NoError(t, json.Unmarshal(out, &peaks))
	require.Len(t, peaks, len(ds))

	for i, d := range ds {
		rs := Regions(Compute(d.img), d.img.W, d.img.H)
		require.NotEmpty(t, rs, d.name)
		assert.True(t, rs[0].Covers(box(d.target)), "%s: our strongest region %v, the singleton %v", d.name, rs[0].Box, d.target)
		// The fine-grained map peaks on the singleton's edge, at most a
		// few pixels outside it.
		const edge = 8
		x, y, b := peaks[i][0], peaks[i][1], d.target
		assert.True(t, x >= b[0]-edge && x < b[0]+b[2]+edge && y >= b[1]-edge && y < b[1]+b[3]+edge,
			"%s: OpenCV's fine-grained maximum at (%d, %d), the singleton %v", d.name, x, y, b)
	}
}

// writePNG writes img as an 8-bit PNG.
func writePNG(t *testing.T, path string, img *Image) {
	out := image.NewRGBA(image.Rect(0, 0, img.W, img.H))
	at := func(v float32) uint8 { return uint8(min(max(v, 0), 1)*255 + 0.5) }
	for i := 0; i < img.W*img.H; i++ {
		out.SetRGBA(i%img.W, i/img.W, color.RGBA{at(img.R[i]), at(img.G[i]), at(img.B[i]), 255})
	}
	var buf bytes.Buffer
	require.NoError(t, png.Encode(&buf, out))
	require.NoError(t, os.WriteFile(path, buf.Bytes(), 0o644))
}
