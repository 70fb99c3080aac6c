package views

import "fmt"

// ExportView offers the ways to export cases as a bundle.
type ExportView struct {
	Chrome
	Total int      // cases outside the trash
	Tags  []Option // Value: tag, Label: tag with its count
}

// BundleItem is one case of an uploaded bundle and what importing does.
type BundleItem struct {
	UID          string
	Name         string
	Action       string // "add", "keep", "conflict"
	ExistingID   int64
	ExistingName string
	ExistingRev  int
	ResultID     int64
}

// ExistingURL links the library's matching case.
func (b BundleItem) ExistingURL() string { return fmt.Sprintf("/cases/%d", b.ExistingID) }

// ResultURL links the case that holds the imported version.
func (b BundleItem) ResultURL() string { return fmt.Sprintf("/cases/%d", b.ResultID) }

// ActionText says in words what the import will do.
func (b BundleItem) ActionText() string {
	switch b.Action {
	case "add":
		return "will be added"
	case "keep":
		return "identical case already in the library: kept as it is"
	case "conflict":
		return "the library holds another version of this case: choose"
	}
	return b.Action
}

// BundleImportView is the import page: the upload form, then the preview of
// an uploaded bundle, then the outcome.
type BundleImportView struct {
	Chrome
	Error      string       // why the upload was refused
	BundleJSON string       // the checked bundle, carried to the apply step
	FileName   string       // as uploaded
	Items      []BundleItem // the preview
	Done       bool         // the import has been applied
	Added      []BundleItem
	Replaced   []BundleItem
	Kept       []BundleItem
	MaxBytes   int64 // the largest bundle the server takes
}

// MaxText is the bundle limit in MiB, for people.
func (v BundleImportView) MaxText() string { return fmt.Sprintf("%d MiB", v.MaxBytes>>20) }

// Count counts preview items by action.
func (v BundleImportView) Count(action string) int {
	n := 0
	for _, it := range v.Items {
		if it.Action == action {
			n++
		}
	}
	return n
}
