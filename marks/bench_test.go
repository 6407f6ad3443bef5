package marks

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"standout/internal/testkit"
	"standout/snapshot"
	"standout/static"
	"strings"
	"testing"
)

// benchExtract times static.Build + Walk over one document.
func benchExtract(b *testing.B, doc []byte) {
	b.SetBytes(int64(len(doc)))
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		p, err := static.Build(bytes.NewReader(doc), static.Options{Source: "bench"})
		if err != nil {
			b.Fatal(err)
		}
		for j := range p.Charts {
			if _, err := Walk(&p.Charts[j]); err != nil {
				b.Fatal(err)
			}
		}
	}
}

// BenchmarkCorpusLargest is the largest corpus chart (10,858 circles).
func BenchmarkCorpusLargest(b *testing.B) {
	dir := corpusDir(b)
	doc, err := os.ReadFile(filepath.Join(dir, "observable-plot/athletesHeightWeight.svg"))
	if err != nil {
		b.Fatal(err)
	}
	benchExtract(b, doc)
}

// BenchmarkPage5MB is a 5 MB page of circles.
func BenchmarkPage5MB(b *testing.B) {
	s := testkit.ManyCircles(1)
	n := 5 << 20 / (len(testkit.ManyCircles(1001)) - len(s)) * 1000
	benchExtract(b, []byte(testkit.ManyCircles(n)))
}

func BenchmarkMarks10k(b *testing.B)  { benchExtract(b, []byte(testkit.ManyCircles(10000))) }
func BenchmarkMarks100k(b *testing.B) { benchExtract(b, []byte(testkit.ManyCircles(100000))) }

func BenchmarkPathParse(b *testing.B) {
	d := "M0,0" + strings.Repeat("C1,2 3,4 5,6A5,5,0,0,1,10,10L3,4", 1000)
	b.SetBytes(int64(len(d)))
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		if _, _, err := ParsePath(d); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkDecodePage10k decodes a read pass's page of 10,000 circles, as
// the extension's core does on every check.
func BenchmarkDecodePage10k(b *testing.B) {
	p, err := static.Build(strings.NewReader(testkit.ManyCircles(10000)), static.Options{Source: "bench"})
	if err != nil {
		b.Fatal(err)
	}
	page, err := json.Marshal(map[string]any{"source": "bench", "snapshots": p.Charts, "problems": []string{}})
	if err != nil {
		b.Fatal(err)
	}
	b.SetBytes(int64(len(page)))
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := snapshot.DecodePage(page); err != nil {
			b.Fatal(err)
		}
	}
}
