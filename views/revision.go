package views

import (
	"fmt"
	"time"
)

// RevisionRow is one saved state of a case in its history.
type RevisionRow struct {
	Revision int
	Name     string
	Author   string
	Created  time.Time
	Checksum string
}

// CreatedText shows the save time in UTC, to the second (two saves in one
// minute are common when people work together).
func (r RevisionRow) CreatedText() string { return r.Created.UTC().Format("2006-01-02 15:04:05 UTC") }

// AuthorText names who saved, or says nobody was named.
func (r RevisionRow) AuthorText() string {
	if r.Author == "" {
		return "(no name given)"
	}
	return r.Author
}

// ShortSum is the start of the content checksum: equal sums, equal content.
func (r RevisionRow) ShortSum() string {
	if len(r.Checksum) > 10 {
		return r.Checksum[:10]
	}
	return r.Checksum
}

// RevisionsView is a case's history.
type RevisionsView struct {
	Chrome
	ID      int64
	Name    string
	Current int // the newest revision
	Trashed bool
	Rows    []RevisionRow // newest first
}

// DefaultA and DefaultB preselect the two newest revisions for a diff.
func (v RevisionsView) DefaultA() int { return max(v.Current-1, 1) }

// DefaultB is the newest revision.
func (v RevisionsView) DefaultB() int { return v.Current }

// CaseURL is the case page.
func (v RevisionsView) CaseURL() string { return fmt.Sprintf("/cases/%d", v.ID) }

// DiffRow is one case-file field in two revisions.
type DiffRow struct {
	Path    string
	A, B    string
	Changed bool
}

// DiffView compares two revisions of one case field by field.
type DiffView struct {
	Chrome
	ID          int64
	Name        string
	Current     int
	A, B        RevisionRow
	Rows        []DiffRow
	OnlyChanged bool
}

// ChangedCount is how many fields differ.
func (v DiffView) ChangedCount() int {
	n := 0
	for _, r := range v.Rows {
		if r.Changed {
			n++
		}
	}
	return n
}

// Shown are the rows the page lists.
func (v DiffView) Shown() []DiffRow {
	if !v.OnlyChanged {
		return v.Rows
	}
	var out []DiffRow
	for _, r := range v.Rows {
		if r.Changed {
			out = append(out, r)
		}
	}
	return out
}

// ToggleURL switches between all fields and changed fields only.
func (v DiffView) ToggleURL() string {
	u := fmt.Sprintf("/cases/%d/diff?a=%d&b=%d", v.ID, v.A.Revision, v.B.Revision)
	if !v.OnlyChanged {
		u += "&changed=1"
	}
	return u
}

// ConflictRow is one case-file field in the user's version and in the
// stored newest revision.
type ConflictRow struct {
	Path          string
	Mine, Theirs  string
	Differs       bool
	MineChanged   bool // the user changed it from the revision they opened
	TheirsChanged bool // the other save changed it
}

// BothChanged marks a field both people changed, differently.
func (r ConflictRow) BothChanged() bool { return r.Differs && r.MineChanged && r.TheirsChanged }

// PickMine is the preselected choice: the user's value where only they
// changed it or both did, the stored value otherwise.
func (r ConflictRow) PickMine() bool { return r.MineChanged }

// ConflictView is shown when a save meets a newer revision: both versions
// side by side, with per-field choice, re-apply, and save-as-copy.
type ConflictView struct {
	Chrome
	ID            int64
	Name          string
	BaseRevision  int // the revision the user started from
	Current       int // the stored newest revision
	CurrentAuthor string
	CurrentTime   time.Time
	MineJSON      string // the user's case file, carried in the form
	Rows          []ConflictRow
	Note          string // e.g. a second conflict during the merge
}

// Differing counts the fields that differ between the two versions.
func (v ConflictView) Differing() int {
	n := 0
	for _, r := range v.Rows {
		if r.Differs {
			n++
		}
	}
	return n
}

// CurrentText says who saved the newest revision and when.
func (v ConflictView) CurrentText() string {
	who := v.CurrentAuthor
	if who == "" {
		who = "someone"
	}
	return fmt.Sprintf("revision %d, saved by %s at %s", v.Current, who, v.CurrentTime.UTC().Format("2006-01-02 15:04:05 UTC"))
}
