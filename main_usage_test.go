package main

import (
	"bytes"
	"strings"
	"testing"
)

// TestHelpListsSubcommands: every spelling of help, with or without the
// word "help", prints the list of subcommands, not serve's flags alone.
func TestHelpListsSubcommands(t *testing.T) {
	for _, args := range [][]string{{"help"}, {"-h"}, {"--help"}, {"-help"}} {
		var out, errw bytes.Buffer
		if code := run(args, strings.NewReader(""), &out, &errw); code != 0 {
			t.Errorf("%v: exit %d, stderr %q", args, code, errw.String())
			continue
		}
		for _, cmd := range []string{"serve", "eval", "backup", "restore", "report", "migrate-store"} {
			if !strings.Contains(out.String(), "fogbench "+cmd) && !strings.Contains(out.String(), "fogbench ["+cmd+"]") {
				t.Errorf("%v: help does not list %q:\n%s", args, cmd, out.String())
			}
		}
	}
}

// TestLibraryFlagsNameBothStores: report's -db takes a PostgreSQL URL as
// well as a SQLite file, and backup and restore say how a PostgreSQL
// library is handled instead of calling -db a SQLite library alone.
func TestLibraryFlagsNameBothStores(t *testing.T) {
	for cmd, want := range map[string]string{"report": "postgres://", "backup": "pg_dump", "restore": "pg_restore"} {
		var out, errw bytes.Buffer
		run([]string{cmd, "-h"}, strings.NewReader(""), &out, &errw)
		help := errw.String()
		if !strings.Contains(help, "-db") || !strings.Contains(help, want) {
			t.Errorf("%s -h does not mention %q beside -db:\n%s", cmd, want, help)
		}
		if strings.Contains(help, "SQLite case library") {
			t.Errorf("%s -h still calls -db a SQLite case library:\n%s", cmd, help)
		}
	}
}
