package main

// Tests for hostile and bad input to the command (issue 10).

import (
	"bytes"
	"fmt"
	"image"
	"image/color"
	"image/png"
	"net/http"
	"net/http/httptest"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/internal/browser"
	"standout/internal/report"
	"standout/internal/testkit"
)

func writePage(t *testing.T, dir, name, body string) string {
	p := filepath.Join(dir, name)
	require.NoError(t, os.WriteFile(p, []byte(body), 0o644))
	return p
}

// lostEmphasis is a chart whose declared emphasis, a grey bar among grey
// bars, cannot stand out: --fail-on error exits 1 on it.
const lostEmphasis = `<svg width="200" height="100"><rect x="10" y="40" width="20" height="60" fill="#777"/>` +
	`<rect data-standout-emphasis x="40" y="30" width="20" height="70" fill="#777"/><rect x="70" y="20" width="20" height="80" fill="#777"/></svg>`

// A page that defines the read pass's global before it runs must not be
// able to hand back a result of its own.
func TestIssue10PageCannotForgeItsResult(t *testing.T) {
	needBrowser(t)
	dir := t.TempDir()
	honest := writePage(t, dir, "honest.html", `<!doctype html><body>`+lostEmphasis+`</body>`)
	forged := writePage(t, dir, "forged.html", `<!doctype html><body><script>
	globalThis.standoutReader = Object.freeze({ readPage: () => ({ source: location.href, snapshots: [], problems: [] }), findCharts: () => [], pageBox: () => [0, 0, 0, 0] });
	Object.defineProperty(globalThis, 'standoutReader', { writable: false, configurable: false });
	JSON.stringify = () => '{"source":"x","snapshots":[],"problems":[]}';
	</script>`+lostEmphasis+`</body>`)
	for _, p := range []string{honest, forged} {
		code, out, errs := runCmd("check", "--browser", "--fail-on", "error", p)
		assert.Equal(t, 1, code, "%s: %s %s", filepath.Base(p), out, errs)
		assert.Contains(t, out, "3 data marks", filepath.Base(p))
	}
}

// Local pages are served from their own folder: nothing outside it, and
// no file: URL, reaches the page or its screenshot.
func TestIssue10LocalPagesStayInTheirFolder(t *testing.T) {
	needBrowser(t)
	top := t.TempDir()
	secret := writePage(t, top, "secret.html", `<!doctype html><body style="margin:0;background:#b03a8e"></body>`)
	dir := filepath.Join(top, "story")
	require.NoError(t, os.Mkdir(dir, 0o755))
	writePage(t, dir, "inside.html", `<!doctype html><body style="margin:0;background:#2e8b57"></body>`)
	page := writePage(t, dir, "page.html", fmt.Sprintf(`<!doctype html><body style="margin:0;background:#fff">
	<iframe src="file://%s" style="position:absolute;left:0;top:0;width:200px;height:200px;border:0"></iframe>
	<iframe src="../secret.html" style="position:absolute;left:220px;top:0;width:200px;height:200px;border:0"></iframe>
	<iframe src="inside.html" style="position:absolute;left:440px;top:0;width:200px;height:200px;border:0"></iframe>
	<div style="position:absolute;top:300px">%s</div></body>`, secret, lostEmphasis))
	local, err := newLocalPages()
	require.NoError(t, err)
	defer local.Close()
	u, err := local.url(page)
	require.NoError(t, err)
	exe := testkit.Chromium(t)
	res, err := readInBrowser(exe, []string{u}, browser.ReadOptions{Screenshot: true}, &strings.Builder{})
	require.NoError(t, err)
	require.NoError(t, res[0].Err)
	img := decodePNGBytes(t, res[0].Screenshot)
	magenta := color.RGBA{0xb0, 0x3a, 0x8e, 0xff}
	for _, x := range []int{100, 320} {
		assert.NotEqual(t, magenta, color.RGBAModel.Convert(img.At(x, 100)), "the file outside the page's folder shows at x=%d", x)
	}
	assert.Equal(t, color.RGBA{0x2e, 0x8b, 0x57, 0xff}, color.RGBAModel.Convert(img.At(540, 100)), "a page in the folder loads")
	// The server itself refuses to leave the folder.
	resp, err := http.Get(strings.Replace(u, "page.html", "..%2fsecret.html", 1))
	require.NoError(t, err)
	resp.Body.Close()
	assert.NotEqual(t, 200, resp.StatusCode)
}

// Page text reaches Markdown only escaped, and the terminal only without
// control characters.
func TestIssue10PageTextIsEscaped(t *testing.T) {
	dir := t.TempDir()
	page := writePage(t, dir, "p.html", "<svg width=\"200\" height=\"100\"><use href=\"#\x1b]0;pwned\x07\x1b[2J\"/>"+
		"<circle cx=\"10\" cy=\"10\" r=\"4\" fill=\"#555\"/><circle cx=\"30\" cy=\"10\" r=\"4\" fill=\"#555\"/></svg>")
	code, out, errs := runCmd("check", page)
	require.Equal(t, 0, code, errs)
	assert.Contains(t, out, "refers to missing")
	assert.NotContains(t, out, "\x1b")
	assert.NotContains(t, out, "\x07")

	rep := &report.Report{Caution: "c", Pages: []report.Page{{Source: "s", Charts: []report.Chart{{
		Path: "svg0", IsChart: true,
		Emphasis: &report.Emphasis{Marks: []string{"svg0/a`](http://x)![y](http://z)`0"}, Holds: map[string]bool{}},
	}}}}}
	var md strings.Builder
	report.WriteMarkdown(&md, rep, nil)
	assert.Contains(t, md.String(), "`` svg0/a`](http://x)![y](http://z)`0 ``", "a code span the id cannot close")
}

// URLs are not file paths, and folders are not pages.
func TestIssue10URLsAndFoldersAsArguments(t *testing.T) {
	code, _, errs := runCmd("check", "data:text/html,<svg></svg>")
	assert.Equal(t, 2, code)
	assert.Contains(t, errs, "add --browser")
	code, _, errs = runCmd("check", "https://staging.invalid/story")
	assert.Equal(t, 2, code)
	assert.Contains(t, errs, "add --browser")
	code, _, errs = runCmd("check", t.TempDir())
	assert.Equal(t, 2, code)
	assert.Contains(t, errs, "is a folder")
}

// --timeout bounds a page in both readers.
func TestIssue10Timeout(t *testing.T) {
	dir := t.TempDir()
	var b strings.Builder
	b.WriteString(`<svg width="1000" height="1000">`)
	for i := 0; i < 20000; i++ {
		fmt.Fprintf(&b, `<circle cx="%d" cy="%d" r="2"/>`, i%1000, i/1000)
	}
	b.WriteString(`</svg>`)
	page := writePage(t, dir, "big.html", b.String())
	code, _, errs := runCmd("check", "--timeout", "1ms", page)
	assert.Equal(t, 2, code)
	assert.Contains(t, errs, "time limit")
	code, _, _ = runCmd("check", "--timeout", "0s", page)
	assert.Equal(t, 2, code)

	needBrowser(t)
	stall := stallingServer(t)
	start := time.Now()
	code, _, errs = runCmd("check", "--browser", "--timeout", "2s", stall.URL)
	assert.Equal(t, 2, code)
	assert.Contains(t, errs, stall.URL)
	assert.Less(t, time.Since(start), 15*time.Second)
}

// An interrupted browser run stops the browser and removes its profile.
func TestIssue10InterruptRemovesProfile(t *testing.T) {
	needBrowser(t)
	if testing.Short() {
		t.Skip("builds the command")
	}
	bin := filepath.Join(t.TempDir(), "standout")
	out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput()
	require.NoError(t, err, "%s", out)
	stall := stallingServer(t)
	tmp := t.TempDir()
	cmd := exec.Command(bin, "check", "--browser", stall.URL)
	cmd.Env = append(os.Environ(), "TMPDIR="+tmp)
	var stderr strings.Builder
	cmd.Stderr = &stderr
	require.NoError(t, cmd.Start())
	// Wait until the browser runs (its profile exists), then interrupt.
	deadline := time.Now().Add(20 * time.Second)
	for time.Now().Before(deadline) {
		if m, _ := filepath.Glob(filepath.Join(tmp, "standout-profile-*")); len(m) > 0 {
			break
		}
		time.Sleep(50 * time.Millisecond)
	}
	time.Sleep(500 * time.Millisecond)
	require.NoError(t, cmd.Process.Signal(syscall.SIGTERM))
	err = cmd.Wait()
	var exit *exec.ExitError
	require.ErrorAs(t, err, &exit)
	assert.Equal(t, 2, exit.ExitCode(), stderr.String())
	assert.Contains(t, stderr.String(), "interrupted")
	// Nothing is left: neither the profile nor the browser's temporary
	// files, which a killed Chromium leaves in its TMPDIR.
	left, err := os.ReadDir(tmp)
	require.NoError(t, err)
	assert.Empty(t, left, "files left behind in TMPDIR")
}

// A browser run that ends well leaves nothing in TMPDIR either.
func TestBrowserRunLeavesNoFiles(t *testing.T) {
	needBrowser(t)
	tmp := t.TempDir()
	page := writePage(t, t.TempDir(), "p.html", `<!doctype html><body>`+lostEmphasis+`</body>`)
	t.Setenv("TMPDIR", tmp)
	code, _, errs := runCmd("check", "--browser", page)
	require.Equal(t, 0, code, errs)
	left, err := os.ReadDir(tmp)
	require.NoError(t, err)
	var names []string
	for _, e := range left {
		names = append(names, e.Name())
	}
	assert.Empty(t, names, "files left behind in TMPDIR")
}

// As root, Chromium runs without its sandbox and the command says so.
func TestIssue10SandboxNote(t *testing.T) {
	if os.Geteuid() != 0 {
		assert.Empty(t, browser.SandboxNote())
		return
	}
	needBrowser(t)
	dir := t.TempDir()
	page := writePage(t, dir, "p.html", `<!doctype html><body>`+lostEmphasis+`</body>`)
	_, _, errs := runCmd("check", "--browser", page)
	assert.Contains(t, errs, "without its sandbox")
}

// The static reader answers hostile pages within seconds.
func TestIssue10StaticHostilePages(t *testing.T) {
	dir := t.TempDir()
	sel := writePage(t, dir, "sel.html", `<style>`+strings.Repeat("g ", 12)+`circle { fill: #7a3b8c }</style><svg>`+
		strings.Repeat("<g>", 480)+`<circle r="3"/>`+strings.Repeat("</g>", 480)+`</svg>`)
	code, out, errs := runCmd("check", sel)
	assert.Equal(t, 0, code, errs)
	assert.Contains(t, out, "#7a3b8c")
	var b strings.Builder
	b.WriteString(`<svg><defs><circle id="l0" r="1"/>`)
	for i := 1; i < 8; i++ {
		fmt.Fprintf(&b, `<g id="l%d">%s</g>`, i, strings.Repeat(fmt.Sprintf(`<use href="#l%d"/>`, i-1), 10))
	}
	b.WriteString(`</defs><use href="#l7"/></svg>`)
	chain := writePage(t, dir, "chain.svg", b.String())
	code, _, errs = runCmd("check", chain)
	assert.Equal(t, 2, code)
	assert.Contains(t, errs, "through <use>")
}

func decodePNGBytes(t *testing.T, b []byte) image.Image {
	img, err := png.Decode(bytes.NewReader(b))
	require.NoError(t, err)
	return img
}

// stallingServer answers no request for 30 s (or until the client gives
// up).
func stallingServer(t *testing.T) *httptest.Server {
	s := httptest.NewServer(http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		select {
		case <-r.Context().Done():
		case <-time.After(30 * time.Second):
		}
	}))
	t.Cleanup(s.Close)
	return s
}
