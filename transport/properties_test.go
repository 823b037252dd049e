package transport_test

import (
	"math"
	"testing"

	"flame1d/chem"
	"flame1d/thermo"
)

func speciesSet(t testing.TB, m *chem.Mechanism) *thermo.SpeciesSet {
	t.Helper()
	sp := make([]thermo.Species, len(m.Species))
	for i := range m.Species {
		sp[i] = m.Species[i].Species
	}
	set, err := thermo.NewSpeciesSet(sp)
	if err != nil {
		t.Fatal(err)
	}
	return set
}

// Air at 300 K, 1 atm: Prandtl number 0.707 and density 1.177 kg/m^3
// (Incropera & DeWitt, Fundamentals of Heat and Mass Transfer, Table A.4,
// from memory). The model's mu, lambda and cp are each within ~2%, so 4%
// for Pr; the density is the ideal-gas law on 21/79 O2/N2 (M = 28.85
// g/mol against the table's 28.97 for air with argon), so 0.5%.
func TestPropertiesAir(t *testing.T) {
	m, tr := natgas(t)
	set := speciesSet(t, m)
	X := make([]float64, len(m.Species))
	X[index(t, m, "O2")], X[index(t, m, "N2")] = 0.21, 0.79
	g, err := tr.Properties(set, 300, atm, X)
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("air 300 K: Pr %.4f, rho %.4f kg/m^3, cp %.1f J/(kg K)", g.Prandtl, g.Density, g.Cp)
	if math.Abs(g.Prandtl/0.707-1) > 0.04 {
		t.Errorf("Pr(air, 300 K) = %.4f, want 0.707 within 4%%", g.Prandtl)
	}
	// Air at 300 K: 26.3 mW/(m K) (Incropera & DeWitt Table A.4, from
	// memory); the mixture rule and the multicomponent model within 3%.
	for _, lam := range []float64{g.Conductivity, g.MulticomponentConductivity} {
		if math.Abs(lam/26.3e-3-1) > 0.03 {
			t.Errorf("lambda(air, 300 K) = %.4g W/(m K), want 26.3e-3 within 3%%", lam)
		}
	}
	if math.Abs(g.Density/1.177-1) > 0.005 {
		t.Errorf("rho(air, 300 K) = %.4f kg/m^3, want 1.177", g.Density)
	}
	// The groups are their definitions of the reported properties.
	k := index(t, m, "O2")
	if g.Prandtl != g.Viscosity*g.Cp/g.Conductivity || g.Lewis[k] != g.Conductivity/(g.Density*g.Cp*g.Diffusion[k]) {
		t.Errorf("Pr %g, Le_O2 %g do not follow from the properties", g.Prandtl, g.Lewis[k])
	}
	for _, bad := range []struct{ T, P float64 }{{9000, atm}, {300, -1}, {300, math.NaN()}} {
		if _, err := tr.Properties(set, bad.T, bad.P, X); err == nil {
			t.Errorf("T %g K, P %g Pa: no error", bad.T, bad.P)
		}
	}
	if _, err := tr.Properties(set, 300, atm, X[:3]); err == nil {
		t.Error("short mole fractions: no error")
	}
}
