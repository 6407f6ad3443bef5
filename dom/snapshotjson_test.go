package dom

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// plainSnapshot has Snapshot's fields without its UnmarshalJSON, so
// encoding/json decodes it by reflection: the oracle for the fast decoder.
type plainSnapshot Snapshot

func canon(t testing.TB, s Snapshot) string {
	if s.Nodes == nil {
		s.Nodes = []Node{}
	}
	b, err := json.Marshal(s)
	require.NoError(t, err)
	return string(b)
}

func TestSnapshotJSONRoundTripCorpus(t *testing.T) {
	// Every fixture's snapshots, encoded and decoded both ways, agree.
	files, _ := filepath.Glob("../testdata/*.*")
	for _, f := range files {
		if strings.HasSuffix(f, ".golden") {
			continue
		}
		data, err := os.ReadFile(f)
		require.NoError(t, err)
		p, err := Build(strings.NewReader(string(data)), Options{Source: f})
		require.NoError(t, err)
		for _, s := range p.Charts {
			b, err := json.Marshal(s)
			require.NoError(t, err)
			var fast Snapshot
			require.NoError(t, json.Unmarshal(b, &fast))
			var slow plainSnapshot
			require.NoError(t, json.Unmarshal(b, &slow))
			assert.Equal(t, canon(t, Snapshot(slow)), canon(t, fast), f)
		}
	}
}

func TestSnapshotJSONEdgeCases(t *testing.T) {
	in := `{"v":1,"path":"svg0","source":"a\"b\\u00e9\ud83d\ude00\ud800x","box":[1,2,3,4,5],"bg":4294967295,
	"nodes":[{"p":-1,"t":"svg","n":"svg0","m":[1,0,0,1,null,0],"f":{"k":2,"c":255,"st":[1,2]},"s":{"k":0},"fo":1,"so":1,"o":1,"sw":1e0,"zz":{"a":[true,false,null]}}],
	"sel":[0],"problems":["x"],"extra":1}`
	var fast Snapshot
	require.NoError(t, json.Unmarshal([]byte(in), &fast))
	var slow plainSnapshot
	require.NoError(t, json.Unmarshal([]byte(in), &slow))
	// encoding/json fails on the fifth box element; the fast decoder
	// ignores it. Everything else agrees.
	slow.Box = fast.Box
	assert.Equal(t, canon(t, Snapshot(slow)), canon(t, fast))
	for _, bad := range []string{`{"v":"1"}`, `{"nodes":[{"f":{"c":-1}}]}`, `{"v":1`, `[1]`, `{"path":"\x01"}`} {
		var s Snapshot
		assert.Error(t, json.Unmarshal([]byte(bad), &s), bad)
	}
}

func FuzzSnapshotJSON(f *testing.F) {
	f.Add([]byte(`{"v":1,"path":"svg0","box":[0,0,10,10],"bg":4294967295,"nodes":[{"p":-1,"t":"svg","n":"svg0","m":[1,0,0,1,0,0],"f":{"k":1,"c":255},"s":{"k":0},"fo":1,"so":1,"o":1,"sw":1,"tx":"h\u00e9","g":[1,2,3]}]}`))
	f.Add([]byte(`{"nodes":[],"problems":["a\\b"],"sel":[1,2]}`))
	f.Add([]byte(`{"nodes":[{"g":[1,2],"g":[3]}],"box":[1,2,3,4],"box":[5],"nodes":[{"m":[1,2,3,4,5,6],"m":[7]}]}`))
	f.Fuzz(func(t *testing.T, b []byte) {
		var slow plainSnapshot
		if json.Unmarshal(b, &slow) != nil {
			var fast Snapshot
			_ = json.Unmarshal(b, &fast) // must not panic
			return
		}
		var fast Snapshot
		if err := json.Unmarshal(b, &fast); err != nil {
			t.Fatalf("encoding/json accepts %q but the fast decoder says %v", b, err)
		}
		if a, c := canon(t, Snapshot(slow)), canon(t, fast); a != c {
			t.Fatalf("decoders disagree on %q:\n%s\n%s", b, a, c)
		}
	})
}

func TestFastFloatMatchesParseFloat(t *testing.T) {
	for _, c := range []string{"0", "-0", "1", "12.5", "-3.14159", "0.1", "123456789012345", "0.000001", "99.999999999999", "4294967295", "1234567.1234567", "-0.0000000000000000000001"} {
		f, ok := fastFloat([]byte(c))
		require.True(t, ok, c)
		want, err := strconv.ParseFloat(c, 64)
		require.NoError(t, err)
		assert.Equal(t, want, f, c)
	}
	for _, c := range []string{"1e5", "1234567890123456", "", "-", "1.2.3", ".5"} {
		_, ok := fastFloat([]byte(c))
		assert.False(t, ok, c)
	}
}

func FuzzFastFloat(f *testing.F) {
	for _, s := range []string{"12.5", "-0.001", "123456789012345"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		got, ok := fastFloat([]byte(s))
		if !ok {
			return
		}
		want, err := strconv.ParseFloat(s, 64)
		if err != nil || want != got && !(want == 0 && got == 0) {
			t.Fatalf("fastFloat(%q) = %v, ParseFloat = %v, %v", s, got, want, err)
		}
	})
}
