// Package wasmmod reads the sections of a WebAssembly module (WebAssembly
// Core Specification 2.0, §5.5): the extension's build rewrites the
// core's data through it, and a test reads the core's function names.
package wasmmod

import (
	"bytes"
	"encoding/binary"
	"errors"
)

// Magic is the module preamble: "\0asm" and version 1.
const Magic = "\x00asm\x01\x00\x00\x00"

// Section is one section of a module, its body as it is.
type Section struct {
	ID   byte
	Body []byte
}

// Sections splits a module into its sections.
func Sections(mod []byte) ([]Section, error) {
	if len(mod) < 8 || !bytes.Equal(mod[:8], []byte(Magic)) {
		return nil, errors.New("not a WebAssembly 1.0 module")
	}
	var out []Section
	for i := 8; i < len(mod); {
		id := mod[i]
		size, n := binary.Uvarint(mod[i+1:])
		if n <= 0 || uint64(len(mod)-i-1-n) < size {
			return nil, errors.New("a section runs past the module")
		}
		out = append(out, Section{id, mod[i+1+n : i+1+n+int(size)]})
		i += 1 + n + int(size)
	}
	return out, nil
}

// Custom returns the body of the first custom section called name, after
// its name, and whether the module has one. Names are shorter than 128
// bytes, so their length is one byte.
func Custom(secs []Section, name string) ([]byte, bool) {
	prefix := append([]byte{byte(len(name))}, name...)
	for _, s := range secs {
		if s.ID == 0 && bytes.HasPrefix(s.Body, prefix) {
			return s.Body[len(prefix):], true
		}
	}
	return nil, false
}

// FunctionNames reads the function names of the "name" custom section
// (§7.4.1), in the order the section lists them.
func FunctionNames(mod []byte) ([]string, error) {
	secs, err := Sections(mod)
	if err != nil {
		return nil, err
	}
	body, ok := Custom(secs, "name")
	if !ok {
		return nil, errors.New("no name section")
	}
	var out []string
	for s := body; len(s) > 0; {
		sub := s[0]
		sz, n := binary.Uvarint(s[1:])
		if n <= 0 || uint64(len(s)-1-n) < sz {
			return nil, errors.New("a name subsection runs past its section")
		}
		data := s[1+n : 1+n+int(sz)]
		s = s[1+n+int(sz):]
		if sub != 1 {
			continue
		}
		count, n := binary.Uvarint(data)
		data = data[n:]
		for range count {
			_, n := binary.Uvarint(data) // the function's index
			data = data[n:]
			l, m := binary.Uvarint(data)
			if n <= 0 || m <= 0 || uint64(len(data)-m) < l {
				return nil, errors.New("a function name runs past its subsection")
			}
			out = append(out, string(data[m:m+int(l)]))
			data = data[m+int(l):]
		}
	}
	return out, nil
}
