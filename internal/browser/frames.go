package browser

import (
	"context"
	"encoding/json"
	"fmt"
	"net/url"
	"regexp"
	"strings"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/dom"
	"github.com/chromedp/cdproto/page"
	"github.com/chromedp/cdproto/runtime"
	"github.com/chromedp/cdproto/target"
	"github.com/chromedp/chromedp"
)

// FrameRead is the read pass's result in a frame of another origin, which
// the read pass in the top document cannot enter but CDP can: its JSON,
// the prefix its charts' paths take in the page (the top reader's name
// for the frame, "frame2/"), and the offset of its content box in page
// CSS px, which its boxes are shifted by.
type FrameRead struct {
	Prefix string
	Dx, Dy float64
	JSON   string
}

// MaxFrameReads bounds the frames of other origins read on one page.
const MaxFrameReads = 16

// unreadFrame matches the top reader's note on a frame it could not
// enter: its name and its src attribute. (snapshot.UnreadFrame reads the
// same note; this package sits below snapshot.)
var unreadFrame = regexp.MustCompile(`^(frame\d+) \((.*)\): not readable \(a cross-origin frame\)`)

// readOtherOrigins runs the read pass in each child frame of the top
// document whose origin differs from the page's, in an isolated world of
// its own, and returns what it read, each under the name the top reader's
// note on it gives (problems: the top reading's notes; the merge drops
// the notes, snapshot.PageJSON.MergeFrame). Frames of another site, which
// a browser with site isolation runs in a process of their own, are read
// through their own targets; site isolation stays on. Without such a note
// there is nothing to read, and the frames are not looked up.
func readOtherOrigins(ctx context.Context, problems []string, reader, opts string, top runtime.ExecutionContextID) ([]FrameRead, error) {
	noted := map[int]bool{}
	for k, p := range problems {
		if unreadFrame.MatchString(p) {
			noted[k] = true
		}
	}
	if len(noted) == 0 {
		return nil, nil
	}
	tree, err := chromedp.Run(ctx, func(ctx context.Context, tg *chromedp.Target) (*page.FrameTree, error) {
		t, err := cdp.Call(ctx, tg, page.GetFrameTree, cdp.Empty{})
		return t.FrameTree, err
	})
	if err != nil || tree == nil || tree.Frame == nil {
		return nil, err
	}
	// Frames of the page's process, and those of other sites, which the
	// browser runs in processes of their own and lists as targets.
	children := make([]*cdp.Frame, 0, len(tree.ChildFrames))
	for _, c := range tree.ChildFrames {
		children = append(children, c.Frame)
	}
	if ts, err := chromedp.Targets(ctx); err == nil {
		for _, ti := range ts {
			if ti.Type == "iframe" && ti.ParentFrameID == tree.Frame.ID {
				children = append(children, &cdp.Frame{ID: cdp.FrameID(ti.TargetID), URL: ti.URL, SecurityOrigin: originOf(ti.URL)})
			}
		}
	}
	var out []FrameRead
	for _, f := range children {
		if f == nil || f.SecurityOrigin == tree.Frame.SecurityOrigin || f.SecurityOrigin == "" || f.SecurityOrigin == "null" {
			continue
		}
		if len(out) == MaxFrameReads {
			// The rest keep the top reader's note: a page cannot make a
			// check read without end.
			break
		}
		fr, src, err := readFrame(ctx, f.ID, reader, opts, top)
		if err != nil {
			return nil, fmt.Errorf("frame %s: %w", f.URL, err)
		}
		// The top reader's name for the frame, found by its note (each
		// note names one frame).
		for k := range problems {
			if !noted[k] {
				continue
			}
			if m := unreadFrame.FindStringSubmatch(problems[k]); m[2] == src {
				fr.Prefix = m[1] + "/"
				delete(noted, k)
				break
			}
		}
		if fr.Prefix == "" {
			fr.Prefix = fmt.Sprintf("xframe%d/", len(out))
		}
		out = append(out, fr)
	}
	return out, nil
}

// originOf is the origin of an http(s) address, "" for any other.
func originOf(u string) string {
	p, err := url.Parse(u)
	if err != nil || (p.Scheme != "http" && p.Scheme != "https") || p.Host == "" {
		return ""
	}
	return p.Scheme + "://" + p.Host
}

// readFrame reads one frame: the read pass in an isolated world of the
// frame, in the page's process or, for a frame of another site, which the
// browser runs in a process of its own, in the frame's own target; and the
// frame element's content box, from the top document's world.
func readFrame(ctx context.Context, id cdp.FrameID, reader, opts string, top runtime.ExecutionContextID) (FrameRead, string, error) {
	var fr FrameRead
	var src string
	var err error
	if fr.JSON, err = readIn(ctx, id, reader, opts); err != nil {
		// Detach when done: closing the target would close the frame.
		fctx, cancel := chromedp.NewContext(ctx, chromedp.WithTargetID(target.ID(id)), chromedp.WithDetachOnCancel())
		defer cancel()
		tree, terr := chromedp.Run(fctx, func(ctx context.Context, tg *chromedp.Target) (*page.FrameTree, error) {
			t, err := cdp.Call(ctx, tg, page.GetFrameTree, cdp.Empty{})
			return t.FrameTree, err
		})
		if terr != nil || tree == nil || tree.Frame == nil {
			return fr, "", fmt.Errorf("%w (and as a frame of another process: %v)", err, terr)
		}
		if fr.JSON, err = readIn(fctx, tree.Frame.ID, reader, opts); err != nil {
			return fr, "", err
		}
	}
	_, err = chromedp.Run(ctx, func(ctx context.Context, tg *chromedp.Target) (struct{}, error) {
		owner, err := cdp.Call(ctx, tg, dom.GetFrameOwner, dom.GetFrameOwnerParams{FrameID: id})
		if err != nil {
			return struct{}{}, err
		}
		node, err := cdp.Call(ctx, tg, dom.ResolveNode, dom.ResolveNodeParams{BackendNodeID: owner.BackendNodeID, ExecutionContextID: top})
		if err != nil || node.Object == nil {
			return struct{}{}, fmt.Errorf("finding the frame's element: %v", err)
		}
		byValue := true
		got, err := cdp.Call(ctx, tg, runtime.CallFunctionOn, runtime.CallFunctionOnParams{ObjectID: node.Object.ObjectID, ReturnByValue: &byValue,
			FunctionDeclaration: frameBoxJS})
		if err != nil || got.Result == nil {
			return struct{}{}, fmt.Errorf("measuring the frame: %v", err)
		}
		var box struct {
			X, Y float64
			Src  string
		}
		if err := json.Unmarshal(got.Result.Value, &box); err != nil {
			return struct{}{}, err
		}
		fr.Dx, fr.Dy, src = box.X, box.Y, box.Src
		return struct{}{}, nil
	})
	return fr, strings.TrimSpace(src), err
}

// readIn runs the read pass in an isolated world of frame id of ctx's
// target and returns its JSON.
func readIn(ctx context.Context, id cdp.FrameID, reader, opts string) (string, error) {
	return chromedp.Run(ctx, func(ctx context.Context, tg *chromedp.Target) (string, error) {
		w, err := cdp.Call(ctx, tg, page.CreateIsolatedWorld, page.CreateIsolatedWorldParams{FrameID: id, WorldName: "standout"})
		if err != nil {
			return "", err
		}
		in := func(p *runtime.EvaluateParams) { p.ContextID = w.ExecutionContextID }
		if _, err := chromedp.Evaluate[chromedp.Void](reader, in)(ctx, tg); err != nil {
			return "", err
		}
		return chromedp.Evaluate[string](`globalThis.standoutReader.readPage(document, `+opts+`).then((p) => JSON.stringify(p))`, chromedp.EvalAwaitPromise, in)(ctx, tg)
	})
}

// frameBoxJS gives a frame element's content box origin in page CSS px
// (past its border and padding, as the read pass measures same-origin
// frames) and its src attribute as the read pass quotes it.
const frameBoxJS = `function () {
  const r = this.getBoundingClientRect();
  const cs = getComputedStyle(this);
  return {
    x: window.scrollX + r.left + (parseFloat(cs.borderLeftWidth) || 0) + (parseFloat(cs.paddingLeft) || 0),
    y: window.scrollY + r.top + (parseFloat(cs.borderTopWidth) || 0) + (parseFloat(cs.paddingTop) || 0),
    src: (this.getAttribute('src') || '').slice(0, 120),
  };
}`
