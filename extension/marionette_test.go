package extension

// A Marionette client for the Firefox end-to-end tests, for the one thing
// WebDriver BiDi does not reach in Firefox ESR: the browser's own window,
// where the toolbar button is. Marionette is Firefox's older remote
// protocol (started with --marionette; its chrome context needs
// --remote-allow-system-access): packets "length:JSON", commands
// [0, id, name, params] and answers [1, id, error, result]
// (https://firefox-source-docs.mozilla.org/testing/marionette/Protocol.html).

import (
	"bufio"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"net"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/require"
)

// marionette is a session in the browser's chrome context.
type marionette struct {
	conn net.Conn
	r    *bufio.Reader
	id   int
}

// dialMarionette connects to the Marionette server of the browser whose
// profile is given (the server writes its port there, as it was asked
// for port 0), opens a session in the chrome context, and returns it
// with the address of the session's WebDriver BiDi side.
func dialMarionette(t testing.TB, profile string) (*marionette, string) {
	var port int
	deadline := time.Now().Add(60 * time.Second)
	for {
		b, err := os.ReadFile(filepath.Join(profile, "MarionetteActivePort"))
		if err == nil {
			if port, err = strconv.Atoi(strings.TrimSpace(string(b))); err == nil && port > 0 {
				break
			}
		}
		if time.Now().After(deadline) {
			t.Fatal("Firefox did not start its Marionette server within 60 s")
		}
		time.Sleep(50 * time.Millisecond)
	}
	conn, err := net.Dial("tcp", fmt.Sprintf("127.0.0.1:%d", port))
	require.NoError(t, err)
	t.Cleanup(func() { conn.Close() })
	m := &marionette{conn: conn, r: bufio.NewReader(conn)}
	_, err = m.packet() // the server's greeting
	require.NoError(t, err)
	res, err := m.call("WebDriver:NewSession", map[string]any{"webSocketUrl": true})
	require.NoError(t, err)
	var session struct {
		Capabilities struct {
			WebSocketURL string `json:"webSocketUrl"`
		} `json:"capabilities"`
	}
	require.NoError(t, json.Unmarshal(res, &session))
	require.NotEmpty(t, session.Capabilities.WebSocketURL, "the session has no BiDi address: %s", res)
	_, err = m.call("Marionette:SetContext", map[string]any{"value": "chrome"})
	require.NoError(t, err)
	return m, session.Capabilities.WebSocketURL
}

// packet reads one "length:JSON" packet.
func (m *marionette) packet() ([]byte, error) {
	head, err := m.r.ReadString(':')
	if err != nil {
		return nil, err
	}
	n, err := strconv.Atoi(strings.TrimSuffix(head, ":"))
	if err != nil || n < 0 || n > 64<<20 {
		return nil, fmt.Errorf("marionette: bad packet length %q", head)
	}
	body := make([]byte, n)
	_, err = io.ReadFull(m.r, body)
	return body, err
}

// call runs one command and returns its result.
func (m *marionette) call(name string, params any) (json.RawMessage, error) {
	m.id++
	msg, err := json.Marshal([]any{0, m.id, name, params})
	if err != nil {
		return nil, err
	}
	m.conn.SetDeadline(time.Now().Add(90 * time.Second))
	if _, err := fmt.Fprintf(m.conn, "%d:%s", len(msg), msg); err != nil {
		return nil, err
	}
	for {
		body, err := m.packet()
		if err != nil {
			return nil, err
		}
		var answer []json.RawMessage
		if err := json.Unmarshal(body, &answer); err != nil || len(answer) != 4 {
			return nil, fmt.Errorf("marionette: %s: bad answer %s", name, body)
		}
		var id int
		if json.Unmarshal(answer[1], &id) != nil || id != m.id {
			continue // an answer to an earlier command that timed out
		}
		if string(answer[2]) != "null" {
			return nil, errors.New("marionette: " + name + ": " + string(answer[2]))
		}
		return answer[3], nil
	}
}

// foxToolbarPress runs the extension's toolbar action in the browser's
// front window, as a click on its button does: Firefox's own
// triggerAction (ext-browserAction.js), which grants the action's
// activeTab to the tab shown.
const foxToolbarPress = `
const { ExtensionParent } = ChromeUtils.importESModule('resource://gre/modules/ExtensionParent.sys.mjs');
const extension = ExtensionParent.GlobalManager.getExtension(arguments[0]);
if (!extension) throw new Error('no extension ' + arguments[0]);
const win = Services.wm.getMostRecentWindow('navigator:browser');
ExtensionParent.apiManager.global.browserActionFor(extension).triggerAction(win);
return true;`

// pressToolbar presses the extension's toolbar button.
func (m *marionette) pressToolbar(t testing.TB, extensionID string) {
	t.Helper()
	_, err := m.call("WebDriver:ExecuteScript", map[string]any{"script": foxToolbarPress, "args": []any{extensionID}})
	require.NoError(t, err)
}
