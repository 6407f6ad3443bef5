package main

import (
	"encoding/json"
	"testing"

	"github.com/stretchr/testify/require"
)

// FuzzParseOptions checks the options' scanner, which reads what the
// extension sends (a reader's picks, the judged pixels, a pick on them):
// it refuses what is not JSON (encoding/json's json.Valid the oracle), and
// what it accepts reads back the same once written out by encoding/json,
// which encoding/json reads the same way too.
func FuzzParseOptions(f *testing.F) {
	for _, s := range []string{`{"type":"analyse"}`, `{"type":"analyse","emphasisNodes":["svg0#3"],"severity":0.5,"full":true,"phoneWidth":360}`,
		`{"frames":[{"prefix":"frame0/","dx":54,"dy":34}]}`, `{"severity":null,"emphasis":null}`,
		`{"pixels":[{"name":"canvas0","regions":{"normal":[{"box":[1,2,3,4],"salience":1}],"deutan":[]}}],"pick":{"name":"canvas0","x":5,"y":6.5}}`,
		`{"pixels":null,"pick":null}`, `{"pixels":[{"regions":{"normal":[{"box":[1,2,3]}]}}]}`, `{"full":1}`, `[]`} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, b []byte) {
		q, err := parseOptions(b)
		if !json.Valid(b) {
			require.Error(t, err, "%q is not JSON", b)
		}
		if err != nil {
			return
		}
		out, err := json.Marshal(q)
		require.NoError(t, err)
		again, err := parseOptions(out)
		require.NoError(t, err, "%s", out)
		require.Equal(t, q, again, "%s", out)
		var std Request
		require.NoError(t, json.Unmarshal(out, &std))
		require.Equal(t, *q, std, "%s", out)
	})
}
