// Package jsonio reads and writes JSON in place, for the snapshot format
// and the core's requests and digests: purpose-written, because
// encoding/json's reflection was the slowest step of the extension's core
// under WebAssembly, and its code, large, runs unoptimised on the first
// check. Fuzz and table tests keep it equal to encoding/json.
package jsonio

import (
	"errors"
	"strconv"
	"unicode/utf16"
	"unicode/utf8"
)

// Scanner reads JSON values from a byte slice. Numbers that JSON encodes
// as null (NaN and infinities from JavaScript) read as 0, as encoding/json
// leaves a float at its zero value for null.
type Scanner struct {
	b []byte
	i int
}

// New returns a Scanner at the start of b.
func New(b []byte) *Scanner { return &Scanner{b: b} }

// Offset is the offset of the next value, after any whitespace.
func (d *Scanner) Offset() int {
	d.ws()
	return d.i
}

// Advance steps over the next n bytes, which the caller has checked form
// a whole value.
func (d *Scanner) Advance(n int) { d.i = min(d.i+n, len(d.b)) }

// Remaining is the number of bytes not yet read.
func (d *Scanner) Remaining() int { return len(d.b) - d.i }

// End reports an error unless only whitespace is left.
func (d *Scanner) End() error {
	if d.ws(); d.i != len(d.b) {
		return d.Error("trailing data")
	}
	return nil
}

var errDepth = errors.New("JSON nested too deeply")

// Error is an error at the scanner's offset. (Messages are put together
// without fmt, which the extension's overlay core does not link.)
func (d *Scanner) Error(msg string) error {
	return errors.New("JSON at offset " + strconv.Itoa(d.i) + ": " + msg)
}

func (d *Scanner) ws() {
	for d.i < len(d.b) {
		switch d.b[d.i] {
		case ' ', '\t', '\n', '\r':
			d.i++
		default:
			return
		}
	}
}

func (d *Scanner) peek() byte {
	d.ws()
	if d.i < len(d.b) {
		return d.b[d.i]
	}
	return 0
}

func (d *Scanner) literal(word string) bool {
	if len(d.b)-d.i >= len(word) && string(d.b[d.i:d.i+len(word)]) == word {
		d.i += len(word)
		return true
	}
	return false
}

// Object calls f for each key; f must consume the value.
func (d *Scanner) Object(f func(key string) error) error {
	if d.peek() == 'n' && d.literal("null") {
		return nil
	}
	if d.peek() != '{' {
		return d.Error("expected an object")
	}
	d.i++
	if d.peek() == '}' {
		d.i++
		return nil
	}
	for {
		if d.peek() != '"' {
			return d.Error("expected a key")
		}
		k, err := d.str()
		if err != nil {
			return err
		}
		if d.peek() != ':' {
			return d.Error("expected ':'")
		}
		d.i++
		if err := f(k); err != nil {
			return err
		}
		switch d.peek() {
		case ',':
			d.i++
		case '}':
			d.i++
			return nil
		default:
			return d.Error("expected ',' or '}'")
		}
	}
}

// Array calls f for each element; f must consume it.
func (d *Scanner) Array(f func() error) error {
	if d.peek() == 'n' && d.literal("null") {
		return nil
	}
	if d.peek() != '[' {
		return d.Error("expected an array")
	}
	d.i++
	if d.peek() == ']' {
		d.i++
		return nil
	}
	for {
		if err := f(); err != nil {
			return err
		}
		switch d.peek() {
		case ',':
			d.i++
		case ']':
			d.i++
			return nil
		default:
			return d.Error("expected ',' or ']'")
		}
	}
}

// Number reads a number, or null as 0.
func (d *Scanner) Number() (float64, error) {
	c := d.peek()
	if c == 'n' && d.literal("null") {
		return 0, nil
	}
	start := d.i
	if c == '-' {
		d.i++
	}
	digits := 0
	for d.i < len(d.b) && d.b[d.i] >= '0' && d.b[d.i] <= '9' {
		d.i++
		digits++
	}
	if digits == 0 {
		return 0, d.Error("expected a number")
	}
	if digits > 1 && d.b[d.i-digits] == '0' {
		return 0, d.Error("bad number: leading zero")
	}
	if d.i < len(d.b) && d.b[d.i] == '.' {
		d.i++
		n := 0
		for d.i < len(d.b) && d.b[d.i] >= '0' && d.b[d.i] <= '9' {
			d.i++
			n++
		}
		if n == 0 {
			return 0, d.Error("bad number")
		}
	}
	if d.i < len(d.b) && (d.b[d.i] == 'e' || d.b[d.i] == 'E') {
		d.i++
		if d.i < len(d.b) && (d.b[d.i] == '+' || d.b[d.i] == '-') {
			d.i++
		}
		n := 0
		for d.i < len(d.b) && d.b[d.i] >= '0' && d.b[d.i] <= '9' {
			d.i++
			n++
		}
		if n == 0 {
			return 0, d.Error("bad number")
		}
	}
	if f, ok := fastFloat(d.b[start:d.i]); ok {
		return f, nil
	}
	f, err := strconv.ParseFloat(string(d.b[start:d.i]), 64)
	if err != nil {
		return 0, d.Error("bad number: " + err.Error())
	}
	return f, nil
}

var pow10 = [...]float64{1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22}

// fastFloat parses a plain decimal ("-12.375", no exponent) of at most 15
// significant digits exactly: the digits form an integer below 2^53 and the
// divisor is an exact power of ten, so the one division rounds correctly
// (the classic fast path of decimal-to-binary conversion). It reports
// false for anything else, which strconv.ParseFloat then handles.
func fastFloat(b []byte) (float64, bool) {
	neg := false
	if len(b) > 0 && b[0] == '-' {
		neg, b = true, b[1:]
	}
	var m uint64
	digits, frac := 0, -1
	for i, c := range b {
		switch {
		case c >= '0' && c <= '9':
			if digits > 0 || c != '0' {
				digits++
			}
			m = m*10 + uint64(c-'0')
			if frac >= 0 {
				frac++
			}
		case c == '.' && frac < 0 && i > 0:
			frac = 0
		default:
			return 0, false
		}
	}
	if digits > 15 || frac > 22 || len(b) == 0 {
		return 0, false
	}
	f := float64(m)
	if frac > 0 {
		f /= pow10[frac]
	}
	if neg {
		f = -f
	}
	return f, true
}

// plainNumber reads a plain decimal at d.i ("-12.375": no exponent, at
// most 15 significant digits) in one pass, the exact fast path of
// fastFloat; it reports false, and leaves d.i, for anything else, which
// number then reads. Snapshots are almost all such numbers.
func (d *Scanner) plainNumber() (float64, bool) {
	b, i := d.b, d.i
	neg := false
	if i < len(b) && b[i] == '-' {
		neg = true
		i++
	}
	start := i
	var m uint64
	sig := 0
	for i < len(b) && b[i] >= '0' && b[i] <= '9' {
		if sig > 0 || b[i] != '0' {
			sig++
		}
		m = m*10 + uint64(b[i]-'0')
		i++
	}
	if i == start || (i-start > 1 && b[start] == '0') {
		return 0, false
	}
	frac := 0
	if i < len(b) && b[i] == '.' {
		i++
		fs := i
		for i < len(b) && b[i] >= '0' && b[i] <= '9' {
			if sig > 0 || b[i] != '0' {
				sig++
			}
			m = m*10 + uint64(b[i]-'0')
			i++
		}
		frac = i - fs
		if frac == 0 {
			return 0, false
		}
	}
	if sig > 15 || frac > 22 || (i < len(b) && (b[i] == 'e' || b[i] == 'E')) {
		return 0, false
	}
	f := float64(m)
	if frac > 0 {
		f /= pow10[frac]
	}
	if neg {
		f = -f
	}
	d.i = i
	return f, true
}

// Numbers appends the elements of an array of numbers to dst; null
// leaves dst empty, as encoding/json leaves a slice nil.
func (d *Scanner) Numbers(dst []float64) ([]float64, error) {
	if d.peek() == 'n' && d.literal("null") {
		return dst, nil
	}
	if d.peek() != '[' {
		return dst, d.Error("expected an array")
	}
	d.i++
	if d.peek() == ']' {
		d.i++
		return dst, nil
	}
	for {
		// Most numbers of the read pass's records are one digit (parents,
		// tags, field bits, counts, references) written without spaces.
		if i := d.i; i+1 < len(d.b) && d.b[i] >= '0' && d.b[i] <= '9' && (d.b[i+1] == ',' || d.b[i+1] == ']') {
			dst = append(dst, float64(d.b[i]-'0'))
			d.i = i + 2
			if d.b[i+1] == ']' {
				return dst, nil
			}
			continue
		}
		d.ws()
		f, ok := d.plainNumber()
		if !ok {
			var err error
			if f, err = d.Number(); err != nil {
				return dst, err
			}
		}
		dst = append(dst, f)
		switch d.peek() {
		case ',':
			d.i++
		case ']':
			d.i++
			return dst, nil
		default:
			return dst, d.Error("expected ',' or ']'")
		}
	}
}

// Strings appends the elements of an array of strings to dst.
func (d *Scanner) Strings(dst []string) ([]string, error) {
	err := d.Array(func() error {
		s, err := d.Text()
		dst = append(dst, s)
		return err
	})
	return dst, err
}

// Text reads a string, or null as "".
func (d *Scanner) Text() (string, error) {
	if d.peek() == 'n' && d.literal("null") {
		return "", nil
	}
	if d.peek() != '"' {
		return "", d.Error("expected a string")
	}
	return d.str()
}

// str reads a JSON string at d.i (which is at the opening quote).
func (d *Scanner) str() (string, error) {
	d.i++
	start := d.i
	// Fast path: no escapes.
	for d.i < len(d.b) {
		c := d.b[d.i]
		if c == '"' {
			s := d.b[start:d.i]
			d.i++
			if !utf8.Valid(s) {
				return string([]rune(string(s))), nil
			}
			return string(s), nil
		}
		if c == '\\' || c < 0x20 {
			break
		}
		d.i++
	}
	buf := append([]byte(nil), d.b[start:d.i]...)
	for d.i < len(d.b) {
		c := d.b[d.i]
		switch {
		case c == '"':
			d.i++
			if !utf8.Valid(buf) {
				return string([]rune(string(buf))), nil
			}
			return string(buf), nil
		case c < 0x20:
			return "", d.Error("control character in string")
		case c != '\\':
			buf = append(buf, c)
			d.i++
			continue
		}
		d.i++
		if d.i >= len(d.b) {
			break
		}
		var err error
		if buf, err = d.escape(buf); err != nil {
			return "", err
		}
	}
	return "", d.Error("unterminated string")
}

// escape appends what the escape after a backslash stands for.
func (d *Scanner) escape(buf []byte) ([]byte, error) {
	e := d.b[d.i]
	d.i++
	switch e {
	case '"', '\\', '/':
		return append(buf, e), nil
	case 'b':
		return append(buf, '\b'), nil
	case 'f':
		return append(buf, '\f'), nil
	case 'n':
		return append(buf, '\n'), nil
	case 'r':
		return append(buf, '\r'), nil
	case 't':
		return append(buf, '\t'), nil
	case 'u':
		r, ok := d.hex4()
		if !ok {
			return buf, d.Error("bad \\u escape")
		}
		if utf16.IsSurrogate(r) {
			// A pair when the next escape completes it; alone it is
			// replaced, as encoding/json does.
			save := d.i
			if d.i+1 < len(d.b) && d.b[d.i] == '\\' && d.b[d.i+1] == 'u' {
				d.i += 2
				if r2, ok := d.hex4(); ok {
					if dec := utf16.DecodeRune(r, r2); dec != utf8.RuneError {
						return utf8.AppendRune(buf, dec), nil
					}
				}
			}
			d.i = save
			r = utf8.RuneError
		}
		return utf8.AppendRune(buf, r), nil
	}
	return buf, d.Error("bad escape")
}

func (d *Scanner) hex4() (rune, bool) {
	if d.i+4 > len(d.b) {
		return 0, false
	}
	v, err := strconv.ParseUint(string(d.b[d.i:d.i+4]), 16, 32)
	if err != nil {
		return 0, false
	}
	d.i += 4
	return rune(v), true
}

// Null consumes a null and reports whether there was one.
func (d *Scanner) Null() bool {
	return d.peek() == 'n' && d.literal("null")
}

// Bool reads true or false, or null as false.
func (d *Scanner) Bool() (bool, error) {
	switch c := d.peek(); {
	case c == 't' && d.literal("true"):
		return true, nil
	case c == 'f' && d.literal("false"), c == 'n' && d.literal("null"):
		return false, nil
	}
	return false, d.Error("expected true or false")
}

// Skip consumes any value, to a bounded depth.
func (d *Scanner) Skip() error { return d.skipDepth(0) }

func (d *Scanner) skipDepth(depth int) error {
	if depth > 64 {
		return errDepth
	}
	switch c := d.peek(); {
	case c == '{':
		return d.Object(func(string) error { return d.skipDepth(depth + 1) })
	case c == '[':
		return d.Array(func() error { return d.skipDepth(depth + 1) })
	case c == '"':
		_, err := d.str()
		return err
	case c == 't' && d.literal("true"), c == 'f' && d.literal("false"), c == 'n' && d.literal("null"):
		return nil
	default:
		_, err := d.Number()
		return err
	}
}
