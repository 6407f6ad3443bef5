package jsonio

import (
	"encoding/json"
	"math"
	"strconv"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"standout/internal/testkit"
)

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

func FuzzPlainNumber(f *testing.F) {
	for _, s := range []string{"12.5", "-0.001", "123456789012345", "0", "-0", "01", "1.", "1e5", "1234567890123456", "0.0000000000000000000001", "7]"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		// The one-pass reader agrees with the general one wherever it
		// accepts, and consumes the same bytes.
		fast := New([]byte(s))
		got, ok := fast.plainNumber()
		if !ok {
			if fast.i != 0 {
				t.Fatalf("%q: refused but moved to %d", s, fast.i)
			}
			return
		}
		slow := New([]byte(s))
		want, err := slow.Number()
		if err != nil || want != got || fast.i != slow.i || math.Signbit(want) != math.Signbit(got) {
			t.Fatalf("%q: plainNumber %v (to %d), number %v, %v (to %d)", s, got, fast.i, want, err, slow.i)
		}
	})
}

func FuzzScannerMatchesEncodingJSON(f *testing.F) {
	for _, s := range []string{`{"a":[1,2.5,-0.25,null],"b":"x\u00e9\n","c":true,"d":{"e":[]}}`, `[1e5, 1E-3, 0]`, `"\ud83d\ude00"`, `{"a":01}`, `[1,]`, `[1,2,03]`, `[0,1,"a"]`, `[7,[8]]`} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		// Skip accepts exactly the single JSON values encoding/json
		// accepts (at the depth it allows), and Numbers and Text read
		// what encoding/json reads.
		d := New([]byte(s))
		err := d.Skip()
		if err == nil {
			err = d.End()
		}
		if err == errDepth {
			return
		}
		var v any
		jerr := json.Unmarshal([]byte(s), &v)
		if (err == nil) != (jerr == nil) {
			t.Fatalf("%q: Skip says %v, encoding/json %v", s, err, jerr)
		}
		var nums []float64
		if json.Unmarshal([]byte(s), &nums) == nil {
			got, err := New([]byte(s)).Numbers(nil)
			require.NoError(t, err, "%q", s)
			if len(nums) == 0 {
				nums = nil
			}
			assert.Equal(t, nums, got, "%q", s)
		} else if jerr == nil {
			// A value that is no array of numbers: Numbers refuses it.
			_, err := New([]byte(s)).Numbers(nil)
			assert.Error(t, err, "%q", s)
		}
		var str string
		if json.Unmarshal([]byte(s), &str) == nil {
			got, err := New([]byte(s)).Text()
			require.NoError(t, err, "%q", s)
			assert.Equal(t, str, got, "%q", s)
		}
	})
}

// Strings and numbers are written byte for byte as encoding/json writes
// them (with HTML escaping off), the reference the hand-written report
// encoders are held to.
func TestAppendStringMatchesEncodingJSON(t *testing.T) {
	for _, s := range []string{"", "plain", `q"b\s`, "\x00\x1f\n\r\t\b\f", "é😀", "\xff\xfe", "a\u2028b\u2029", "<&>", "\x7f"} {
		assert.Equal(t, testkit.EncodingJSON(t, s), string(AppendString(nil, s)), "%q", s)
	}
}

func TestAppendNumberMatchesEncodingJSON(t *testing.T) {
	for _, f := range []float64{0, math.Copysign(0, -1), 1, -1, 0.1, 1.0 / 3, 1e-6, 9.99e-7, 1e-7, 1.5e-10, 1e20, 1e21, 123456789012345680000, 1e300, -2.5e-300, 5e-324, math.MaxFloat64, 42.125} {
		assert.Equal(t, testkit.EncodingJSON(t, f), string(AppendNumber(nil, f)), "%v", f)
	}
	assert.Equal(t, "null", string(AppendNumber(nil, math.NaN())))
}
