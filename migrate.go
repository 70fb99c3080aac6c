package main

import (
	"context"
	"flag"
	"fmt"
	"io"
	"os"

	"fogbench/calc"
	"fogbench/store"
)

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
