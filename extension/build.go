package extension

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
)

// Build writes a ready-to-load extension into dir: the embedded files, the
// Go core built for WebAssembly (GOOS=js GOARCH=wasm; Cores) and the wasm_exec.js
// of the very toolchain that built it, never a hand-kept copy. It needs
// the go tool and the Standout source, found from the working directory up.
func Build(dir string, firefox bool) error {
	root, err := moduleRoot()
	if err != nil {
		return err
	}
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return err
	}
	err = fs.WalkDir(Files, ".", func(p string, d fs.DirEntry, err error) error {
		if err != nil || d.IsDir() {
			return err
		}
		b, err := Files.ReadFile(p)
		if err != nil {
			return err
		}
		name := p
		switch p {
		case "manifest.json":
			if firefox {
				return nil
			}
		case "manifest.firefox.json":
			if !firefox {
				return nil
			}
			name = "manifest.json"
		}
		out := filepath.Join(dir, filepath.FromSlash(name))
		if err := os.MkdirAll(filepath.Dir(out), 0o755); err != nil {
			return err
		}
		return os.WriteFile(out, b, 0o644)
	})
	if err != nil {
		return err
	}
	if err := writeTrainingPages(dir); err != nil {
		return err
	}
	// Two cores: what every press loads, and what an export loads.
	for _, c := range Cores {
		out := filepath.Join(dir, c.File)
		if err := buildCore(root, out, c.Args...); err != nil {
			return err
		}
		if c.Shrink {
			if err := shrink(out); err != nil {
				return err
			}
			// A module the strip does not understand ships whole, and
			// TestShippedCoreSize says so.
			if _, err := stripFindFuncTab(out); err != nil {
				return err
			}
		}
	}
	goroot, err := exec.Command("go", "env", "GOROOT").Output()
	if err != nil {
		return fmt.Errorf("finding the Go toolchain: %w", err)
	}
	gr := strings.TrimSpace(string(goroot))
	for _, p := range []string{filepath.Join(gr, "lib", "wasm", "wasm_exec.js"), filepath.Join(gr, "misc", "wasm", "wasm_exec.js")} {
		if b, err := os.ReadFile(p); err == nil {
			return os.WriteFile(filepath.Join(dir, "wasm_exec.js"), b, 0o644)
		}
	}
	return errors.New("wasm_exec.js not found in the Go toolchain at " + gr)
}

// Core is one WebAssembly build of ./wasm the extension carries.
type Core struct {
	File string
	// Args are the go build arguments that make it.
	Args []string
	// Shrink runs wasm-opt over it where the machine has it (shrink)
	// and takes out the runtime's findfunctab (findfunc.go).
	Shrink bool
}

// Cores are the extension's two builds of the core. The overlay core
// answers a press: the overlay's digest and the saliency of charts drawn
// as pixels; it leaves out the report's formats, and with them fmt and
// reflect, so a press downloads and compiles less. The report core is the
// whole core, registered as standoutReport; the background loads it for
// an export only. -s drops a module's name section (about 75 KB): the
// engine then names the core's functions by index in its own traces,
// while Go's stack traces, which the core's error answers carry, read
// Go's own tables and keep their names.
var Cores = []Core{
	{"standout.wasm", []string{"-tags=overlaycore", "-ldflags=-s"}, true},
	{"standout-report.wasm", []string{"-ldflags=-s -X main.handleGlobal=standoutReport"}, false},
}

// buildCore builds ./wasm for WebAssembly into out.
func buildCore(root, out string, args ...string) error {
	abs, err := filepath.Abs(out)
	if err != nil {
		return err
	}
	cmd := exec.Command("go", append(append([]string{"build", "-trimpath"}, args...), "-o", abs, "./wasm")...)
	cmd.Dir = root
	cmd.Env = append(os.Environ(), "GOOS=js", "GOARCH=wasm")
	if out, err := cmd.CombinedOutput(); err != nil {
		return fmt.Errorf("building the WebAssembly core %s: %v\n%s", filepath.Base(abs), err, out)
	}
	return nil
}

// WasmOpt is binaryen's optimiser (Debian's binaryen package), or "" when
// the machine has none: the overlay core is then shipped as Go built it.
func WasmOpt() string {
	p, err := exec.LookPath("wasm-opt")
	if err != nil {
		return ""
	}
	return p
}

// shrink runs wasm-opt -Oz over a core in place, when the machine has it.
// It takes about 7% off the code and leaves the data as the linker wrote
// it. Go's WebAssembly keeps its own stack in linear memory and knows a
// function by its index in the table, which the optimiser keeps, so what
// it does to the code is invisible to Go's runtime; the features enabled
// are the ones Go's output already uses. The Node test of the shipped
// core (TestShippedCoreAnswersAsBuilt) holds the result to the golden
// digests.
func shrink(path string) error {
	opt := WasmOpt()
	if opt == "" {
		return nil
	}
	tmp := path + ".opt"
	cmd := exec.Command(opt, "-Oz", "--enable-bulk-memory", "--enable-sign-ext", "--enable-nontrapping-float-to-int", "--enable-mutable-globals", path, "-o", tmp)
	if out, err := cmd.CombinedOutput(); err != nil {
		os.Remove(tmp)
		return fmt.Errorf("wasm-opt on %s: %v\n%s", filepath.Base(path), err, out)
	}
	return os.Rename(tmp, path)
}

// moduleRoot finds the Standout module from the working directory up.
func moduleRoot() (string, error) {
	d, err := os.Getwd()
	if err != nil {
		return "", err
	}
	for {
		b, err := os.ReadFile(filepath.Join(d, "go.mod"))
		if err == nil && strings.HasPrefix(strings.TrimSpace(string(b)), "module standout") {
			return d, nil
		}
		parent := filepath.Dir(d)
		if parent == d {
			return "", errors.New("run this from the Standout repository: it builds the WebAssembly core from source")
		}
		d = parent
	}
}
