package fuel

import (
	"strings"
	"testing"
)

func TestParseFormula(t *testing.T) {
	for _, c := range []struct {
		in      string
		want    Formula
		wantErr string
	}{
		{"C11.2H21.9", Formula{C: 11.2, H: 21.9}, ""},
		{"C12H23O0.05", Formula{C: 12, H: 23, O: 0.05}, ""},
		{"H4C", Formula{C: 1, H: 4}, ""},
		{" C7H16 ", Formula{C: 7, H: 16}, ""},
		{"", Formula{}, "empty"},
		{"C11H22N0.1", Formula{}, "only the elements C, H and O"},
		{"c11h22", Formula{}, "capital letters"},
		{"C11H22C1", Formula{}, "appears twice"},
		{"C1.2.3H4", Formula{}, "not a non-negative number"},
		{"H2", Formula{}, "needs carbon"},
		{"C2", Formula{}, "needs hydrogen"},
		{"CH4O4", Formula{}, "not a fuel"},
	} {
		got, err := ParseFormula(c.in)
		if c.wantErr != "" {
			if err == nil || !strings.Contains(err.Error(), c.wantErr) {
				t.Errorf("ParseFormula(%q) error = %v, want one containing %q", c.in, err, c.wantErr)
			}
			continue
		}
		if err != nil || got != c.want {
			t.Errorf("ParseFormula(%q) = %+v, %v; want %+v", c.in, got, err, c.want)
		}
	}
}

func TestFormulaFromRatios(t *testing.T) {
	// Round trip: the ratios and molar mass of C11.2H21.9O0.1 give it back.
	want := Formula{C: 11.2, H: 21.9, O: 0.1}
	got, err := FormulaFromRatios(want.HToC(), want.O/want.C, want.MolarMass())
	if err != nil {
		t.Fatal(err)
	}
	if relErr(got.C, want.C) > 1e-14 || relErr(got.H, want.H) > 1e-14 || relErr(got.O, want.O) > 1e-14 {
		t.Errorf("FormulaFromRatios = %+v, want %+v", got, want)
	}
	// n-dodecane, C12H26: 170.34 g/mol (IUPAC 2021 standard atomic weights:
	// 12 x 12.011 + 26 x 1.008 = 170.340).
	if w := (Formula{C: 12, H: 26}).MolarMass(); relErr(w, 0.170340) > 1e-12 {
		t.Errorf("molar mass of C12H26 = %.8g kg/mol, want 0.170340", w)
	}
	for _, bad := range [][3]float64{{0, 0, 0.15}, {2, -0.1, 0.15}, {2, 0, 0}} {
		if _, err := FormulaFromRatios(bad[0], bad[1], bad[2]); err == nil {
			t.Errorf("FormulaFromRatios(%v) accepted", bad)
		}
	}
}

func TestFormulaString(t *testing.T) {
	for _, c := range []struct {
		f    Formula
		want string
	}{
		{Formula{C: 11.2, H: 21.9}, "C11.2H21.9"},
		{Formula{C: 1, H: 4}, "CH4"},
		{Formula{C: 12, H: 23, O: 0.05}, "C12H23O0.05"},
	} {
		if got := c.f.String(); got != c.want {
			t.Errorf("%+v.String() = %q, want %q", c.f, got, c.want)
		}
	}
}
