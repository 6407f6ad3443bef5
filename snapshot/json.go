package snapshot

import (
	"errors"
	"math"
	"strconv"
	"strings"

	"standout/internal/jsonio"
)

// The JSON form of a Snapshot (SnapshotVersion 2) is columnar, so that the
// read pass writes it with a few array pushes per element and the core
// reads it without an object per element:
//
//	{"v": 2, "source": "…", "path": "svg0", "title": "…", "anchor": "…", "box": [x, y, w, h], "bg": rgba,
//	 "sel": [node, …], "problems": ["…", …],
//	 "tags": ["svg", "g", "circle", …],
//	 "paints": [kind, rgba, count, stop…, kind, rgba, count, stop…, …],
//	 "styles": [flags, fill, stroke, fillOpacity, strokeOpacity, opacity, strokeWidth, …],
//	 "strs": ["…", …],
//	 "nodes": [record, record, …]}
//
// "paints" is a table of Paint entries, each its kind, its colour, the
// number of its stops and the stops. "styles", which may be left out, is
// a table of styles of seven numbers each, as a record writes one; a
// record may name one as a style written before (512, below), so that a
// reader that keeps the table in order from one reading of a chart to
// the next leaves the records alone when a style new to the chart comes
// first (at most 2 × MaxNodes styles: a reader keeps at most one for each
// element a chart may have, and adds at most as many). Each node is one
// record of numbers in
// "nodes", four fixed fields, then the node's style (seven numbers, unless
// it repeats the previous record's, or one number when it repeats a style
// written before) and then the optional fields:
//
//	parent tag name has [flags fill stroke fillOpacity strokeOpacity opacity strokeWidth | style] …
//
// parent is the parent's record's index, −1 for the root, or −2
// (ParentPrev) for the record just before, so that an element's first
// child (a mark's <title>) names its parent the same wherever the element
// stands. tag indexes "tags"; fill and stroke index the paint entries;
// flags are Node.Flags. name derives Node.Name from the parent's: the
// root's is the snapshot's Path; k ≥ 0 names the parent's k-th element
// child, parent + "/" + tag + k; −2 (NameNext) the child after the one
// its parent's last such record named (k one more, or 0 for the first),
// so that an element added or taken away leaves its siblings' records as
// they were; −1 content a <use> instantiates, parent + ">" + tag. has
// says whether the style is there and which optional fields follow, in
// this order:
//
//	128 the style is the previous record's and is not written
//	512 the style is one written before: one number in its place, the
//	    style's index among the styles of "styles" and then those the
//	    records before wrote out, in their order (a chart's marks take a
//	    few styles, not in runs)
//	 1  CTM: six numbers; without it the parent's CTM (the root's: identity)
//	 2  Geom: a count, at most maxGeom, then the numbers
//	 4  BBox: four numbers
//	 8  D: an index into "strs"
//	16  Text: an index into "strs"
//	32  Label: an index into "strs"
//	64  Name: an index into "strs", replacing the derived name
//	256 Class: an index into "strs" (records may share one)
//
// An index into "strs" may be −1 (StrNext): the string after the highest
// one a field has named so far, as a string new to the reading is; so the
// records after an element added or taken away name theirs as before.
//
// JavaScript writes NaN and the infinities as null; they read as 0, as
// encoding/json reads null into a number.
// The optional fields of a node record, as the has number announces them.
// extension/constants.js carries the same values, generated from these.
const (
	FieldCTM = 1 << iota
	FieldGeom
	FieldBBox
	FieldD
	FieldText
	FieldLabel
	FieldName
	FieldSameStyle
	FieldClass
	FieldStyleRef
	fieldAll = FieldCTM | FieldGeom | FieldBBox | FieldD | FieldText | FieldLabel | FieldName | FieldSameStyle | FieldClass | FieldStyleRef
)

// The slots of a node record's style, in order.
const (
	StyleFlags = iota
	StyleFill
	StyleStroke
	StyleFillOpacity
	StyleStrokeOpacity
	StyleOpacity
	StyleStrokeWidth
	StyleLen
)

const (
	// NameUse is the name field of content instantiated by <use>.
	NameUse = -1
	// NameNext is the name field of the element child after the one its
	// parent's last record with a k ≥ 0 named.
	NameNext = -2
	// StrNext is a string field naming the string after the highest one
	// a field has named.
	StrNext = -1
	// ParentPrev is the parent field of a record whose parent is the
	// record just before it.
	ParentPrev = -2
	// MaxClassBytes bounds a node's class attribute as the readers keep it.
	MaxClassBytes = 256
	// maxGeom bounds a record's geometry count.
	maxGeom = 16
	// maxStops bounds the stops of one paint entry.
	maxStops = 1 << 16
)

// snapshotWire is the JSON document as it stands, before its records are
// interpreted. encoding/json decodes it by reflection (the fuzz test's
// oracle); the scanner decodes it faster.
type snapshotWire struct {
	Version  float64   `json:"v"`
	Source   string    `json:"source"`
	Path     string    `json:"path"`
	Title    string    `json:"title"`
	Anchor   string    `json:"anchor"`
	Box      []float64 `json:"box"`
	Bg       float64   `json:"bg"`
	Sel      []float64 `json:"sel"`
	Problems []string  `json:"problems"`
	Tags     []string  `json:"tags"`
	Paints   []float64 `json:"paints"`
	Styles   []float64 `json:"styles"`
	Strs     []string  `json:"strs"`
	Nodes    []float64 `json:"nodes"`
}

var wireKeys = []string{"v", "source", "path", "title", "anchor", "box", "bg", "sel", "problems", "tags", "paints", "styles", "strs", "nodes"}

// UnmarshalJSON decodes a snapshot's columnar JSON form.
func (s *Snapshot) UnmarshalJSON(b []byte) error {
	d := jsonio.New(b)
	var w snapshotWire
	if err := readWire(d, &w); err != nil {
		return wrap("snapshot: ", err)
	}
	if err := d.End(); err != nil {
		return wrap("snapshot: ", err)
	}
	out, err := w.snapshot()
	if err != nil {
		return err
	}
	*s = out
	return nil
}

// readWire reads a snapshot document into w. A repeated key replaces what
// the earlier one set, as encoding/json does. It is not inlined: each
// caller would get its own copy of its closure, 6 KB of the extension's
// core apiece.
//
//go:noinline
func readWire(d *jsonio.Scanner, w *snapshotWire) error {
	return d.Object(func(key string) error {
		var err error
		switch fold(key, wireKeys) {
		case "v":
			w.Version, err = d.Number()
		case "source":
			w.Source, err = d.Text()
		case "path":
			w.Path, err = d.Text()
		case "title":
			w.Title, err = d.Text()
		case "anchor":
			w.Anchor, err = d.Text()
		case "box":
			w.Box, err = d.Numbers(w.Box[:0])
		case "bg":
			w.Bg, err = d.Number()
		case "sel":
			w.Sel, err = d.Numbers(w.Sel[:0])
		case "problems":
			w.Problems, err = d.Strings(w.Problems[:0])
		case "tags":
			w.Tags, err = d.Strings(w.Tags[:0])
		case "paints":
			w.Paints, err = d.Numbers(w.Paints[:0])
		case "styles":
			w.Styles, err = d.Numbers(w.Styles[:0])
		case "strs":
			w.Strs, err = d.Strings(w.Strs[:0])
		case "nodes":
			if w.Nodes == nil {
				// Room for the numbers the rest of the input could hold
				// at about four bytes each, so that the array does not
				// double its way up from one. A page's snapshots share
				// one such buffer (DecodePage), so this is paid once per
				// input, not once per chart.
				w.Nodes = make([]float64, 0, d.Remaining()/4+1)
			}
			w.Nodes, err = d.Numbers(w.Nodes[:0])
		default:
			err = d.Skip()
		}
		return err
	})
}

// fold maps a key to the field it names the way encoding/json does: an
// exact match first, else the first case-insensitive one.
func fold(key string, known []string) string {
	for _, k := range known {
		if k == key {
			return k
		}
	}
	for _, k := range known {
		if strings.EqualFold(k, key) {
			return k
		}
	}
	return key
}

// record reads the numbers of "nodes" one at a time.
type record struct {
	v    []float64
	i    int
	node int
	// entry names what node counts in errors: "node " when empty.
	entry string
	// newStr is one past the highest index into strs a field has named.
	newStr int
}

func (r *record) error(msg string) error {
	entry := r.entry
	if entry == "" {
		entry = "node "
	}
	return errors.New("snapshot: " + entry + strconv.Itoa(r.node) + ": " + msg)
}

func (r *record) num() (float64, error) {
	if r.i >= len(r.v) {
		return 0, r.error("the record is cut short")
	}
	r.i++
	return r.v[r.i-1], nil
}

// int reads an integer within [lo, hi).
func (r *record) int(what string, lo, hi int) (int, error) {
	f, err := r.num()
	if err != nil {
		return 0, err
	}
	if f != math.Trunc(f) || f < float64(lo) || f >= float64(hi) {
		return 0, r.error(what + " " + num(f) + " is not an integer within [" + strconv.Itoa(lo) + ", " + strconv.Itoa(hi) + ")")
	}
	return int(f), nil
}

// str reads an index into strs, or StrNext.
func (r *record) str(strs []string) (string, error) {
	k, err := r.int("string", StrNext, len(strs))
	if err != nil {
		return "", err
	}
	if k == StrNext {
		if r.newStr >= len(strs) {
			return "", r.error("a new string past the last of strs")
		}
		k = r.newStr
	}
	r.newStr = max(r.newStr, k+1)
	return strs[k], nil
}

func packed(f float64) (uint32, bool) {
	if f < 0 || f > 0xffffffff || f != math.Trunc(f) {
		return 0, false
	}
	return uint32(f), true
}

// snapshot interprets the document: the tables and every record.
func (w *snapshotWire) snapshot() (Snapshot, error) {
	if w.Version != SnapshotVersion {
		return Snapshot{}, errors.New("snapshot: version " + num(w.Version) + ", want " + strconv.Itoa(SnapshotVersion))
	}
	s := Snapshot{Version: SnapshotVersion, Source: w.Source, Path: w.Path, Title: w.Title, Anchor: w.Anchor, Problems: w.Problems}
	switch len(w.Box) {
	case 0:
	case 4:
		copy(s.Box[:], w.Box)
	default:
		return Snapshot{}, errors.New("snapshot: box has " + strconv.Itoa(len(w.Box)) + " numbers, want 4")
	}
	bg, ok := packed(w.Bg)
	if !ok {
		return Snapshot{}, errors.New("snapshot: background " + num(w.Bg) + " is not a packed colour")
	}
	s.Background = bg
	paints, err := paintTable(w.Paints)
	if err != nil {
		return Snapshot{}, err
	}
	if err := w.nodes(&s, paints); err != nil {
		return Snapshot{}, err
	}
	for _, f := range w.Sel {
		if f != math.Trunc(f) || f < 0 || f >= float64(len(s.Nodes)) {
			return Snapshot{}, errors.New("snapshot: selects node " + num(f) + " of " + strconv.Itoa(len(s.Nodes)))
		}
		s.Selected = append(s.Selected, int32(f))
	}
	return s, nil
}

func paintTable(v []float64) ([]Paint, error) {
	var out []Paint
	for i := 0; i < len(v); {
		if len(v)-i < 3 {
			return nil, errors.New("snapshot: paint " + strconv.Itoa(len(out)) + " is cut short")
		}
		k, c, n := v[i], v[i+1], v[i+2]
		rgba, ok := packed(c)
		if !ok || (k != float64(PaintNone) && k != float64(PaintColour) && k != float64(PaintServer)) || n != math.Trunc(n) || n < 0 || n > maxStops || float64(len(v)-i-3) < n {
			return nil, errors.New("snapshot: paint " + strconv.Itoa(len(out)) + " (" + num(k) + ", " + num(c) + ", " + num(n) + ") is not a paint")
		}
		p := Paint{Kind: uint8(k), RGBA: rgba}
		i += 3
		if n > 0 {
			p.Stops = make([]uint32, int(n))
			for j := range p.Stops {
				if p.Stops[j], ok = packed(v[i+j]); !ok {
					return nil, errors.New("snapshot: paint " + strconv.Itoa(len(out)) + ": stop " + num(v[i+j]) + " is not a packed colour")
				}
			}
			i += int(n)
		}
		out = append(out, p)
	}
	return out, nil
}

// nodes interprets the records. The nodes' names are written into one
// buffer and cut from one string, and their geometry shares one slab, so
// decoding allocates per snapshot rather than per node.
func (w *snapshotWire) nodes(s *Snapshot, paints []Paint) error {
	v := w.Nodes
	// Room for the nodes, from the usual record length (a style repeated,
	// a CTM inherited, three numbers of geometry) rather than the shortest.
	s.Nodes = make([]Node, 0, min(len(v)/8+1, MaxNodes))
	nr := nodeReader{w: w, s: s, paints: paints, r: record{v: v}, nameAt: make([][2]int32, 0, cap(s.Nodes)), lastK: make([]int32, 0, cap(s.Nodes))}
	if len(w.Styles)%StyleLen != 0 {
		return errors.New("snapshot: styles has " + strconv.Itoa(len(w.Styles)) + " numbers, not a multiple of " + strconv.Itoa(StyleLen))
	}
	// A reader keeps at most a style for each element a chart may have and
	// adds at most as many.
	if len(w.Styles) > 2*MaxNodes*StyleLen {
		return errors.New("snapshot: styles has more than " + strconv.Itoa(2*MaxNodes) + " styles, two for each element a chart may have")
	}
	if len(w.Styles) > 0 {
		nr.table = make([]style, len(w.Styles)/StyleLen)
		t := record{v: w.Styles, entry: "style "}
		for ; t.i < len(t.v); t.node++ {
			var err error
			if nr.table[t.node], err = nr.readStyle(&t); err != nil {
				return err
			}
		}
	}
	for nr.r.i < len(v) {
		if err := nr.next(); err != nil {
			return err
		}
	}
	nr.finish()
	return nil
}

// nodeReader interprets a snapshot's node records one by one. Names are
// built in one byte slab, and geometry and boxes in one number slab, both
// cut into the nodes once complete.
type nodeReader struct {
	w      *snapshotWire
	s      *Snapshot
	paints []Paint
	r      record
	names  []byte
	nameAt [][2]int32
	lastK  []int32 // per node, the k its last child named by one had, or −1
	slab   []float64
	spans  []span  // geometry (node ≥ 0) and boxes (−node−1), cut from slab
	styled []int32 // the nodes whose records write their styles out, in order
	table  []style // the styles of "styles"
}

type span struct{ node, at, n int32 }

// next reads one record.
func (nr *nodeReader) next() error {
	r, s := &nr.r, nr.s
	r.node = len(s.Nodes)
	if r.node >= MaxNodes {
		return errors.New("snapshot: chart " + s.Path + " has more than " + strconv.Itoa(MaxNodes) + " elements")
	}
	p, err := r.int("parent", ParentPrev, r.node)
	if err != nil {
		return err
	}
	if p == ParentPrev {
		if r.node == 0 {
			return r.error("the first record has no record before it")
		}
		p = r.node - 1
	}
	tag, err := r.int("tag", 0, len(nr.w.Tags))
	if err != nil {
		return err
	}
	nk, err := r.int("name", NameNext, math.MaxInt32)
	if err != nil {
		return err
	}
	has, err := r.int("has", 0, fieldAll+1)
	if err != nil {
		return err
	}
	// Built in place: a Node is large, and copying one into the slice
	// costs a write barrier per pointer while the collector runs.
	s.Nodes = append(s.Nodes, Node{})
	nd := &s.Nodes[len(s.Nodes)-1]
	nd.Parent, nd.Tag = int32(p), nr.w.Tags[tag]
	if err := nr.style(nd, has); err != nil {
		return err
	}
	if err := nr.ctm(nd, has, p); err != nil {
		return err
	}
	if err := nr.numbers(has); err != nil {
		return err
	}
	if err := nr.strings(nd, has); err != nil {
		return err
	}
	if err := nr.name(nd, has, p, nk); err != nil {
		return err
	}
	if has&FieldClass != 0 {
		c, err := nr.r.str(nr.w.Strs)
		if err != nil {
			return err
		}
		if len(c) > MaxClassBytes {
			return errors.New("a class of " + strconv.Itoa(len(c)) + " bytes, more than " + strconv.Itoa(MaxClassBytes))
		}
		nd.Class = c
	}
	return nil
}

// style reads the record's style, or repeats the previous record's or
// one written before.
func (nr *nodeReader) style(nd *Node, has int) error {
	r := &nr.r
	if has&FieldSameStyle != 0 || has&FieldStyleRef != 0 {
		from := r.node - 1
		switch {
		case has&FieldSameStyle != 0 && has&FieldStyleRef != 0:
			return r.error("a record repeats two styles")
		case has&FieldStyleRef != 0:
			k, err := r.int("style", 0, len(nr.table)+len(nr.styled))
			if err != nil {
				return err
			}
			if k < len(nr.table) {
				nr.table[k].set(nd, nr.paints)
				return nil
			}
			from = int(nr.styled[k-len(nr.table)])
		case r.node == 0:
			return r.error("the first record cannot repeat a style")
		}
		copyStyle(nd, &nr.s.Nodes[from])
		return nil
	}
	nr.styled = append(nr.styled, int32(r.node))
	st, err := nr.readStyle(r)
	if err != nil {
		return err
	}
	st.set(nd, nr.paints)
	return nil
}

func copyStyle(nd, from *Node) {
	nd.Flags, nd.Fill, nd.Stroke = from.Flags, from.Fill, from.Stroke
	nd.FillOpacity, nd.StrokeOpacity, nd.Opacity, nd.StrokeWidth = from.FillOpacity, from.StrokeOpacity, from.Opacity, from.StrokeWidth
}

// style is a style as a record writes it: its paints by their index.
type style struct {
	flags                      uint8
	fill, stroke               int32
	fillOpacity, strokeOpacity float64
	opacity, strokeWidth       float64
}

func (st *style) set(nd *Node, paints []Paint) {
	nd.Flags, nd.Fill, nd.Stroke = st.flags, paints[st.fill], paints[st.stroke]
	nd.FillOpacity, nd.StrokeOpacity, nd.Opacity, nd.StrokeWidth = st.fillOpacity, st.strokeOpacity, st.opacity, st.strokeWidth
}

// readStyle reads a style's seven numbers, from a record or from
// "styles".
func (nr *nodeReader) readStyle(r *record) (style, error) {
	v := r.v
	flags, err := r.int("flags", 0, int(Hidden|Invisible)+1)
	if err != nil {
		return style{}, err
	}
	fill, err := r.int("fill", 0, len(nr.paints))
	if err != nil {
		return style{}, err
	}
	stroke, err := r.int("stroke", 0, len(nr.paints))
	if err != nil {
		return style{}, err
	}
	if len(v)-r.i < 4 {
		return style{}, r.error("the record is cut short")
	}
	st := style{uint8(flags), int32(fill), int32(stroke), v[r.i], v[r.i+1], v[r.i+2], v[r.i+3]}
	r.i += 4
	return st, nil
}

// ctm reads the record's CTM, or takes the parent's (the root's:
// identity).
func (nr *nodeReader) ctm(nd *Node, has, p int) error {
	switch {
	case has&FieldCTM != 0:
		for k := range nd.CTM {
			var err error
			if nd.CTM[k], err = nr.r.num(); err != nil {
				return err
			}
		}
	case p >= 0:
		nd.CTM = nr.s.Nodes[p].CTM
	default:
		nd.CTM = IdentityMatrix
	}
	return nil
}

// numbers reads the record's geometry and box into the slab.
func (nr *nodeReader) numbers(has int) error {
	r, v := &nr.r, nr.r.v
	if has&FieldGeom != 0 {
		n, err := r.int("geometry count", 0, maxGeom+1)
		if err != nil {
			return err
		}
		if len(v)-r.i < n {
			return r.error("the record is cut short")
		}
		nr.spans = append(nr.spans, span{int32(r.node), int32(len(nr.slab)), int32(n)})
		nr.slab = append(nr.slab, v[r.i:r.i+n]...)
		r.i += n
	}
	if has&FieldBBox != 0 {
		if len(v)-r.i < 4 {
			return r.error("the record is cut short")
		}
		nr.spans = append(nr.spans, span{-int32(r.node) - 1, int32(len(nr.slab)), 4})
		nr.slab = append(nr.slab, v[r.i:r.i+4]...)
		r.i += 4
	}
	return nil
}

// strings reads the record's path data, text and label.
func (nr *nodeReader) strings(nd *Node, has int) error {
	var err error
	if has&FieldD != 0 {
		if nd.D, err = nr.r.str(nr.w.Strs); err != nil {
			return err
		}
	}
	if has&FieldText != 0 {
		if nd.Text, err = nr.r.str(nr.w.Strs); err != nil {
			return err
		}
	}
	if has&FieldLabel != 0 {
		if nd.Label, err = nr.r.str(nr.w.Strs); err != nil {
			return err
		}
	}
	return nil
}

// name derives the node's name from its parent's, or reads it.
func (nr *nodeReader) name(nd *Node, has, p, nk int) error {
	start := len(nr.names)
	nr.lastK = append(nr.lastK, -1)
	if p >= 0 && has&FieldName == 0 && nk != NameUse {
		if nk == NameNext {
			if nr.lastK[p] == math.MaxInt32 {
				return nr.r.error("a name past the largest index")
			}
			nk = int(nr.lastK[p]) + 1
		}
		nr.lastK[p] = int32(nk)
	}
	switch {
	case has&FieldName != 0:
		explicit, err := nr.r.str(nr.w.Strs)
		if err != nil {
			return err
		}
		nr.names = append(nr.names, explicit...)
	case p < 0:
		nr.names = append(nr.names, nr.s.Path...)
	default:
		pn := nr.nameAt[p]
		nr.names = append(nr.names, nr.names[pn[0]:pn[1]]...)
		if nk == NameUse {
			nr.names = append(nr.names, '>')
			nr.names = append(nr.names, nd.Tag...)
		} else {
			nr.names = append(nr.names, '/')
			nr.names = append(nr.names, nd.Tag...)
			nr.names = strconv.AppendInt(nr.names, int64(nk), 10)
		}
	}
	nr.nameAt = append(nr.nameAt, [2]int32{int32(start), int32(len(nr.names))})
	return nil
}

// finish cuts the names, geometry and boxes into the nodes.
func (nr *nodeReader) finish() {
	all := string(nr.names)
	for i := range nr.s.Nodes {
		nr.s.Nodes[i].Name = all[nr.nameAt[i][0]:nr.nameAt[i][1]]
	}
	for _, sp := range nr.spans {
		vals := nr.slab[sp.at : sp.at+sp.n : sp.at+sp.n]
		if sp.node >= 0 {
			nr.s.Nodes[sp.node].Geom = vals
		} else {
			nr.s.Nodes[-sp.node-1].BBox = vals
		}
	}
}

// MarshalJSON writes the snapshot's columnar JSON form. Names that follow
// the derivation rules are not written out; others go to "strs".
func (s Snapshot) MarshalJSON() ([]byte, error) {
	var e wireEncoder
	b := []byte(`{"v":`)
	b = strconv.AppendInt(b, int64(s.Version), 10)
	b = append(b, `,"source":`...)
	b = jsonio.AppendString(b, s.Source)
	b = append(b, `,"path":`...)
	b = jsonio.AppendString(b, s.Path)
	if s.Title != "" {
		b = append(b, `,"title":`...)
		b = jsonio.AppendString(b, s.Title)
	}
	if s.Anchor != "" {
		b = append(b, `,"anchor":`...)
		b = jsonio.AppendString(b, s.Anchor)
	}
	b = append(b, `,"box":`...)
	b = jsonio.AppendFloats(b, s.Box[:])
	b = append(b, `,"bg":`...)
	b = strconv.AppendUint(b, uint64(s.Background), 10)
	if len(s.Selected) > 0 {
		b = append(b, `,"sel":[`...)
		for i, v := range s.Selected {
			if i > 0 {
				b = append(b, ',')
			}
			b = strconv.AppendInt(b, int64(v), 10)
		}
		b = append(b, ']')
	}
	if len(s.Problems) > 0 {
		b = append(b, `,"problems":`...)
		b = jsonio.AppendStrings(b, s.Problems)
	}
	nodes, err := e.records(&s)
	if err != nil {
		return nil, err
	}
	b = append(b, `,"tags":`...)
	b = jsonio.AppendStrings(b, e.tags)
	b = append(b, `,"paints":`...)
	b = jsonio.AppendFloats(b, e.paints)
	b = append(b, `,"strs":`...)
	b = jsonio.AppendStrings(b, e.strs)
	b = append(b, `,"nodes":`...)
	b = jsonio.AppendFloats(b, nodes)
	return append(b, '}'), nil
}

type paintKey struct {
	kind  uint8
	rgba  uint32
	stops string
}

type wireEncoder struct {
	tags   []string
	tagIdx map[string]int
	paints []float64
	paintI map[paintKey]int
	strs   []string
}

func (e *wireEncoder) tag(t string) float64 {
	if e.tagIdx == nil {
		e.tagIdx = map[string]int{}
	}
	i, ok := e.tagIdx[t]
	if !ok {
		i = len(e.tags)
		e.tags = append(e.tags, t)
		e.tagIdx[t] = i
	}
	return float64(i)
}

func (e *wireEncoder) paint(p Paint) float64 {
	if e.paintI == nil {
		e.paintI = map[paintKey]int{}
	}
	k := paintKey{p.Kind, p.RGBA, stopsKey(p.Stops)}
	i, ok := e.paintI[k]
	if !ok {
		i = len(e.paintI)
		e.paintI[k] = i
		e.paints = append(e.paints, float64(p.Kind), float64(p.RGBA), float64(len(p.Stops)))
		for _, st := range p.Stops {
			e.paints = append(e.paints, float64(st))
		}
	}
	return float64(i)
}

// str writes a string field: a string of its own, after every one named
// before, so StrNext.
func (e *wireEncoder) str(s string) float64 {
	e.strs = append(e.strs, s)
	return StrNext
}

// records writes every node's record.
func (e *wireEncoder) records(s *Snapshot) ([]float64, error) {
	var out []float64
	var prevKey [StyleLen]uint64
	styles := map[[StyleLen]uint64]int{} // the styles written out, numbered
	lastK := make([]int, len(s.Nodes))   // as nodeReader.lastK
	for i := range s.Nodes {
		lastK[i] = -1
		nd := &s.Nodes[i]
		p := int(nd.Parent)
		if err := checkNode(s, i); err != nil {
			return nil, err
		}
		nk, explicit := nameLink(s, i)
		has := presentFields(s, i)
		switch {
		case explicit:
			has |= FieldName
			nk = 0
		case p >= 0 && nk >= 0:
			k := nk
			if k == lastK[p]+1 {
				nk = NameNext
			}
			lastK[p] = k
		}
		fill, stroke := e.paint(nd.Fill), e.paint(nd.Stroke)
		style := [StyleLen]float64{float64(nd.Flags), fill, stroke, nd.FillOpacity, nd.StrokeOpacity, nd.Opacity, nd.StrokeWidth}
		key := styleKey(style)
		ref, written := styles[key]
		switch {
		case i > 0 && key == prevKey:
			has |= FieldSameStyle
		case written:
			has |= FieldStyleRef
		}
		pf := float64(p)
		if p >= 0 && p == i-1 {
			pf = ParentPrev
		}
		out = append(out, pf, e.tag(nd.Tag), float64(nk), float64(has))
		switch {
		case has&FieldSameStyle != 0:
		case has&FieldStyleRef != 0:
			out = append(out, float64(ref))
		default:
			out = append(out, style[:]...)
			styles[key] = len(styles)
		}
		prevKey = key
		out = e.optional(out, nd, has)
	}
	return out, nil
}

// checkNode refuses a node the JSON form cannot hold.
func checkNode(s *Snapshot, i int) error {
	nd := &s.Nodes[i]
	p := int(nd.Parent)
	switch {
	case p >= i || p < -1:
		return errors.New("snapshot: chart " + s.Path + ": node " + strconv.Itoa(i) + " has parent " + strconv.Itoa(int(p)) + ", which does not precede it")
	case len(nd.Geom) > maxGeom:
		return errors.New("snapshot: chart " + s.Path + ": node " + strconv.Itoa(i) + " has " + strconv.Itoa(len(nd.Geom)) + " geometry values, more than " + strconv.Itoa(maxGeom))
	case len(nd.BBox) != 0 && len(nd.BBox) != 4:
		return errors.New("snapshot: chart " + s.Path + ": node " + strconv.Itoa(i) + " has a box of " + strconv.Itoa(len(nd.BBox)) + " numbers")
	}
	return nil
}

// nameLink is the name field of node i: its index among its parent's
// children, or NameUse, when its name derives from the parent's; else
// explicit is true and the name is written out.
func nameLink(s *Snapshot, i int) (nk int, explicit bool) {
	nd := &s.Nodes[i]
	p := int(nd.Parent)
	if p < 0 {
		return 0, nd.Name != s.Path
	}
	rest, ok := strings.CutPrefix(nd.Name, s.Nodes[p].Name)
	switch {
	case ok && rest == ">"+nd.Tag:
		return NameUse, false
	case ok && strings.HasPrefix(rest, "/"+nd.Tag):
		k, err := strconv.Atoi(rest[1+len(nd.Tag):])
		return k, err != nil || k < 0 || strconv.Itoa(k) != rest[1+len(nd.Tag):]
	}
	return 0, true
}

// presentFields are the optional fields node i has (all but the name).
func presentFields(s *Snapshot, i int) int {
	nd := &s.Nodes[i]
	p := int(nd.Parent)
	has := 0
	if (p >= 0 && nd.CTM != s.Nodes[p].CTM) || (p < 0 && Matrix(nd.CTM) != IdentityMatrix) {
		has |= FieldCTM
	}
	if len(nd.Geom) > 0 {
		has |= FieldGeom
	}
	if len(nd.BBox) == 4 {
		has |= FieldBBox
	}
	if nd.D != "" {
		has |= FieldD
	}
	if nd.Text != "" {
		has |= FieldText
	}
	if nd.Label != "" {
		has |= FieldLabel
	}
	if nd.Class != "" {
		has |= FieldClass
	}
	return has
}

// optional appends the optional fields has announces, in their order.
func (e *wireEncoder) optional(out []float64, nd *Node, has int) []float64 {
	if has&FieldCTM != 0 {
		out = append(out, nd.CTM[:]...)
	}
	if has&FieldGeom != 0 {
		out = append(out, float64(len(nd.Geom)))
		out = append(out, nd.Geom...)
	}
	if has&FieldBBox != 0 {
		out = append(out, nd.BBox...)
	}
	if has&FieldD != 0 {
		out = append(out, e.str(nd.D))
	}
	if has&FieldText != 0 {
		out = append(out, e.str(nd.Text))
	}
	if has&FieldLabel != 0 {
		out = append(out, e.str(nd.Label))
	}
	if has&FieldName != 0 {
		out = append(out, e.str(nd.Name))
	}
	if has&FieldClass != 0 {
		out = append(out, e.str(nd.Class))
	}
	return out
}

// styleKey is a style bit for bit: styles are compared as the decoder
// will read them, so that a NaN, written as null and read as 0, is never
// taken for another.
func styleKey(a [StyleLen]float64) (k [StyleLen]uint64) {
	for i, v := range a {
		k[i] = math.Float64bits(v)
	}
	return k
}

// PageJSON is what the browser's read pass returns for a page.
type PageJSON struct {
	Source    string
	Snapshots []Snapshot
	// Raw holds each snapshot's JSON as read, a part of the decoded input:
	// a caller may know a chart it has judged before by it.
	Raw [][]byte
	// Skipped, from DecodePageKnowing, says which snapshots were known and
	// left undecoded (their Snapshots entries are empty); nil when none.
	Skipped  []bool
	Problems []string
	// Rasters are the page's charts drawn as pixels, which no reader can
	// read marks from.
	Rasters []Raster
}

// Raster is an element that draws pixels at a chart's size: a <canvas>,
// an <img>, an <object> or an <embed> at least RasterMin in CSS px. Its
// marks cannot be read; it is named so that no check passes in silence.
type Raster struct {
	Tag, Name string
	// Box is its box in page CSS px; the static reader, which has no
	// layout, knows only the size its attributes give (0 when none).
	Box [4]float64
}

// RasterMin is the smallest box, width and height in CSS px, taken for a
// chart rather than an icon. Provisional: a small chart or a sparkline
// is smaller, an icon seldom this large.
var RasterMin = [2]float64{100, 60}

// MaxRasters bounds the rasters a page reports.
const MaxRasters = 1000

// pageKeys and rasterKeys are the fields of PageJSON and Raster, whose
// keys the decoder folds as encoding/json does (fold).
var (
	pageKeys   = []string{"source", "snapshots", "problems", "rasters"}
	rasterKeys = []string{"tag", "name", "box"}
)

// DecodePage decodes the read pass's result,
// {"source": …, "snapshots": […], "problems": […], …}, with the fast
// scanner throughout (encoding/json would first scan the whole input to
// validate it, which costs as much again under WebAssembly).
func DecodePage(b []byte) (*PageJSON, error) { return DecodePageKnowing(b, nil) }

// errPageNodes is the error of a page past MaxPageNodes (built when
// needed: a variable would be built at every start of the core).
func errPageNodes() error {
	return errors.New("the page's charts have more than " + strconv.Itoa(MaxPageNodes) + " elements, more than one check takes")
}

// Known is a chart a caller judged before: its snapshot's JSON as read,
// and its number of nodes.
type Known struct {
	Raw   string
	Nodes int
}

// DecodePageKnowing is DecodePage, except that the i-th snapshot, when its
// JSON is known[i].Raw byte for byte, is neither scanned nor decoded: its
// Snapshots entry is left empty and its Skipped entry true. It still
// counts known[i].Nodes towards the page's limit. A caller that judged
// the charts of the page before, most of them unchanged, decodes only
// what changed.
func DecodePageKnowing(b []byte, known []Known) (*PageJSON, error) {
	d := jsonio.New(b)
	var p PageJSON
	err := d.Object(func(key string) error {
		var err error
		switch fold(key, pageKeys) {
		case "source":
			p.Source, err = d.Text()
		case "problems":
			p.Problems, err = d.Strings(p.Problems[:0])
		case "rasters":
			p.Rasters, err = decodeRasters(d)
		case "snapshots":
			p.Snapshots, p.Raw = p.Snapshots[:0], p.Raw[:0]
			// One buffer for every snapshot's numbers: a snapshot keeps
			// none of them once interpreted.
			var numbers []float64
			total := 0
			err = d.Array(func() error {
				w := snapshotWire{Nodes: numbers}
				start := d.Offset()
				if i := len(p.Snapshots); i < len(known) && known[i].Raw != "" && len(b)-start >= len(known[i].Raw) && string(b[start:start+len(known[i].Raw)]) == known[i].Raw {
					// A complete value, since the known one is: the scanner
					// steps over it.
					d.Advance(len(known[i].Raw))
					p.Raw = append(p.Raw, b[start:start+len(known[i].Raw)])
					p.Snapshots = append(p.Snapshots, Snapshot{})
					for len(p.Skipped) < i {
						p.Skipped = append(p.Skipped, false)
					}
					p.Skipped = append(p.Skipped, true)
					if total += known[i].Nodes; total > MaxPageNodes {
						return errPageNodes()
					}
					return nil
				}
				if err := readWire(d, &w); err != nil {
					return err
				}
				p.Raw = append(p.Raw, b[start:len(b)-d.Remaining()])
				numbers = w.Nodes[:0]
				s, err := w.snapshot()
				if err != nil {
					return wrap("snapshot "+strconv.Itoa(len(p.Snapshots))+": ", err)
				}
				if total += len(s.Nodes); total > MaxPageNodes {
					return errPageNodes()
				}
				p.Snapshots = append(p.Snapshots, s)
				return nil
			})
		default:
			err = d.Skip()
		}
		return err
	})
	if err == nil {
		err = d.End()
	}
	if err != nil {
		return nil, wrap("snapshot: page ", err)
	}
	for p.Skipped != nil && len(p.Skipped) < len(p.Snapshots) {
		p.Skipped = append(p.Skipped, false)
	}
	return &p, nil
}

// decodeRasters reads the read pass's rasters: [{tag, name, box}, …].
func decodeRasters(d *jsonio.Scanner) ([]Raster, error) {
	var out []Raster
	err := d.Array(func() error {
		if len(out) >= MaxRasters {
			return errors.New("more than " + strconv.Itoa(MaxRasters) + " raster elements")
		}
		var r Raster
		err := d.Object(func(key string) error {
			var err error
			switch fold(key, rasterKeys) {
			case "tag":
				r.Tag, err = d.Text()
			case "name":
				r.Name, err = d.Text()
			case "box":
				var box []float64
				if box, err = d.Numbers(nil); err == nil {
					if len(box) != 4 {
						return errors.New("a raster box of " + strconv.Itoa(len(box)) + " numbers, want 4")
					}
					copy(r.Box[:], box)
				}
			default:
				err = d.Skip()
			}
			return err
		})
		out = append(out, r)
		return err
	})
	return out, err
}

// Messages are put together without fmt, which the extension's overlay
// core does not link.

// num writes a number as fmt's %v does.
func num(f float64) string { return strconv.FormatFloat(f, 'g', -1, 64) }

// wrapped is an error with its context before it, as fmt.Errorf's %w
// makes one.
type wrapped struct {
	prefix string
	err    error
}

func (w *wrapped) Error() string { return w.prefix + w.err.Error() }
func (w *wrapped) Unwrap() error { return w.err }

func wrap(prefix string, err error) error { return &wrapped{prefix, err} }

// stopsKey is a gradient's stops as a map key.
func stopsKey(stops []uint32) string {
	b := make([]byte, 0, 9*len(stops))
	for _, s := range stops {
		b = strconv.AppendUint(append(b, ' '), uint64(s), 16)
	}
	return string(b)
}
