package main

import (
	"bytes"
	"encoding/json"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"

	"fogbench/calc"
)

// Ctrl-C stops `fogbench eval` in the middle of a long evaluation: it exits
// 130 with one line saying the calculation was cancelled, and no JSON. The
// file holds four 2000-class transient cases (seconds of work on the
// development machine); the signal comes after 700 ms and the bound on the
// exit is generous.
func TestEvalStopsOnSIGINT(t *testing.T) {
	bin := fogbenchBinary(t)
	tinj := 300.0
	c := calc.Case{Format: calc.CaseFormat, Name: "large transient (invented)", Fluid: "n-decane",
		InjectionTemperatureK: &tinj, Heating: "transient",
		Gas:          calc.Gas{ID: "air", PressurePa: 300000, TemperatureK: 600, RelativeVelocityMS: 5},
		Distribution: calc.Distribution{Model: "rosin-rammler", XM: 3e-5, Q: 3, Bins: calc.MaxBins}}
	data, err := json.Marshal([]calc.Case{c, c, c, c})
	if err != nil {
		t.Fatal(err)
	}
	file := filepath.Join(t.TempDir(), "large.json")
	if err := os.WriteFile(file, data, 0o644); err != nil {
		t.Fatal(err)
	}
	cmd := exec.Command(bin, "eval", file)
	var stdout, stderr bytes.Buffer
	cmd.Stdout, cmd.Stderr = &stdout, &stderr
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	done := make(chan error, 1)
	go func() { done <- cmd.Wait() }()
	time.Sleep(700 * time.Millisecond)
	sent := time.Now()
	if err := cmd.Process.Signal(syscall.SIGINT); err != nil {
		t.Fatal(err)
	}
	select {
	case <-done:
	case <-time.After(10 * time.Second):
		cmd.Process.Kill()
		t.Fatal("fogbench eval still running 10 s after SIGINT")
	}
	t.Logf("exited %v after SIGINT", time.Since(sent))
	if code := cmd.ProcessState.ExitCode(); code != 130 {
		t.Errorf("exit code %d, want 130; stderr %q", code, stderr.String())
	}
	if msg := stderr.String(); !strings.Contains(msg, "cancelled") || strings.Count(msg, "\n") != 1 {
		t.Errorf("stderr %q: want one line saying the calculation was cancelled", msg)
	}
	if stdout.Len() != 0 {
		t.Errorf("a cancelled run wrote %d bytes of output", stdout.Len())
	}
}
