// Package browser starts a headless Chromium for Standout: for the
// extension's end-to-end tests and for the command line's browser mode.
// It builds its own flag list: chromedp's defaults disable extensions.
package browser

import (
	"context"
	"errors"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"time"

	"github.com/chromedp/chromedp"
)

// knownPaths are where Chromium is looked for, in order. Debian's
// /usr/bin/chromium is a wrapper that adds flags of its own; the binary
// behind it comes first.
var knownPaths = []string{
	"/usr/lib/chromium/chromium",
	"/usr/bin/chromium",
	"/usr/bin/chromium-browser",
	"/usr/bin/google-chrome",
	"/opt/google/chrome/chrome",
}

// ErrNoBrowser says that no Chromium was found, and how to get one.
var ErrNoBrowser = errors.New("no Chromium found: install it (Debian: apt-get install chromium), or give its path with --chromium or the STANDOUT_CHROMIUM environment variable")

// Find returns the Chromium binary: explicit if given, else
// $STANDOUT_CHROMIUM, else the first of the known paths, else chromium on
// the PATH.
func Find(explicit string) (string, error) {
	for _, p := range []string{explicit, os.Getenv("STANDOUT_CHROMIUM")} {
		if p == "" {
			continue
		}
		if _, err := os.Stat(p); err != nil {
			return "", fmt.Errorf("browser %s: %w", p, err)
		}
		return p, nil
	}
	for _, p := range knownPaths {
		if _, err := os.Stat(p); err == nil {
			return p, nil
		}
	}
	for _, name := range []string{"chromium", "chromium-browser", "google-chrome"} {
		if p, err := exec.LookPath(name); err == nil {
			return p, nil
		}
	}
	return "", ErrNoBrowser
}

// Options configure a browser.
type Options struct {
	// Exec is the binary (see Find).
	Exec string
	// Extension is an unpacked extension folder to load, or "".
	Extension string
	// UserDataDir is a fresh profile folder.
	UserDataDir string
	// NoSandbox starts Chromium without its sandbox, which it refuses to
	// use when run as root (see SandboxNote).
	NoSandbox bool
}

// SandboxNote says why Chromium cannot use its sandbox on this machine,
// or "" when it can be tried. Chromium refuses to start as root with its
// sandbox on (common in containers and CI).
func SandboxNote() string {
	if os.Geteuid() == 0 {
		return "Chromium runs without its sandbox: this process runs as root, where Chromium refuses the sandbox; run as an ordinary user to keep it"
	}
	return ""
}

// NewAllocator returns a chromedp allocator context for a headless
// Chromium with the flags this project needs and no GPU. Call the cancel
// func to stop the browser.
func NewAllocator(parent context.Context, o Options) (context.Context, context.CancelFunc) {
	opts := []chromedp.ExecAllocatorOption{
		chromedp.ExecPath(o.Exec),
		chromedp.NoFirstRun,
		chromedp.NoDefaultBrowserCheck,
		chromedp.Flag("headless", "new"),
		chromedp.Flag("disable-gpu", true),
		chromedp.Flag("disable-quic", true),
		chromedp.Flag("disable-background-networking", true),
		chromedp.Flag("disable-component-update", true),
		chromedp.Flag("disable-sync", true),
		chromedp.Flag("disable-dev-shm-usage", true),
		chromedp.Flag("disable-features", "Translate,MediaRouter,OptimizationHints"),
		chromedp.Flag("force-color-profile", "srgb"),
		chromedp.Flag("hide-scrollbars", true),
		chromedp.Flag("mute-audio", true),
		chromedp.WindowSize(1280, 900),
	}
	if o.NoSandbox {
		opts = append(opts, chromedp.Flag("no-sandbox", true))
	}
	if o.UserDataDir != "" {
		opts = append(opts, chromedp.UserDataDir(o.UserDataDir))
	}
	if o.Extension != "" {
		opts = append(opts,
			chromedp.Flag("load-extension", o.Extension),
			chromedp.Flag("disable-extensions-except", o.Extension),
			chromedp.Flag("enable-unsafe-extension-debugging", true),
		)
	}
	return chromedp.NewExecAllocator(parent, opts...)
}

// lockFolder is the folder Chromium made in TMPDIR for a profile's lock
// (the profile's SingletonSocket links into it), or "" when there is
// none. A browser that is killed, as cancelling the allocator does,
// leaves it there.
func lockFolder(profile string) string {
	lock, err := os.Readlink(filepath.Join(profile, "SingletonSocket"))
	if err != nil || filepath.Base(lock) != "SingletonSocket" {
		return ""
	}
	// Only a folder of its own, in the TMPDIR the browser had from us.
	d := filepath.Dir(lock)
	if filepath.Dir(d) != filepath.Clean(os.TempDir()) {
		return ""
	}
	return d
}

// RemoveLockFolder removes the lock folder a stopped browser left in
// TMPDIR for profile, keeping the profile itself for a browser started
// again.
func RemoveLockFolder(profile string) {
	if d := lockFolder(profile); d != "" {
		os.RemoveAll(d)
	}
}

// RemoveProfile removes a profile folder once its browser was stopped,
// with its lock folder. Chromium's helper processes can outlive the main
// process by a moment and write into the profile meanwhile, and
// os.RemoveAll then fails ("directory not empty"): the removal is tried
// again every 25 ms for up to five seconds, and the last error returned.
func RemoveProfile(dir string) error {
	RemoveLockFolder(dir)
	deadline := time.Now().Add(5 * time.Second)
	for {
		err := os.RemoveAll(dir)
		if err == nil || time.Now().After(deadline) {
			return err
		}
		time.Sleep(25 * time.Millisecond)
	}
}
