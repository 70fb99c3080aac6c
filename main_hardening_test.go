package main

import (
	"bytes"
	"crypto/ecdsa"
	"crypto/elliptic"
	"crypto/rand"
	"crypto/tls"
	"crypto/x509"
	"crypto/x509/pkix"
	"encoding/pem"
	"io"
	"math/big"
	"net"
	"net/http"
	"net/url"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"

	"fogbench/calc"
)

// Without credentials, fogbench refuses every address that other machines
// could reach, before it touches the library file.
func TestServeRefusesEveryNonLoopbackAddress(t *testing.T) {
	for _, addr := range []string{"0.0.0.0:0", ":0", "[::]:0", "192.0.2.10:8080", "example.invalid:8080", "[2001:db8::1]:80"} {
		db := filepath.Join(t.TempDir(), "never.db")
		var out bytes.Buffer
		if code := run([]string{"serve", "-addr", addr, "-db", db}, nil, &out, &out); code != 2 {
			t.Errorf("-addr %s: exit %d, want 2: %s", addr, code, out.String())
			continue
		}
		if !strings.Contains(out.String(), "loopback") {
			t.Errorf("-addr %s: message %q does not say why", addr, out.String())
		}
		if _, err := os.Stat(db); err == nil {
			t.Errorf("-addr %s: the library was created although serving was refused", addr)
		}
	}
	for _, addr := range []string{"127.0.0.1:8080", "localhost:8080", "[::1]:8080", "127.0.0.2:1"} {
		if err := checkLoopback(addr); err != nil {
			t.Errorf("loopback %s refused: %v", addr, err)
		}
	}
}

// The HTTP server bounds slow clients, idle connections and headers.
func TestHTTPServerTimeouts(t *testing.T) {
	srv := newHTTPServer("127.0.0.1:0", http.NotFoundHandler())
	for name, d := range map[string]time.Duration{"ReadHeaderTimeout": srv.ReadHeaderTimeout, "ReadTimeout": srv.ReadTimeout,
		"WriteTimeout": srv.WriteTimeout, "IdleTimeout": srv.IdleTimeout} {
		if d <= 0 || d > 2*time.Minute {
			t.Errorf("%s = %v: want a bound of at most two minutes", name, d)
		}
	}
	if srv.ReadHeaderTimeout > 15*time.Second {
		t.Errorf("ReadHeaderTimeout %v lets a client trickle headers too long", srv.ReadHeaderTimeout)
	}
	if srv.MaxHeaderBytes <= 0 || srv.MaxHeaderBytes > 1<<20 {
		t.Errorf("MaxHeaderBytes = %d", srv.MaxHeaderBytes)
	}
}

// -tls-cert and -tls-key go together and must load.
func TestTLSFlagsAreChecked(t *testing.T) {
	dir := t.TempDir()
	certFile, keyFile := writeSelfSigned(t, dir)
	for _, args := range [][]string{
		{"-tls-cert", certFile},
		{"-tls-key", keyFile},
		{"-tls-cert", filepath.Join(dir, "missing.pem"), "-tls-key", keyFile},
		{"-tls-cert", keyFile, "-tls-key", certFile},
	} {
		var out bytes.Buffer
		db := filepath.Join(dir, "never.db")
		if code := run(append([]string{"serve", "-addr", "127.0.0.1:0", "-db", db}, args...), nil, &out, &out); code != 2 {
			t.Errorf("%v: exit %d, want 2: %s", args, code, out.String())
		}
		if !strings.Contains(out.String(), "tls") {
			t.Errorf("%v: message %q does not name the TLS flags", args, out.String())
		}
		if _, err := os.Stat(db); err == nil {
			t.Errorf("%v: library created despite the bad flags", args)
		}
	}
}

// writeSelfSigned makes a certificate for 127.0.0.1 valid for an hour.
func writeSelfSigned(t *testing.T, dir string) (certFile, keyFile string) {
	t.Helper()
	key, err := ecdsa.GenerateKey(elliptic.P256(), rand.Reader)
	if err != nil {
		t.Fatal(err)
	}
	tmpl := &x509.Certificate{
		SerialNumber: big.NewInt(1), Subject: pkix.Name{CommonName: "fogbench test"},
		NotBefore: time.Now().Add(-time.Minute), NotAfter: time.Now().Add(time.Hour),
		IPAddresses: []net.IP{net.ParseIP("127.0.0.1")}, KeyUsage: x509.KeyUsageDigitalSignature,
		ExtKeyUsage: []x509.ExtKeyUsage{x509.ExtKeyUsageServerAuth},
	}
	der, err := x509.CreateCertificate(rand.Reader, tmpl, tmpl, &key.PublicKey, key)
	if err != nil {
		t.Fatal(err)
	}
	kder, err := x509.MarshalECPrivateKey(key)
	if err != nil {
		t.Fatal(err)
	}
	certFile, keyFile = filepath.Join(dir, "cert.pem"), filepath.Join(dir, "key.pem")
	if err := os.WriteFile(certFile, pem.EncodeToMemory(&pem.Block{Type: "CERTIFICATE", Bytes: der}), 0o600); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(keyFile, pem.EncodeToMemory(&pem.Block{Type: "EC PRIVATE KEY", Bytes: kder}), 0o600); err != nil {
		t.Fatal(err)
	}
	return certFile, keyFile
}

// With a certificate the real binary serves HTTPS only, and its cookies
// are Secure.
func TestServeOverTLS(t *testing.T) {
	bin := fogbenchBinary(t)
	dir := t.TempDir()
	certFile, keyFile := writeSelfSigned(t, dir)
	p := startServe(t, bin, filepath.Join(dir, "tls.db"), "-tls-cert", certFile, "-tls-key", keyFile)
	if !strings.HasPrefix(p.url, "https://") {
		t.Fatalf("serving at %s, want https", p.url)
	}
	pemData, _ := os.ReadFile(certFile)
	pool := x509.NewCertPool()
	pool.AppendCertsFromPEM(pemData)
	hc := &http.Client{
		Transport:     &http.Transport{TLSClientConfig: &tls.Config{RootCAs: pool}},
		CheckRedirect: func(*http.Request, []*http.Request) error { return http.ErrUseLastResponse },
		Timeout:       10 * time.Second,
	}
	resp, err := hc.Get(p.url + "/cases")
	if err != nil {
		t.Fatal(err)
	}
	io.Copy(io.Discard, resp.Body)
	resp.Body.Close()
	if resp.StatusCode != http.StatusOK || resp.TLS == nil {
		t.Fatalf("GET over TLS: status %d, TLS %v", resp.StatusCode, resp.TLS != nil)
	}
	resp, err = hc.PostForm(p.url+"/settings/units", url.Values{"system": {"us"}, "back": {"/cases"}})
	if err != nil {
		t.Fatal(err)
	}
	resp.Body.Close()
	cookies := resp.Cookies()
	if len(cookies) == 0 {
		t.Fatalf("no cookie set (status %d)", resp.StatusCode)
	}
	for _, c := range cookies {
		if !c.Secure || !c.HttpOnly {
			t.Errorf("cookie %s over TLS: Secure %v, HttpOnly %v", c.Name, c.Secure, c.HttpOnly)
		}
	}
	// Plain HTTP to the TLS port gets no page.
	resp, err = http.Get("http://" + p.addr + "/cases")
	if err == nil {
		resp.Body.Close()
		if resp.StatusCode == http.StatusOK {
			t.Error("plain HTTP served a page on the TLS port")
		}
	}
	p.cmd.Process.Signal(syscall.SIGTERM)
	if code := p.waitExit(t, 20*time.Second); code != 0 {
		t.Errorf("exit %d", code)
	}
}

// The command line refuses hostile case files with exit 2 and one line
// naming the field, and prints no results.
func TestEvalRefusesHostileInput(t *testing.T) {
	one := `{"format":"fogbench-case/1","name":"cli","fluid":"water","liquid_temperature_k":298.15,
  "gas":{"pressure_pa":101325,"temperature_k":310},
  "distribution":{"model":"rosin-rammler","x_m":5e-5,"q":2.5,"bins":4}}`
	for _, c := range []struct{ in, field string }{
		{strings.Replace(one, `"x_m":5e-5`, `"x_m":1e999`, 1), "distribution.x_m"},
		{strings.Replace(one, `"bins":4`, `"bins":99999999`, 1), "distribution.bins"},
		{strings.Replace(one, `"pressure_pa":101325`, `"pressure_pa":-1`, 1), "gas.pressure_pa"},
		{strings.Replace(one, `"temperature_k":310`, `"temperature_k":1e9`, 1), "gas.temperature_k"},
		{strings.Replace(one, `"liquid_temperature_k":298.15`, `"liquid_temperature_k":0`, 1), "liquid_temperature_k"},
		{strings.Replace(one, `"bins":4}`, `"bins":4,"d_max_m":1e300}`, 1), "distribution.d_max_m"},
		{"[" + strings.Repeat(one+",", calc.MaxBatchCases) + one + "]", "file"},
		{"[" + one + strings.Repeat(" ", calc.MaxBatchFileBytes) + "]", "file"},
		{`{"format":"fogbench-case/1","name":NaN}`, "name: is not valid JSON at line 1, column 36"},
	} {
		var out, errb bytes.Buffer
		code := run([]string{"eval", "-"}, strings.NewReader(c.in), &out, &errb)
		if code != 2 || !strings.Contains(errb.String(), c.field) {
			t.Errorf("%s: exit %d, message %q", c.field, code, errb.String())
		}
		if out.Len() != 0 || strings.Count(strings.TrimSpace(errb.String()), "\n") != 0 {
			t.Errorf("%s: printed %q and %q, want one line and no results", c.field, out.String(), errb.String())
		}
	}
}
