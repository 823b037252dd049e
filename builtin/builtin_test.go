package builtin

import (
	"bytes"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"flame1d/chem"
	"flame1d/chem/mechtoml"
)

func TestNames(t *testing.T) {
	want := []string{"burke2012-hydrogen", "lu2009-heptane", "ranzi2012-c1c3", "smith1999-natgas"}
	if got := Names(); !reflect.DeepEqual(got, want) {
		t.Fatalf("Names() = %v, want %v", got, want)
	}
}

// TestCounts: each built-in loads, validates, and has the size its
// authors publish (GRI-Mech 3.0 release notes, Smith et al. 1999: 53
// species, 325 reactions; Burke et al. 2012: 13 species, 27 reactions in
// the posted file; Lu et al. 2009: 68 species, 283 reactions; CRECK
// C1-C3 HT, c0c4/PROVENANCE.md: 114 species, 1999 reactions).
func TestCounts(t *testing.T) {
	cases := []struct {
		name                string
		elements            []string
		species, reactions  int
		citation, converted string
	}{
		{"smith1999-natgas", []string{"O", "H", "C", "N", "AR"}, 53, 325, "GRI-Mech 3.0", "converted by flame1d mech import"},
		{"burke2012-hydrogen", []string{"H", "O", "N", "AR", "HE", "C"}, 13, 27, "Burke, M. Chaos, Y. Ju, F. L. Dryer, S. J. Klippenstein", "converted by flame1d mech import"},
		{"lu2009-heptane", []string{"H", "C", "O", "N"}, 68, 283, "Combustion and Flame 156 (2009) 1542", "converted by flame1d mech import"},
		{"ranzi2012-c1c3", []string{"C", "H", "O", "N", "HE", "AR"}, 114, 1999, "Progress in Energy and Combustion Science 38 (2012) 468", "converted by flame1d mech import"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			m, err := Mechanism(c.name)
			if err != nil {
				t.Fatal(err)
			}
			if problems, err := m.Validate(); err != nil {
				t.Fatalf("does not validate: %v %v", err, problems)
			}
			if len(m.Species) != c.species || len(m.Reactions) != c.reactions {
				t.Errorf("%d species, %d reactions; want %d, %d", len(m.Species), len(m.Reactions), c.species, c.reactions)
			}
			if !reflect.DeepEqual(upper(m.Elements), c.elements) {
				t.Errorf("elements %v, want %v", m.Elements, c.elements)
			}
			if m.Name != c.name || !strings.Contains(m.Description, c.citation) ||
				!strings.Contains(strings.ToLower(m.Description), c.converted) || !strings.Contains(m.Description, "commit ") {
				t.Errorf("name %q / description lacks the citation:\n%s", m.Name, m.Description)
			}
			for i := range m.Species {
				if m.Species[i].Transport == nil {
					t.Errorf("species %s has no transport data", m.Species[i].Name)
				}
			}
			if o := m.Reactions[0].Origin; o.File != "builtin/mechanisms/"+c.name+".toml" || o.Line <= 0 {
				t.Errorf("reaction 1 origin %+v", o)
			}
		})
	}
}

func upper(s []string) []string {
	out := make([]string, len(s))
	for i, e := range s {
		out[i] = strings.ToUpper(e)
	}
	return out
}

// TestRoundTrip: every built-in comes back bit for bit through Write/Read.
func TestRoundTrip(t *testing.T) {
	for _, name := range Names() {
		m, err := Mechanism(name)
		if err != nil {
			t.Fatal(err)
		}
		var buf bytes.Buffer
		if err := mechtoml.Write(&buf, m); err != nil {
			t.Fatal(err)
		}
		back, _, err := mechtoml.Read(&buf, name)
		if err != nil {
			t.Fatal(err)
		}
		if d := mechtoml.Diff(m, back); d != "" {
			t.Errorf("%s: round trip changed %s", name, d)
		}
		// The embedded text is exactly what the writer makes of it.
		embedded, _ := files.ReadFile(fileOf(name))
		var again bytes.Buffer
		if err := mechtoml.Write(&again, back); err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(embedded, again.Bytes()) {
			t.Errorf("%s: rewriting the built-in gives different text (regenerate with -update)", name)
		}
	}
}

// TestPublishedValues spot-checks numbers against the published files,
// independently of the importer: converted by hand with 1 cal = 4.184 J,
// 1 cm^3 = 1e-6 m^3, 1 Å = 1e-10 m, 1 D = 3.33564e-30 C m.
func TestPublishedValues(t *testing.T) {
	rel := func(a, b float64) float64 { return math.Abs(a-b) / math.Abs(b) }
	const tol = 1e-14 // unit conversion only: a few ulps
	find := func(m *chem.Mechanism, eq string) *chem.Reaction {
		for i := range m.Reactions {
			if m.Reactions[i].Equation == eq {
				return &m.Reactions[i]
			}
		}
		t.Fatalf("%s: no reaction %q", m.Name, eq)
		return nil
	}
	gri, err := Mechanism("smith1999-natgas")
	if err != nil {
		t.Fatal(err)
	}
	// GRI-Mech 3.0 grimech30.dat, reaction 3: O+H2<=>H+OH 3.870E+04 2.700 6260.00.
	r := find(gri, "O+H2<=>H+OH")
	if r.Form != chem.Elementary || rel(r.Rate.A, 3.87e4*1e-6) > tol || r.Rate.B != 2.7 || rel(r.Rate.E, 6260*4.184) > tol {
		t.Errorf("O+H2<=>H+OH = %+v", r.Rate)
	}
	// Reaction 52: H+CH3(+M)<=>CH4(+M) 13.90E+15 -0.534 536; LOW 2.62E+33 -4.76 2440;
	// TROE 0.783 74 2941 6964; H2O/6.
	r = find(gri, "H+CH3(+M)<=>CH4(+M)")
	f := r.FalloffRate
	if r.Form != chem.Falloff || rel(f.High.A, 13.9e15*1e-6) > tol || rel(f.Low.A, 2.62e33*1e-12) > tol || f.Low.B != -4.76 ||
		f.Troe == nil || *f.Troe != (chem.Troe{A: 0.783, T3: 74, T1: 2941, T2: 6964, HasT2: true}) ||
		r.ThirdBody.Efficiencies[gri.SpeciesIndex("H2O")] != 6 {
		t.Errorf("H+CH3(+M)<=>CH4(+M) = %+v %+v", *f, r.ThirdBody)
	}
	// GRI-Mech 3.0 transport.dat: H2O 2 572.400 2.605 1.844 0.000 4.000.
	h2o := gri.Species[gri.SpeciesIndex("H2O")].Transport
	if h2o.Geometry != chem.Nonlinear || h2o.WellDepth != 572.4 || rel(h2o.Diameter, 2.605e-10) > tol ||
		rel(h2o.Dipole, 1.844*3.33564e-30) > 2e-6 || h2o.Polarizability != 0 || h2o.RotRelaxation != 4 {
		t.Errorf("H2O transport = %+v", *h2o)
	}
	// thermo30.dat, CH4: 200-3500 K, switch 1000 K, a1 (low) 5.14987613.
	ch4 := gri.Species[gri.SpeciesIndex("CH4")].Thermo
	if ch4.TLow != 200 || ch4.TMid != 1000 || ch4.THigh != 3500 || ch4.Low[0] != 5.14987613 || ch4.High[0] != 0.074851495 {
		t.Errorf("CH4 thermo = %+v", ch4)
	}

	hep, err := Mechanism("lu2009-heptane")
	if err != nil {
		t.Fatal(err)
	}
	// Lu et al. sk68 mech.inp: nc7h16 = h + c7h15 1.625E+88 -21.01 ... (the
	// large-A, strongly negative-b step the provenance notes point out).
	found := false
	for i := range hep.Reactions {
		r := &hep.Reactions[i]
		if r.Form == chem.Elementary && r.Rate.B == -21.01 && rel(r.Rate.A, 1.625e88) < tol {
			found = true
		}
	}
	if !found {
		t.Error("lu2009-heptane: no step with A = 1.625e88 /s, b = -21.01")
	}
}

// TestLoad: names, .toml paths, and the two ways a user gets it wrong.
func TestLoad(t *testing.T) {
	if m, err := Load("burke2012-hydrogen"); err != nil || m.Name != "burke2012-hydrogen" {
		t.Fatalf("Load(burke2012-hydrogen) = %v, %v", m, err)
	}
	dir := t.TempDir()
	h2, _ := Mechanism("burke2012-hydrogen")
	path := filepath.Join(dir, "my-h2.toml")
	if err := mechtoml.WriteFile(path, h2); err != nil {
		t.Fatal(err)
	}
	m, err := Load(path)
	if err != nil {
		t.Fatal(err)
	}
	if d := mechtoml.Diff(h2, m); d != "" {
		t.Errorf("Load(path) differs from the file written: %s", d)
	}
	if m.Reactions[0].Origin.File != path {
		t.Errorf("origin %+v, want the file path", m.Reactions[0].Origin)
	}

	kbFile := filepath.Join(dir, "site-a.inp")
	os.WriteFile(kbFile, []byte("! my mechanism\nELEMENTS\nH O\nEND\nSPECIES H2 O2 END\n"), 0o644)
	broken := filepath.Join(dir, "broken.toml")
	os.WriteFile(broken, []byte("format_version = 1\nelements = [\"H\"]\nspecies = 3\n"), 0o644)
	cases := []struct {
		arg  string
		want []string
	}{
		{kbFile, []string{"keyword-block format", "flame1d mech import"}},
		{"gri31", []string{`"gri31" is neither a built-in mechanism`, "burke2012-hydrogen, lu2009-heptane, ranzi2012-c1c3, smith1999-natgas"}},
		{filepath.Join(dir, "missing.toml"), []string{"does not exist", "burke2012-hydrogen, lu2009-heptane, ranzi2012-c1c3, smith1999-natgas"}},
		{dir, []string{"is a directory"}},
		{broken, []string{broken + ":3:", "species must be an array of tables"}},
	}
	for _, c := range cases {
		_, err := Load(c.arg)
		if err == nil {
			t.Errorf("Load(%q) succeeded", c.arg)
			continue
		}
		for _, w := range c.want {
			if !strings.Contains(err.Error(), w) {
				t.Errorf("Load(%q) error %q lacks %q", c.arg, err, w)
			}
		}
	}
	if _, err := Mechanism("nope"); err == nil || !strings.Contains(err.Error(), "smith1999-natgas") {
		t.Errorf("Mechanism(nope) error %v should list the built-in names", err)
	}
}

// TestCallsIndependent: each call returns a mechanism of its own (no shared
// state between callers).
func TestCallsIndependent(t *testing.T) {
	a, _ := Mechanism("burke2012-hydrogen")
	a.Species[0].Thermo.Low[0] = 99
	a.Reactions[0].Rate.A = -1
	b, _ := Mechanism("burke2012-hydrogen")
	if b.Species[0].Thermo.Low[0] == 99 || b.Reactions[0].Rate.A == -1 {
		t.Error("a change to one returned mechanism shows in the next")
	}
}

func BenchmarkMechanismGRI30(b *testing.B) {
	for b.Loop() {
		if _, err := Mechanism("smith1999-natgas"); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkMechanismCRECK(b *testing.B) {
	for b.Loop() {
		if _, err := Mechanism("ranzi2012-c1c3"); err != nil {
			b.Fatal(err)
		}
	}
}
