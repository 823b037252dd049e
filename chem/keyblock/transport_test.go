package keyblock

import (
	"errors"
	"strings"
	"testing"

	"flame1d/chem"
)

// TestReadTransportSharedSets reads the published transport files; counts
// from each set's PROVENANCE.md, values from the file text.
func TestReadTransportSharedSets(t *testing.T) {
	tests := []struct {
		set     string
		entries int
		name    string
		want    chem.TransportParams // SI
	}{
		// gri30/transport.dat line 94: "N2 1 97.530 3.621 0.000 1.760 4.000".
		{"gri30", 110, "N2", chem.TransportParams{Geometry: chem.Linear, WellDepth: 97.53, Diameter: 3.621e-10, Polarizability: 1.76e-30, RotRelaxation: 4}},
		// c0c4/transport.dat line 88: "RALD3<TAB><TAB>  2 411.000 4.820 0.000 0.000 1.000"; lines end in "!".
		{"c0c4", 114, "RALD3", chem.TransportParams{Geometry: chem.Nonlinear, WellDepth: 411, Diameter: 4.82e-10, RotRelaxation: 1}},
		{"h2o2", 13, "AR", chem.TransportParams{Geometry: chem.Atom, WellDepth: 136.5, Diameter: 3.33e-10}},
		{"thermo-extra", 15, "CSOLID", chem.TransportParams{}},
		{"nheptane-sk68", 68, "nc7h16", chem.TransportParams{}},
	}
	for _, tc := range tests {
		t.Run(tc.set, func(t *testing.T) {
			f, path := openShared(t, tc.set, "transport.dat")
			tr, probs, err := ReadTransport(f, path)
			if err != nil {
				t.Fatalf("%v", err)
			}
			if len(tr) != tc.entries {
				t.Errorf("%d entries, want %d (problems %v)", len(tr), tc.entries, probs)
			}
			got, ok := tr[tc.name]
			if !ok {
				t.Fatalf("%s missing", tc.name)
			}
			if tc.want.WellDepth == 0 {
				return
			}
			if got.Geometry != tc.want.Geometry || got.WellDepth != tc.want.WellDepth || !closeTo(got.Diameter, tc.want.Diameter, 1e-12) ||
				!closeTo(got.Polarizability, tc.want.Polarizability, 1e-12) || got.RotRelaxation != tc.want.RotRelaxation || got.Dipole != 0 {
				t.Errorf("%s = %+v, want %+v", tc.name, got, tc.want)
			}
		})
	}
	t.Run("aramco database line with geometry 3", func(t *testing.T) {
		// c0c4-aramco13/transport.dat line 955: "NC4H9COCH2 3 534.323 ...", a
		// species not in the mechanism; on its own the file is in error there.
		f, path := openShared(t, "c0c4-aramco13", "transport.dat")
		tr, probs, err := ReadTransport(f, path)
		if err == nil || errorCount(probs) != 1 || probs[0].Pos.Line != 955 || !strings.Contains(probs[0].Message, `geometry "3"`) {
			t.Fatalf("err %v problems %v", err, probs)
		}
		if len(tr) != 1649-1 {
			t.Errorf("%d entries, want 1648", len(tr))
		}
	})
}

func TestReadTransportBroken(t *testing.T) {
	tests := []struct {
		name, text string
		line       int
		want       string
		warning    bool
	}{
		{"short line", "H2 1 38.0 2.92 0.0 0.79\n", 1, "has 6 fields, expected 7", false},
		{"bad number", "! c\nH2 1 38.0 2,92 0.0 0.79 280\n", 2, `bad sigma "2,92"`, false},
		{"negative diameter", "H2 1 38.0 -2.92 0.0 0.79 280\n", 1, "must be positive", false},
		{"geometry", "H2 1.5 38.0 2.92 0.0 0.79 280\n", 1, `geometry "1.5"`, false},
		{"repeat with other values", "H2 1 38.0 2.92 0.0 0.79 280\nH2 1 40.0 2.92 0.0 0.79 280\n", 2, "first line (1) is used", true},
		{"extra fields", "H2 1 38.0 2.92 0.0 0.79 280 99\n", 1, "extra field", true},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			tr, probs, err := ReadTransport(strings.NewReader(tc.text), "t.tran")
			var verr *chem.ValidationError
			if !tc.warning && !errors.As(err, &verr) {
				t.Fatalf("err %v, want a *chem.ValidationError", err)
			}
			if tc.warning && (err != nil || tr["H2"].WellDepth != 38) {
				t.Fatalf("err %v, H2 %+v", err, tr["H2"])
			}
			for _, p := range probs {
				if p.Warning == tc.warning && p.Pos.Line == tc.line && strings.Contains(p.Message, tc.want) {
					return
				}
			}
			t.Errorf("no problem %q at line %d: %v", tc.want, tc.line, probs)
		})
	}
}
