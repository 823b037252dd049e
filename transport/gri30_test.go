package transport_test

import (
	"os"
	"path/filepath"
	"sort"
	"strings"
	"sync"
	"testing"

	"flame1d/chem"
	"flame1d/chem/keyblock"
	"flame1d/transport"
)

// mechanismsDir returns ../shared/data/mechanisms beside the repository
// root, or skips the test when that folder is absent.
func mechanismsDir(t testing.TB) string {
	t.Helper()
	dir, err := os.Getwd()
	if err != nil {
		t.Fatal(err)
	}
	for {
		if _, err := os.Stat(filepath.Join(dir, "go.mod")); err == nil {
			break
		}
		parent := filepath.Dir(dir)
		if parent == dir {
			t.Skip("repository root (go.mod) not found; shared mechanism data unavailable")
		}
		dir = parent
	}
	shared := filepath.Join(dir, "..", "shared", "data", "mechanisms")
	if _, err := os.Stat(shared); err != nil {
		t.Skipf("shared mechanism data not found at %s: %v", shared, err)
	}
	return shared
}

var gri struct {
	once  sync.Once
	mech  *chem.Mechanism
	model *transport.Model
	err   error
}

// gri30 returns the GRI-Mech 3.0 species (thermo and transport; Smith et al.
// 1999, thermo30.dat and transport.dat as released) and a Model fitted on
// the default range. The reactions are not needed here.
func gri30(t testing.TB) (*chem.Mechanism, *transport.Model) {
	t.Helper()
	dir := filepath.Join(mechanismsDir(t), "gri30")
	gri.once.Do(func() {
		gri.mech, gri.err = readSpecies(filepath.Join(dir, "thermo.dat"), filepath.Join(dir, "transport.dat"))
		if gri.err == nil {
			gri.model, gri.err = transport.New(gri.mech, transport.Options{})
		}
	})
	if gri.err != nil {
		t.Fatal(gri.err)
	}
	return gri.mech, gri.model
}

// readSpecies builds a reaction-free mechanism from a thermo file and a
// transport file.
func readSpecies(thermoPath, transportPath string) (*chem.Mechanism, error) {
	tf, err := os.Open(thermoPath)
	if err != nil {
		return nil, err
	}
	defer tf.Close()
	recs, _, err := keyblock.ReadThermo(tf, thermoPath)
	if err != nil {
		return nil, err
	}
	rf, err := os.Open(transportPath)
	if err != nil {
		return nil, err
	}
	defer rf.Close()
	tr, _, err := keyblock.ReadTransport(rf, transportPath)
	if err != nil {
		return nil, err
	}
	m := &chem.Mechanism{Name: "gri30-species"}
	elems := map[string]bool{}
	for _, r := range recs {
		sp := chem.Species{Species: r.Species, Origin: r.Origin}
		if p, ok := tr[r.Name]; ok {
			sp.Transport = &p
		}
		for e := range r.Composition {
			elems[strings.ToUpper(e)] = true
		}
		m.Species = append(m.Species, sp)
	}
	for e := range elems {
		m.Elements = append(m.Elements, e)
	}
	sort.Strings(m.Elements)
	return m, nil
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
