package extension

import (
	"bytes"
	"encoding/binary"
	"os"
	"os/exec"
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/internal/testkit"
	"standout/internal/wasmmod"
)

// linkedCore builds the overlay core as Go's linker writes it, before any
// shrinking.
func linkedCore(t *testing.T) []byte {
	t.Helper()
	if testing.Short() {
		t.Skip("builds the core for WebAssembly")
	}
	out := filepath.Join(t.TempDir(), "core.wasm")
	require.NoError(t, buildCore(testkit.Root(t), out, Cores[0].Args...))
	mod, err := os.ReadFile(out)
	require.NoError(t, err)
	return mod
}

// TestFindFuncTableRebuilt holds findfunc.js, run under Node on the
// linker's memory image with the table cleared, to the table Go's linker
// wrote (cmd/link/internal/ld/pcln.go, findfunctab), byte for byte.
func TestFindFuncTableRebuilt(t *testing.T) {
	mod := linkedCore(t)
	secs, err := wasmmod.Sections(mod)
	require.NoError(t, err)
	var segs []dataSegment
	for _, s := range secs {
		if s.ID == 11 {
			segs, err = readData(s.Body)
			require.NoError(t, err)
		}
	}
	img := memoryImage(segs)
	l, err := findLayout(img)
	require.NoError(t, err)
	linker := bytes.Clone(img[l.table : l.table+l.size])
	require.Greater(t, bytes.Count(linker, []byte{0}), len(linker)/2, "a table of mostly zeros")
	require.Greater(t, len(linker)-bytes.Count(linker, []byte{0}), int(l.nfunc), "a table with an index in every function's buckets")
	clear(img[l.table : l.table+l.size])
	dir := t.TempDir()
	require.NoError(t, os.WriteFile(filepath.Join(dir, "image"), img, 0o644))
	require.NoError(t, os.WriteFile(filepath.Join(dir, "layout"), l.section(), 0o644))
	script := `
import { readFileSync, writeFileSync } from 'node:fs';
const [js, dir] = process.argv.slice(2);
const { rebuildFindFuncTable } = await import(js);
const img = readFileSync(dir + '/image');
const buffer = img.buffer.slice(img.byteOffset, img.byteOffset + img.length);
const layout = readFileSync(dir + '/layout');
rebuildFindFuncTable(layout.buffer.slice(layout.byteOffset, layout.byteOffset + layout.length), buffer);
writeFileSync(dir + '/image', new Uint8Array(buffer));
`
	require.NoError(t, os.WriteFile(filepath.Join(dir, "rebuild.mjs"), []byte(script), 0o644))
	node := testkit.Node(t)
	js, err := filepath.Abs("findfunc.js")
	require.NoError(t, err)
	b, err := exec.Command(node, filepath.Join(dir, "rebuild.mjs"), js, dir).CombinedOutput()
	require.NoError(t, err, "%s", b)
	got, err := os.ReadFile(filepath.Join(dir, "image"))
	require.NoError(t, err)
	require.Len(t, got, len(img))
	assert.True(t, bytes.Equal(linker, got[l.table:l.table+l.size]), "findfunc.js does not rebuild the linker's table")
	clear(got[l.table : l.table+l.size])
	assert.True(t, bytes.Equal(img, got), "findfunc.js wrote outside the table")
}

// TestFindFuncStripRefuses checks that the build leaves a module whole
// when it cannot rebuild its table exactly.
func TestFindFuncStripRefuses(t *testing.T) {
	mod := linkedCore(t)
	out, why := withoutFindFuncTab(mod)
	require.Empty(t, why)
	require.Less(t, len(out), len(mod)-200_000, "the table's segments are gone")
	_, why = withoutFindFuncTab(out)
	assert.Equal(t, "the table was taken out already", why)
	_, why = withoutFindFuncTab(mod[:len(mod)/2])
	assert.NotEmpty(t, why, "a cut module")
	// One bucket of the linker's table changed: the rebuilt table no
	// longer matches, so the module is left as it is.
	secs, err := wasmmod.Sections(mod)
	require.NoError(t, err)
	for _, s := range secs {
		if s.ID != 11 {
			continue
		}
		segs, err := readData(s.Body)
		require.NoError(t, err)
		l, err := findLayout(memoryImage(segs))
		require.NoError(t, err)
		for _, g := range segs {
			if g.off <= l.table+2000 && l.table+2000 < g.off+uint32(len(g.data)) {
				g.data[l.table+2000-g.off] ^= 1
				_, why = withoutFindFuncTab(mod)
				assert.Equal(t, "the table built from the ftab is not the linker's", why)
				return
			}
		}
	}
	t.Fatal("no data segment holds the table's bytes")
}

// TestShippedCoreSize holds the overlay core the extension ships to 3 MiB
// (issue 14's budget, the saliency map included). Without wasm-opt the
// build ships it larger: the test skips on a developer machine and fails
// under CI=true.
func TestShippedCoreSize(t *testing.T) {
	if testing.Short() {
		t.Skip("builds the extension")
	}
	_, err := exec.LookPath("wasm-opt")
	testkit.Needs(t, "wasm-opt (apt-get install binaryen; without it the overlay core ships unshrunk)", err)
	mod, err := os.ReadFile(filepath.Join(built(t), "standout.wasm"))
	require.NoError(t, err)
	secs, err := wasmmod.Sections(mod)
	require.NoError(t, err)
	layout, _ := wasmmod.Custom(secs, FindFuncSection)
	require.Len(t, layout, 28, "the findfunctab was taken out")
	t.Logf("overlay core: %d bytes; its findfunctab, rebuilt on load: %d bytes", len(mod), binary.LittleEndian.Uint32(layout[4:]))
	assert.LessOrEqual(t, len(mod), 3<<20)
}

// FuzzDataSection reads a data section as the build does and checks what
// the build relies on: nothing panics, and the image cut into segments
// again (segmentsOf, appendData) reads back as the same memory.
func FuzzDataSection(f *testing.F) {
	f.Add(appendData(nil, []dataSegment{{8, []byte{1, 2, 3}}, {100, []byte{0, 0, 7}}}))
	f.Add(appendData(nil, []dataSegment{{0, bytes.Repeat([]byte{0, 0, 0, 9}, 40)}, {1 << 20, []byte{255}}}))
	f.Add([]byte{1, 0, 0x41, 0x80, 0x80, 0x80, 0x80, 0x08, 0x0b, 1, 1})
	f.Add([]byte{0xff, 0xff, 0xff, 0xff, 0x0f})
	f.Fuzz(func(t *testing.T, body []byte) {
		segs, err := readData(body)
		if err != nil {
			return
		}
		img := memoryImage(segs)
		again, err := readData(appendData(nil, segmentsOf(img)))
		require.NoError(t, err)
		got := memoryImage(again)
		require.True(t, bytes.Equal(bytes.TrimRight(img, "\x00"), bytes.TrimRight(got, "\x00")), "the image changed when cut again")
		// Whatever the section holds, the strip refuses or succeeds
		// without a panic.
		mod := appendSection(append([]byte{}, wasmmod.Magic...), 11, body)
		withoutFindFuncTab(mod)
	})
}

// FuzzStripModule hands the strip any bytes as a module: it refuses them
// or strips them, never panics, and what it strips reads back as a module
// that carries FindFuncSection once.
func FuzzStripModule(f *testing.F) {
	f.Add([]byte(wasmmod.Magic))
	f.Add(appendSection([]byte(wasmmod.Magic), 11, appendData(nil, []dataSegment{{16, []byte{0xf1, 0xff, 0xff, 0xff, 0, 0, 1, 8}}})))
	f.Add(appendSection([]byte(wasmmod.Magic), 0, []byte{3, 'a', 'b', 'c'}))
	f.Fuzz(func(t *testing.T, mod []byte) {
		out, why := withoutFindFuncTab(mod)
		if why != "" {
			return
		}
		secs, err := wasmmod.Sections(out)
		require.NoError(t, err)
		n := 0
		for _, s := range secs {
			if _, ok := wasmmod.Custom([]wasmmod.Section{s}, FindFuncSection); ok {
				n++
			}
		}
		require.Equal(t, 1, n)
	})
}
