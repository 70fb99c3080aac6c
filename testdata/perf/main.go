// Command perf measures the serving targets of docs/performance.md on
// loopback only: it seeds a library of -cases invented cases through the
// store, starts `fogbench serve` on 127.0.0.1, times the first response
// after start, drives POST /api/evaluate with one 60-bin case from
// -workers concurrent clients for -duration, then the case page of a
// handful of cases (whose plots are cached per revision), and reports
// throughput, p50/p99 latency and the server's resident memory.
//
//	go run ./testdata/perf -cases 10000 -workers 32 -duration 10s
package main

import (
	"bufio"
	"bytes"
	"context"
	"encoding/json"
	"flag"
	"fmt"
	"io"
	"math"
	"net/http"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"runtime"
	"slices"
	"strings"
	"sync"
	"syscall"
	"time"

	"fogbench/calc"
	"fogbench/store"
)

func main() {
	ncases := flag.Int("cases", 10000, "cases in the seeded library")
	workers := flag.Int("workers", 32, "concurrent connections")
	duration := flag.Duration("duration", 10*time.Second, "how long to drive each kind of request (at most 60s)")
	steady := flag.Bool("steady", false, "evaluate at the steady (wet-bulb) surface temperature instead of a fixed one")
	clientProcs := flag.Int("client-procs", 0, "GOMAXPROCS of this load generator (0: the runtime's default)")
	dir := flag.String("dir", filepath.Join(os.TempDir(), "fogbench-perf"), "working directory")
	flag.Parse()
	if *clientProcs > 0 {
		runtime.GOMAXPROCS(*clientProcs)
	}
	if *duration > time.Minute {
		*duration = time.Minute
	}
	if err := run(*ncases, *workers, *duration, *steady, *dir); err != nil {
		fmt.Fprintln(os.Stderr, "perf:", err)
		os.Exit(1)
	}
}

func ptr(v float64) *float64 { return &v }

// benchCase is a 60-bin water case; steady leaves the surface temperature
// to the wet-bulb solve.
func benchCase(name string, x float64, steady bool) calc.Case {
	c := calc.Case{Format: calc.CaseFormat, Name: name, Fluid: "water", LiquidTemperatureK: ptr(293.15),
		Gas:          calc.Gas{PressurePa: 101325, TemperatureK: 300, RelativeHumidity: ptr(0.3), RelativeVelocityMS: 2},
		Distribution: calc.Distribution{Model: "rosin-rammler", XM: x, Q: 2.5, Bins: 60, DMinM: 1e-6, DMaxM: 300e-6}}
	if steady {
		c.LiquidTemperatureK = nil
	}
	return c
}

func run(ncases, workers int, duration time.Duration, steady bool, dir string) error {
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return err
	}
	bin := filepath.Join(dir, "fogbench")
	if out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput(); err != nil {
		return fmt.Errorf("go build: %v\n%s", err, out)
	}
	db := filepath.Join(dir, fmt.Sprintf("lib-%d.db", ncases))
	ids, err := seed(db, ncases)
	if err != nil {
		return err
	}
	start := time.Now()
	cmd := exec.Command(bin, "serve", "-addr", "127.0.0.1:0", "-db", db)
	stderr, _ := cmd.StderrPipe()
	stdout, _ := cmd.StdoutPipe()
	if err := cmd.Start(); err != nil {
		return err
	}
	defer func() {
		cmd.Process.Signal(os.Interrupt)
		done := make(chan struct{})
		go func() { cmd.Wait(); close(done) }()
		select {
		case <-done:
		case <-time.After(10 * time.Second):
			cmd.Process.Kill()
		}
	}()
	base, err := findAddr(stdout, stderr)
	if err != nil {
		return err
	}
	client := &http.Client{Transport: &http.Transport{MaxIdleConnsPerHost: workers}, Timeout: 30 * time.Second}
	for {
		resp, err := client.Get(base + "/cases")
		if err == nil {
			io.Copy(io.Discard, resp.Body)
			resp.Body.Close()
			if resp.StatusCode == 200 {
				break
			}
		}
		if time.Since(start) > 30*time.Second {
			return fmt.Errorf("no response within 30 s")
		}
		time.Sleep(2 * time.Millisecond)
	}
	fmt.Printf("library: %d cases; first 200 from GET /cases %.0f ms after exec (target < 300 ms)\n", ncases, ms(time.Since(start)))
	fmt.Printf("resident memory after start: %.1f MiB\n", rss(cmd.Process.Pid))

	body, _ := json.Marshal(benchCase("perf", 50e-6, steady))
	mode := "fixed surface temperature"
	if steady {
		mode = "steady surface temperature"
	}
	pid := cmd.Process.Pid
	drive(fmt.Sprintf("POST /api/evaluate (60 bins, %s)", mode), pid, client, workers, duration, func() (*http.Request, error) {
		return http.NewRequest(http.MethodPost, base+"/api/evaluate", bytes.NewReader(body))
	}, "target >= 500 req/s, p99 < 50 ms")

	pages := ids[:min(len(ids), 8)]
	var next int
	var mu sync.Mutex
	drive(fmt.Sprintf("GET /cases/{id} (%d cases in turn, plots cached)", len(pages)), pid, client, workers, duration, func() (*http.Request, error) {
		mu.Lock()
		id := pages[next%len(pages)]
		next++
		mu.Unlock()
		return http.NewRequest(http.MethodGet, fmt.Sprintf("%s/cases/%d", base, id), nil)
	}, "target p99 < 50 ms")
	fmt.Printf("resident memory at the end: %.1f MiB (peak %.1f MiB; target < 100 MB)\n", rss(cmd.Process.Pid), hwm(cmd.Process.Pid))
	return nil
}

// seed makes (or reuses) a library with n cases.
func seed(db string, n int) ([]int64, error) {
	ctx := context.Background()
	st, err := store.Open(ctx, db)
	if err != nil {
		return nil, err
	}
	defer st.Close()
	rows, total, err := st.ListCases(ctx, store.ListOptions{Limit: 8})
	if err != nil {
		return nil, err
	}
	var ids []int64
	for _, r := range rows {
		ids = append(ids, r.ID)
	}
	for i := total; i < n; i++ {
		x := 20e-6 + 100e-6*float64(i%97)/97
		rec, err := st.CreateCase(ctx, benchCase(fmt.Sprintf("Perf rig %05d", i+1), x, i%2 == 0), "perf")
		if err != nil {
			return nil, err
		}
		if len(ids) < 8 {
			ids = append(ids, rec.ID)
		}
	}
	return ids, nil
}

var addrRE = regexp.MustCompile(`http://127\.0\.0\.1:\d+`)

func findAddr(pipes ...io.Reader) (string, error) {
	found := make(chan string, 1)
	for _, r := range pipes {
		go func() {
			sc := bufio.NewScanner(r)
			for sc.Scan() {
				if m := addrRE.FindString(sc.Text()); m != "" {
					select {
					case found <- m:
					default:
					}
				}
			}
		}()
	}
	select {
	case a := <-found:
		return a, nil
	case <-time.After(30 * time.Second):
		return "", fmt.Errorf("the server printed no loopback address")
	}
}

// drive runs workers closed-loop clients for duration and prints
// throughput, latency percentiles and the CPU seconds the server and this
// load generator used meanwhile: both share the machine's cores, so the
// generator's share is capacity the server did not have.
func drive(name string, pid int, client *http.Client, workers int, duration time.Duration, mk func() (*http.Request, error), target string) {
	var mu sync.Mutex
	var lat []time.Duration
	errs := 0
	deadline := time.Now().Add(duration)
	begin := time.Now()
	srv0, own0 := procCPU(pid), selfCPU()
	var wg sync.WaitGroup
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for time.Now().Before(deadline) {
				req, _ := mk()
				t0 := time.Now()
				resp, err := client.Do(req)
				ok := err == nil && resp.StatusCode == 200
				if err == nil {
					io.Copy(io.Discard, resp.Body)
					resp.Body.Close()
				}
				d := time.Since(t0)
				mu.Lock()
				if ok {
					lat = append(lat, d)
				} else {
					errs++
				}
				mu.Unlock()
			}
		}()
	}
	wg.Wait()
	el := time.Since(begin)
	srvCPU, ownCPU := procCPU(pid)-srv0, selfCPU()-own0
	slices.Sort(lat)
	p := func(q float64) float64 {
		if len(lat) == 0 {
			return math.NaN()
		}
		return ms(lat[min(len(lat)-1, int(q*float64(len(lat))))])
	}
	fmt.Printf("%s, %d connections, %.0f s: %.0f req/s, p50 %.1f ms, p90 %.1f ms, p99 %.1f ms, max %.1f ms, %d errors (%s)\n",
		name, workers, el.Seconds(), float64(len(lat))/el.Seconds(), p(0.5), p(0.9), p(0.99), p(1), errs, target)
	fmt.Printf("  CPU: server %.2f cores (%.2f ms per request), load generator %.2f cores, of %d\n",
		srvCPU/el.Seconds(), 1e3*srvCPU/float64(max(len(lat), 1)), ownCPU/el.Seconds(), runtime.NumCPU())
}

// procCPU is the user + system CPU time of process pid in seconds, from
// /proc/PID/stat (fields 14 and 15, in clock ticks of 1/100 s on Linux).
func procCPU(pid int) float64 {
	data, err := os.ReadFile(fmt.Sprintf("/proc/%d/stat", pid))
	if err != nil {
		return math.NaN()
	}
	// The command name (field 2) may hold spaces; count from after its ')'.
	f := strings.Fields(string(data[bytes.LastIndexByte(data, ')')+1:]))
	if len(f) < 13 {
		return math.NaN()
	}
	var ut, st float64
	fmt.Sscan(f[11], &ut)
	fmt.Sscan(f[12], &st)
	return (ut + st) / 100
}

// selfCPU is this process's user + system CPU time in seconds.
func selfCPU() float64 {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return math.NaN()
	}
	return float64(ru.Utime.Nano()+ru.Stime.Nano()) / 1e9
}

func ms(d time.Duration) float64 { return float64(d.Microseconds()) / 1e3 }

func procStatus(pid int, key string) float64 {
	data, err := os.ReadFile(fmt.Sprintf("/proc/%d/status", pid))
	if err != nil {
		return math.NaN()
	}
	for _, line := range strings.Split(string(data), "\n") {
		var kb float64
		if _, err := fmt.Sscanf(line, key+": %f kB", &kb); err == nil {
			return kb / 1024
		}
	}
	return math.NaN()
}

func rss(pid int) float64 { return procStatus(pid, "VmRSS") }
func hwm(pid int) float64 { return procStatus(pid, "VmHWM") }
