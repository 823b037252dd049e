package transport_test

import (
	"sync"
	"testing"

	"flame1d/builtin"
	"flame1d/chem"
	"flame1d/transport"
)

var gri struct {
	once  sync.Once
	mech  *chem.Mechanism
	model *transport.Model
	err   error
}

// natgas returns the built-in GRI-Mech 3.0 (Smith et al. 1999; thermo and
// transport data as released, converted by the importer) and a Model fitted
// on the default range.
func natgas(t testing.TB) (*chem.Mechanism, *transport.Model) {
	t.Helper()
	gri.once.Do(func() {
		gri.mech, gri.err = builtin.Mechanism("smith1999-natgas")
		if gri.err == nil {
			gri.model, gri.err = transport.New(gri.mech, transport.Options{})
		}
	})
	if gri.err != nil {
		t.Fatal(gri.err)
	}
	return gri.mech, gri.model
}

// index returns the index of a species or fails the test.
func index(t testing.TB, m *chem.Mechanism, name string) int {
	t.Helper()
	k := m.SpeciesIndex(name)
	if k < 0 {
		t.Fatalf("species %s not in mechanism", name)
	}
	return k
}

// hydrogen returns the built-in Burke et al. (2012) H2/O2 mechanism (its
// species include He, Ar, N2, CO and CO2) and a Model on the default range.
func hydrogen(t testing.TB) (*chem.Mechanism, *transport.Model) {
	t.Helper()
	m, err := builtin.Mechanism("burke2012-hydrogen")
	if err != nil {
		t.Fatal(err)
	}
	tr, err := transport.New(m, transport.Options{})
	if err != nil {
		t.Fatal(err)
	}
	return m, tr
}
