package extension

// A WebDriver BiDi client for the Firefox end-to-end tests: Firefox (129
// and later) speaks BiDi natively when started with
// --remote-debugging-port, so no driver is downloaded. The protocol is
// JSON commands over one WebSocket (W3C WebDriver BiDi, §5 "Transport"):
// {id, method, params} out, {type: "success"|"error"|"event", ...} back.

import (
	"bufio"
	"bytes"
	"context"
	"encoding/base64"
	"encoding/json"
	"errors"
	"fmt"
	"image"
	"image/png"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/stretchr/testify/require"
	"golang.org/x/net/websocket"
)

// bidi is one session with a Firefox started for a test.
type bidi struct {
	t      testing.TB
	ws     *websocket.Conn
	mu     sync.Mutex
	nextID int
	// waiting holds, per command id, where its answer goes.
	waiting map[int]chan bidiAnswer
	events  chan bidiEvent
	// context is the top-level browsing context (the first tab).
	context string
	// downloads is the folder the profile saves downloads to.
	downloads string
	// chrome is the session's Marionette side, in the browser's window,
	// where the toolbar button is.
	chrome *marionette
}

type bidiAnswer struct {
	Type    string          `json:"type"`
	ID      int             `json:"id"`
	Result  json.RawMessage `json:"result"`
	Error   string          `json:"error"`
	Message string          `json:"message"`
	Method  string          `json:"method"`
	Params  json.RawMessage `json:"params"`
}

type bidiEvent struct {
	Method string
	Params json.RawMessage
}

// firefox finds Firefox (Debian's firefox-esr), skipping the test where
// there is none, except under CI=true, where the Firefox suite must run.
func firefox(t testing.TB) string {
	t.Helper()
	if testing.Short() {
		t.Skip("-short skips the browser tests")
	}
	for _, name := range []string{os.Getenv("STANDOUT_FIREFOX"), "firefox-esr", "firefox"} {
		if name == "" {
			continue
		}
		if p, err := exec.LookPath(name); err == nil {
			return p
		}
	}
	if os.Getenv("CI") == "true" {
		t.Fatal("Firefox is required under CI=true (apt-get install firefox-esr)")
	}
	t.Skip("no Firefox on this machine (apt-get install firefox-esr)")
	return ""
}

// profilePrefs keep a test profile quiet and put downloads in one folder
// without asking. The remote agent adds its own recommended preferences
// (remote.prefs.recommended) for automation.
const profilePrefs = `user_pref("browser.download.folderList", 2);
user_pref("browser.download.dir", %q);
user_pref("browser.download.useDownloadDir", true);
user_pref("browser.download.always_ask_before_handling_new_types", false);
user_pref("browser.download.alwaysOpenPanel", false);
user_pref("extensions.autoDisableScopes", 0);
user_pref("browser.shell.checkDefaultBrowser", false);
user_pref("datareporting.policy.dataSubmissionEnabled", false);
user_pref("toolkit.telemetry.reportingpolicy.firstRun", false);
user_pref("marionette.port", 0);
`

// startFirefox starts a headless Firefox with a fresh profile (with more
// user_pref lines, if any), opens a session through Marionette (Firefox
// allows one, and BiDi does not reach the browser's window) with BiDi
// on it, as geckodriver does, and finds its tab.
func startFirefox(t testing.TB, prefs ...string) *bidi {
	exe := firefox(t)
	profile, downloads := t.TempDir(), t.TempDir()
	userJS := fmt.Sprintf(profilePrefs, downloads) + strings.Join(prefs, "\n")
	require.NoError(t, os.WriteFile(filepath.Join(profile, "user.js"), []byte(userJS), 0o644))
	ctx, cancel := context.WithCancel(context.Background())
	cmd := exec.CommandContext(ctx, exe, "--headless", "--no-remote", "--profile", profile, "--remote-debugging-port=0", "--remote-allow-origins=http://127.0.0.1",
		"--marionette", "--remote-allow-system-access", "about:blank")
	cmd.Env = append(os.Environ(), "MOZ_CRASHREPORTER_DISABLE=1")
	stderr, err := cmd.StderrPipe()
	require.NoError(t, err)
	require.NoError(t, cmd.Start())
	t.Cleanup(func() {
		cancel()
		_ = cmd.Wait()
	})
	addr := make(chan string, 1)
	go func() {
		re := regexp.MustCompile(`WebDriver BiDi listening on (ws://\S+)`)
		sc := bufio.NewScanner(stderr)
		for sc.Scan() {
			if m := re.FindStringSubmatch(sc.Text()); m != nil {
				addr <- m[1]
			}
		}
	}()
	select {
	case <-addr:
	case <-time.After(60 * time.Second):
		t.Fatal("Firefox did not start its WebDriver BiDi server within 60 s")
	}
	chrome, url := dialMarionette(t, profile)
	ws, err := websocket.Dial(url, "", "http://127.0.0.1/")
	require.NoError(t, err)
	ws.MaxPayloadBytes = 64 << 20
	b := &bidi{t: t, ws: ws, waiting: map[int]chan bidiAnswer{}, events: make(chan bidiEvent, 256), downloads: downloads, chrome: chrome}
	go b.readLoop()
	t.Cleanup(func() { ws.Close() })
	var tree struct {
		Contexts []struct {
			Context string `json:"context"`
		} `json:"contexts"`
	}
	b.call("browsingContext.getTree", map[string]any{}, &tree)
	if len(tree.Contexts) == 0 {
		t.Fatal("Firefox has no tab")
	}
	b.context = tree.Contexts[0].Context
	return b
}

func (b *bidi) readLoop() {
	for {
		var raw []byte
		if err := websocket.Message.Receive(b.ws, &raw); err != nil {
			b.mu.Lock()
			for id, ch := range b.waiting {
				ch <- bidiAnswer{Type: "error", ID: id, Error: "connection closed", Message: err.Error()}
				delete(b.waiting, id)
			}
			b.mu.Unlock()
			return
		}
		var a bidiAnswer
		if json.Unmarshal(raw, &a) != nil {
			continue
		}
		if a.Type == "event" {
			select {
			case b.events <- bidiEvent{a.Method, a.Params}:
			default: // nobody listens: drop
			}
			continue
		}
		b.mu.Lock()
		ch := b.waiting[a.ID]
		delete(b.waiting, a.ID)
		b.mu.Unlock()
		if ch != nil {
			ch <- a
		}
	}
}

// send runs one command and decodes its result into out (when not nil).
func (b *bidi) send(method string, params any, out any) error {
	b.mu.Lock()
	b.nextID++
	id := b.nextID
	ch := make(chan bidiAnswer, 1)
	b.waiting[id] = ch
	b.mu.Unlock()
	msg, err := json.Marshal(map[string]any{"id": id, "method": method, "params": params})
	if err != nil {
		return err
	}
	if err := websocket.Message.Send(b.ws, string(msg)); err != nil {
		return err
	}
	select {
	case a := <-ch:
		if a.Type == "error" {
			return fmt.Errorf("%s: %s: %s", method, a.Error, a.Message)
		}
		if out != nil {
			return json.Unmarshal(a.Result, out)
		}
		return nil
	case <-time.After(90 * time.Second):
		return errors.New(method + ": no answer within 90 s")
	}
}

// call is send, failing the test on an error.
func (b *bidi) call(method string, params any, out any) {
	b.t.Helper()
	require.NoError(b.t, b.send(method, params, out))
}

// ---------- the Firefox harness ----------

// foxHarness drives the extension in Firefox through BiDi, with the
// methods the Chromium harness has, so that one suite runs in both.
type foxHarness struct {
	*bidi
	url string
	// extension is the installed extension's id.
	extension string
}

func (h *foxHarness) open(url string) {
	h.url = url
	h.call("browsingContext.navigate", map[string]any{"context": h.context, "url": url, "wait": "complete"}, nil)
}

type bidiValue struct {
	Type     string          `json:"type"`
	Value    json.RawMessage `json:"value"`
	SharedID string          `json:"sharedId"`
}

type bidiEval struct {
	Type             string    `json:"type"`
	Result           bidiValue `json:"result"`
	ExceptionDetails *struct {
		Text string `json:"text"`
	} `json:"exceptionDetails"`
}

// evalValue evaluates expr in the page and returns its serialised value.
func (h *foxHarness) evalValue(expr string, opts map[string]any) bidiValue {
	h.t.Helper()
	p := map[string]any{"expression": expr, "target": map[string]any{"context": h.context}, "awaitPromise": true}
	for k, v := range opts {
		p[k] = v
	}
	var r bidiEval
	h.call("script.evaluate", p, &r)
	if r.Type == "exception" {
		h.t.Fatalf("%s: %s", expr, r.ExceptionDetails.Text)
	}
	return r.Result
}

func (h *foxHarness) eval(expr string) string {
	h.t.Helper()
	v := h.evalValue(expr, nil)
	var s string
	if v.Type != "string" || json.Unmarshal(v.Value, &s) != nil {
		h.t.Fatalf("%s: not a string but %s %s", expr, v.Type, v.Value)
	}
	return s
}

// inOverlay calls fn (source of a function of one argument) with this
// bound to the overlay's closed shadow root, which BiDi hands to
// automation (a node's serialisation carries its shadow root, open or
// closed), and returns its string result.
func (h *foxHarness) inOverlay(fn string, arg string) string {
	h.t.Helper()
	host := h.evalValue(`document.querySelector('`+hostSelector+`')`, map[string]any{
		"serializationOptions": map[string]any{"includeShadowTree": "all", "maxDomDepth": 0},
	})
	var node struct {
		ShadowRoot *bidiValue `json:"shadowRoot"`
	}
	if host.Type != "node" || json.Unmarshal(host.Value, &node) != nil || node.ShadowRoot == nil {
		h.t.Fatalf("no overlay host with a shadow root (%s %s)", host.Type, host.Value)
	}
	var r bidiEval
	h.call("script.callFunction", map[string]any{
		"functionDeclaration": fn,
		"this":                map[string]any{"sharedId": node.ShadowRoot.SharedID},
		"arguments":           []any{map[string]any{"type": "string", "value": arg}},
		"target":              map[string]any{"context": h.context},
		"awaitPromise":        true,
	}, &r)
	if r.Type == "exception" {
		h.t.Fatalf("in the overlay: %s", r.ExceptionDetails.Text)
	}
	var s string
	require.NoError(h.t, json.Unmarshal(r.Result.Value, &s))
	return s
}

func (h *foxHarness) overlayHTML() string {
	return `<div data-standout="">` + h.inOverlay(`function () { return this.innerHTML; }`, "") + `</div>`
}

func (h *foxHarness) tb() testing.TB { return h.t }

func (h *foxHarness) press() { h.chrome.pressToolbar(h.t, h.extension) }

// control is the centre of the overlay's control with that data-action,
// scrolled into view, in viewport px.
func (h *foxHarness) control(action string) (x, y float64) {
	out := h.inOverlay(`function (a) {
	  const e = this.querySelector('[data-action="' + a + '"]');
	  if (!e) return '';
	  e.scrollIntoView({ block: 'nearest' });
	  const r = e.getBoundingClientRect();
	  return JSON.stringify([r.left + r.width / 2, r.top + r.height / 2]);
	}`, action)
	var c [2]float64
	if json.Unmarshal([]byte(out), &c) != nil {
		h.t.Fatalf("no control %q in the overlay", action)
	}
	return c[0], c[1]
}

func (h *foxHarness) clickInOverlay(action string) { h.clickAt(h.control(action)) }

// clickAt presses and releases the mouse at a point of the viewport:
// BiDi input actions are trusted events.
func (h *foxHarness) clickAt(x, y float64) {
	h.call("input.performActions", map[string]any{"context": h.context, "actions": []any{map[string]any{
		"type": "pointer", "id": "mouse", "parameters": map[string]any{"pointerType": "mouse"},
		"actions": []any{
			map[string]any{"type": "pointerMove", "x": int(x), "y": int(y)},
			map[string]any{"type": "pointerDown", "button": 0},
			map[string]any{"type": "pointerUp", "button": 0},
		},
	}}}, nil)
}

// bidiKeys are WebDriver's code points for the named keys (WebDriver
// §17.4.2, "Keyboard actions").
var bidiKeys = map[string]string{"Home": "\uE011", "Escape": "\uE00C", "ArrowLeft": "\uE012", "ArrowUp": "\uE013", "ArrowRight": "\uE014", "ArrowDown": "\uE015"}

func (h *foxHarness) typeInOverlay(action string, keys ...string) {
	h.inOverlay(`function (a) { this.querySelector('[data-action="' + a + '"]').focus(); return ''; }`, action)
	for _, k := range keys {
		h.pressKey(k)
	}
}

func (h *foxHarness) pressKey(key string) {
	v := key
	if c, ok := bidiKeys[key]; ok {
		v = c
	}
	h.call("input.performActions", map[string]any{"context": h.context, "actions": []any{map[string]any{
		"type": "key", "id": "keyboard",
		"actions": []any{map[string]any{"type": "keyDown", "value": v}, map[string]any{"type": "keyUp", "value": v}},
	}}}, nil)
}

func (h *foxHarness) screenshot() ([]byte, image.Image) {
	var r struct {
		Data string `json:"data"`
	}
	h.call("browsingContext.captureScreenshot", map[string]any{"context": h.context}, &r)
	shot, err := base64.StdEncoding.DecodeString(r.Data)
	require.NoError(h.t, err)
	img, err := png.Decode(bytes.NewReader(shot))
	require.NoError(h.t, err)
	return shot, img
}

func (h *foxHarness) downloads() string { return h.bidi.downloads }

var _, _ e2eBrowser = (*harness)(nil), (*foxHarness)(nil)

// builtForFirefoxTest is the Firefox build for the tests: the shipped
// one, declaring every page an allowed host (the origins a reader grants
// for framed charts, FrameOfAllowedOrigin).
func builtForFirefoxTest(t testing.TB) string {
	foxOnce.Do(func() {
		d, err := os.MkdirTemp("", "standout-fox-")
		if err == nil {
			err = Build(d, true)
		}
		if err == nil {
			err = editManifest(d, func(m map[string]any) { m["host_permissions"] = []string{"<all_urls>"} })
		}
		foxDir, foxErr = d, err
	})
	require.NoError(t, foxErr)
	return foxDir
}

var (
	foxOnce sync.Once
	foxDir  string
	foxErr  error
)

// newFox starts Firefox with the test build installed (as a temporary
// add-on, through BiDi's webExtension.install), and reaches its window
// through Marionette to press the toolbar button.
func newFox(t testing.TB, prefs ...string) *foxHarness {
	dir := builtForFirefoxTest(t)
	b := startFirefox(t, prefs...)
	var installed struct {
		Extension string `json:"extension"`
	}
	b.call("webExtension.install", map[string]any{"extensionData": map[string]any{"type": "path", "path": dir}}, &installed)
	require.NotEmpty(t, installed.Extension, "webExtension.install named no extension")
	return &foxHarness{bidi: b, extension: installed.Extension}
}
