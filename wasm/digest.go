package main

import (
	"math"
	"sort"
	"strconv"
	"unicode/utf8"

	"standout/internal/report"
	"standout/perception"
)

// Digest is the part of a report the overlay needs, columnar so that it
// encodes and crosses to JavaScript quickly: per chart the marks' ids,
// their boxes as one flat array and their verdicts as one letter each, the
// findings with their marks as indices, and the emphasis. The core writes
// it by hand (appendDigest); the type documents it and decodes it in tests.
type Digest struct {
	Pages   []DigestPage `json:"pages"`
	Caution string       `json:"caution"`
}

// DigestPage is one page of a Digest.
type DigestPage struct {
	Source   string        `json:"source"`
	Problems []string      `json:"problems"`
	Charts   []DigestChart `json:"charts"`
}

// DigestChart is one chart of a Digest.
type DigestChart struct {
	Path    string     `json:"path"`
	IsChart bool       `json:"isChart"`
	Box     [4]float64 `json:"box"`
	// IDs are the marks' ids; Boxes holds each mark's x y width height in
	// page px, rounded to hundredths as in the report; Verdicts holds one
	// letter per mark: p pops, c conjunction, b blends.
	IDs      []string        `json:"ids"`
	Boxes    []float64       `json:"boxes"`
	Verdicts string          `json:"verdicts"`
	Findings []DigestFinding `json:"findings"`
	Emphasis *DigestEmphasis `json:"emphasis,omitempty"`
}

// DigestFinding is a finding whose marks are indices into the chart's.
type DigestFinding struct {
	ID       string     `json:"id"`
	Severity string     `json:"severity"`
	Message  string     `json:"message"`
	Marks    []int      `json:"marks"`
	Fix      *DigestFix `json:"fix,omitempty"`
}

// DigestFix is a finding's fix.
type DigestFix struct {
	Kind     string `json:"kind"`
	CSS      string `json:"css"`
	Verified bool   `json:"verified"`
}

// DigestEmphasis is the emphasis, by mark index, and whether it holds for
// each vision type.
type DigestEmphasis struct {
	Marks    []int           `json:"marks"`
	Inferred bool            `json:"inferred"`
	Holds    map[string]bool `json:"holds"`
}

var verdictLetter = map[perception.Verdict]byte{perception.Pops: 'p', perception.Conjunction: 'c', perception.Blends: 'b'}

func countMarks(as []report.Analysed) int {
	n := 0
	for _, a := range as {
		n += len(a.Chart.Marks)
	}
	return n
}

// appendDigest writes the Digest of the analysed charts of one page.
func appendDigest(b []byte, source string, problems []string, as []report.Analysed) []byte {
	b = append(b, `{"pages":[{"source":`...)
	b = appendString(b, source)
	b = append(b, `,"problems":`...)
	b = appendStrings(b, problems)
	b = append(b, `,"charts":[`...)
	for ci, a := range as {
		if ci > 0 {
			b = append(b, ',')
		}
		ch := a.Chart
		b = append(b, `{"path":`...)
		b = appendString(b, ch.Path)
		b = append(b, `,"isChart":`...)
		b = strconv.AppendBool(b, ch.IsChart)
		b = append(b, `,"box":`...)
		b = appendFloats(b, ch.Box[:])
		b = append(b, `,"ids":[`...)
		for i, m := range ch.Marks {
			if i > 0 {
				b = append(b, ',')
			}
			b = appendString(b, m.ID)
		}
		b = append(b, `],"boxes":[`...)
		for i, m := range ch.Marks {
			if i > 0 {
				b = append(b, ',')
			}
			for k, v := range m.BBox {
				if k > 0 {
					b = append(b, ',')
				}
				b = appendHundredths(b, v)
			}
		}
		b = append(b, `],"verdicts":"`...)
		for i := range ch.Marks {
			v := byte('b')
			if a.Result != nil {
				if l, ok := verdictLetter[a.Result.Marks[i][0].Verdict]; ok {
					v = l
				}
			}
			b = append(b, v)
		}
		b = append(b, `","findings":[`...)
		if a.Result != nil {
			for fi, f := range a.Result.Findings {
				if fi > 0 {
					b = append(b, ',')
				}
				b = append(b, `{"id":`...)
				b = appendString(b, f.ID)
				b = append(b, `,"severity":`...)
				b = appendString(b, string(f.Severity))
				b = append(b, `,"message":`...)
				b = appendString(b, f.Message)
				b = append(b, `,"marks":`...)
				b = appendInts(b, f.Marks, len(ch.Marks))
				if f.Fix != nil {
					b = append(b, `,"fix":{"kind":`...)
					b = appendString(b, f.Fix.Kind)
					b = append(b, `,"css":`...)
					b = appendString(b, f.Fix.CSS)
					b = append(b, `,"verified":`...)
					b = strconv.AppendBool(b, f.Fix.Verified)
					b = append(b, '}')
				}
				b = append(b, '}')
			}
		}
		b = append(b, ']')
		if a.Result != nil {
			b = append(b, `,"emphasis":{"marks":`...)
			b = appendInts(b, a.Result.Emphasis, len(ch.Marks))
			b = append(b, `,"inferred":`...)
			b = strconv.AppendBool(b, a.Result.Inferred)
			b = append(b, `,"holds":{`...)
			for vi, v := range perception.Visions {
				if vi > 0 {
					b = append(b, ',')
				}
				b = appendString(b, v.String())
				b = append(b, ':')
				b = strconv.AppendBool(b, a.Result.Holds[vi])
			}
			b = append(b, "}}"...)
		}
		b = append(b, '}')
	}
	b = append(b, `]}],"caution":`...)
	b = appendString(b, report.Caution)
	return append(b, '}')
}

// appendTiming writes a map of timings with its keys in order.
func appendTiming(b []byte, t map[string]float64) []byte {
	keys := make([]string, 0, len(t))
	for k := range t {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	b = append(b, '{')
	for i, k := range keys {
		if i > 0 {
			b = append(b, ',')
		}
		b = appendString(b, k)
		b = append(b, ':')
		b = appendFloat(b, t[k])
	}
	return append(b, '}')
}

// appendFloats writes numbers as a JSON array.
func appendFloats(b []byte, v []float64) []byte {
	b = append(b, '[')
	for i, f := range v {
		if i > 0 {
			b = append(b, ',')
		}
		b = appendFloat(b, f)
	}
	return append(b, ']')
}

// appendFloat writes a number; JSON has no NaN or infinity, so they are
// written as null.
func appendFloat(b []byte, f float64) []byte {
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return append(b, "null"...)
	}
	return strconv.AppendFloat(b, f, 'f', -1, 64)
}

// appendHundredths writes v rounded to hundredths: the same number as
// appendFloat(math.Round(v*100)/100), without strconv's general
// shortest-form search, which dominated the digest's encoding.
func appendHundredths(b []byte, v float64) []byte {
	n := math.Round(v * 100)
	if !(math.Abs(n) < 1<<53) {
		return appendFloat(b, n/100)
	}
	k := int64(n)
	if k < 0 {
		b = append(b, '-')
		k = -k
	}
	b = strconv.AppendInt(b, k/100, 10)
	switch f := k % 100; {
	case f == 0:
	case f%10 == 0:
		b = append(b, '.', byte('0'+f/10))
	default:
		b = append(b, '.', byte('0'+f/10), byte('0'+f%10))
	}
	return b
}

// appendInts writes the indices of v that lie within [0, n).
func appendInts(b []byte, v []int, n int) []byte {
	b = append(b, '[')
	first := true
	for _, x := range v {
		if x < 0 || x >= n {
			continue
		}
		if !first {
			b = append(b, ',')
		}
		first = false
		b = strconv.AppendInt(b, int64(x), 10)
	}
	return append(b, ']')
}

func appendStrings(b []byte, v []string) []byte {
	b = append(b, '[')
	for i, s := range v {
		if i > 0 {
			b = append(b, ',')
		}
		b = appendString(b, s)
	}
	return append(b, ']')
}

const hexDigits = "0123456789abcdef"

// appendString writes s as a JSON string (RFC 8259 §7): quotes,
// backslashes and control characters escaped, invalid UTF-8 replaced by
// U+FFFD as encoding/json does.
func appendString(b []byte, s string) []byte {
	b = append(b, '"')
	start := 0
	for i := 0; i < len(s); {
		c := s[i]
		if c < utf8.RuneSelf {
			if c >= 0x20 && c != '"' && c != '\\' {
				i++
				continue
			}
			b = append(b, s[start:i]...)
			switch c {
			case '"', '\\':
				b = append(b, '\\', c)
			case '\n':
				b = append(b, '\\', 'n')
			case '\r':
				b = append(b, '\\', 'r')
			case '\t':
				b = append(b, '\\', 't')
			default:
				b = append(b, '\\', 'u', '0', '0', hexDigits[c>>4], hexDigits[c&0xf])
			}
			i++
			start = i
			continue
		}
		r, size := utf8.DecodeRuneInString(s[i:])
		if r == utf8.RuneError && size == 1 {
			b = append(b, s[start:i]...)
			b = append(b, `\ufffd`...)
			i += size
			start = i
			continue
		}
		i += size
	}
	b = append(b, s[start:]...)
	return append(b, '"')
}
