package extension

import (
	"bytes"
	"encoding/binary"
	"errors"
	"os"

	"standout/internal/wasmmod"
)

// Go's linker writes into every WebAssembly module a lookup table from
// code address to function, the runtime's findfunctab: on WebAssembly a
// code address is a function's index shifted left by 16, so the table
// holds 16 buckets of 20 bytes for every function, nearly all zero but
// for the function's index. The module stores it as some 35,000 small
// data segments, 344 KB of the overlay core's 3.4 MB, though the table is
// a function of the runtime's function table (ftab), which the module
// carries anyway.
//
// stripFindFuncTab takes the table out of the module's data and adds a
// custom section, FindFuncSection, saying where it goes; findfunc.js
// rebuilds it into the instance's memory before Go starts, as the linker
// built it (cmd/link/internal/ld/pcln.go, findfunctab). The build
// rebuilds it the same way first and strips it only when the result is
// the linker's table byte for byte; otherwise, as with a module whose
// layout it does not know, it leaves the module as it is and says why.
// TestFindFuncTableRebuilt holds findfunc.js to the linker's bytes.

// FindFuncSection names the custom section that places the table: seven
// little-endian uint32s, the table's address and size, the ftab's address
// and number of functions (without its end marker), the text base, and
// the lowest and highest code address.
const FindFuncSection = "standout.findfunctab"

// goLayout is where the runtime's tables are in a module's memory.
type goLayout struct {
	table, size        uint32 // findfunctab
	ftab, nfunc        uint32
	text, minpc, maxpc uint32
}

func (l goLayout) section() []byte {
	b := make([]byte, 0, 28)
	for _, v := range []uint32{l.table, l.size, l.ftab, l.nfunc, l.text, l.minpc, l.maxpc} {
		b = binary.LittleEndian.AppendUint32(b, v)
	}
	return b
}

const (
	pcHeaderMagic = 0xfffffff1 // Go 1.20 and later (runtime/symtab.go)
	bucketSize    = 4096       // abi.FuncTabBucketSize
	subBuckets    = 16
	subBucketSize = bucketSize / subBuckets
)

// maxImage bounds the memory a module's data may lay out: Go's data is a
// few megabytes, and the image is held whole while the table is found.
const maxImage = 64 << 20

// dataSegment is one active data segment: its memory offset and bytes.
type dataSegment struct {
	off  uint32
	data []byte
}

// readData reads a data section of active segments placed by i32.const,
// the only kind Go's linker and wasm-opt write for it.
func readData(body []byte) ([]dataSegment, error) {
	count, n := binary.Uvarint(body)
	if n <= 0 {
		return nil, errors.New("bad data section")
	}
	p := body[n:]
	if count > uint64(len(p)/4) { // a segment takes at least 4 bytes
		return nil, errors.New("more data segments than the section holds")
	}
	segs := make([]dataSegment, 0, count)
	for range count {
		if len(p) < 2 || p[0] != 0 || p[1] != 0x41 {
			return nil, errors.New("a data segment that is not active at an i32.const offset")
		}
		off, n := readSLEB(p[2:])
		if n <= 0 || off < 0 || off >= 1<<32 || len(p) < 2+n+1 || p[2+n] != 0x0b {
			return nil, errors.New("a data segment with an unreadable offset")
		}
		p = p[2+n+1:]
		l, m := binary.Uvarint(p)
		if m <= 0 || uint64(len(p)-m) < l {
			return nil, errors.New("a data segment runs past its section")
		}
		if uint64(off)+l > maxImage {
			return nil, errors.New("a data segment beyond the first 64 MiB of memory")
		}
		segs = append(segs, dataSegment{uint32(off), p[m : m+int(l)]})
		p = p[m+int(l):]
	}
	if len(p) != 0 {
		return nil, errors.New("bytes after the last data segment")
	}
	return segs, nil
}

// readSLEB reads a signed LEB128 number (the i32.const operand) and the
// bytes it took, or n = 0 when it is cut short or longer than 64 bits.
func readSLEB(b []byte) (v int64, n int) {
	var shift uint
	for i, c := range b {
		if i == 10 {
			return 0, 0
		}
		v |= int64(c&0x7f) << shift
		shift += 7
		if c < 0x80 {
			if shift < 64 && c&0x40 != 0 {
				v |= -1 << shift
			}
			return v, i + 1
		}
	}
	return 0, 0
}

// memoryImage lays the segments out as the instance's memory starts.
func memoryImage(segs []dataSegment) []byte {
	var end uint32
	for _, g := range segs {
		end = max(end, g.off+uint32(len(g.data)))
	}
	img := make([]byte, end)
	for _, g := range segs {
		copy(img[g.off:], g.data)
	}
	return img
}

// findLayout finds the runtime's pcHeader by its magic and the
// moduledata that points at it (runtime/symtab.go: pcHeader's fields,
// then moduledata's first fields, pcHeader through maxpc, then text).
func findLayout(img []byte) (goLayout, error) {
	u64 := func(at uint64) uint64 {
		if at+8 > uint64(len(img)) {
			return 0
		}
		return binary.LittleEndian.Uint64(img[at:])
	}
	var hdr uint64
	found := 0
	for at := uint64(0); at+72 <= uint64(len(img)); at += 8 {
		if binary.LittleEndian.Uint32(img[at:]) == pcHeaderMagic && img[at+4] == 0 && img[at+5] == 0 && img[at+6] == 1 && img[at+7] == 8 {
			hdr, found = at, found+1
		}
	}
	if found != 1 {
		return goLayout{}, errors.New("no single Go 1.20+ pcHeader in the data")
	}
	nfunc, pcln := u64(hdr+8), u64(hdr+64)
	for at := uint64(0); at+192 <= uint64(len(img)); at += 8 {
		if u64(at) != hdr || u64(at+8) != hdr+u64(hdr+32) || u64(at+104) != hdr+pcln || u64(at+128) != hdr+pcln || u64(at+136) != nfunc+1 {
			continue
		}
		if u64(at+160) >= 1<<32 || u64(at+168) >= 1<<32 || u64(at+168) <= u64(at+160) || u64(at+176) >= 1<<32 {
			return goLayout{}, errors.New("code addresses beyond 32 bits")
		}
		l := goLayout{ftab: uint32(hdr + pcln), nfunc: uint32(nfunc), table: uint32(u64(at + 152)),
			minpc: uint32(u64(at + 160)), maxpc: uint32(u64(at + 168)), text: uint32(u64(at + 176))}
		nsub := (l.maxpc - l.minpc + subBucketSize - 1) / subBucketSize
		nb := (l.maxpc - l.minpc + bucketSize - 1) / bucketSize
		l.size = 4*nb + nsub
		if uint64(l.table)+uint64(l.size) > uint64(len(img)) || uint64(l.ftab)+8*uint64(l.nfunc+1) > uint64(len(img)) {
			return goLayout{}, errors.New("the tables lie beyond the data")
		}
		return l, nil
	}
	return goLayout{}, errors.New("no moduledata points at the pcHeader")
}

// buildFindFuncTable builds the table from the ftab as the linker does:
// each subbucket holds the lowest index of a function whose code
// addresses reach it, each bucket that of its first subbucket and each
// subbucket its difference from it. On WebAssembly a function's first
// code address is its ftab entry shifted left by 16, plus the text base;
// the last function runs to maxpc. findfunc.js computes the same table
// for functions that each begin a bucket, as on WebAssembly, which this
// function requires (TestFindFuncTableRebuilt).
func buildFindFuncTable(l goLayout, img []byte) ([]byte, error) {
	const none = int64(1) << 40
	lo, hi := uint64(l.minpc), uint64(l.maxpc)
	nsub := (hi - lo + subBucketSize - 1) / subBucketSize
	idx := make([]int64, nsub)
	for i := range idx {
		idx[i] = none
	}
	entry := func(k uint32) uint64 {
		return uint64(binary.LittleEndian.Uint32(img[l.ftab+8*k:]))<<16 + uint64(l.text)
	}
	for k := uint32(0); k < l.nfunc; k++ {
		p, q := entry(k), hi
		if k+1 < l.nfunc {
			q = entry(k + 1)
		}
		if p < lo || q > hi || q <= p {
			return nil, errors.New("the ftab's functions are not in order within minpc and maxpc")
		}
		if (p-lo)%bucketSize != 0 {
			// findfunc.js writes only the buckets functions begin.
			return nil, errors.New("a function that does not begin a bucket")
		}
		for ; p < q; p += subBucketSize {
			idx[(p-lo)/subBucketSize] = min(idx[(p-lo)/subBucketSize], int64(k))
		}
		idx[(q-1-lo)/subBucketSize] = min(idx[(q-1-lo)/subBucketSize], int64(k))
	}
	out := make([]byte, l.size)
	for b := uint64(0); b*subBuckets < nsub; b++ {
		base := idx[b*subBuckets]
		if base == none {
			return nil, errors.New("a hole in the table")
		}
		binary.LittleEndian.PutUint32(out[b*(4+subBuckets):], uint32(base))
		for j := uint64(0); j < subBuckets && b*subBuckets+j < nsub; j++ {
			d := idx[b*subBuckets+j] - base
			if d < 0 || d >= 256 {
				return nil, errors.New("a subbucket out of its bucket's range")
			}
			out[b*(4+subBuckets)+4+j] = byte(d)
		}
	}
	return out, nil
}

// segmentsOf cuts a memory image into active segments, leaving out runs
// of zeros long enough that a new segment's header costs less.
func segmentsOf(img []byte) []dataSegment {
	const gap = 16
	var segs []dataSegment
	for i := 0; i < len(img); {
		if img[i] == 0 {
			i++
			continue
		}
		j, zeros := i, 0
		for j < len(img) && zeros < gap {
			if img[j] == 0 {
				zeros++
			} else {
				zeros = 0
			}
			j++
		}
		segs = append(segs, dataSegment{uint32(i), img[i : j-zeros]})
		i = j
	}
	return segs
}

func appendData(b []byte, segs []dataSegment) []byte {
	b = binary.AppendUvarint(b, uint64(len(segs)))
	for _, g := range segs {
		b = append(b, 0, 0x41)
		b = appendSLEB(b, int64(g.off))
		b = append(b, 0x0b)
		b = binary.AppendUvarint(b, uint64(len(g.data)))
		b = append(b, g.data...)
	}
	return b
}

func appendSLEB(b []byte, v int64) []byte {
	for {
		c := byte(v & 0x7f)
		v >>= 7
		if (v == 0 && c&0x40 == 0) || (v == -1 && c&0x40 != 0) {
			return append(b, c)
		}
		b = append(b, c|0x80)
	}
}

func appendSection(b []byte, id byte, body []byte) []byte {
	b = append(b, id)
	b = binary.AppendUvarint(b, uint64(len(body)))
	return append(b, body...)
}

// stripFindFuncTab rewrites the module at path without the table's bytes
// and with FindFuncSection. It returns why it left the module as it was,
// or "" when it took the table out.
func stripFindFuncTab(path string) (string, error) {
	mod, err := os.ReadFile(path)
	if err != nil {
		return "", err
	}
	out, why := withoutFindFuncTab(mod)
	if why != "" {
		return why, nil
	}
	return "", os.WriteFile(path, out, 0o644)
}

func withoutFindFuncTab(mod []byte) ([]byte, string) {
	secs, err := wasmmod.Sections(mod)
	if err != nil {
		return nil, err.Error()
	}
	if _, ok := wasmmod.Custom(secs, FindFuncSection); ok {
		return nil, "the table was taken out already"
	}
	data := -1
	for i, s := range secs {
		if s.ID == 11 {
			data = i
		}
	}
	if data < 0 {
		return nil, "no data section"
	}
	segs, err := readData(secs[data].Body)
	if err != nil {
		return nil, err.Error()
	}
	img := memoryImage(segs)
	l, err := findLayout(img)
	if err != nil {
		return nil, err.Error()
	}
	table, err := buildFindFuncTable(l, img)
	if err != nil {
		return nil, err.Error()
	}
	if !bytes.Equal(table, img[l.table:l.table+l.size]) {
		return nil, "the table built from the ftab is not the linker's"
	}
	if l.table%4 != 0 || l.ftab%4 != 0 {
		return nil, "the tables are not aligned for findfunc.js's 32-bit view"
	}
	clear(img[l.table : l.table+l.size])
	segs = segmentsOf(img)
	out := []byte(wasmmod.Magic)
	for i, s := range secs {
		switch {
		case i == data:
			out = appendSection(out, 11, appendData(nil, segs))
		case s.ID == 12: // the data count (bulk memory)
			out = appendSection(out, 12, binary.AppendUvarint(nil, uint64(len(segs))))
		default:
			out = appendSection(out, s.ID, s.Body)
		}
	}
	name := append([]byte{byte(len(FindFuncSection))}, FindFuncSection...)
	return appendSection(out, 0, append(name, l.section()...)), ""
}
