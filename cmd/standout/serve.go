package main

import (
	"errors"
	"fmt"
	"net"
	"net/http"
	"net/url"
	"os"
	"path/filepath"
	"strconv"
	"strings"
)

// localPages serves local pages to the headless browser from loopback,
// each from its own folder, instead of opening them as file: URLs. A
// page opened as a file: URL may load any other local file (an <iframe>
// of a system file, which a screenshot then shows); a page served over
// HTTP can load only what its folder holds, and the browser refuses its
// file: subresources. Each folder is opened with os.Root, so neither ".."
// nor a symbolic link leads out of it.
type localPages struct {
	srv   *http.Server
	base  string
	dirs  map[string]int
	roots []*os.Root
}

func newLocalPages() (*localPages, error) {
	l, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		return nil, fmt.Errorf("serving local pages: %w", err)
	}
	lp := &localPages{base: "http://" + l.Addr().String(), dirs: map[string]int{}}
	lp.srv = &http.Server{Handler: http.HandlerFunc(lp.serve)}
	go lp.srv.Serve(l)
	return lp, nil
}

// serve answers /K/path from the K-th folder.
func (lp *localPages) serve(w http.ResponseWriter, r *http.Request) {
	k, rest, _ := strings.Cut(strings.TrimPrefix(r.URL.Path, "/"), "/")
	i, err := strconv.Atoi(k)
	if err != nil || i < 0 || i >= len(lp.roots) {
		http.NotFound(w, r)
		return
	}
	r2 := r.Clone(r.Context())
	r2.URL.Path = "/" + rest
	http.FileServerFS(lp.roots[i].FS()).ServeHTTP(w, r2)
}

// url returns where the browser finds a local page: a file path or a
// file: URL.
func (lp *localPages) url(arg string) (string, error) {
	p := arg
	if u, err := url.Parse(arg); err == nil && u.Scheme == "file" {
		p = u.Path
	}
	abs, err := filepath.Abs(p)
	if err != nil {
		return "", err
	}
	st, err := os.Stat(abs)
	if err != nil {
		return "", err
	}
	if st.IsDir() {
		return "", errors.New("is a folder, not a page")
	}
	dir := filepath.Dir(abs)
	i, ok := lp.dirs[dir]
	if !ok {
		root, err := os.OpenRoot(dir)
		if err != nil {
			return "", err
		}
		i = len(lp.roots)
		lp.roots = append(lp.roots, root)
		lp.dirs[dir] = i
	}
	return lp.base + "/" + strconv.Itoa(i) + "/" + (&url.URL{Path: filepath.Base(abs)}).EscapedPath(), nil
}

func (lp *localPages) Close() {
	lp.srv.Close()
	for _, r := range lp.roots {
		r.Close()
	}
}

// webURL says whether an argument is a URL the browser loads as it is
// (http, https, data, about), rather than a local page.
func webURL(a string) bool {
	u, err := url.Parse(a)
	if err != nil || len(u.Scheme) < 2 { // "C:" is a Windows drive
		return false
	}
	switch strings.ToLower(u.Scheme) {
	case "http", "https", "data", "about":
		return true
	}
	return false
}
