// Command serve serves the build output on the local machine only, for looking at the page over
// http:// as well as from file://.
//
//	go run ./site/serve -dir dist
//
// It listens on 127.0.0.1 at the first free port from 8080 (or -port), prints the URL and the
// absolute path of the offline page (which works on its own, without this server), and serves
// .wasm files as application/wasm so WebAssembly.instantiateStreaming accepts them.
package main

import (
	"errors"
	"flag"
	"fmt"
	"net"
	"net/http"
	"os"
	"path/filepath"
	"strings"
	"syscall"
)

// portTries is how many consecutive ports serve tries before giving up.
const portTries = 100

func main() {
	dir := flag.String("dir", "dist", "directory to serve")
	port := flag.Int("port", 8080, "first port to try")
	flag.Parse()
	if err := run(*dir, *port); err != nil {
		fmt.Fprintln(os.Stderr, "site/serve:", err)
		os.Exit(1)
	}
}

func run(dir string, port int) error {
	abs, err := filepath.Abs(dir)
	if err != nil {
		return err
	}
	if fi, err := os.Stat(abs); err != nil || !fi.IsDir() {
		return fmt.Errorf("%s is not a directory; run `make site` first", abs)
	}
	ln, err := listen(port)
	if err != nil {
		return err
	}
	page := filepath.Join(abs, "copoly.html")
	fmt.Printf("serving %s\n  http://%s/copoly.html\n", abs, ln.Addr())
	if _, err := os.Stat(page); err == nil {
		fmt.Printf("offline page (opens without this server):\n  %s\n", page)
	} else {
		fmt.Printf("no %s yet; run `make site`\n", page)
	}
	return http.Serve(ln, handler(abs))
}

// listen opens the first free port on the loopback interface from first on.
func listen(first int) (net.Listener, error) {
	for p := first; p < first+portTries && p <= 65535; p++ {
		ln, err := net.Listen("tcp", fmt.Sprintf("127.0.0.1:%d", p))
		if err == nil {
			return ln, nil
		}
		if !errors.Is(err, syscall.EADDRINUSE) {
			return nil, err
		}
	}
	return nil, fmt.Errorf("no free port in %d..%d on 127.0.0.1", first, first+portTries-1)
}

// handler serves dir with the right type for .wasm and no caching, so a rebuild shows at once.
func handler(dir string) http.Handler {
	files := http.FileServer(http.Dir(dir))
	return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		if strings.HasSuffix(r.URL.Path, ".wasm") {
			w.Header().Set("Content-Type", "application/wasm")
		}
		w.Header().Set("Cache-Control", "no-store")
		files.ServeHTTP(w, r)
	})
}
