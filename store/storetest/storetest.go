// Package storetest gives tests a fresh, empty case library in each
// database fogbench supports, so one set of tests runs against both.
//
// SQLite needs nothing: a file in t.TempDir(). PostgreSQL needs a database
// named by FOGBENCH_TEST_PG (a postgres:// URL; .ci/pg-throwaway starts a
// throw-away cluster and prints it); each test gets its own schema there,
// dropped when the test ends. Without FOGBENCH_TEST_PG the PostgreSQL tests
// skip with a message, or fail when CI=true.
package storetest

import (
	"context"
	"crypto/rand"
	"database/sql"
	"encoding/hex"
	"net/url"
	"os"
	"path/filepath"
	"sync"
	"testing"

	_ "github.com/jackc/pgx/v5/stdlib" // the "pgx" database/sql driver
)

// EnvPostgres names the environment variable holding the test database.
const EnvPostgres = "FOGBENCH_TEST_PG"

// Backend is one database a library can live in.
type Backend struct {
	Name string
	// New returns the -db value of a fresh, empty library that lasts until
	// the test ends.
	New func(t testing.TB) string
}

// SQLite gives a library file in the test's temporary folder.
var SQLite = Backend{Name: "sqlite", New: func(t testing.TB) string {
	return filepath.Join(t.TempDir(), "lib.db")
}}

// Postgres gives a fresh schema in the FOGBENCH_TEST_PG database.
var Postgres = Backend{Name: "postgres", New: PostgresDSN}

// Backends lists every database, SQLite first.
func Backends() []Backend { return []Backend{SQLite, Postgres} }

var (
	adminOnce sync.Once
	admin     *sql.DB
	adminErr  error
)

// PostgresDSN creates a schema of its own for the test in the
// FOGBENCH_TEST_PG database and returns a URL whose search_path is that
// schema; the schema is dropped when the test ends.
func PostgresDSN(t testing.TB) string {
	t.Helper()
	base := os.Getenv(EnvPostgres)
	if base == "" {
		if os.Getenv("CI") == "true" {
			t.Fatalf("%s is not set: CI must run the PostgreSQL store tests (.ci/run starts a throw-away cluster)", EnvPostgres)
		}
		t.Skipf("PostgreSQL tests skipped: set %s=postgres://… (for example: eval \"$(.ci/pg-throwaway start /tmp/fbpg)\")", EnvPostgres)
	}
	adminOnce.Do(func() {
		admin, adminErr = sql.Open("pgx", base)
		if adminErr == nil {
			admin.SetMaxOpenConns(4)
			adminErr = admin.Ping()
		}
	})
	if adminErr != nil {
		t.Fatalf("%s: %v", EnvPostgres, adminErr)
	}
	u, err := url.Parse(base)
	if err != nil {
		t.Fatalf("%s: %v", EnvPostgres, err)
	}
	suffix := make([]byte, 8)
	rand.Read(suffix)
	schema := "fbtest_" + hex.EncodeToString(suffix)
	if _, err := admin.Exec(`CREATE SCHEMA ` + schema); err != nil {
		t.Fatalf("create schema %s: %v", schema, err)
	}
	t.Cleanup(func() {
		if _, err := admin.ExecContext(context.Background(), `DROP SCHEMA `+schema+` CASCADE`); err != nil {
			t.Errorf("drop schema %s: %v", schema, err)
		}
	})
	q := u.Query()
	q.Set("search_path", schema)
	u.RawQuery = q.Encode()
	return u.String()
}
