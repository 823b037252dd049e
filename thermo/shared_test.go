package thermo_test

import (
	"flame1d/internal/shareddata"
	"os"
	"path/filepath"
	"testing"

	"flame1d/builtin"
	"flame1d/chem"
	"flame1d/chem/keyblock"
	"flame1d/thermo"
)

// mechanismsDir is shareddata.MechanismsDir.
func mechanismsDir(t testing.TB) string { t.Helper(); return shareddata.MechanismsDir(t) }

// sharedThermo reads the thermo records of one published set.
func sharedThermo(t testing.TB, set string) []thermo.Species {
	t.Helper()
	path := filepath.Join(mechanismsDir(t), set, "thermo.dat")
	f, err := os.Open(path)
	if err != nil {
		t.Skipf("%s not available: %v", path, err)
	}
	defer f.Close()
	recs, _, err := keyblock.ReadThermo(f, path)
	if err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	sp := make([]thermo.Species, len(recs))
	for i := range recs {
		sp[i] = recs[i].Species
	}
	return sp
}

// natgasSet is the species set of the shipped GRI-Mech 3.0 (package
// builtin): the checks against reference tables are about the data flame1d
// ships.
func natgasSet(t testing.TB) *thermo.SpeciesSet {
	t.Helper()
	_, s := natgasMechanism(t)
	return s
}

func moles(t testing.TB, s *thermo.SpeciesSet, pairs map[string]float64) []float64 {
	t.Helper()
	n := make([]float64, s.Len())
	for name, v := range pairs {
		k := s.Index(name)
		if k < 0 {
			t.Fatalf("no species %s", name)
		}
		n[k] = v
	}
	return n
}

// natgasMechanism returns the shipped GRI-Mech 3.0 with a species set in
// the same species order.
func natgasMechanism(t testing.TB) (*chem.Mechanism, *thermo.SpeciesSet) {
	t.Helper()
	m, err := builtin.Mechanism("smith1999-natgas")
	if err != nil {
		t.Fatalf("built-in GRI-Mech 3.0: %v", err)
	}
	sp := make([]thermo.Species, len(m.Species))
	for i := range m.Species {
		sp[i] = m.Species[i].Species
	}
	s, err := thermo.NewSpeciesSet(sp)
	if err != nil {
		t.Fatal(err)
	}
	return m, s
}
