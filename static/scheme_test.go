package static

import (
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/snapshot"
)

// Rules under @media (prefers-color-scheme: …) apply only in the scheme
// they name (Media Queries 5 §11.5), as light-dark() and custom properties
// resolve for the scheme read in: the static reader read the dark
// scheme's highlight colour into a light-scheme page.
func TestColourSchemeMediaQueries(t *testing.T) {
	page := `<!doctype html><html><head><style>
	:root { color-scheme: light dark; --bar: light-dark(#3b6e8f, #9cc3dc); }
	@media (prefers-color-scheme: dark) { .hi { fill: #ffb86b; } }
	@media not (prefers-color-scheme: dark) { .lo { fill: #5e5e5e; } }
	@media screen and (prefers-color-scheme: light), print { .mid { fill: #6a994e; } }
	</style></head><body><svg width="200" height="100">
	<rect x="10" y="40" width="20" height="60" style="fill: var(--bar)"/>
	<rect class="hi" x="40" y="20" width="20" height="80" fill="#c8553d"/>
	<rect class="lo" x="70" y="50" width="20" height="50" fill="#a7a9ac"/>
	<rect class="mid" x="100" y="50" width="20" height="50" fill="#a7a9ac"/></svg></body></html>`
	fills := func(dark bool) []string {
		p, err := Build(strings.NewReader(page), Options{Source: "t", Dark: dark})
		require.NoError(t, err)
		var out []string
		for _, n := range p.Charts[0].Nodes {
			if n.Tag == "rect" {
				out = append(out, snapshot.Hex(n.Fill.RGBA))
			}
		}
		return out
	}
	assert.Equal(t, []string{"#3b6e8f", "#c8553d", "#5e5e5e", "#6a994e"}, fills(false), "light")
	assert.Equal(t, []string{"#9cc3dc", "#ffb86b", "#a7a9ac", "#a7a9ac"}, fills(true), "dark")
}
