package main

import (
	"bytes"
	"io"
	"net/http"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// A token under 128 bits (server.TokenBits) is refused at start, before
// the library is opened, with a message that does not print the token.
// Issue 17: aaaaaaaaaaaaaaaa was accepted.
func TestServeRefusesAWeakToken(t *testing.T) {
	weak := []string{"aaaaaaaaaaaaaaaa", "abababababababababababababababab", "0123456789abcdef0123456789abcde"}
	for _, tok := range weak {
		// Checked first: serve with an accepted token would not return.
		if _, err := loadToken("", tok); err == nil {
			t.Fatalf("token %q accepted", tok)
		}
	}
	for _, tok := range weak {
		t.Setenv("FOGBENCH_TOKEN", tok)
		db := filepath.Join(t.TempDir(), "never.db")
		var out bytes.Buffer
		if code := run([]string{"serve", "-addr", "127.0.0.1:0", "-db", db}, nil, &out, &out); code != 2 {
			t.Errorf("token %q: exit %d, want 2: %s", tok, code, out.String())
			continue
		}
		if msg := out.String(); !strings.Contains(msg, "too weak") || !strings.Contains(msg, "128") || strings.Contains(msg, tok) {
			t.Errorf("token %q: message %q", tok, msg)
		}
		if _, err := os.Stat(db); err == nil {
			t.Errorf("token %q: the library was created", tok)
		}
	}
	// The same from a token file.
	file := filepath.Join(t.TempDir(), "token")
	os.WriteFile(file, []byte("aaaaaaaaaaaaaaaa\n"), 0o600)
	if _, err := loadToken(file, ""); err == nil {
		t.Error("a weak token file was accepted")
	}
	if tok, err := loadToken("", "kP3v9+QzR1xW7mL0aT4yN8cB2sD6fH5j\n"); err != nil || tok != "kP3v9+QzR1xW7mL0aT4yN8cB2sD6fH5j" {
		t.Errorf("a strong token: %q, %v", tok, err)
	}
}

func TestAllowHostFlagIsChecked(t *testing.T) {
	db := filepath.Join(t.TempDir(), "never.db")
	var out bytes.Buffer
	if code := run([]string{"serve", "-allow-host", "http://fog.example.org/", "-db", db}, nil, &out, &out); code != 2 {
		t.Errorf("a URL as -allow-host: exit %d, want 2", code)
	}
	var h hostList
	if err := h.Set("fog.example.org, proxy.example:8443"); err != nil || len(h) != 2 {
		t.Errorf("two names: %v %v", h, err)
	}
}

// The running binary answers its loopback names and a name given with
// -allow-host, and refuses any other Host with 421.
func TestServeAllowsOnlyItsHostNames(t *testing.T) {
	bin := fogbenchBinary(t)
	p := startServe(t, bin, filepath.Join(t.TempDir(), "hosts.db"), "-allow-host", "fog.example.org")
	get := func(host string) int {
		req, _ := http.NewRequest("GET", p.url+"/api/cases", nil)
		req.Host = host
		resp, err := (&http.Client{Timeout: 10 * time.Second}).Do(req)
		if err != nil {
			t.Fatal(err)
		}
		io.Copy(io.Discard, resp.Body)
		resp.Body.Close()
		return resp.StatusCode
	}
	_, port, _ := strings.Cut(p.addr, ":")
	for host, want := range map[string]int{
		p.addr: 200, "localhost:" + port: 200, "fog.example.org": 200,
		"rebind.example:" + port: 421, "localhost:1": 421,
	} {
		if got := get(host); got != want {
			t.Errorf("Host %s: %d, want %d", host, got, want)
		}
	}
	p.cmd.Process.Signal(syscall.SIGTERM)
	if code := p.waitExit(t, 20*time.Second); code != 0 {
		t.Errorf("exit %d", code)
	}
}
