// Command bench times fogbench against the numpy/scipy reference in
// docs/bench/reference.py on one seeded batch of varied cases, each run as a
// whole process writing its full results (per-bin and history) as JSON, and
// checks that the two agree within the stated tolerances.
//
//	go run ./testdata/bench [-n 1000] [-seed 1] [-runs 3] [-dir /tmp/fogbench-bench]
//
// It builds fogbench into -dir first unless -fogbench names a binary. See
// docs/performance.md for the figures it printed.
package main

import (
	"bytes"
	"encoding/json"
	"flag"
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"os/exec"
	"path/filepath"
	"slices"
	"time"

	"fogbench/calc"
	"fogbench/calc/fluid"
)

func main() {
	n := flag.Int("n", 1000, "number of cases in the batch")
	seed := flag.Uint64("seed", 1, "seed of the case generator")
	runs := flag.Int("runs", 3, "timed runs of each program (the median is reported)")
	dir := flag.String("dir", filepath.Join(os.TempDir(), "fogbench-bench"), "working directory for the batch and outputs")
	bin := flag.String("fogbench", "", "fogbench binary (default: go build into -dir)")
	python := flag.String("python", "/usr/bin/python3", "Python with numpy and scipy")
	script := flag.String("reference", "docs/bench/reference.py", "reference script")
	flag.Parse()
	if err := run(*n, *seed, *runs, *dir, *bin, *python, *script); err != nil {
		fmt.Fprintln(os.Stderr, "bench:", err)
		os.Exit(1)
	}
}

func run(n int, seed uint64, runs int, dir, bin, python, script string) error {
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return err
	}
	if bin == "" {
		bin = filepath.Join(dir, "fogbench")
		if out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput(); err != nil {
			return fmt.Errorf("go build: %v\n%s", err, out)
		}
	}
	cases := Batch(n, seed)
	batch := filepath.Join(dir, "batch.json")
	if err := writeJSON(batch, cases); err != nil {
		return err
	}
	// Both programs read the whole batch in one process (fogbench eval
	// takes up to calc.MaxBatchCases cases per file; a larger batch runs
	// in chunks, a process start each).
	var chunks []string
	for i := 0; i < n; i += calc.MaxBatchCases {
		f := filepath.Join(dir, fmt.Sprintf("chunk-%03d.json", len(chunks)))
		if err := writeJSON(f, cases[i:min(n, i+calc.MaxBatchCases)]); err != nil {
			return err
		}
		chunks = append(chunks, f)
	}
	bins := 0
	for _, c := range cases {
		bins += c.Distribution.Bins
	}
	fmt.Printf("batch: %d cases (seed %d), %d bins in all, 201 history points each; fogbench in %d process(es) of <= %d cases, the reference in one\n",
		n, seed, bins, len(chunks), calc.MaxBatchCases)

	pyOut := filepath.Join(dir, "reference.json")
	var fbOuts []string
	var jobs [][]string
	for k, c := range chunks {
		fbOuts = append(fbOuts, filepath.Join(dir, fmt.Sprintf("fogbench-%03d.json", k)))
		jobs = append(jobs, []string{bin, "eval", c})
	}
	tf, err := timeRuns(runs, fbOuts, jobs)
	if err != nil {
		return fmt.Errorf("fogbench: %w", err)
	}
	tp, err := timeRuns(runs, []string{pyOut}, [][]string{{python, script, batch}})
	if err != nil {
		return fmt.Errorf("reference: %w", err)
	}
	report := func(name string, t timing) {
		fmt.Printf("%-10s wall %7.3f s (median of %d: %s)  cpu %7.3f s  %8.0f cases/s\n",
			name, t.wall.Seconds(), len(t.walls), fmtDurations(t.walls), t.cpu.Seconds(), float64(n)/t.wall.Seconds())
	}
	report("fogbench", tf)
	report("reference", tp)
	fmt.Printf("throughput ratio fogbench/reference: %.1fx wall, %.1fx cpu (target >= 20x)\n",
		tp.wall.Seconds()/tf.wall.Seconds(), tp.cpu.Seconds()/tf.cpu.Seconds())

	var fb, py []Result
	for _, f := range fbOuts {
		var part []Result
		if err := readJSON(f, &part); err != nil {
			return err
		}
		fb = append(fb, part...)
	}
	if err := readJSON(pyOut, &py); err != nil {
		return err
	}
	a, err := Compare(fb, py)
	if err != nil {
		return err
	}
	fmt.Print(a)
	if !a.OK() {
		return fmt.Errorf("results disagree beyond the stated tolerances")
	}
	return nil
}

type timing struct {
	wall, cpu time.Duration
	walls     []time.Duration
}

// timeRuns runs the jobs (one after another, each with its standard output
// to its file) runs times and returns the median total wall time and the
// CPU time (user + system) of that run.
func timeRuns(runs int, outPaths []string, jobs [][]string) (timing, error) {
	type one struct{ wall, cpu time.Duration }
	var all []one
	for range runs {
		var o one
		for k, job := range jobs {
			out, err := os.Create(outPaths[k])
			if err != nil {
				return timing{}, err
			}
			cmd := exec.Command(job[0], job[1:]...)
			var stderr bytes.Buffer
			cmd.Stdout, cmd.Stderr = out, &stderr
			start := time.Now()
			err = cmd.Run()
			o.wall += time.Since(start)
			out.Close()
			if err != nil {
				return timing{}, fmt.Errorf("%v: %s", err, stderr.String())
			}
			o.cpu += cmd.ProcessState.UserTime() + cmd.ProcessState.SystemTime()
		}
		all = append(all, o)
	}
	slices.SortFunc(all, func(a, b one) int { return int(a.wall - b.wall) })
	m := all[len(all)/2]
	t := timing{wall: m.wall, cpu: m.cpu}
	for _, o := range all {
		t.walls = append(t.walls, o.wall)
	}
	return t, nil
}

func writeJSON(path string, v any) error {
	data, err := json.Marshal(v)
	if err != nil {
		return err
	}
	return os.WriteFile(path, data, 0o644)
}

func fmtDurations(ds []time.Duration) string {
	s := ""
	for i, d := range ds {
		if i > 0 {
			s += " "
		}
		s += fmt.Sprintf("%.3f", d.Seconds())
	}
	return s
}

func readJSON(path string, v any) error {
	data, err := os.ReadFile(path)
	if err != nil {
		return err
	}
	return json.Unmarshal(data, v)
}

func ptr(v float64) *float64 { return &v }

// Batch returns n varied cases inside the reference's scope (water or
// n-heptane in air, fixed surface temperature, stagnant or Ranz–Marshall,
// Rosin–Rammler or volume log-normal sizes), seeded so that every run
// times the same work.
func Batch(n int, seed uint64) []calc.Case {
	rng := rand.New(rand.NewPCG(seed, 0x5eed))
	uni := func(a, b float64) float64 { return a + (b-a)*rng.Float64() }
	logUni := func(a, b float64) float64 { return math.Exp(uni(math.Log(a), math.Log(b))) }
	cases := make([]calc.Case, n)
	for i := range cases {
		c := calc.Case{Format: calc.CaseFormat, Fluid: "water"}
		if rng.Float64() < 0.4 {
			c.Fluid = "n-heptane"
		}
		l, _ := fluid.Lookup(c.Fluid)
		p := logUni(0.5e5, 3e5)
		tb, _ := l.SaturationTemperature(p)
		tMin := 275.0
		if c.Fluid == "n-heptane" {
			tMin = 250
		}
		ts := uni(tMin, math.Min(340, tb-10))
		x := 0.0
		if rng.Float64() < 0.5 {
			x = uni(0, 0.8) * l.SaturationPressure(ts) / p
		}
		c.LiquidTemperatureK = ptr(ts)
		c.Gas = calc.Gas{ID: "air", PressurePa: p, TemperatureK: uni(280, 600), VaporMoleFraction: ptr(x)}
		if rng.Float64() < 0.4 {
			c.Evaporation.Convection = "none"
		} else {
			c.Evaporation.Convection = "ranz-marshall"
			c.Gas.RelativeVelocityMS = uni(0, 30)
		}
		c.Evaporation.NoTransition = rng.Float64() < 0.1
		d := calc.Distribution{Bins: 20 + rng.IntN(81), Spacing: "log"}
		if rng.Float64() < 0.6 {
			d.Model, d.XM, d.Q = "rosin-rammler", logUni(10e-6, 150e-6), uni(1.5, 4)
			q := func(F float64) float64 { return d.XM * math.Pow(-math.Log1p(-F), 1/d.Q) }
			d.DMinM, d.DMaxM = q(0.001), q(0.999)
		} else {
			d.Model, d.MedianM, d.GSD, d.Basis = "log-normal", logUni(10e-6, 150e-6), uni(1.3, 2.5), "volume"
			s := math.Log(d.GSD)
			d.DMinM, d.DMaxM = d.MedianM*math.Exp(-3.09*s), d.MedianM*math.Exp(3.09*s)
		}
		c.Distribution = d
		c.Name = fmt.Sprintf("bench %d: %s %s, %d bins", i+1, c.Fluid, d.Model, d.Bins)
		cases[i] = c
	}
	return cases
}
