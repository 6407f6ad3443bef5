package main

import (
	"encoding/json"
	"fmt"
	"math/rand"
	"standout/snapshot"
	"standout/static"
	"strings"
	"testing"
)

// scatterSnapshots is one scatter chart of n circles in four colours, as
// the static reader reads it, with the circles recolour names painted in
// their own colours.
func scatterSnapshots(b testing.TB, seed int64, n int, recolour map[int]string) []snapshot.Snapshot {
	rng := rand.New(rand.NewSource(seed))
	cols := []string{"#3b6e8f", "#d0842c", "#5a9a4e", "#9a6aa6"}
	var s strings.Builder
	s.WriteString(`<svg width="1000" height="800"><g>`)
	for i := 0; i < n; i++ {
		x, y, c := 10+rng.Float64()*980, 10+rng.Float64()*780, cols[rng.Intn(4)]
		if r, ok := recolour[i]; ok {
			c = r
		}
		fmt.Fprintf(&s, `<circle cx="%.1f" cy="%.1f" r="3" fill="%s"/>`, x, y, c)
	}
	s.WriteString(`</g></svg>`)
	p, err := static.Build(strings.NewReader(s.String()), static.Options{Source: "bench"})
	if err != nil {
		b.Fatal(err)
	}
	return p.Charts
}

// benchRequest is a request with one scatter chart of n circles.
func benchRequest(b *testing.B, seed int64, n int) []byte {
	req, err := json.Marshal(Request{Type: "analyse", Source: "bench", Snapshots: scatterSnapshots(b, seed, n, nil)})
	if err != nil {
		b.Fatal(err)
	}
	return req
}

// pageOf is the extension's page JSON of the charts snaps.
func pageOf(b testing.TB, snaps []snapshot.Snapshot) []byte {
	page, err := json.Marshal(map[string]any{"source": "bench", "snapshots": snaps})
	if err != nil {
		b.Fatal(err)
	}
	return page
}

// benchPage is the extension's page JSON of one scatter chart of n
// circles (scatterSnapshots).
func benchPage(b testing.TB, seed int64, n int, recolour map[int]string) []byte {
	return pageOf(b, scatterSnapshots(b, seed, n, recolour))
}

// BenchmarkHandle5k is the core's whole request for 5,000 marks: decode,
// walk, analyse, encode the report and its Markdown. Two charts whose
// marks lie elsewhere alternate, so nothing kept from the last request
// (perception's neighbour search) serves.
func BenchmarkHandle5k(b *testing.B) {
	reqs := [][]byte{benchRequest(b, 1, 5000), benchRequest(b, 2, 5000)}
	b.SetBytes(int64(len(reqs[0])))
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		Handle(reqs[i%2])
	}
}

// twoChartPage is a page of two scatter charts of n circles, with one
// mark of chart edit (1 or 2; 0 for none) in another colour.
func twoChartPage(b testing.TB, n, edit int) []byte {
	re := func(c int) map[int]string {
		if c == edit {
			return map[int]string{0: "#5d6e7f"}
		}
		return nil
	}
	snaps := append(scatterSnapshots(b, 1, n, re(1)), scatterSnapshots(b, 2, n, re(2))...)
	snaps[1].Path = "svg1"
	return pageOf(b, snaps)
}

// BenchmarkHandlePage5k is the extension's form: options and page apart,
// answered with the overlay's digest. The pages alternate as an edit that
// moves the marks would: the whole chart is judged again each time.
// recoloured alternates pages that differ in one mark's fill, as a check
// again after a recolour, which finds every mark where it was;
// two-recoloured a page of two such charts recoloured in turn, so that
// both are judged each time, on the neighbour searches kept of each.
func BenchmarkHandlePage5k(b *testing.B) {
	opts := []byte(`{"type":"analyse"}`)
	for _, c := range []struct {
		name  string
		pages [][]byte
	}{
		{"moved", [][]byte{benchPage(b, 1, 5000, nil), benchPage(b, 2, 5000, nil)}},
		{"recoloured", [][]byte{benchPage(b, 1, 5000, nil), benchPage(b, 1, 5000, map[int]string{0: "#5d6e7f"})}},
		{"two-recoloured", [][]byte{twoChartPage(b, 5000, 1), twoChartPage(b, 5000, 2)}},
	} {
		b.Run(c.name, func(b *testing.B) {
			b.SetBytes(int64(len(c.pages[0])))
			for i := 0; i < b.N; i++ {
				HandlePage(opts, c.pages[i%2])
			}
		})
	}
}

// BenchmarkHandlePage5kFix is BenchmarkHandlePage5k with a second
// emphasis, one mark in a brown that stands out for normal vision but not
// under every CVD, so that the digest's findings search for a fix.
func BenchmarkHandlePage5kFix(b *testing.B) {
	snaps := scatterSnapshots(b, 5000, 5000, map[int]string{0: "#7f6e5d", 2500: "#111111"})
	page := pageOf(b, snaps)
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
