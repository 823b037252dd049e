package fuel

import (
	"flame1d/internal/shareddata"
	"math"
	"os"
	"sync"
	"testing"

	"flame1d/builtin"
	"flame1d/chem"
	"flame1d/chem/keyblock"
	"flame1d/thermo"
)

// sharedMechanisms is shareddata.MechanismsDir.
func sharedMechanisms(t testing.TB) string { t.Helper(); return shareddata.MechanismsDir(t) }

// readThermoFile reads every record of a classic thermo file as species.
func readThermoFile(t testing.TB, path string) []thermo.Species {
	t.Helper()
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

var (
	mechMu    sync.Mutex
	mechCache = map[string]*chem.Mechanism{}
)

// builtinMech loads a built-in mechanism (parsed once per test binary;
// callers must not modify it) and its species set.
func builtinMech(t testing.TB, name string) (*chem.Mechanism, *thermo.SpeciesSet) {
	t.Helper()
	mechMu.Lock()
	defer mechMu.Unlock()
	m := mechCache[name]
	if m == nil {
		var err error
		if m, err = builtin.Mechanism(name); err != nil {
			t.Fatal(err)
		}
		mechCache[name] = m
	}
	set, err := SpeciesSet(m)
	if err != nil {
		t.Fatal(err)
	}
	return m, set
}

func relErr(got, want float64) float64 {
	return math.Abs(got-want) / math.Max(math.Abs(want), 1e-300)
}

// poolAtoms returns the C, H, O atoms of a resolved pool per mole of fuel.
func poolAtoms(set *thermo.SpeciesSet, p *Pool) (c, h, o float64) {
	for i, name := range p.Species {
		k := set.Index(name)
		ck, hk, ok, _ := speciesAtoms(set.Species[k].Composition)
		c += ck * p.Moles[i]
		h += hk * p.Moles[i]
		o += ok * p.Moles[i]
	}
	return c, h, o
}

// checkClosure fails unless the pool holds exactly the fuel's atoms.
func checkClosure(t *testing.T, set *thermo.SpeciesSet, p *Pool) {
	t.Helper()
	c, h, o := poolAtoms(set, p)
	f := p.Formula
	if relErr(c, f.C) > 1e-12 || relErr(h, f.H) > 1e-12 || math.Abs(o-f.O) > 1e-12*(f.C+f.H+f.O) {
		t.Errorf("%s: pool holds C %.17g H %.17g O %.17g, fuel %s: closure worse than 1e-12", p.Fuel, c, h, o, f)
	}
}
