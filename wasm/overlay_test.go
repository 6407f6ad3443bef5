//go:build overlaycore

package main

import (
	"encoding/json"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// TestOverlayCoreLeavesTheReportOut runs in the overlay core's build
// (go test -tags overlaycore -run 'OverlayCore|DigestGolden' ./wasm): a
// request for the whole report is refused with the name of the core that
// answers it, and TestDigestGolden holds the digests to the whole core's.
func TestOverlayCoreLeavesTheReportOut(t *testing.T) {
	var r Response
	require.NoError(t, json.Unmarshal(HandlePage([]byte(`{"type":"analyse","full":true}`), []byte(`{"source":"x","snapshots":[]}`)), &r))
	assert.False(t, r.OK)
	assert.Contains(t, r.Error, "standout-report.wasm")
	require.NoError(t, json.Unmarshal(HandlePage([]byte(`{"type":"analyse"}`), []byte(`{"source":"x","snapshots":[]}`)), &r))
	assert.True(t, r.OK, r.Error)
	assert.NotNil(t, r.Overlay)
}
