package keyblock

import (
	"errors"
	"math"
	"strings"
	"testing"

	"flame1d/chem"
	"flame1d/thermo"
)

func errorCount(ps []chem.Problem) int {
	n := 0
	for _, p := range ps {
		if !p.Warning {
			n++
		}
	}
	return n
}

// readSharedThermo reads the thermo file of a shared set; it fails the test
// on any error.
func readSharedThermo(t *testing.T, set string) ([]ThermoRecord, []chem.Problem) {
	t.Helper()
	f, path := openShared(t, set, "thermo.dat")
	recs, probs, err := ReadThermo(f, path)
	if err != nil {
		t.Fatal(err)
	}
	return recs, probs
}

func findRecord(recs []ThermoRecord, name string) *ThermoRecord {
	for i := range recs {
		if strings.EqualFold(recs[i].Name, name) {
			return &recs[i]
		}
	}
	return nil
}

// TestReadThermoSharedSets reads every published thermo file and checks the
// record counts stated in each set's PROVENANCE.md.
func TestReadThermoSharedSets(t *testing.T) {
	tests := []struct {
		set, file string
		records   int // distinct names
		warnings  int // at least this many warnings
		check     string
	}{
		{"gri30", "thermo.dat", 53, 0, "CH2(S)"},
		{"h2o2", "thermo.dat", 13, 0, "HO2"},
		{"c0c4", "thermo.dat", 114, 0, "C4H8-1"},
		// 366 records, IIC4H7Q2-T twice (PROVENANCE.md): one warning.
		{"c0c4-aramco13", "thermo.dat", 365, 1, "OH*"},
		// 574 four-line records (counted by their column-80 markers), one
		// name (ch3chcoch3) twice.
		{"nheptane-sk68", "thermo.dat", 573, 1, "nc7h16"},
		{"thermo-extra", "thermo.dat", 15, 0, "CSOLID"},
	}
	for _, tc := range tests {
		t.Run(tc.set, func(t *testing.T) {
			f, path := openShared(t, tc.set, tc.file)
			recs, probs, err := ReadThermo(f, path)
			if err != nil {
				t.Fatalf("ReadThermo: %v", err)
			}
			if len(recs) != tc.records {
				t.Errorf("%d records, want %d", len(recs), tc.records)
			}
			if len(probs) < tc.warnings {
				t.Errorf("%d warnings, want at least %d: %v", len(probs), tc.warnings, probs)
			}
			if findRecord(recs, tc.check) == nil {
				t.Errorf("species %q not read", tc.check)
			}
			for _, r := range recs {
				if r.Origin.Line == 0 || r.Origin.File != path {
					t.Fatalf("record %s has no origin: %+v", r.Name, r.Origin)
				}
			}
		})
	}
}

// TestThermoAgainstJANAF evaluates polynomials read from the GRI-Mech 3.0
// thermo file against JANAF values. The NASA fits reproduce the tables to
// about 0.1 % in cp and s and 0.1 kJ/mol in h; the tolerances below are
// 0.5 % and 0.3 kJ/mol, still far tighter than any column mis-read.
func TestThermoAgainstJANAF(t *testing.T) {
	recs, _ := readSharedThermo(t, "gri30")
	const R = thermo.GasConstant
	tests := []struct {
		species  string
		T        float64
		quantity string  // "cp" J/(mol K), "s" J/(mol K), "h" kJ/mol
		want     float64 // JANAF Thermochemical Tables, 4th ed. (Chase 1998), from memory
	}{
		{"N2", 1000, "cp", 32.698},
		{"O2", 1000, "cp", 34.870},
		{"H2O", 1000, "cp", 41.268},
		{"CO2", 1000, "cp", 54.308},
		{"O2", 298.15, "s", 205.147},
		{"N2", 298.15, "s", 191.609},
		{"H2O", 298.15, "s", 188.834},
		{"CO2", 298.15, "s", 213.795},
		{"H2", 298.15, "s", 130.680},
		// Enthalpy of formation at 298.15 K equals the absolute enthalpy of
		// the polynomials (elements in their reference state have h = 0).
		{"H2O", 298.15, "h", -241.826},
		{"CO2", 298.15, "h", -393.522},
		{"CO", 298.15, "h", -110.527},
		{"CH4", 298.15, "h", -74.873},
		{"N2", 298.15, "h", 0},
	}
	for _, tc := range tests {
		r := findRecord(recs, tc.species)
		if r == nil {
			t.Fatalf("%s missing", tc.species)
		}
		var got, tol float64
		switch tc.quantity {
		case "cp":
			got, tol = R*r.Thermo.CpR(tc.T), 0.005*tc.want
		case "s":
			got, tol = R*r.Thermo.SR(tc.T), 0.005*tc.want
		case "h":
			got, tol = R*tc.T*r.Thermo.HRT(tc.T)/1e3, 0.3
		}
		if math.Abs(got-tc.want) > tol {
			t.Errorf("%s %s(%g K) = %.3f, JANAF %.3f (tol %.3f)", tc.species, tc.quantity, tc.T, got, tc.want, tol)
		}
	}
}

// TestThermoColumnQuirks checks per-record fields that real files write in
// unusual ways (see each set's PROVENANCE.md).
func TestThermoColumnQuirks(t *testing.T) {
	t.Run("gri30 per-species T mid", func(t *testing.T) {
		recs, _ := readSharedThermo(t, "gri30")
		// gri30/PROVENANCE.md: HCNO, HOCN, HNCO have T mid 1382, 1368, 1478 K.
		for name, tmid := range map[string]float64{"HCNO": 1382, "HOCN": 1368, "HNCO": 1478, "O": 1000} {
			if r := findRecord(recs, name); r == nil || r.Thermo.TMid != tmid {
				t.Errorf("%s T mid = %v, want %g", name, r, tmid)
			}
		}
		if r := findRecord(recs, "C3H8"); r == nil || r.Composition["C"] != 3 || r.Composition["H"] != 8 || len(r.Composition) != 2 {
			t.Errorf("C3H8 composition %v", r)
		}
	})
	t.Run("nheptane T mid spilling into column 74", func(t *testing.T) {
		recs, _ := readSharedThermo(t, "nheptane-sk68")
		// Line "oh  ... 300.000  5000.000 1357.000    01" of the file.
		if r := findRecord(recs, "oh"); r == nil || r.Thermo.TMid != 1357 || r.Composition["O"] != 1 || r.Composition["H"] != 1 {
			t.Errorf("oh: %+v", r)
		}
		// Explicit zero counts ("o   0    0    0") are dropped.
		if r := findRecord(recs, "h"); r == nil || len(r.Composition) != 1 {
			t.Errorf("h composition: %+v", r)
		}
	})
	t.Run("aramco duplicate and 15th field", func(t *testing.T) {
		recs, probs := readSharedThermo(t, "c0c4-aramco13")
		r := findRecord(recs, "IIC4H7Q2-T")
		if r == nil {
			t.Fatal("IIC4H7Q2-T missing")
		}
		// PROVENANCE.md: first entry S298 = 490 J/(mol K), second 348.
		if s := thermo.GasConstant * r.Thermo.SR(298.15); math.Abs(s-490) > 5 {
			t.Errorf("IIC4H7Q2-T S298 = %.1f J/(mol K), want the first record's 490", s)
		}
		warned := false
		for _, p := range probs {
			warned = warned || (p.Warning && strings.Contains(p.Message, "IIC4H7Q2-T") && p.Pos.Line == 963)
		}
		if !warned {
			t.Errorf("no warning at line 963 for the repeated IIC4H7Q2-T: %v", probs)
		}
		// CC3H4 line 4 carries "0.3332728 E+05" in columns 61-75 (ignored);
		// a7 low is the 14th coefficient, 0.22729762E+02.
		c := findRecord(recs, "CC3H4")
		if c == nil || c.Thermo.Low[6] != 0.22729762e+02 || c.Thermo.Low[5] != 0.32334137e+05 {
			t.Errorf("CC3H4 low coefficients %+v", c)
		}
	})
	t.Run("thermo-extra graphite", func(t *testing.T) {
		recs, _ := readSharedThermo(t, "thermo-extra")
		r := findRecord(recs, "CSOLID")
		if r == nil || len(r.Composition) != 1 || r.Composition["C"] != 1 {
			t.Fatalf("CSOLID: %+v", r)
		}
		// Graphite S298 = 5.74 J/(mol K), JANAF 4th ed. (Chase 1998), from
		// memory; PROVENANCE.md reports 5.71 from these polynomials.
		if s := thermo.GasConstant * r.Thermo.SR(298.15); math.Abs(s-5.74) > 0.1 {
			t.Errorf("CSOLID S298 = %.3f J/(mol K)", s)
		}
		if r.Thermo.TMid != 1500 {
			t.Errorf("CSOLID T mid %g, want 1500", r.Thermo.TMid)
		}
	})
}

// h2o block with a default-temperature line, lower-case keywords and a
// record whose temperature fields are blank (defaults used).
const goodThermo = `thermo all
   300.000  1000.000  5000.000
! a comment line
H2O               L 8/89H   2O   1          G   200.000  3500.000  1000.000    1
 3.03399249E+00 2.17691804E-03-1.64072518E-07-9.70419870E-11 1.68200992E-14    2
-3.00042971E+04 4.96677010E+00 4.19864056E+00-2.03643410E-03 6.52040211E-06    3
-5.48797062E-09 1.77197817E-12-3.02937267E+04-8.49032208E-01                   4
XE2               test  XE  2               G                                  1
 2.50000000E+00 0.00000000E+00 0.00000000E+00 0.00000000E+00 0.00000000E+00    2
-7.45375000E+02 6.16441993E+00 2.50000000E+00 0.00000000E+00 0.00000000E+00    3
 0.00000000E+00 0.00000000E+00-7.45375000E+02 6.16441993E+00                   4
AB5               test  C   1H   1          G   300.000  5000.000 1000.00AR  1    1
 2.50000000E+00 0.00000000E+00 0.00000000E+00 0.00000000E+00 0.00000000E+00    2
-7.45375000E+02 6.16441993E+00 2.50000000E+00 0.00000000E+00 0.00000000E+00    3
 0.00000000E+00 0.00000000E+00-7.45375000E+02 6.16441993E+00                   4
end
`

func TestReadThermoFormat(t *testing.T) {
	recs, probs, err := ReadThermo(strings.NewReader(goodThermo), "t.dat")
	if err != nil || len(recs) != 3 {
		t.Fatalf("err %v, %d records, problems %v", err, len(recs), probs)
	}
	h2o := recs[0]
	if h2o.Name != "H2O" || h2o.Origin.Line != 4 || h2o.Thermo.High[0] != 3.03399249 || h2o.Thermo.Low[0] != 4.19864056 ||
		h2o.Thermo.Low[6] != -8.49032208e-01 || h2o.Thermo.TLow != 200 || h2o.Thermo.THigh != 3500 {
		t.Errorf("H2O record: %+v", h2o)
	}
	xe := recs[1]
	if xe.Thermo.TLow != 300 || xe.Thermo.TMid != 1000 || xe.Thermo.THigh != 5000 || xe.Composition["XE"] != 2 {
		t.Errorf("blank temperatures not defaulted: %+v", xe)
	}
	if ab := recs[2]; ab.Composition["AR"] != 1 || len(ab.Composition) != 3 {
		t.Errorf("fifth element field (cols 74-78) not read: %v", ab.Composition)
	}
}

// TestReadThermoBroken feeds defective records; each must produce the named
// error at the right line, never a panic.
func TestReadThermoBroken(t *testing.T) {
	rec := func(name string, l1tail string, c [4]string) string {
		return name + strings.Repeat(" ", 24-len(name)) + l1tail + "\n" + c[1] + "\n" + c[2] + "\n" + c[3] + "\n"
	}
	ok := [4]string{"",
		" 2.50000000E+00 0.00000000E+00 0.00000000E+00 0.00000000E+00 0.00000000E+00    2",
		"-7.45375000E+02 4.36600000E+00 2.50000000E+00 0.00000000E+00 0.00000000E+00    3",
		" 0.00000000E+00 0.00000000E+00-7.45375000E+02 4.36600000E+00                   4"}
	l1 := "AR  1               G   300.000  5000.000  1000.000    1"
	bad := ok
	bad[2] = "-7.45375000E+02 4.366000X0E+00 2.50000000E+00 0.00000000E+00 0.00000000E+00    3"
	tests := []struct {
		name  string
		input string
		line  int
		want  string // substring of an error message
	}{
		{"truncated record", "THERMO\n" + "AR" + strings.Repeat(" ", 22) + l1 + "\n" + ok[1] + "\n" + rec("AR2", l1, ok) + "END\n",
			2, "truncated thermo record \"AR\""},
		{"truncated at EOF", "THERMO\n" + rec("AR", l1, ok) + "AR3" + strings.Repeat(" ", 21) + l1 + "\n" + ok[1] + "\n",
			6, "truncated thermo record \"AR3\""},
		{"bad number", "THERMO\n" + rec("AR", l1, bad) + "END\n", 4, `bad coefficient 7 "4.366000X0E+00"`},
		{"NaN is not a number", "THERMO\n" + rec("AR", l1, [4]string{"", ok[1], strings.Replace(ok[2], "4.36600000E+00", "           NaN", 1), ok[3]}) + "END\n",
			4, `"NaN"`},
		{"no elements", "THERMO\n" + rec("X", "                    G   300.000  5000.000  1000.000    1", ok) + "END\n",
			2, "lists no elements"},
		{"bad element count", "THERMO\n" + rec("X", "AR  x               G   300.000  5000.000  1000.000    1", ok) + "END\n",
			2, `bad element count "x"`},
		{"blank temperature without default", "THERMO\n" + rec("X", "AR  1               G                                  1", ok) + "END\n",
			2, "low temperature field is blank"},
		{"unordered temperatures", "THERMO\n" + rec("X", "AR  1               G  5000.000   300.000  1000.000    1", ok) + "END\n",
			2, "not ordered"},
		{"empty file", "", 0, "no thermo records"},
		{"garbage", "THERMO\nthis is not a thermo file\nEND\n", 2, "truncated thermo record"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, probs, err := ReadThermo(strings.NewReader(tc.input), "bad.dat")
			var verr *chem.ValidationError
			if !errors.As(err, &verr) {
				t.Fatalf("err = %v, want a *chem.ValidationError; problems %v", err, probs)
			}
			found := false
			for _, p := range probs {
				if !p.Warning && strings.Contains(p.Message, tc.want) && p.Pos.Line == tc.line && p.Pos.File == "bad.dat" {
					found = true
				}
			}
			if !found {
				t.Errorf("no error containing %q at bad.dat:%d; got %v", tc.want, tc.line, probs)
			}
		})
	}
}

func TestReadThermoWarnings(t *testing.T) {
	tests := []struct {
		name, input, want string
	}{
		{"missing END", strings.TrimSuffix(goodThermo, "end\n"), "no END line"},
		{"no header", goodThermo[strings.Index(goodThermo, "H2O "):strings.Index(goodThermo, "XE2")], "no THERMO header"},
		{"tabs", strings.Replace(goodThermo, "H2O               L 8/89", "H2O\t\t  L 8/89", 1), "TAB"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			recs, probs, err := ReadThermo(strings.NewReader(tc.input), "w.dat")
			if err != nil || len(recs) == 0 {
				t.Fatalf("err %v, %d records", err, len(recs))
			}
			found := false
			for _, p := range probs {
				found = found || (p.Warning && strings.Contains(p.Message, tc.want))
			}
			if !found {
				t.Errorf("no warning %q in %v", tc.want, probs)
			}
		})
	}
}

func FuzzReadThermo(f *testing.F) {
	f.Add(goodThermo)
	f.Add("THERMO\nAR                      AR  1               G   300.000  5000.000  1000.000    1\n")
	f.Add("THERMO ALL\n300 1000 5000\nEND\n")
	f.Add("\t\t!\n")
	f.Fuzz(func(t *testing.T, s string) {
		recs, probs, err := ReadThermo(strings.NewReader(s), "fuzz.dat")
		if err == nil && errorCount(probs) > 0 {
			t.Fatalf("error problems without an error: %v", probs)
		}
		for _, r := range recs {
			for _, c := range append(r.Thermo.Low[:], r.Thermo.High[:]...) {
				if math.IsNaN(c) || math.IsInf(c, 0) {
					t.Fatalf("non-finite coefficient in %s", r.Name)
				}
			}
		}
	})
}
