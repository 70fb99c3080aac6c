package main

import (
	"bufio"
	"bytes"
	"database/sql"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math/rand/v2"
	"net"
	"net/http"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"sync"
	"syscall"
	"testing"
	"time"
)

// These tests run the real binary, built once per test run, as a user
// would: a separate process on a loopback port with its own library file.

var (
	buildOnce sync.Once
	binPath   string
	buildErr  error
)

// fogbenchBinary builds the command into a temporary directory.
func fogbenchBinary(t *testing.T) string {
	t.Helper()
	if testing.Short() {
		t.Skip("builds and runs the binary; skipped with -short")
	}
	buildOnce.Do(func() {
		dir, err := os.MkdirTemp("", "fogbench-bin-")
		if err != nil {
			buildErr = err
			return
		}
		binPath = filepath.Join(dir, "fogbench")
		out, err := exec.Command("go", "build", "-o", binPath, ".").CombinedOutput()
		if err != nil {
			buildErr = fmt.Errorf("go build: %v\n%s", err, out)
		}
	})
	if buildErr != nil {
		t.Fatal(buildErr)
	}
	return binPath
}

func TestMain(m *testing.M) {
	code := m.Run()
	if binPath != "" {
		os.RemoveAll(filepath.Dir(binPath))
	}
	os.Exit(code)
}

// process is one running fogbench serve.
type process struct {
	cmd  *exec.Cmd
	url  string // http://127.0.0.1:PORT
	addr string
	mu   sync.Mutex
	log  bytes.Buffer
	done chan struct{} // closed when the process has exited
	err  error         // its exit, valid after done
}

func (p *process) logText() string {
	p.mu.Lock()
	defer p.mu.Unlock()
	return p.log.String()
}

var servingURL = regexp.MustCompile(`msg="fogbench is serving" url=(https?://[^/ ]+)/`)

// startServe runs fogbench serve on a free loopback port and waits until
// it says where it listens.
func startServe(t *testing.T, bin, db string, extra ...string) *process {
	t.Helper()
	args := append([]string{"serve", "-addr", "127.0.0.1:0", "-db", db}, extra...)
	cmd := exec.Command(bin, args...)
	stderr, err := cmd.StderrPipe()
	if err != nil {
		t.Fatal(err)
	}
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	p := &process{cmd: cmd, done: make(chan struct{})}
	found := make(chan string, 1)
	go func() {
		sc := bufio.NewScanner(stderr)
		for sc.Scan() {
			line := sc.Text()
			p.mu.Lock()
			p.log.WriteString(line + "\n")
			p.mu.Unlock()
			if m := servingURL.FindStringSubmatch(line); m != nil {
				select {
				case found <- m[1]:
				default:
				}
			}
		}
		p.err = cmd.Wait()
		close(p.done)
	}()
	t.Cleanup(func() {
		select {
		case <-p.done:
		default:
			cmd.Process.Kill()
			<-p.done
		}
	})
	select {
	case u := <-found:
		p.url = u
		p.addr = strings.TrimPrefix(strings.TrimPrefix(u, "http://"), "https://")
		return p
	case <-p.done:
		t.Fatalf("fogbench exited before serving: %v\n%s", p.err, p.logText())
	case <-time.After(20 * time.Second):
		t.Fatalf("fogbench did not start within 20 s:\n%s", p.logText())
	}
	return nil
}

// waitExit waits for the process to end and returns its exit code.
func (p *process) waitExit(t *testing.T, limit time.Duration) int {
	t.Helper()
	select {
	case <-p.done:
	case <-time.After(limit):
		t.Fatalf("fogbench still running after %v:\n%s", limit, p.logText())
	}
	var ee *exec.ExitError
	if errors.As(p.err, &ee) {
		return ee.ExitCode()
	}
	if p.err != nil {
		t.Fatal(p.err)
	}
	return 0
}

// integrityCheck opens the library file directly and asks SQLite to check
// every page and index, and the foreign keys.
func integrityCheck(t *testing.T, db string) {
	t.Helper()
	conn, err := sql.Open("sqlite3", "file:"+db+"?_busy_timeout=5000")
	if err != nil {
		t.Fatal(err)
	}
	defer conn.Close()
	var res string
	if err := conn.QueryRow("PRAGMA integrity_check").Scan(&res); err != nil {
		t.Fatal(err)
	}
	if res != "ok" {
		t.Fatalf("integrity_check: %s", res)
	}
	rows, err := conn.Query("PRAGMA foreign_key_check")
	if err != nil {
		t.Fatal(err)
	}
	defer rows.Close()
	if rows.Next() {
		t.Fatal("foreign_key_check reports dangling references")
	}
}

func crashCase(name string) string {
	return fmt.Sprintf(`{"format":"fogbench-case/1","name":%q,"fluid":"water","liquid_temperature_k":298.15,
  "gas":{"pressure_pa":101325,"temperature_k":310},
  "distribution":{"model":"rosin-rammler","x_m":5e-5,"q":2.5,"bins":8,"d_min_m":1e-6,"d_max_m":3e-4}}`, name)
}

// ack is a save the server acknowledged: the case id, the revision the
// answer named and the name saved in it.
type ack struct {
	id   int64
	rev  int
	name string
}

// saveLoop creates cases and updates its own ones until the server goes
// away, and records every save the server acknowledged. It returns whether
// the kill cut a request off (rather than refusing the next connection)
// and how many answers were neither 201 nor 200.
func saveLoop(base, tag string, rng *rand.Rand, out chan<- ack) (cutOff bool, bad int) {
	hc := &http.Client{Timeout: 10 * time.Second}
	var mine []ack
	for i := 0; ; i++ {
		name := fmt.Sprintf("%s save %d", tag, i)
		var req *http.Request
		update := len(mine) > 0 && rng.IntN(3) == 0
		var target ack
		if update {
			target = mine[rng.IntN(len(mine))]
			body := fmt.Sprintf(`{"revision":%d,"case":%s}`, target.rev, crashCase(name))
			req, _ = http.NewRequest(http.MethodPut, fmt.Sprintf("%s/api/cases/%d", base, target.id), strings.NewReader(body))
		} else {
			req, _ = http.NewRequest(http.MethodPost, base+"/api/cases", strings.NewReader(crashCase(name)))
		}
		req.Header.Set("Content-Type", "application/json")
		resp, err := hc.Do(req)
		if err != nil {
			return !errors.Is(err, syscall.ECONNREFUSED), bad // the server is gone
		}
		var rec struct {
			ID       int64  `json:"id"`
			Revision int    `json:"revision"`
			Name     string `json:"name"`
		}
		err = json.NewDecoder(resp.Body).Decode(&rec)
		resp.Body.Close()
		ok := resp.StatusCode == http.StatusCreated || resp.StatusCode == http.StatusOK
		if !ok || err != nil {
			// A save that was not acknowledged promises nothing, but
			// a server that answers anything else is at fault.
			bad++
			continue
		}
		a := ack{id: rec.ID, rev: rec.Revision, name: rec.Name}
		out <- a
		if update {
			for j := range mine {
				if mine[j].id == a.id {
					mine[j] = a
				}
			}
		} else {
			mine = append(mine, a)
		}
	}
}

// checkAcknowledged asks the restarted server for every acknowledged save:
// the case exists, its revision is at least the acknowledged one, and that
// revision carries the name that was saved.
func checkAcknowledged(t *testing.T, base string, acks map[[2]int64]string) {
	t.Helper()
	type revList struct {
		Revisions []struct {
			Revision int    `json:"revision"`
			Name     string `json:"name"`
		} `json:"revisions"`
	}
	byID := map[int64]revList{}
	for key, name := range acks {
		id, rev := key[0], int(key[1])
		rl, ok := byID[id]
		if !ok {
			resp, err := http.Get(fmt.Sprintf("%s/api/cases/%d/revisions", base, id))
			if err != nil {
				t.Fatal(err)
			}
			if resp.StatusCode != http.StatusOK {
				resp.Body.Close()
				t.Fatalf("acknowledged case %d is missing after the crash: status %d", id, resp.StatusCode)
			}
			err = json.NewDecoder(resp.Body).Decode(&rl)
			resp.Body.Close()
			if err != nil {
				t.Fatal(err)
			}
			byID[id] = rl
		}
		found := false
		for _, r := range rl.Revisions {
			if r.Revision == rev {
				found = true
				if r.Name != name {
					t.Errorf("case %d revision %d is named %q, acknowledged %q", id, rev, r.Name, name)
				}
			}
		}
		if !found {
			t.Errorf("acknowledged revision %d of case %d was lost", rev, id)
		}
	}
}

// Crash safety: saves go to the real server from several clients at once,
// the process is killed with SIGKILL at a random moment (seeded), the file
// must pass SQLite's integrity check, and after a restart every save the
// server acknowledged (201 or 200) must be there. Bounded rounds and time.
func TestCrashKeepsAcknowledgedSaves(t *testing.T) {
	bin := fogbenchBinary(t)
	db := filepath.Join(t.TempDir(), "crash.db")
	rng := rand.New(rand.NewPCG(10, 7))
	acks := map[[2]int64]string{}
	const rounds, workers = 6, 6
	deadline := time.Now().Add(25 * time.Second)
	var interrupted, bad int
	for round := 0; round < rounds && time.Now().Before(deadline); round++ {
		p := startServe(t, bin, db)
		checkAcknowledged(t, p.url, acks)
		out := make(chan ack, 1024)
		var wg sync.WaitGroup
		cut, fails := make([]bool, workers), make([]int, workers)
		for w := range workers {
			wg.Add(1)
			wrng := rand.New(rand.NewPCG(uint64(round), uint64(w)))
			go func() {
				defer wg.Done()
				cut[w], fails[w] = saveLoop(p.url, fmt.Sprintf("r%d w%d", round, w), wrng, out)
			}()
		}
		collected := make(chan int)
		go func() {
			n := 0
			for a := range out {
				acks[[2]int64{a.id, int64(a.rev)}] = a.name
				n++
			}
			collected <- n
		}()
		time.Sleep(time.Duration(150+rng.IntN(600)) * time.Millisecond)
		if err := p.cmd.Process.Signal(syscall.SIGKILL); err != nil {
			t.Fatal(err)
		}
		p.waitExit(t, 10*time.Second)
		wg.Wait()
		close(out)
		n := <-collected
		for w := range workers {
			bad += fails[w]
			if cut[w] {
				interrupted++
			}
		}
		if n == 0 {
			t.Fatalf("round %d: no save was acknowledged before the kill:\n%s", round, p.logText())
		}
		integrityCheck(t, db)
	}
	p := startServe(t, bin, db)
	checkAcknowledged(t, p.url, acks)
	p.cmd.Process.Signal(syscall.SIGTERM)
	p.waitExit(t, 20*time.Second)
	integrityCheck(t, db)
	t.Logf("%d acknowledged saves checked after SIGKILLs; %d requests cut off by the kills", len(acks), interrupted)
	if bad > 0 {
		t.Errorf("%d saves were answered with an error while the server ran", bad)
	}
	if interrupted == 0 {
		t.Error("no request was in flight at any kill: the test did not exercise a crash mid-write")
	}
}

// Graceful shutdown: SIGTERM while a request is half sent closes the
// listener at once, lets that request finish with its answer, closes the
// library and exits 0, leaving a file that passes the integrity check.
func TestSIGTERMDrainsRequestsAndClosesTheLibrary(t *testing.T) {
	bin := fogbenchBinary(t)
	db := filepath.Join(t.TempDir(), "drain.db")
	p := startServe(t, bin, db)
	body := crashCase("drained")
	conn, err := net.Dial("tcp", p.addr)
	if err != nil {
		t.Fatal(err)
	}
	defer conn.Close()
	conn.SetDeadline(time.Now().Add(30 * time.Second))
	half := len(body) / 2
	fmt.Fprintf(conn, "POST /api/cases HTTP/1.1\r\nHost: %s\r\nContent-Type: application/json\r\nContent-Length: %d\r\n\r\n%s",
		p.addr, len(body), body[:half])
	time.Sleep(300 * time.Millisecond) // the handler is now reading the body
	if err := p.cmd.Process.Signal(syscall.SIGTERM); err != nil {
		t.Fatal(err)
	}
	for start := time.Now(); !strings.Contains(p.logText(), "shutting down"); {
		if time.Since(start) > 10*time.Second {
			t.Fatalf("no shutdown message:\n%s", p.logText())
		}
		time.Sleep(20 * time.Millisecond)
	}
	// New connections are refused while the old one drains.
	refused := false
	for start := time.Now(); time.Since(start) < 5*time.Second; time.Sleep(20 * time.Millisecond) {
		c, err := net.DialTimeout("tcp", p.addr, time.Second)
		if err != nil {
			refused = true
			break
		}
		c.Close()
	}
	if !refused {
		t.Error("the listener still accepts connections after SIGTERM")
	}
	select {
	case <-p.done:
		t.Fatalf("exited with a request in flight:\n%s", p.logText())
	default:
	}
	if _, err := io.WriteString(conn, body[half:]); err != nil {
		t.Fatal(err)
	}
	resp, err := http.ReadResponse(bufio.NewReader(conn), nil)
	if err != nil {
		t.Fatalf("the request in flight got no answer: %v\n%s", err, p.logText())
	}
	data, _ := io.ReadAll(resp.Body)
	resp.Body.Close()
	if resp.StatusCode != http.StatusCreated || !bytes.Contains(data, []byte(`"drained"`)) {
		t.Fatalf("request in flight: status %d: %s", resp.StatusCode, data)
	}
	if code := p.waitExit(t, 20*time.Second); code != 0 {
		t.Fatalf("exit %d:\n%s", code, p.logText())
	}
	if !strings.Contains(p.logText(), "library closed") {
		t.Errorf("the library was not closed:\n%s", p.logText())
	}
	// SQLite removes the write-ahead log when the last connection closes
	// cleanly; a left-over one means a connection was abandoned.
	if _, err := os.Stat(db + "-wal"); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("write-ahead log left behind: %v", err)
	}
	integrityCheck(t, db)
	// The saved case is there after a restart.
	p2 := startServe(t, bin, db)
	resp, err = http.Get(p2.url + "/api/cases?q=drained")
	if err != nil {
		t.Fatal(err)
	}
	var list struct{ Total int }
	json.NewDecoder(resp.Body).Decode(&list)
	resp.Body.Close()
	if list.Total != 1 {
		t.Errorf("the drained save is not in the library: %d found", list.Total)
	}
	p2.cmd.Process.Signal(syscall.SIGINT)
	if code := p2.waitExit(t, 20*time.Second); code != 0 {
		t.Errorf("SIGINT: exit %d", code)
	}
}
