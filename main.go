// Command fogbench is a local web app for sizing atomizers and sprays: drop
// size distributions, the Laplace pressure and Kelvin raise of vapor pressure
// per size class, evaporation of each class and of the whole spray, and a
// case library shared in a SQLite file or a PostgreSQL database.
//
// Usage:
//
//	fogbench [serve] [-addr 127.0.0.1:8080] [-db fogbench.db] [-tls-cert C -tls-key K]
//	fogbench eval [-strict] [FILE|-]   evaluate case file(s), print results as JSON
//	fogbench backup -db LIB FILE    consistent copy of a running library
//	fogbench restore FILE -db LIB   replace a library with a checked backup
//	fogbench report ID -o FILE.pdf  PDF report of a stored case
//	fogbench migrate-store -from A -to B   move a library between SQLite and PostgreSQL
package main

import (
	"bytes"
	"context"
	"crypto/tls"
	"encoding/json"
	"errors"
	"flag"
	"fmt"
	"io"
	"log/slog"
	"net"
	"net/http"
	"os"
	"os/signal"
	"runtime"
	"runtime/debug"
	"strconv"
	"strings"
	"sync"
	"sync/atomic"
	"syscall"
	"time"

	"fogbench/calc"
	"fogbench/server"
	"fogbench/store"
)

func main() {
	os.Exit(run(os.Args[1:], os.Stdin, os.Stdout, os.Stderr))
}

// run dispatches a subcommand and returns the exit code: 0 success, 1 a
// fault, 2 bad input or usage.
func run(args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	cmd := "serve"
	if len(args) > 0 && len(args[0]) > 0 && args[0][0] != '-' {
		cmd, args = args[0], args[1:]
	} else if len(args) > 0 && isHelpFlag(args[0]) {
		// "fogbench -h" asks about fogbench, not about serve's flags.
		cmd = "help"
	}
	switch cmd {
	case "serve":
		return serve(args, stderr)
	case "eval":
		return evalCmd(args, stdin, stdout, stderr)
	case "backup":
		return backupCmd(args, stderr)
	case "restore":
		return restoreCmd(args, stdout, stderr)
	case "report":
		return reportCmd(args, stderr)
	case "migrate-store":
		return migrateStoreCmd(args, stdout, stderr)
	case "help", "-h", "--help":
		fmt.Fprint(stdout, usage)
		return 0
	}
	fmt.Fprintf(stderr, "fogbench: unknown command %q\n%s", cmd, usage)
	return 2
}

// isHelpFlag reports whether arg is one of the spellings of a request for
// help that the flag package answers.
func isHelpFlag(arg string) bool {
	switch arg {
	case "-h", "-help", "--help", "--h":
		return true
	}
	return false
}

const usage = `usage:
  fogbench [serve] [-addr 127.0.0.1:8080] [-db fogbench.db] [-tls-cert CERT.pem -tls-key KEY.pem] [-allow-host NAME]
  fogbench eval [-strict] [FILE|-]  evaluate a case file (one case or an array) and print the results as JSON;
                                    in an array a failing case gets its error in its place (-strict: exit non-zero then)
  fogbench backup [-db fogbench.db] FILE   write a consistent copy of the library (safe while serving)
  fogbench restore FILE [-db fogbench.db]  replace the library with a checked backup (stop the server first)
  fogbench report CASE-ID -o FILE.pdf [-db fogbench.db] [-paper a4|letter]   PDF report of a stored case
  fogbench migrate-store -from LIB -to LIB   copy a whole library into an empty one (SQLite file or postgres:// URL)

-db takes a SQLite file or a postgres://USER@HOST/DB URL (docs/stores.md);
backup and restore work on SQLite files (a PostgreSQL library is backed up
with pg_dump). "fogbench COMMAND -h" lists a command's flags.
`

func serve(args []string, stderr io.Writer) int {
	fs := flag.NewFlagSet("serve", flag.ContinueOnError)
	fs.SetOutput(stderr)
	addr := fs.String("addr", "127.0.0.1:8080", "address to listen on")
	dbPath := fs.String("db", "fogbench.db", "case library: a SQLite file or a postgres:// URL (created with demo cases if new)")
	verbose := fs.Bool("v", false, "log every request")
	tokenFile := fs.String("token-file", "", "file holding the access token (or set FOGBENCH_TOKEN); required for a non-loopback -addr")
	tlsCert := fs.String("tls-cert", "", "serve HTTPS with this PEM certificate (with -tls-key)")
	tlsKey := fs.String("tls-key", "", "PEM private key of -tls-cert")
	var allowHosts hostList
	fs.Var(&allowHosts, "allow-host", "without a token, also answer to this host name (NAME or NAME:PORT, e.g. a reverse proxy's); repeat or separate with commas")
	if err := fs.Parse(args); err != nil {
		return 2
	}
	tlsConfig, err := loadTLS(*tlsCert, *tlsKey)
	if err != nil {
		fmt.Fprintf(stderr, "fogbench: %v\n", err)
		return 2
	}
	level := slog.LevelInfo
	if *verbose {
		level = slog.LevelDebug
	}
	logger := slog.New(slog.NewTextHandler(stderr, &slog.HandlerOptions{Level: level}))
	if os.Getenv("GOGC") == "" {
		// Half as many collections as the default: under load they took
		// about a sixth of an evaluation request's CPU, for some 4 MiB more
		// resident memory (docs/performance.md). GOGC still overrides.
		debug.SetGCPercent(200)
	}
	if os.Getenv("GOMEMLIMIT") == "" {
		// A soft limit on the Go heap: with GOGC=200 and the results cache
		// full (case pages of many cases) the heap grew to three times its
		// live size and the process past 100 MB resident; near the limit
		// the collector runs sooner instead. GOMEMLIMIT still overrides.
		debug.SetMemoryLimit(serveMemoryLimit)
	}
	token, err := loadToken(*tokenFile, os.Getenv("FOGBENCH_TOKEN"))
	if err != nil {
		fmt.Fprintf(stderr, "fogbench: %v\n", err)
		return 2
	}
	if token == "" { // without a token, serve this machine only
		if err := checkLoopback(*addr); err != nil {
			fmt.Fprintf(stderr, "fogbench: %v\n", err)
			return 2
		}
	} else {
		logger.Info("access token required: people sign in at /login, API clients send Authorization: Bearer")
	}
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
	defer stop()
	st, err := store.Open(ctx, *dbPath)
	if err != nil {
		fmt.Fprintf(stderr, "fogbench: %v\n", err)
		return 1
	}
	defer func() {
		if err := st.Close(); err != nil {
			logger.Error("closing the library", "err", err)
			return
		}
		logger.Info("library closed", "db", st.Path())
	}()
	if len(st.RemovedRestoreCopies) > 0 {
		logger.Info("removed the temporary files an interrupted restore had left", "files", strings.Join(st.RemovedRestoreCopies, ", "))
	}
	logWriteCheck(ctx, st, logger)
	if n, err := st.SeedDemo(ctx); err != nil {
		fmt.Fprintf(stderr, "fogbench: %v\n", err)
		return 1
	} else if n > 0 {
		logger.Info("new library seeded with demo cases", "db", st.Path(), "cases", n)
	}
	app := server.New(st, logger)
	app.SecureCookies = tlsConfig != nil
	app.Token = token
	app.AllowedHosts = allowHosts
	srv := newHTTPServer(*addr, app.Handler())
	srv.TLSConfig = tlsConfig
	ln, err := net.Listen("tcp", *addr)
	if err != nil {
		fmt.Fprintf(stderr, "fogbench: %v\n", err)
		return 1
	}
	scheme := "http"
	if tlsConfig != nil {
		scheme = "https"
	}
	logger.Info("fogbench is serving", "url", scheme+"://"+ln.Addr().String()+"/", "db", st.Path())
	errc := make(chan error, 1)
	go func() {
		if tlsConfig != nil {
			errc <- srv.ServeTLS(ln, "", "")
			return
		}
		errc <- srv.Serve(ln)
	}()
	select {
	case err := <-errc:
		fmt.Fprintf(stderr, "fogbench: %v\n", err)
		return 1
	case <-ctx.Done():
	}
	logger.Info("shutting down: draining requests")
	sctx, cancel := context.WithTimeout(context.Background(), 15*time.Second)
	defer cancel()
	if err := srv.Shutdown(sctx); err != nil {
		logger.Error("shutdown", "err", err)
		return 1
	}
	return 0
}

// newHTTPServer bounds how long a client may take: a slow client cannot
// hold a connection open by trickling headers or a body, and idle
// keep-alive connections are closed.
func newHTTPServer(addr string, h http.Handler) *http.Server {
	return &http.Server{
		Addr:              addr,
		Handler:           h,
		ReadHeaderTimeout: 10 * time.Second,
		ReadTimeout:       60 * time.Second,
		WriteTimeout:      60 * time.Second,
		IdleTimeout:       120 * time.Second,
		MaxHeaderBytes:    64 << 10,
	}
}

// loadTLS reads the certificate and key given with -tls-cert and -tls-key;
// neither means plain HTTP (nil), one without the other is a usage error.
func loadTLS(certFile, keyFile string) (*tls.Config, error) {
	if certFile == "" && keyFile == "" {
		return nil, nil
	}
	if certFile == "" || keyFile == "" {
		return nil, errors.New("give both -tls-cert and -tls-key, or neither")
	}
	cert, err := tls.LoadX509KeyPair(certFile, keyFile)
	if err != nil {
		return nil, fmt.Errorf("-tls-cert/-tls-key: %v", err)
	}
	return &tls.Config{Certificates: []tls.Certificate{cert}, MinVersion: tls.VersionTLS12}, nil
}

// checkLoopback refuses a non-loopback address: fogbench has no access
// control yet, so it serves this machine only.
func checkLoopback(addr string) error {
	host, _, err := net.SplitHostPort(addr)
	if err != nil {
		return fmt.Errorf("-addr %q: %v", addr, err)
	}
	if host == "localhost" {
		return nil
	}
	ip := net.ParseIP(host)
	if ip == nil || !ip.IsLoopback() {
		return fmt.Errorf("-addr %q is not a loopback address: to serve other machines, give an access token with -token-file or FOGBENCH_TOKEN (see docs/access.md)", addr)
	}
	return nil
}

// serveMemoryLimit is `fogbench serve`'s soft limit on the memory the Go
// runtime manages (heap, stacks, its own structures), set unless
// GOMEMLIMIT is: 64 MiB held the loopback load test's resident peak at
// 82 MiB, against 103–105 MiB without it (docs/performance.md).
const serveMemoryLimit = 64 << 20

// evalCmd reads case file(s) and prints the results as JSON: one object for
// one case, an array for an array.
//
// An array never aborts for one case: a case that cannot be computed gets
// its error object (calc.CaseError) in its place and a line on stderr, and
// the exit code is 0 unless -strict, which exits with the first failing
// case's code (2 bad input, 1 a fault). Ctrl-C stops the whole batch
// (exit 130). A single case exits with its error as before.
func evalCmd(args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	fs := flag.NewFlagSet("eval", flag.ContinueOnError)
	fs.SetOutput(stderr)
	strict := fs.Bool("strict", false, "exit non-zero when any case of an array fails (each failing case still has its error in its place)")
	if err := fs.Parse(args); err != nil {
		return 2
	}
	args = fs.Args()
	if len(args) > 1 {
		fmt.Fprintf(stderr, "fogbench eval: give one file or - for standard input\n")
		return 2
	}
	in, name := stdin, "standard input"
	if len(args) == 1 && args[0] != "-" {
		f, err := os.Open(args[0])
		if err != nil {
			fmt.Fprintf(stderr, "fogbench eval: %v\n", err)
			return 2
		}
		defer f.Close()
		in, name = f, args[0]
	}
	data, err := io.ReadAll(io.LimitReader(in, calc.MaxBatchFileBytes+1))
	if err != nil {
		fmt.Fprintf(stderr, "fogbench eval: read %s: %v\n", name, err)
		return 1
	}
	cases, err := calc.DecodeBatch(bytes.NewReader(data), calc.MaxBatchFileBytes, calc.MaxBatchCases)
	if err != nil {
		fmt.Fprintf(stderr, "fogbench eval: %s: %v\n", name, err)
		return 2
	}
	// Ctrl-C stops the evaluation between classes and time steps (exit
	// 130); once stop has run, a second one ends the process as usual.
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt)
	defer stop()
	array := calc.IsArray(data)
	failedAs := func(where string, err error) int {
		fmt.Fprintf(stderr, "fogbench eval: %s: %v\n", where, oneLine(err))
		switch calc.ErrorCode(err) {
		case calc.Internal:
			return 1
		case calc.Canceled:
			return 130
		}
		return 2
	}
	failed := func(i int, err error) int {
		where := name
		if len(cases) > 1 {
			where = fmt.Sprintf("%s: case %d", name, i+1)
		}
		return failedAs(where, err)
	}
	if !array && isTerminal(stdout) {
		// A single case printed to a terminal is indented for reading.
		res, err := calc.EvaluateContext(ctx, cases[0])
		if err != nil {
			return failed(0, err)
		}
		enc := json.NewEncoder(stdout)
		enc.SetIndent("", "  ")
		if err := enc.Encode(res); err != nil {
			fmt.Fprintf(stderr, "fogbench eval: %v\n", err)
			return 1
		}
		return 0
	}
	if !array {
		outs, i, err := encodeAll(ctx, cases, runtime.GOMAXPROCS(0))
		if err != nil {
			return failed(i, err)
		}
		if _, err := joinJSON(outs, false).WriteTo(stdout); err != nil {
			fmt.Fprintf(stderr, "fogbench eval: %v\n", err)
			return 1
		}
		return 0
	}
	outs, errs, err := encodeBatch(ctx, cases, runtime.GOMAXPROCS(0))
	if err != nil {
		// Only a stop (Ctrl-C) ends a batch early.
		fmt.Fprintf(stderr, "fogbench eval: %s: %v\n", name, oneLine(err))
		return 130
	}
	code := 0
	for _, err := range errs {
		if err != nil {
			// The error names its case already (calc.InBatch).
			c := failedAs(name, err)
			if code == 0 {
				code = c
			}
		}
	}
	if _, err := joinJSON(outs, true).WriteTo(stdout); err != nil {
		fmt.Fprintf(stderr, "fogbench eval: %v\n", err)
		return 1
	}
	if !*strict {
		return 0
	}
	return code
}

// encodeBatch is encodeAll for an array: a failing case's encoding is its
// calc.CaseError and its error is returned at its index in errs, and the
// other cases go on. Only a stop of ctx (Canceled) ends the batch, with
// that error.
func encodeBatch(ctx context.Context, cases []calc.Case, workers int) ([][]byte, []error, error) {
	outs := make([][]byte, len(cases))
	errs := make([]error, len(cases))
	_, err := runAll(len(cases), workers, func(i int) error {
		res, err := calc.EvaluateContext(ctx, cases[i])
		if err == nil {
			outs[i], err = res.AppendJSON(nil)
		}
		if err != nil {
			if calc.ErrorCode(err) == calc.Canceled {
				return err
			}
			// The list index names the case as POST /api/evaluate and
			// decoding name it: "[1].distribution.q", else "case 2: ".
			err = calc.InBatch(i, err)
			errs[i] = err
			outs[i], err = json.Marshal(calc.NewCaseError(err))
		}
		return err
	})
	if err != nil {
		return nil, nil, err
	}
	return outs, errs, nil
}

// encodeAll evaluates the cases on up to workers goroutines (cases are
// independent and calc.Evaluate is safe for concurrent use), each encoding
// the results it computed as compact JSON, and returns the encodings in
// input order; or the first failing case in input order with its index and
// error, as a one-by-one loop would. Compact: indenting doubled the bytes
// and took about a sixth of a batch's CPU; calc's encoder writes what
// encoding/json writes, faster, and encoding in the workers puts it on all
// cores. When ctx is done the case being evaluated fails with calc's
// Canceled error.
func encodeAll(ctx context.Context, cases []calc.Case, workers int) ([][]byte, int, error) {
	outs := make([][]byte, len(cases))
	i, err := runAll(len(cases), workers, func(i int) error {
		res, err := calc.EvaluateContext(ctx, cases[i])
		if err == nil {
			outs[i], err = res.AppendJSON(nil)
		}
		return err
	})
	if err != nil {
		return nil, i, err
	}
	return outs, 0, nil
}

// joinJSON returns the encoded results as one JSON value and a newline:
// the single object, or the array of them (what calc.AppendResultsJSON
// writes), as buffers written in one vectored write where the system has
// one.
func joinJSON(outs [][]byte, array bool) *net.Buffers {
	if !array {
		return &net.Buffers{outs[0], []byte("\n")}
	}
	bufs := make(net.Buffers, 0, 2*len(outs)+2)
	bufs = append(bufs, []byte("["))
	for i, o := range outs {
		if i > 0 {
			bufs = append(bufs, []byte(","))
		}
		bufs = append(bufs, o)
	}
	bufs = append(bufs, []byte("]\n"))
	return &bufs
}

// runAll calls do(i) for i = 0 … n−1 on up to workers goroutines and
// returns the first failing index in input order with its error, as a
// one-by-one loop would: indices after a failure are skipped, indices
// before it always run.
func runAll(n, workers int, do func(i int) error) (int, error) {
	errs := make([]error, n)
	var next, firstBad atomic.Int64
	firstBad.Store(int64(n))
	var wg sync.WaitGroup
	for range max(1, min(workers, n)) {
		wg.Go(func() {
			for {
				i := next.Add(1) - 1
				if i >= int64(n) || i > firstBad.Load() {
					return
				}
				if err := do(int(i)); err != nil {
					errs[i] = err
					for bad := firstBad.Load(); i < bad && !firstBad.CompareAndSwap(bad, i); bad = firstBad.Load() {
					}
				}
			}
		})
	}
	wg.Wait()
	if bad := int(firstBad.Load()); bad < n {
		return bad, errs[bad]
	}
	return 0, nil
}

// isTerminal reports whether w is a character device such as a terminal.
func isTerminal(w io.Writer) bool {
	f, ok := w.(*os.File)
	if !ok {
		return false
	}
	st, err := f.Stat()
	return err == nil && st.Mode()&os.ModeCharDevice != 0
}

func oneLine(err error) string {
	s := err.Error()
	for i, r := range s {
		if r == '\n' {
			return s[:i]
		}
	}
	return s
}

func backupCmd(args []string, stderr io.Writer) int {
	fs := flag.NewFlagSet("backup", flag.ContinueOnError)
	fs.SetOutput(stderr)
	dbPath := fs.String("db", "fogbench.db", "case library to copy: a SQLite file (a postgres:// library is backed up with pg_dump)")
	if err := fs.Parse(args); err != nil {
		return 2
	}
	if fs.NArg() != 1 {
		fmt.Fprintln(stderr, "fogbench backup: give the destination file")
		return 2
	}
	dest := fs.Arg(0)
	if _, err := os.Stat(dest); err == nil {
		fmt.Fprintf(stderr, "fogbench backup: %s exists; choose a new file\n", dest)
		return 2
	} else if !errors.Is(err, os.ErrNotExist) {
		fmt.Fprintf(stderr, "fogbench backup: %v\n", err)
		return 1
	}
	ctx := context.Background()
	st, err := store.Open(ctx, *dbPath)
	if err != nil {
		fmt.Fprintf(stderr, "fogbench backup: %v\n", err)
		return 1
	}
	defer st.Close()
	if err := st.Backup(ctx, dest); err != nil {
		fmt.Fprintf(stderr, "fogbench backup: %v\n", err)
		if calc.ErrorCode(err) == calc.Invalid { // a PostgreSQL library: pg_dump
			return 2
		}
		return 1
	}
	return 0
}

// reportCmd writes the PDF report of a stored case. The case id may come
// before or after the flags.
func reportCmd(args []string, stderr io.Writer) int {
	fs := flag.NewFlagSet("report", flag.ContinueOnError)
	fs.SetOutput(stderr)
	dbPath := fs.String("db", "fogbench.db", "case library: a SQLite file or a postgres:// URL")
	out := fs.String("o", "", "PDF file to write")
	paper := fs.String("paper", "a4", "paper size: a4 or letter")
	pos, ok := parseWithPositional(fs, args)
	if !ok {
		return 2
	}
	if len(pos) != 1 || *out == "" {
		fmt.Fprintln(stderr, "fogbench report: give one case id and -o FILE.pdf")
		return 2
	}
	id, err := strconv.ParseInt(pos[0], 10, 64)
	if err != nil || id <= 0 {
		fmt.Fprintf(stderr, "fogbench report: %q is not a case id\n", pos[0])
		return 2
	}
	if *paper != "a4" && *paper != "letter" {
		fmt.Fprintf(stderr, "fogbench report: -paper %q: use a4 or letter\n", *paper)
		return 2
	}
	if _, err := os.Stat(*dbPath); err != nil && !store.IsPostgres(*dbPath) {
		fmt.Fprintf(stderr, "fogbench report: %v\n", err)
		return 2
	}
	ctx := context.Background()
	st, err := store.Open(ctx, *dbPath)
	if err != nil {
		fmt.Fprintf(stderr, "fogbench report: %v\n", err)
		return 1
	}
	defer st.Close()
	logger := slog.New(slog.NewTextHandler(stderr, &slog.HandlerOptions{Level: slog.LevelWarn}))
	var buf bytes.Buffer
	if err := server.New(st, logger).WriteCaseReportPDF(ctx, &buf, id, *paper); err != nil {
		fmt.Fprintf(stderr, "fogbench report: %v\n", oneLine(err))
		if calc.ErrorCode(err) == calc.Internal {
			return 1
		}
		return 2
	}
	if err := os.WriteFile(*out, buf.Bytes(), 0o644); err != nil {
		fmt.Fprintf(stderr, "fogbench report: %v\n", err)
		return 1
	}
	return 0
}

// hostList collects -allow-host names.
type hostList []string

func (h *hostList) String() string { return strings.Join(*h, ",") }

func (h *hostList) Set(v string) error {
	for _, n := range strings.Split(v, ",") {
		if n = strings.TrimSpace(n); n != "" {
			if err := server.CheckAllowedHost(n); err != nil {
				return err
			}
			*h = append(*h, n)
		}
	}
	return nil
}

// loadToken reads the access token from -token-file, else from
// FOGBENCH_TOKEN. Surrounding white space (a trailing newline) is dropped.
// The token is never printed.
func loadToken(file, env string) (string, error) {
	tok := env
	if file != "" {
		data, err := os.ReadFile(file)
		if err != nil {
			return "", fmt.Errorf("-token-file: %v", err)
		}
		if fi, err := os.Stat(file); err == nil && fi.Mode().Perm()&0o077 != 0 {
			fmt.Fprintf(os.Stderr, "fogbench: warning: %s can be read by other users; chmod 600 it\n", file)
		}
		tok = string(data)
	}
	tok = strings.TrimSpace(tok)
	if tok != "" {
		if err := server.CheckToken(tok); err != nil {
			return "", err
		}
	}
	return tok, nil
}

// logWriteCheck says in one line at start whether the library takes
// writes, with the free space on its disk; a read-only library is served
// for reading and every save is refused with a message.
func logWriteCheck(ctx context.Context, st *store.Store, logger *slog.Logger) {
	wc, err := st.CheckWritable(ctx)
	if err != nil {
		logger.Warn("the library cannot be written: cases can be read, every save will be refused with a message", "db", st.Path(), "cause", err)
		return
	}
	if wc.FreeBytes < 0 {
		logger.Info("the library is writable", "db", st.Path())
		return
	}
	logger.Info("the library is writable", "db", st.Path(), "free_on_disk", fmt.Sprintf("%.1f GiB", float64(wc.FreeBytes)/(1<<30)))
}

// restoreCmd replaces a library with a backup after checking it. The file
// may come before or after the flags.
func restoreCmd(args []string, stdout, stderr io.Writer) int {
	fs := flag.NewFlagSet("restore", flag.ContinueOnError)
	fs.SetOutput(stderr)
	dbPath := fs.String("db", "fogbench.db", "case library to replace: a SQLite file (a postgres:// library is restored with pg_restore)")
	pos, ok := parseWithPositional(fs, args)
	if !ok {
		return 2
	}
	if len(pos) != 1 {
		fmt.Fprintln(stderr, "fogbench restore: give the backup file")
		return 2
	}
	rep, err := store.RestoreFile(context.Background(), pos[0], *dbPath)
	if err != nil {
		fmt.Fprintf(stderr, "fogbench restore: %v\n", err)
		if calc.ErrorCode(err) == calc.Internal {
			return 1
		}
		return 2
	}
	if len(rep.RemovedCopies) > 0 {
		fmt.Fprintf(stdout, "removed %d temporary files an earlier, interrupted restore had left: %s\n", len(rep.RemovedCopies), strings.Join(rep.RemovedCopies, ", "))
	}
	fmt.Fprintf(stdout, "restored %s from %s: %d cases, schema %d; integrity check ok\n", *dbPath, pos[0], rep.Cases, rep.SchemaVersion)
	if rep.KeptAside != "" {
		fmt.Fprintf(stdout, "the previous library is kept as %s\n", rep.KeptAside)
	}
	fmt.Fprintln(stdout, "The new file was put in place by an atomic rename; fogbench cannot tell whether another program still had the old file open, so restart any server using it.")
	return 0
}

// parseWithPositional parses flags that may stand before or after the
// positional arguments (flag stops at the first non-flag) and returns the
// positional ones; ok is false when a flag is malformed.
func parseWithPositional(fs *flag.FlagSet, args []string) (pos []string, ok bool) {
	for {
		if err := fs.Parse(args); err != nil {
			return nil, false
		}
		if fs.NArg() == 0 {
			return pos, true
		}
		pos = append(pos, fs.Arg(0))
		args = fs.Args()[1:]
	}
}

// migrateStoreCmd copies a whole library (every revision, tag, trash state
// and user liquid, with the same case numbers) into an empty one, for
// moving between a SQLite file and PostgreSQL (docs/stores.md).
func migrateStoreCmd(args []string, stdout, stderr io.Writer) int {
	fs := flag.NewFlagSet("migrate-store", flag.ContinueOnError)
	fs.SetOutput(stderr)
	from := fs.String("from", "", "library to copy: a SQLite file or a postgres:// URL")
	to := fs.String("to", "", "empty library to fill: a SQLite file (created) or a postgres:// URL (the database must exist)")
	if err := fs.Parse(args); err != nil {
		return 2
	}
	if *from == "" || *to == "" || fs.NArg() != 0 {
		fmt.Fprintln(stderr, "fogbench migrate-store: give -from LIB and -to LIB")
		return 2
	}
	if *from == *to {
		fmt.Fprintln(stderr, "fogbench migrate-store: -from and -to name the same library")
		return 2
	}
	if !store.IsPostgres(*from) {
		if _, err := os.Stat(*from); err != nil {
			fmt.Fprintf(stderr, "fogbench migrate-store: -from: %v\n", err)
			return 2
		}
	}
	ctx := context.Background()
	src, err := store.Open(ctx, *from)
	if err != nil {
		fmt.Fprintf(stderr, "fogbench migrate-store: %v\n", err)
		return 1
	}
	defer src.Close()
	dst, err := store.Open(ctx, *to)
	if err != nil {
		fmt.Fprintf(stderr, "fogbench migrate-store: %v\n", err)
		return 1
	}
	defer dst.Close()
	rep, err := store.CopyLibrary(ctx, src, dst)
	if err != nil {
		fmt.Fprintf(stderr, "fogbench migrate-store: %v\n", err)
		if calc.ErrorCode(err) == calc.Invalid {
			return 2
		}
		return 1
	}
	fmt.Fprintf(stdout, "copied %d cases (%d revisions, %d tags) and %d user liquids from %s to %s; integrity check ok\n",
		rep.Cases, rep.Revisions, rep.Tags, rep.Liquids, src.Path(), dst.Path())
	return 0
}
