package extension

import (
	"bytes"
	"encoding/json"
	"fmt"
	"image/png"
	"os"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestIconsAreCurrent(t *testing.T) {
	for _, s := range IconSizes {
		got, err := os.ReadFile(fmt.Sprintf("icons/%d.png", s))
		require.NoError(t, err, "run go generate ./extension")
		assert.Equal(t, IconPNG(s), got, "icons/%d.png is stale: run go generate ./extension", s)
		img, err := png.Decode(bytesReader(got))
		require.NoError(t, err)
		assert.Equal(t, s, img.Bounds().Dx())
	}
}

// Both manifests name icons the extension ships, at the sizes the
// WebExtension manifest's icons key documents (16, 32, 48, 128).
func TestManifestsNameShippedIcons(t *testing.T) {
	for _, name := range []string{"manifest.json", "manifest.firefox.json"} {
		raw, err := Files.ReadFile(name)
		require.NoError(t, err)
		var m struct {
			Icons  map[string]string `json:"icons"`
			Action struct {
				DefaultIcon map[string]string `json:"default_icon"`
			} `json:"action"`
		}
		require.NoError(t, json.Unmarshal(raw, &m))
		require.Len(t, m.Icons, len(IconSizes), name)
		require.NotEmpty(t, m.Action.DefaultIcon, name)
		for _, set := range []map[string]string{m.Icons, m.Action.DefaultIcon} {
			for size, path := range set {
				b, err := Files.ReadFile(path)
				require.NoError(t, err, "%s names %s", name, path)
				img, err := png.Decode(bytesReader(b))
				require.NoError(t, err)
				assert.Equal(t, size, fmt.Sprint(img.Bounds().Dx()), "%s: %s", name, path)
			}
		}
	}
}

func bytesReader(b []byte) *bytes.Reader { return bytes.NewReader(b) }
