package main

import (
	"encoding/json"
	"fmt"
	"math/rand"
	"standout/static"
	"strings"
	"testing"
)

// benchRequest is a request with one scatter chart of n circles.
func benchRequest(b *testing.B, n int) []byte {
	rng := rand.New(rand.NewSource(1))
	cols := []string{"#3b6e8f", "#d0842c", "#5a9a4e", "#9a6aa6"}
	var s strings.Builder
	s.WriteString(`<svg width="1000" height="800"><g>`)
	for i := 0; i < n; i++ {
		fmt.Fprintf(&s, `<circle cx="%.1f" cy="%.1f" r="3" fill="%s"/>`, 10+rng.Float64()*980, 10+rng.Float64()*780, cols[rng.Intn(4)])
	}
	s.WriteString(`</g></svg>`)
	p, err := static.Build(strings.NewReader(s.String()), static.Options{Source: "bench"})
	if err != nil {
		b.Fatal(err)
	}
	req, err := json.Marshal(Request{Type: "analyse", Source: "bench", Snapshots: p.Charts})
	if err != nil {
		b.Fatal(err)
	}
	return req
}

// BenchmarkHandle5k is the core's whole request for 5,000 marks: decode,
// walk, analyse, encode the report and its Markdown.
func BenchmarkHandle5k(b *testing.B) {
	req := benchRequest(b, 5000)
	b.SetBytes(int64(len(req)))
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		Handle(req)
	}
}

// BenchmarkHandlePage5k is the extension's form: options and page apart,
// answered with the overlay's digest.
func BenchmarkHandlePage5k(b *testing.B) {
	req := benchRequest(b, 5000)
	var q Request
	if err := json.Unmarshal(req, &q); err != nil {
		b.Fatal(err)
	}
	page, _ := json.Marshal(map[string]any{"source": "bench", "snapshots": q.Snapshots})
	opts := []byte(`{"type":"analyse"}`)
	b.SetBytes(int64(len(page)))
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		charts.forget() // judged anew each time, as after an edit
		HandlePage(opts, page)
	}
}

// BenchmarkHandlePage5kFix is BenchmarkHandlePage5k with a second
// emphasis, one mark in a brown that stands out for normal vision but not
// under every CVD, so that the digest's findings search for a fix.
func BenchmarkHandlePage5kFix(b *testing.B) {
	rng := rand.New(rand.NewSource(5000))
	cols := []string{"#3b6e8f", "#d0842c", "#5a9a4e", "#9a6aa6"}
	var s strings.Builder
	s.WriteString(`<svg width="1000" height="800"><g>`)
	for i := 0; i < 5000; i++ {
		c := cols[rng.Intn(4)]
		switch i {
		case 0:
			c = "#7f6e5d"
		case 2500:
			c = "#111111"
		}
		fmt.Fprintf(&s, `<circle cx="%.1f" cy="%.1f" r="3" fill="%s"/>`, 10+rng.Float64()*980, 10+rng.Float64()*780, c)
	}
	s.WriteString(`</g></svg>`)
	p, err := static.Build(strings.NewReader(s.String()), static.Options{Source: "bench"})
	if err != nil {
		b.Fatal(err)
	}
	page, _ := json.Marshal(map[string]any{"source": "bench", "snapshots": p.Charts})
	opts := []byte(`{"type":"analyse"}`)
	if out := HandlePage(opts, page); !strings.Contains(string(out), `"fix"`) {
		b.Fatal("no fix was searched")
	}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		charts.forget()
		HandlePage(opts, page)
	}
}

// BenchmarkRecheckOneOfFourEdited is a re-check of a page of four corpus
// charts after an edit to one (the pages alternate): recalled keeps the
// other charts' digests from the last request (charts.go), fresh forgets
// them first, as the core did before it kept any.
func BenchmarkRecheckOneOfFourEdited(b *testing.B) {
	pages := [][]byte{corpusPage(b, false), corpusPage(b, true)}
	opts := []byte(`{"type":"analyse"}`)
	for _, keep := range []bool{true, false} {
		name := map[bool]string{true: "recalled", false: "fresh"}[keep]
		b.Run(name, func(b *testing.B) {
			HandlePage(opts, pages[1])
			for i := 0; i < b.N; i++ {
				if !keep {
					charts.forget()
				}
				HandlePage(opts, pages[i%2])
			}
		})
	}
}
