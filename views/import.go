package views

// ImportView is the measured-data block of the case form: the file field,
// what the last file turned out to hold, and fits of the parametric models
// to the classes. Nothing in it touches the case until the user applies it.
type ImportView struct {
	FileName string
	Error    string     // why the file was refused, shown beside the file field
	Detected []Figure   // what the reader found: layout, separator, unit, basis, rows
	Preview  [][]string // the first lines of the file, split into cells
	// PreviewHasHeader says the first Preview line is the file's header.
	PreviewHasHeader bool
	Warnings         []string
	Classes          []ClassRow
	// Carry holds the classes read from the file in hidden fields, so
	// "apply" and "fit" work without sending the file again.
	Carry   ImportCarry
	Applied string // a note after the classes or a fit went into the form
	Fits    []FitRow
	// FitError says why no fit could be made (no classes, bad classes).
	FitError string
}

// ImportCarry is the imported distribution as plain lists: edges in µm and
// per-class shares in % on Basis.
type ImportCarry struct {
	Name      string
	Edges     string
	Fractions string
	Basis     string
}

// ClassRow is one imported class as a table row.
type ClassRow struct {
	Range, Number, Volume string
}

// FitRow is one model family fitted to the classes.
type FitRow struct {
	Family   string // case-file model name, e.g. "rosin-rammler"
	Label    string
	Params   []Figure
	RMS      string // in percentage points of cumulative volume
	R2       string
	Warnings []string
	Best     bool // the highest R² of the families tried
	Failed   string
}

// HasClasses reports whether a file has been read successfully and its
// classes can be applied or fitted.
func (v ImportView) HasClasses() bool { return v.Carry.Edges != "" && v.Carry.Fractions != "" }

// Open reports whether the import block should start unfolded: something
// happened in it.
func (v ImportView) Open() bool {
	return v.Error != "" || v.HasClasses() || v.Applied != "" || len(v.Fits) > 0 || v.FitError != ""
}

// PreviewHeader is the first preview line when the file had a header.
func (v ImportView) PreviewHeader() []string {
	if !v.PreviewHasHeader || len(v.Preview) == 0 {
		return nil
	}
	return v.Preview[0]
}

// PreviewBody is the preview without its header line.
func (v ImportView) PreviewBody() [][]string {
	if v.PreviewHasHeader && len(v.Preview) > 0 {
		return v.Preview[1:]
	}
	return v.Preview
}

// ModelLabel is the human name of a distribution model.
func ModelLabel(model string) string {
	for _, o := range (FormView{}).Models() {
		if o.Value == model {
			return o.Label
		}
	}
	return model
}
