package extension

// What the end-to-end suite needs of a browser with the extension loaded,
// so that one suite runs in Chromium (CDP, harness) and in Firefox
// (WebDriver BiDi, foxHarness).

import (
	"encoding/json"
	"fmt"
	"image"
	"net/http"
	"os"
	"path/filepath"
	"testing"
	"time"

	"github.com/stretchr/testify/require"
)

type e2eBrowser interface {
	tb() testing.TB
	// open loads url in the tab and waits for it.
	open(url string)
	// press presses the toolbar action once (in Firefox, the test build's
	// entry to the same handler).
	press()
	eval(expr string) string
	// overlayHTML serialises the overlay, its closed shadow root included.
	overlayHTML() string
	// clickInOverlay clicks the overlay's control with that data-action as
	// a person does: a trusted press and release at its centre.
	clickInOverlay(action string)
	// clickAt clicks at a point of the viewport (CSS px).
	clickAt(x, y float64)
	// typeInOverlay focuses a control of the overlay and types keys
	// ("Home", "ArrowDown", "Escape", a letter) as trusted key events.
	typeInOverlay(action string, keys ...string)
	// pressKey types one key into the page.
	pressKey(key string)
	// screenshot captures the viewport as PNG.
	screenshot() ([]byte, image.Image)
	// downloads is the folder downloads are saved to without asking.
	downloads() string
}

// trigger presses the toolbar action. If the page has no overlay a few
// seconds later (the press can race the tab's first paint under load), it
// presses once more.
func trigger(b e2eBrowser) {
	had := state(b) != ""
	b.press()
	if had {
		return
	}
	for i := 0; i < 100; i++ {
		if state(b) != "" {
			return
		}
		time.Sleep(100 * time.Millisecond)
	}
	b.press()
}

// state is the overlay host's data-state ("" when there is none).
func state(b e2eBrowser) string {
	return b.eval(`(() => { const e = document.querySelector('` + hostSelector + `'); return e ? (e.getAttribute('data-state') || 'open') : ''; })()`)
}

func waitState(b e2eBrowser, want string) {
	// Generous: CI runs other test packages on the same two cores, and the
	// first check compiles the WebAssembly core.
	deadline := time.Now().Add(45 * time.Second)
	got := ""
	for time.Now().Before(deadline) {
		if got = state(b); got == want {
			return
		}
		time.Sleep(50 * time.Millisecond)
	}
	msg := ""
	if got == "error" {
		msg = b.overlayHTML()
	}
	b.tb().Fatalf("overlay state %q, want %q %s", got, want, msg)
}

// showPage serves body as a page, opens it, presses the action and waits
// for the overlay.
func showPage(b e2eBrowser, body string) {
	srv := serve(b.tb(), func(w http.ResponseWriter, r *http.Request) {
		w.Header().Set("Content-Type", "text/html; charset=utf-8")
		fmt.Fprint(w, body)
	})
	b.open(srv.URL + "/")
	trigger(b)
	waitState(b, "ready")
}

// chooseInOverlay picks the option at index of a <select> of the overlay
// with the keyboard, as a person does: Home, then ArrowDown.
func chooseInOverlay(b e2eBrowser, action string, index int) {
	keys := []string{"Home"}
	for i := 0; i < index; i++ {
		keys = append(keys, "ArrowDown")
	}
	b.typeInOverlay(action, keys...)
}

// markRects resolves mark ids ("svg0/g1/rect3") to the elements' boxes in
// page px, from getBoundingClientRect; for a circle or an ellipse, from its
// own geometry through getScreenCTM (SVG 2 §8.9, the exact bounds of the
// transformed shape): in a rotated space Chromium's getBoundingClientRect
// is the looser box of its transformed box, Firefox's the exact one.
func markRects(b e2eBrowser, ids []string) [][4]float64 {
	js, _ := json.Marshal(ids)
	expr := `(() => {
	  const tops = [...document.querySelectorAll('svg')].filter((s) => !s.parentElement.closest('svg'));
	  const find = (id) => {
	    const parts = id.split('/');
	    let el = tops[Number(parts[0].slice(3))];
	    for (const p of parts.slice(1)) { el = el.children[Number(/\d+$/.exec(p)[0])]; }
	    return el;
	  };
	  return JSON.stringify(` + string(js) + `.map((id) => {
	    const el = find(id);
	    if (el.localName === 'circle' || el.localName === 'ellipse') {
	      const m = el.getScreenCTM();
	      const c = el.localName === 'circle';
	      const cx = el.cx.baseVal.value, cy = el.cy.baseVal.value;
	      const rx = c ? el.r.baseVal.value : el.rx.baseVal.value, ry = c ? el.r.baseVal.value : el.ry.baseVal.value;
	      const hx = Math.hypot(m.a * rx, m.c * ry), hy = Math.hypot(m.b * rx, m.d * ry);
	      const x = m.a * cx + m.c * cy + m.e, y = m.b * cx + m.d * cy + m.f;
	      return [x - hx + scrollX, y - hy + scrollY, 2 * hx, 2 * hy];
	    }
	    const r = el.getBoundingClientRect();
	    return [r.left + scrollX, r.top + scrollY, r.width, r.height];
	  }));
	})()`
	var out [][4]float64
	require.NoError(b.tb(), json.Unmarshal([]byte(b.eval(expr)), &out))
	return out
}

// downloaded waits up to 10 s for a finished download in dir and returns
// its bytes, or nil. A download is finished when it is not empty, no
// partial file (Firefox's name.part) is beside it, and its size held for
// one poll.
func downloaded(dir, name string) []byte {
	p := filepath.Join(dir, name)
	last := int64(-1)
	for i := 0; i < 100; i++ {
		time.Sleep(100 * time.Millisecond)
		fi, err := os.Stat(p)
		if err != nil || fi.Size() == 0 {
			continue
		}
		if _, err := os.Stat(p + ".part"); err == nil {
			continue
		}
		if fi.Size() == last {
			b, err := os.ReadFile(p)
			if err == nil {
				return b
			}
		}
		last = fi.Size()
	}
	return nil
}
