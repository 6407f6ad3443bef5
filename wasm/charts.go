package main

import (
	"sync"

	"standout/internal/report"
	"standout/perception"
	"standout/snapshot"
)

// charts keeps the digest of each chart of the last page the core
// answered, so that a re-check after an edit to one chart of a page
// judges that chart alone. A chart is known by its snapshot as the read
// pass wrote it, byte for byte, under the same options, byte for byte: a
// chart's digest depends on nothing else (report.AppendDigestChart).
// Within a chart judged again, the analysis reuses what it kept of the
// last ones (perception.Kept: their last few neighbour searches, which
// a recolour leaves as they were).
var charts chartMemo

type chartMemo struct {
	mu      sync.Mutex
	options string
	digests map[string][]byte
	// last is the last page's charts in order, each's JSON (a key of
	// digests) and number of nodes: a page checked again usually has the
	// same charts in the same places, which need not be decoded
	// (snapshot.DecodePageKnowing).
	last []snapshot.Known
	kept *perception.Kept
}

// known is the last page's charts, when they were judged under options.
func (m *chartMemo) known(options []byte) []snapshot.Known {
	m.mu.Lock()
	defer m.mu.Unlock()
	if m.digests == nil || m.options != string(options) {
		return nil
	}
	return m.last
}

// analysisKept is what the analyses of the core's requests keep for the
// next.
func (m *chartMemo) analysisKept() *perception.Kept {
	m.mu.Lock()
	defer m.mu.Unlock()
	if m.kept == nil {
		m.kept = &perception.Kept{}
	}
	return m.kept
}

// recall returns the kept digest of each raw snapshot judged under
// options, nil where there is none.
func (m *chartMemo) recall(options []byte, raw [][]byte) [][]byte {
	m.mu.Lock()
	defer m.mu.Unlock()
	out := make([][]byte, len(raw))
	if m.digests == nil || m.options != string(options) {
		return out
	}
	for i, r := range raw {
		out[i] = m.digests[string(r)]
	}
	return out
}

// keep replaces what is kept with the digests of one page's charts, and
// their numbers of nodes.
func (m *chartMemo) keep(options []byte, raw, digests [][]byte, nodes []int) {
	m.mu.Lock()
	defer m.mu.Unlock()
	m.options = string(options)
	m.digests = make(map[string][]byte, len(raw))
	m.last = make([]snapshot.Known, len(raw))
	for i, r := range raw {
		k := string(r)
		m.digests[k] = digests[i]
		m.last[i] = snapshot.Known{Raw: k, Nodes: nodes[i]}
	}
}

// forget drops what is kept.
func (m *chartMemo) forget() {
	m.mu.Lock()
	defer m.mu.Unlock()
	m.options, m.digests, m.last, m.kept = "", nil, nil, nil
}

// pending is a page's charts being digested: the digest of each one
// recalled, or nil until it is judged.
type pending struct {
	q       *Request
	digests [][]byte
	nodes   []int // each chart's number of nodes
	decoded int   // how many charts were decoded
	todo    []int // the charts to judge now
	// keep says whether the digests are kept for the next request: the
	// request came with each of its snapshots as read.
	keep bool
}

// recallCharts looks up q's charts among those kept, when q came with its
// snapshots as read (q.raw), and lists the ones to judge. A chart the
// decoder skipped as known (q.skipped) is recalled; were it not, it is
// decoded now.
func recallCharts(q *Request) (*pending, error) {
	p := &pending{q: q, keep: q.raw != nil && len(q.raw) == len(q.Snapshots), nodes: make([]int, len(q.Snapshots))}
	if p.keep {
		p.digests = charts.recall(q.options, q.raw)
	} else {
		p.digests = make([][]byte, len(q.Snapshots))
	}
	for i, d := range p.digests {
		skipped := i < len(q.skipped) && q.skipped[i]
		if skipped && d == nil {
			// The page decoder, which the core links anyway.
			one, err := snapshot.DecodePage(append(append([]byte(`{"snapshots":[`), q.raw[i]...), "]}"...))
			if err != nil {
				return nil, err
			}
			q.Snapshots[i], skipped = one.Snapshots[0], false
		}
		if !skipped {
			p.decoded++
			p.nodes[i] = len(q.Snapshots[i].Nodes)
		} else {
			p.nodes[i] = q.known[i].Nodes
		}
		if d == nil {
			p.todo = append(p.todo, i)
		}
	}
	return p, nil
}

// snapshots are the charts to judge.
func (p *pending) snapshots() []snapshot.Snapshot {
	if len(p.todo) == len(p.q.Snapshots) {
		return p.q.Snapshots
	}
	out := make([]snapshot.Snapshot, len(p.todo))
	for k, i := range p.todo {
		out[k] = p.q.Snapshots[i]
	}
	return out
}

// recalled is how many charts' digests were recalled, and their bytes.
func (p *pending) recalled() (n, bytes int) {
	for _, d := range p.digests {
		bytes += len(d)
	}
	return len(p.digests) - len(p.todo), bytes
}

// write writes the digest of the page: as, the judged charts in the order
// of todo, with the recalled ones. It keeps every chart's digest for the
// next request when the request came with its snapshots as read.
func (p *pending) write(b []byte, problems []string, as []report.Analysed) []byte {
	for k, a := range as {
		p.digests[p.todo[k]] = report.AppendDigestChart(make([]byte, 0, 256+80*len(a.Chart.Marks)), a)
	}
	b = report.AppendDigestOpen(b, p.q.Source, problems)
	for i, d := range p.digests {
		if i > 0 {
			b = append(b, ',')
		}
		b = append(b, d...)
	}
	if p.keep {
		charts.keep(p.q.options, p.q.raw, p.digests, p.nodes)
	}
	return report.AppendDigestClose(b)
}
