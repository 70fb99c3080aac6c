package server

import (
	"context"
	"time"

	"fogbench/calc"
	"fogbench/calc/fluid"
	"fogbench/store"
)

// Library is the case library the server works on. store.Open returns one
// over a SQLite file or a PostgreSQL database (chosen by -db); the handlers
// see only these methods, so both behave the same to them.
type Library interface {
	// Now is the library's clock (report dates, bundle names).
	Now() time.Time

	CreateCase(ctx context.Context, c calc.Case, author string) (store.CaseRecord, error)
	// UpdateCase returns a *store.ConflictError when base is not the
	// newest revision.
	UpdateCase(ctx context.Context, id int64, base int, c calc.Case, author string) (store.CaseRecord, error)
	GetCase(ctx context.Context, id int64) (store.CaseRecord, error)
	ListCases(ctx context.Context, o store.ListOptions) ([]store.CaseSummary, int, error)
	CountCases(ctx context.Context) (int, error)
	DuplicateCase(ctx context.Context, id int64, name, author string) (store.CaseRecord, error)
	RenameCase(ctx context.Context, id int64, base int, name, author string) (store.CaseRecord, error)
	TrashCase(ctx context.Context, id int64) error
	RestoreCase(ctx context.Context, id int64) error

	Revisions(ctx context.Context, id int64) ([]store.Revision, error)
	GetRevision(ctx context.Context, id int64, rev int) (store.Revision, error)
	RestoreRevision(ctx context.Context, id int64, rev, base int, author string) (store.CaseRecord, error)
	DiffRevisions(ctx context.Context, id int64, a, b int) ([]store.FieldDiff, error)

	SetTags(ctx context.Context, id int64, tags []string) error
	Tags(ctx context.Context) ([]store.TagCount, error)

	Export(ctx context.Context, o store.ExportOptions) (store.Bundle, error)
	PlanImport(ctx context.Context, b store.Bundle) ([]store.ImportItem, error)
	// Import applies the whole bundle or, on any failure, nothing.
	Import(ctx context.Context, b store.Bundle, choices map[string]store.ImportChoice, def store.ImportChoice, author string) (store.ImportResult, error)

	CreateLiquid(ctx context.Context, spec fluid.CustomSpec) (store.LiquidRecord, error)
	UpdateLiquid(ctx context.Context, id string, base int, spec fluid.CustomSpec) (store.LiquidRecord, error)
	GetLiquid(ctx context.Context, id string) (store.LiquidRecord, error)
	ListLiquids(ctx context.Context) ([]store.LiquidRecord, error)
	DeleteLiquid(ctx context.Context, id string) error

	// Upkeep, used by main around serving.
	SeedDemo(ctx context.Context) (int, error)
	// Backup copies a SQLite library; on PostgreSQL it answers that
	// pg_dump is the way.
	Backup(ctx context.Context, dest string) error
	IntegrityCheck(ctx context.Context) error
	SchemaVersion(ctx context.Context) (int, error)
	Close() error
}

var _ Library = (*store.Store)(nil)
