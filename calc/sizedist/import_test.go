package sizedist

import (
	"bytes"
	"errors"
	"math"
	"os"
	"strings"
	"testing"

	"fogbench/calc/valid"
)

func importFile(t *testing.T, name string) *Import {
	t.Helper()
	f, err := os.Open("../../testdata/sizedist/" + name)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	imp, err := ImportCSV(f, 1<<20)
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	return imp
}

func TestImportExampleFiles(t *testing.T) {
	t.Run("bins, semicolon, decimal comma, BOM, µm", func(t *testing.T) {
		imp := importFile(t, "bins_volume_semicolon.csv")
		if imp.Shape != ShapeBins || imp.Separator != ";" || !imp.DecimalComma || imp.Unit != "µm" || imp.Basis != BasisVolume || imp.Rows != 10 {
			t.Errorf("detected %s sep %q comma %v unit %q basis %s rows %d", imp.Shape, imp.Separator, imp.DecimalComma, imp.Unit, imp.Basis, imp.Rows)
		}
		b := imp.Binned
		near(t, "first edge", b.Edges[0], 5e-6, 1e-12)
		near(t, "last edge", b.Edges[10], 287e-6, 1e-12)
		near(t, "v_5", b.Volume[5], 26.7/99.9, 1e-12) // the file sums to 99.9 %
		if !strings.Contains(strings.Join(imp.Warnings, "|"), "normalised") {
			t.Errorf("no normalisation note: %q", imp.Warnings)
		}
		if len(imp.Preview) != PreviewRows || imp.Preview[0][0] != "Lower edge (µm)" || imp.Preview[1][2] != "0,4" {
			t.Errorf("preview %q", imp.Preview)
		}
	})
	t.Run("edges column, tab, number basis", func(t *testing.T) {
		imp := importFile(t, "bins_number_edges.tsv")
		if imp.Shape != ShapeBins || imp.Separator != "\t" || imp.Basis != BasisNumber || imp.Unit != "µm" {
			t.Errorf("detected %+v", imp)
		}
		b := imp.Binned
		if b.Len() != 5 {
			t.Fatalf("%d classes", b.Len())
		}
		near(t, "n_0 (2–4 µm)", b.Number[0], 0.125, 1e-12)
		near(t, "edge 5", b.Edges[5], 64e-6, 1e-12)
	})
	t.Run("cumulative, mm", func(t *testing.T) {
		imp := importFile(t, "cumulative_mm.csv")
		if imp.Shape != ShapeCumulative || imp.Unit != "mm" || imp.Separator != "," {
			t.Errorf("detected %+v", imp)
		}
		b := imp.Binned
		near(t, "edge 1", b.Edges[1], 20e-6, 1e-12)
		near(t, "v_2 (40–60 µm)", b.Volume[2], 0.206, 1e-12)
		// Dv50 lies in 60–80 µm: t = (0.5 − 0.352)/0.217, D⁴ interpolation.
		tt := (0.5 - 0.352) / 0.217
		near(t, "Dv50", b.VolumeQuantile(0.5), 60e-6*math.Pow(1+tt*(math.Pow(80.0/60, 4)-1), 0.25), 1e-9)
	})
	t.Run("raw list", func(t *testing.T) {
		imp := importFile(t, "raw_drops_um.csv")
		if imp.Shape != ShapeRaw || imp.RawCount != 3000 || imp.Rows != 3000 || imp.Unit != "µm" || imp.Raw == nil {
			t.Fatalf("detected %s count %d unit %q", imp.Shape, imp.RawCount, imp.Unit)
		}
		// The binned and exact statistics agree to the class resolution.
		s := imp.Binned.Summary()
		if math.Abs(s.D32/imp.Raw.D32-1) > 0.03 {
			t.Errorf("binned D32 %g vs exact %g", s.D32, imp.Raw.D32)
		}
	})
}

// Hand arithmetic (Mugele & Evans definitions on three drops of 1, 2, 3 µm):
// Σd = 6, Σd² = 14, Σd³ = 36, Σd⁴ = 98 → D10 = 2, D32 = 36/14, D43 = 98/36;
// cumulative volume 1/36, 9/36, 1 → Dv10 = 2, Dv50 = 3; Dn50 = 2 µm.
func TestRawMeansHandArithmetic(t *testing.T) {
	s := RawMeans([]float64{3 * um, 1 * um, 2 * um})
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"D10", s.D10, 2}, {"D20", s.D20, math.Sqrt(14.0 / 3)}, {"D30", s.D30, math.Cbrt(12)},
		{"D21", s.D21, 14.0 / 6}, {"D31", s.D31, math.Sqrt(6)},
		{"D32", s.D32, 36.0 / 14}, {"D43", s.D43, 98.0 / 36},
		{"Dv10", s.Dv10, 2}, {"Dv50", s.Dv50, 3}, {"Dv90", s.Dv90, 3}, {"Dn50", s.Dn50, 2},
	} {
		near(t, c.name, c.got/um, c.want, 1e-12)
	}
	if w := RawMeans([]float64{math.NaN(), 1e-6}).Warnings; len(w) == 0 {
		t.Error("a NaN drop must be reported")
	}
}

func TestImportCSVShapes(t *testing.T) {
	for _, c := range []struct {
		name, in string
		shape    Shape
		basis    Basis
		unit     string
		check    func(t *testing.T, imp *Import)
	}{
		{"no header, 3 columns", "10,20,40\n20,40,60\n", ShapeBins, BasisVolume, "µm", func(t *testing.T, imp *Import) {
			near(t, "v_0", imp.Binned.Volume[0], 0.4, 1e-12)
		}},
		{"no header, 2 columns", "10,0\n20,30\n40,100\n", ShapeCumulative, BasisVolume, "µm", nil},
		{"decimal comma single column with header", "d (mm)\n0,010\n0,020\n0,015\n", ShapeRaw, BasisVolume, "mm", func(t *testing.T, imp *Import) {
			near(t, "D10", imp.Raw.D10, 15e-6, 1e-12)
		}},
		{"counts", "lower (um),upper (um),count\n1,2,30\n2,4,50\n4,8,20\n", ShapeBins, BasisNumber, "µm", func(t *testing.T, imp *Import) {
			near(t, "n_1", imp.Binned.Number[1], 0.5, 1e-12)
		}},
		{"descending classes, CRLF, quotes", "\"From [m]\",\"To [m]\",\"Mass fraction\"\r\n4e-6,8e-6,0.2\r\n2e-6,4e-6,0.5\r\n1e-6,2e-6,0.3\r\n", ShapeBins, BasisVolume, "m", func(t *testing.T, imp *Import) {
			near(t, "edge 0", imp.Binned.Edges[0], 1e-6, 1e-12)
			near(t, "v_0", imp.Binned.Volume[0], 0.3, 1e-12)
		}},
		{"edges column, fractions on lower edge", "edge (um);vol %\n10;50\n20;50\n40;\n", ShapeBins, BasisVolume, "µm", nil},
		{"Latin-1 µ", "Diameter (\xb5m)\tCumulative %\n10\t0\n20\t50\n40\t100\n", ShapeCumulative, BasisVolume, "µm", nil},
		{"cumulative not starting at 0", "size (um),cum %\n10,5\n20,50\n40,100\n", ShapeCumulative, BasisVolume, "µm", func(t *testing.T, imp *Import) {
			near(t, "v_0", imp.Binned.Volume[0], 0.5, 1e-12)
			if len(imp.Warnings) == 0 {
				t.Error("no warning for volume below the first diameter")
			}
		}},
	} {
		t.Run(c.name, func(t *testing.T) {
			imp, err := ImportCSV(strings.NewReader(c.in), 1<<16)
			if err != nil {
				t.Fatal(err)
			}
			if imp.Shape != c.shape || imp.Basis != c.basis || imp.Unit != c.unit {
				t.Errorf("got %s %s %q, want %s %s %q", imp.Shape, imp.Basis, imp.Unit, c.shape, c.basis, c.unit)
			}
			if c.check != nil {
				c.check(t, imp)
			}
		})
	}
}

func TestImportCSVErrors(t *testing.T) {
	for _, c := range []struct {
		name, in, want string
	}{
		{"empty", "", "empty"},
		{"only BOM and comments", "\xef\xbb\xbf# nothing\n\n", "empty"},
		{"single bin", "lower (um),upper (um),vol %\n10,20,100\n", "single class"},
		{"non-monotonic edges", "edge (um),vol %\n10,\n30,50\n20,50\n", "not monotonic"},
		{"non-contiguous", "lower (um),upper (um),vol %\n10,20,50\n25,40,50\n", "line 3"},
		{"negative fraction", "lower (um),upper (um),vol %\n10,20,110\n20,40,-10\n", "line 3: fraction -10 is negative"},
		{"non-numeric fraction", "lower (um),upper (um),vol %\n10,20,abc\n20,40,50\n", "line 2"},
		{"sum 90", "lower (um),upper (um),vol %\n10,20,40\n20,40,50\n", "expected 100"},
		{"unknown unit", "diameter (in)\n1\n2\n", `unknown diameter unit "in"`},
		{"raw non-numeric", "d (um)\n1\n2\nx\n", "line 4"},
		{"raw negative", "d (um)\n1\n-2\n", "line 3"},
		{"raw NaN", "d (um)\n1\nNaN\n", "line 3"},
		{"raw single drop", "d (um)\n12\n", "at least 2"},
		{"cumulative falls", "d (um),cum %\n10,0\n20,60\n30,50\n40,100\n", "line 4"},
		{"oversize", "d (um),oversize %\n10,100\n20,0\n", "undersize"},
		{"ragged", "1,2\n1;2\n1\t2\n", "separator"},
		{"unknown layout", "alpha,beta\n1,2\n", "layout"},
		{"4 columns no header", "1,2,3,4\n", "no header"},
	} {
		t.Run(c.name, func(t *testing.T) {
			imp, err := ImportCSV(strings.NewReader(c.in), 1<<16)
			if imp != nil || err == nil {
				t.Fatalf("got %+v, want an error", imp)
			}
			var fe *valid.FieldError
			if !errors.As(err, &fe) || fe.Field != "file" {
				t.Fatalf("error %v is not a file field error", err)
			}
			if !strings.Contains(err.Error(), c.want) {
				t.Errorf("error %q lacks %q", err, c.want)
			}
		})
	}
	t.Run("over maxBytes", func(t *testing.T) {
		_, err := ImportCSV(bytes.NewReader(make([]byte, 101)), 100)
		if err == nil || !strings.Contains(err.Error(), "larger than the limit of 100 bytes") {
			t.Errorf("got %v", err)
		}
	})
}
