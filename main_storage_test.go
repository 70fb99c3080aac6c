package main

import (
	"bufio"
	"context"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// TestServeStartsWithAWriteCheck starts the binary on a library beside
// which a killed restore left its hidden copy: the copy is removed, and one
// line says the library is writable, before the server says it is serving.
func TestServeStartsWithAWriteCheck(t *testing.T) {
	bin := fogbenchBinary(t)
	dir := t.TempDir()
	lib := filepath.Join(dir, "lib.db")
	stale := filepath.Join(dir, ".lib.db.restore-00aa11bb22cc")
	if err := os.WriteFile(stale, make([]byte, 1<<20), 0o644); err != nil {
		t.Fatal(err)
	}
	ctx, cancel := context.WithTimeout(context.Background(), 30*time.Second)
	defer cancel()
	cmd := exec.CommandContext(ctx, bin, "serve", "-db", lib, "-addr", "127.0.0.1:0")
	stderr, err := cmd.StderrPipe()
	if err != nil {
		t.Fatal(err)
	}
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	defer func() { cmd.Process.Kill(); cmd.Wait() }()
	var lines []string
	sc := bufio.NewScanner(stderr)
	for sc.Scan() {
		lines = append(lines, sc.Text())
		if strings.Contains(sc.Text(), "fogbench is serving") {
			break
		}
	}
	log := strings.Join(lines, "\n")
	if !strings.Contains(log, `msg="the library is writable"`) || !strings.Contains(log, "free_on_disk=") {
		t.Errorf("no write-check line at start:\n%s", log)
	}
	if !strings.Contains(log, "interrupted restore") || !strings.Contains(log, stale) {
		t.Errorf("the removed restore copy is not named:\n%s", log)
	}
	if _, err := os.Stat(stale); !os.IsNotExist(err) {
		t.Errorf("the stale restore copy is still there: %v", err)
	}
}

// TestServeNamesAReadOnlyFileSystem starts the binary on a library in a
// folder mounted read-only (a private mount namespace: unshare(1) as root)
// and on a new library there: it stops with exit 1 and a message naming
// the read-only file system, not SQLite's "no such file or directory".
// Skipped where mount namespaces are not available.
func TestServeNamesAReadOnlyFileSystem(t *testing.T) {
	bin := fogbenchBinary(t)
	if err := exec.Command("unshare", "-m", "true").Run(); err != nil {
		t.Skipf("no private mount namespace here (unshare -m: %v)", err)
	}
	dir := t.TempDir()
	existing := filepath.Join(dir, "lib.db")
	// A library made while the folder was writable.
	var out strings.Builder
	ctx, cancel := context.WithTimeout(context.Background(), 20*time.Second)
	defer cancel()
	if b, err := exec.CommandContext(ctx, bin, "backup", "-db", existing, filepath.Join(t.TempDir(), "b.db")).CombinedOutput(); err != nil {
		t.Fatalf("making the library: %v %s", err, b)
	}
	for _, lib := range []string{existing, filepath.Join(dir, "new.db")} {
		script := `mount --bind "$1" "$1" && mount -o remount,bind,ro "$1" && exec "$2" serve -db "$3" -addr 127.0.0.1:0`
		cmd := exec.CommandContext(ctx, "unshare", "-m", "sh", "-c", script, "sh", dir, bin, lib)
		out.Reset()
		cmd.Stdout, cmd.Stderr = &out, &out
		err := cmd.Run()
		code := -1
		if ee, ok := err.(*exec.ExitError); ok {
			code = ee.ExitCode()
		}
		msg := out.String()
		if strings.Contains(msg, "mount:") {
			t.Skipf("cannot mount here: %s", msg)
		}
		if code != 1 || !strings.Contains(msg, "read-only file system") || strings.Contains(msg, "no such file or directory") {
			t.Errorf("%s on a read-only file system: exit %d, %q", filepath.Base(lib), code, msg)
		}
	}
}
