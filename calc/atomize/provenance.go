package atomize

import (
	"sort"
	"strconv"
	"strings"
)

// Citation is the published source of a relation, as full as it is known.
// Fields that were not read are left empty rather than guessed.
type Citation struct {
	Authors  string `json:"authors"`
	Title    string `json:"title,omitempty"`
	Journal  string `json:"journal"`
	Year     int    `json:"year"`
	Volume   string `json:"volume,omitempty"` // "3" or "3(1)"
	Pages    string `json:"pages,omitempty"`  // "11–18", or the first page alone
	Equation string `json:"equation,omitempty"`
}

// String is the citation in one line: authors (year), "title", journal
// volume, pages; equation.
func (c Citation) String() string {
	var b strings.Builder
	b.WriteString(c.Authors)
	b.WriteString(" (" + strconv.Itoa(c.Year) + ")")
	if c.Title != "" {
		b.WriteString(", “" + c.Title + "”")
	}
	b.WriteString(", " + c.Journal)
	if c.Volume != "" {
		b.WriteString(" " + c.Volume)
	}
	if c.Pages != "" {
		b.WriteString(", " + c.Pages)
	}
	if c.Equation != "" {
		b.WriteString("; " + c.Equation)
	}
	return b.String()
}

// Provenance says where the form of a relation comes from and how far
// fogbench has checked it. It is the single record every page, report,
// CSV and API response shows for the relation.
type Provenance struct {
	Citation Citation `json:"citation"`
	// Checked is true when the form and constants were compared with an
	// independent text (the paper, a book quoting it, or open scientific
	// code that cites the original), named in CheckedAgainst.
	Checked        bool   `json:"checked"`
	CheckedAgainst string `json:"checked_against,omitempty"`
	// Status is the plain-words verdict shown to users: "checked against
	// …" or "published form not confirmed here: use the band".
	Status string `json:"status"`
	// Note adds what the check did not settle (units, a constant that
	// differs between sources), or is empty.
	Note string `json:"note,omitempty"`
}

// statusUnconfirmed is the status of a form not compared with any
// independent text.
const statusUnconfirmed = "published form not confirmed here: use the band"

// checkedAgainst records a form compared with an independent text.
func checkedAgainst(c Citation, what, note string) Provenance {
	return Provenance{Citation: c, Checked: true, CheckedAgainst: what, Status: "checked against " + what, Note: note}
}

// unconfirmed records a form that no independent text confirmed.
func unconfirmed(c Citation, note string) Provenance {
	return Provenance{Citation: c, Status: statusUnconfirmed, Note: note}
}

// The open sources the forms were compared with. Each is open scientific
// code that cites the original paper; none is a spray-sizing product.
const (
	srcPerseus = "the open injector-design code Raphael174/PERSEUS (SingleSwirlCorrel.py), which cites Lefebvre's correlations"
	srcSVEC    = "the open MATLAB nozzle model GianoncelliStefano/SVEC11 (S3_Nozzles.m), which cites the paper by title"
	srcRESA    = "the open swirl-injector code luiserpenbach/RESA (swirl_injector/thermodynamics.py)"
)

// Relation ids of the auxiliary relations (not SMD correlations) with a
// provenance record.
const (
	RelRizkLefebvreCD   = "rizk-lefebvre-1985-discharge-coefficient"
	RelRizkLefebvreFilm = "rizk-lefebvre-1985-film-thickness"
	RelSuyariFilm       = "suyari-lefebvre-1986-film-thickness"
	RelRizkLefebvreCone = "rizk-lefebvre-1985-cone-angle"
	RelLichtarowicz     = "lichtarowicz-1965-discharge-coefficient"
	RelGiffenMuraszew   = "giffen-muraszew-1953-discharge-coefficient"
)

var citeRizkLefebvre1985 = Citation{Authors: "Rizk, N. K. & Lefebvre, A. H.", Title: "Internal flow characteristics of simplex swirl atomizers",
	Journal: "J. Propulsion Power", Year: 1985, Volume: "1(3)", Pages: "193–199"}

// relations holds the provenance of every auxiliary relation.
var relations = map[string]Provenance{
	RelRizkLefebvreCD: checkedAgainst(citeRizkLefebvre1985,
		srcPerseus+" (CdLev), "+srcRESA+" (rizk_lefebvre): C_D = 0.35 (A_p/(D_s d0))^0.5 (D_s/d0)^0.25", ""),
	RelRizkLefebvreFilm: checkedAgainst(citeRizkLefebvre1985,
		srcPerseus+" (helev, labelled theoretical): t = 3.66 [d0 ṁ_L μ_L/(ρ_L ΔP_L)]^0.25",
		"an approximation of Rizk & Lefebvre's implicit film equation; the measurements of Suyari & Lefebvre (1986) gave the constant 2.7"),
	RelSuyariFilm: checkedAgainst(Citation{Authors: "Suyari, M. & Lefebvre, A. H.", Title: "Film thickness measurements in a simplex swirl atomizer",
		Journal: "J. Propulsion Power", Year: 1986, Volume: "2(6)", Pages: "528–533"},
		srcPerseus+" (heSuy, labelled experimental) and "+srcRESA+" (suyari_lefebvre): t = 2.7 [d0 ṁ_L μ_L/(ρ_L ΔP_L)]^0.25",
		"the same group as Rizk & Lefebvre (1985), with the constant fitted to measured films"),
	RelRizkLefebvreCone: unconfirmed(citeRizkLefebvre1985,
		"the open codes read use other, air-core-based cone-angle relations, so this form was not compared"),
	RelLichtarowicz: checkedAgainst(Citation{Authors: "Lichtarowicz, A., Duggins, R. K. & Markland, E.",
		Title:   "Discharge coefficients for incompressible non-cavitating flow through long orifices",
		Journal: "J. Mech. Eng. Sci.", Year: 1965, Volume: "7(2)", Pages: "210–219"},
		srcSVEC+": C_D,max = 0.827 − 0.0085 l0/d0", "the high-Reynolds-number limit; the same code adds the low-Re term, which fogbench does not"),
	RelGiffenMuraszew: checkedAgainst(Citation{Authors: "Giffen, E. & Muraszew, A.", Journal: "book", Year: 1953},
		srcPerseus+" (CdGiff): C_D = 1.17 [(1 − X)³/(1 + X)]^0.5", ""),
}

// RelationProvenance returns the provenance of an auxiliary relation
// (Rel* ids) or of an SMD correlation id, and whether it is known.
func RelationProvenance(id string) (Provenance, bool) {
	if p, ok := relations[id]; ok {
		return p, true
	}
	for _, f := range families {
		if c := f.correlation(id); c != nil {
			return c.info.Provenance, true
		}
	}
	return Provenance{}, false
}

// RelationIDs lists the auxiliary relations with a provenance record.
func RelationIDs() []string {
	ids := make([]string, 0, len(relations))
	for id := range relations {
		ids = append(ids, id)
	}
	sort.Strings(ids)
	return ids
}

// relationSource is "citation; status" of an auxiliary relation, as shown
// beside a figure it produced.
func relationSource(id string) string {
	p := relations[id]
	return p.Citation.String() + "; " + p.Status
}
