package extension

import (
	"bytes"
	"encoding/json"
	"os"
	"os/exec"
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/internal/testkit"
	"standout/internal/testpages"
)

// coreUnderNode loads the overlay core as the extension ships it into
// Node, the way background.js loads it, and answers a digest request for
// each page (JSON {name: pageJSON} on stdin), printing {name: response}.
const coreUnderNode = `
import { readFileSync } from 'node:fs';
const dir = process.argv[2];
await import(dir + '/wasm_exec.js');
const { restoreFindFuncTable } = await import(dir + '/findfunc.js');
const go = new Go();
go.env = { GOGC: 'off', GOMEMLIMIT: '256MiB' };
const { module, instance } = await WebAssembly.instantiate(readFileSync(dir + '/standout.wasm'), go.importObject);
restoreFindFuncTable(module, instance);
go.run(instance);
for (let i = 0; i < 400 && !globalThis.standoutHandle; i++) await new Promise((r) => setTimeout(r, 5));
const pages = JSON.parse(readFileSync(0, 'utf8'));
const out = {};
for (const [name, page] of Object.entries(pages)) out[name] = JSON.parse(globalThis.standoutHandle('{"type":"analyse"}', page));
process.stdout.write(JSON.stringify(out));
process.exit(0);
`

// TestShippedCoreAnswersAsBuilt holds the overlay core the extension
// ships (built with the overlaycore tag, then shrunk by wasm-opt where the
// machine has it) to the digests the whole core gives natively
// (wasm/testdata/digests.golden.json), run in Node as the background runs
// it.
func TestShippedCoreAnswersAsBuilt(t *testing.T) {
	if testing.Short() {
		t.Skip("builds the extension")
	}
	node := testkit.Node(t)
	dir := built(t)
	script := filepath.Join(t.TempDir(), "core.mjs")
	require.NoError(t, os.WriteFile(script, []byte(coreUnderNode), 0o644))
	pages := map[string]string{}
	for name, b := range testpages.Requests(t) {
		pages[name] = string(b)
	}
	in, err := json.Marshal(pages)
	require.NoError(t, err)
	cmd := exec.Command(node, script, dir)
	cmd.Stdin = bytes.NewReader(in)
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	out, err := cmd.Output()
	require.NoError(t, err, "%s", stderr.String())
	assert.Empty(t, stderr.String(), "the core warned")
	var got map[string]map[string]any
	require.NoError(t, json.Unmarshal(out, &got))
	for _, r := range got {
		delete(r, "timing")
	}
	want, err := os.ReadFile(testpages.DigestsGolden(t))
	require.NoError(t, err)
	gotJSON, err := json.Marshal(got)
	require.NoError(t, err)
	require.JSONEq(t, string(want), string(gotJSON))
}
