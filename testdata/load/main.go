// Command load drives a real fogbench server on loopback and reports what
// it measured: it builds the binary, seeds a library of invented cases
// through the store, starts `fogbench serve` on 127.0.0.1, and for a
// bounded time lets concurrent clients open case pages, evaluate case
// files through POST /api/evaluate and save new cases through
// POST /api/cases. It prints throughput, p50/p99 latency and errors per
// kind of request, and the server's resident memory before and after
// (from /proc/PID/status). It exits 1 on any 5xx, transport error or
// unexpected status, or when the server's resident peak reaches -max-rss
// MiB (the performance target: under 100 MB), so CI can run a short
// version.
//
//	go run ./testdata/load -duration 20s -workers 8 -cases 1000
package main

import (
	"bufio"
	"bytes"
	"context"
	"encoding/json"
	"flag"
	"fmt"
	"io"
	"math/rand/v2"
	"net/http"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"slices"
	"strings"
	"sync"
	"syscall"
	"time"

	"fogbench/calc"
	"fogbench/store"
)

func main() {
	duration := flag.Duration("duration", 20*time.Second, "how long to drive the server")
	workers := flag.Int("workers", 8, "concurrent clients")
	ncases := flag.Int("cases", 1000, "cases in the seeded library")
	bins := flag.Int("bins", 30, "size classes of each seeded case")
	seed := flag.Uint64("seed", 1, "random seed for the library and the request mix")
	bin := flag.String("bin", "", "fogbench binary to run (default: go build one)")
	maxRSS := flag.Float64("max-rss", 100, "fail when the server's resident peak reaches this many MiB (0: no check)")
	flag.Parse()
	if err := run(*duration, *workers, *ncases, *bins, *seed, *bin, *maxRSS); err != nil {
		fmt.Fprintln(os.Stderr, "load:", err)
		os.Exit(1)
	}
}

// kinds of request, in the order of the report.
var kinds = []string{"GET /cases/{id}", "POST /api/evaluate", "POST /api/cases"}

type sample struct {
	kind   int
	status int // 0: transport error
	dur    time.Duration
}

func run(duration time.Duration, workers, ncases, bins int, seed uint64, bin string, maxRSS float64) error {
	dir, err := os.MkdirTemp("", "fogbench-load-")
	if err != nil {
		return err
	}
	defer os.RemoveAll(dir)
	if bin == "" {
		bin = filepath.Join(dir, "fogbench")
		if out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput(); err != nil {
			return fmt.Errorf("go build: %v\n%s", err, out)
		}
	}
	rng := rand.New(rand.NewPCG(seed, 0x10ad))
	db := filepath.Join(dir, "load.db")
	start := time.Now()
	ids, err := seedLibrary(db, ncases, bins, rng)
	if err != nil {
		return err
	}
	fmt.Printf("seeded %d cases (%d classes each) in %v\n", len(ids), bins, time.Since(start).Round(time.Millisecond))

	srv, base, err := startServer(bin, db)
	if err != nil {
		return err
	}
	defer srv.Process.Kill()
	if !strings.HasPrefix(base, "http://127.0.0.1:") {
		return fmt.Errorf("server at %s is not on loopback", base)
	}
	rssBefore, _ := memory(srv.Process.Pid)

	samples := make(chan sample, 4096)
	var wg sync.WaitGroup
	began := time.Now()
	deadline := began.Add(duration)
	for w := range workers {
		wg.Add(1)
		wrng := rand.New(rand.NewPCG(seed, uint64(w)+1))
		go func() {
			defer wg.Done()
			drive(base, ids, bins, wrng, deadline, samples)
		}()
	}
	go func() { wg.Wait(); close(samples) }()
	var all []sample
	for s := range samples {
		all = append(all, s)
	}
	elapsed := time.Since(began)
	rssAfter, hwm := memory(srv.Process.Pid)

	srv.Process.Signal(syscall.SIGTERM)
	exitErr := srv.Wait()

	failures := report(all, elapsed, workers)
	fmt.Printf("server resident memory: %s before, %s after, peak %s\n", mib(rssBefore), mib(rssAfter), mib(hwm))
	if exitErr != nil {
		return fmt.Errorf("server did not shut down cleanly: %v", exitErr)
	}
	if failures > 0 {
		return fmt.Errorf("%d failed requests (5xx, transport errors or unexpected status)", failures)
	}
	if maxRSS > 0 && float64(hwm) >= maxRSS*(1<<20) {
		return fmt.Errorf("server resident peak %s reached the limit of %.0f MiB", mib(hwm), maxRSS)
	}
	return nil
}

// seedLibrary writes ncases invented cases through the store, as a team's
// library would hold them, and returns their ids.
func seedLibrary(db string, ncases, bins int, rng *rand.Rand) ([]int64, error) {
	ctx := context.Background()
	st, err := store.Open(ctx, db)
	if err != nil {
		return nil, err
	}
	defer st.Close()
	ids := make([]int64, 0, ncases)
	for i := range ncases {
		rec, err := st.CreateCase(ctx, loadCase(fmt.Sprintf("Load rig %04d", i), bins, rng), "load generator")
		if err != nil {
			return nil, err
		}
		ids = append(ids, rec.ID)
	}
	return ids, nil
}

// loadCase is an invented spray: one of four liquids, a Rosin–Rammler or
// log-normal distribution, warm air.
func loadCase(name string, bins int, rng *rand.Rand) calc.Case {
	between := func(lo, hi float64) float64 { return lo + (hi-lo)*rng.Float64() }
	fluid := []string{"water", "water", "ethanol", "n-heptane", "n-decane"}[rng.IntN(5)]
	c := calc.Case{Format: calc.CaseFormat, Name: name, Fluid: fluid,
		Notes: "Invented case written by the load generator.",
		Gas:   calc.Gas{PressurePa: 101325, TemperatureK: between(295, 420)}}
	zero := 0.0
	c.Gas.VaporMoleFraction = &zero
	d := &c.Distribution
	if rng.IntN(2) == 0 {
		d.Model, d.XM, d.Q = "rosin-rammler", between(2e-5, 1.2e-4), between(1.8, 3.5)
	} else {
		d.Model, d.MedianM, d.GSD, d.Basis = "log-normal", between(2e-5, 1e-4), between(1.4, 2.2), "volume"
	}
	d.Bins, d.DMinM, d.DMaxM = bins, 1e-6, 4e-4
	return c
}

func startServer(bin, db string) (*exec.Cmd, string, error) {
	cmd := exec.Command(bin, "serve", "-addr", "127.0.0.1:0", "-db", db)
	stderr, err := cmd.StderrPipe()
	if err != nil {
		return nil, "", err
	}
	if err := cmd.Start(); err != nil {
		return nil, "", err
	}
	serving := regexp.MustCompile(`url=(http://[^/ ]+)/`)
	found := make(chan string, 1)
	go func() {
		sc := bufio.NewScanner(stderr)
		for sc.Scan() {
			if m := serving.FindStringSubmatch(sc.Text()); m != nil {
				select {
				case found <- m[1]:
				default:
				}
			}
			if strings.Contains(sc.Text(), "level=ERROR") {
				fmt.Fprintln(os.Stderr, "server:", sc.Text())
			}
		}
	}()
	select {
	case u := <-found:
		return cmd, u, nil
	case <-time.After(30 * time.Second):
		cmd.Process.Kill()
		return nil, "", fmt.Errorf("server did not start")
	}
}

// drive sends requests until the deadline: half case pages, three in ten
// evaluations, two in ten saves.
func drive(base string, ids []int64, bins int, rng *rand.Rand, deadline time.Time, out chan<- sample) {
	hc := &http.Client{Timeout: 60 * time.Second}
	for n := 0; time.Now().Before(deadline); n++ {
		var req *http.Request
		kind := 0
		switch r := rng.IntN(10); {
		case r < 5:
			req, _ = http.NewRequest(http.MethodGet, fmt.Sprintf("%s/cases/%d", base, ids[rng.IntN(len(ids))]), nil)
		case r < 8:
			kind = 1
			body, _ := json.Marshal(loadCase("evaluate only", bins, rng))
			req, _ = http.NewRequest(http.MethodPost, base+"/api/evaluate", bytes.NewReader(body))
			req.Header.Set("Content-Type", "application/json")
		default:
			kind = 2
			body, _ := json.Marshal(loadCase(fmt.Sprintf("Saved under load %d", rng.Int64()), bins, rng))
			req, _ = http.NewRequest(http.MethodPost, base+"/api/cases", bytes.NewReader(body))
			req.Header.Set("Content-Type", "application/json")
		}
		start := time.Now()
		resp, err := hc.Do(req)
		s := sample{kind: kind}
		if err == nil {
			io.Copy(io.Discard, resp.Body)
			resp.Body.Close()
			s.status = resp.StatusCode
		} else {
			fmt.Fprintln(os.Stderr, "request error:", err)
		}
		s.dur = time.Since(start)
		out <- s
	}
}

// report prints one line per kind of request and returns the failures.
func report(all []sample, elapsed time.Duration, workers int) int {
	want := []int{http.StatusOK, http.StatusOK, http.StatusCreated}
	failures := 0
	fmt.Printf("%d workers for %v\n", workers, elapsed)
	fmt.Printf("%-20s %8s %9s %9s %9s %9s %6s %6s\n", "request", "count", "req/s", "p50", "p99", "max", "5xx", "other")
	total := 0
	for k, name := range kinds {
		var durs []time.Duration
		var fivexx, other int
		for _, s := range all {
			if s.kind != k {
				continue
			}
			durs = append(durs, s.dur)
			switch {
			case s.status >= 500:
				fivexx++
			case s.status != want[k]:
				other++ // transport errors (status 0) and unexpected answers
			}
		}
		slices.Sort(durs)
		total += len(durs)
		failures += fivexx + other
		fmt.Printf("%-20s %8d %9.2f %9s %9s %9s %6d %6d\n", name, len(durs), float64(len(durs))/elapsed.Seconds(),
			pct(durs, 0.50), pct(durs, 0.99), pct(durs, 1), fivexx, other)
	}
	fmt.Printf("%-20s %8d %9.2f\n", "all", total, float64(total)/elapsed.Seconds())
	return failures
}

func pct(d []time.Duration, p float64) string {
	if len(d) == 0 {
		return "-"
	}
	i := int(p*float64(len(d))+0.5) - 1
	i = max(0, min(i, len(d)-1))
	return d[i].Round(100 * time.Microsecond).String()
}

// memory reads the resident set size and its peak (VmRSS, VmHWM) of a
// process from /proc, in bytes; zero where unavailable.
func memory(pid int) (rss, hwm int64) {
	data, err := os.ReadFile(fmt.Sprintf("/proc/%d/status", pid))
	if err != nil {
		return 0, 0
	}
	for _, line := range strings.Split(string(data), "\n") {
		var kb int64
		if _, err := fmt.Sscanf(line, "VmRSS: %d kB", &kb); err == nil {
			rss = kb << 10
		}
		if _, err := fmt.Sscanf(line, "VmHWM: %d kB", &kb); err == nil {
			hwm = kb << 10
		}
	}
	return rss, hwm
}

func mib(b int64) string {
	if b == 0 {
		return "n/a"
	}
	return fmt.Sprintf("%.1f MiB", float64(b)/(1<<20))
}
