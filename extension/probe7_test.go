package extension

import (
	"context"
	"encoding/json"
	"fmt"
	"net/http"
	"os"
	"strings"
	"testing"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/profiler"
	"github.com/chromedp/chromedp"
	"github.com/stretchr/testify/require"
)

func TestProbeSWProfile(t *testing.T) {
	body := scatterPage(5000)
	h := newHarness(t)
	srv := serve(t, func(w http.ResponseWriter, r *http.Request) {
		w.Header().Set("Content-Type", "text/html; charset=utf-8")
		fmt.Fprint(w, body)
	})
	h.open(srv.URL + "/")
	h.clickToOverlay(t)
	h.trigger()
	h.waitState("")
	ts, err := chromedp.Targets(h.ctx)
	require.NoError(t, err)
	var swID string
	for _, ti := range ts {
		if ti.Type == "service_worker" && strings.HasPrefix(ti.URL, "chrome-extension://"+h.extID) {
			swID = string(ti.TargetID)
		}
	}
	require.NotEmpty(t, swID)
	var sctx context.Context
	for _, ti := range ts {
		if string(ti.TargetID) == swID {
			sctx, _ = chromedp.NewContext(h.ctx, chromedp.WithTargetID(ti.TargetID))
		}
	}
	_, err = chromedp.Run(sctx, func(ctx context.Context, tg *chromedp.Target) (chromedp.Void, error) {
		if _, err := cdp.Call(ctx, tg, profiler.Enable, cdp.Empty{}); err != nil {
			return chromedp.Void{}, err
		}
		cdp.Call(ctx, tg, profiler.SetSamplingInterval, profiler.SetSamplingIntervalParams{Interval: 100})
		_, err := cdp.Call(ctx, tg, profiler.Start, cdp.Empty{})
		return chromedp.Void{}, err
	})
	require.NoError(t, err)
	for k := 0; k < 6; k++ {
		p := h.clickToOverlay(t)
		t.Logf("%.0f %+v", p.Ready, p.Timing)
		h.trigger()
		h.waitState("")
	}
	prof, err := chromedp.Run(sctx, func(ctx context.Context, tg *chromedp.Target) (*profiler.Profile, error) {
		res, err := cdp.Call(ctx, tg, profiler.Stop, cdp.Empty{})
		if err != nil {
			return nil, err
		}
		return res.Profile, nil
	})
	b, _ := json.Marshal(prof)
	os.WriteFile("/tmp/sw.cpuprofile", b, 0o644)
}
