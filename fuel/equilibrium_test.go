package fuel

import (
	"math"
	"strings"
	"testing"
)

// Stoichiometric methane-air from 298 K at 1 atm: adiabatic flame
// temperature 2226 K with dissociation (Turns, An Introduction to
// Combustion, 2nd ed. 2000, Table 2.1; from memory). 10 K covers the
// thermo differences between his tables and GRI-Mech 3.0's.
func TestPremixedEquilibriumMethaneAir(t *testing.T) {
	m, set := builtinMech(t, "smith1999-natgas")
	rep, err := PremixedEquilibrium(m, EquilibriumRequest{Fuel: map[string]float64{"CH4": 1}, Oxidizer: air,
		EquivalenceRatio: 1, Temperature: 298.15, Pressure: 101325})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("T_ad = %.1f K", rep.Temperature)
	if rep.Mode != Adiabatic || math.Abs(rep.Temperature-2226) > 10 {
		t.Errorf("mode %s, T_ad = %.1f K, want 2226 K within 10 K", rep.Mode, rep.Temperature)
	}
	// Mass is conserved, so the densities' ratio is the inverse ratio of
	// the specific volumes: rho_u/rho_b = (T_b M_u)/(T_u M_b) by the ideal
	// gas law, exact.
	Mu := 0.0
	for n, x := range rep.Reactants {
		Mu += x * set.MolarMass[set.Index(n)]
	}
	want := rep.Temperature * Mu / (rep.InitialT * rep.MeanMolarMass)
	if got := rep.UnburnedDensity / rep.BurnedDensity; math.Abs(got/want-1) > 1e-12 {
		t.Errorf("density ratio %.15g, ideal gas %.15g", got, want)
	}
	sum := 0.0
	for _, x := range rep.MoleFractions {
		sum += x
	}
	if math.Abs(sum-1) > 1e-12 || rep.ElementResidual > 1e-10 {
		t.Errorf("mole fractions sum to %.15g; element residual %g", sum, rep.ElementResidual)
	}
	// CH4 LHV 50.0 MJ/kg (NIST-JANAF formation enthalpies; Turns 2000,
	// Table B.1: 50,016 kJ/kg, from memory).
	if rep.FuelLHV == nil || math.Abs(*rep.FuelLHV/50.016e6-1) > 0.003 {
		t.Errorf("fuel LHV %v, want 50.0 MJ/kg", rep.FuelLHV)
	}
}

func TestPremixedEquilibriumModes(t *testing.T) {
	m, _ := builtinMech(t, "smith1999-natgas")
	h2 := EquilibriumRequest{Fuel: map[string]float64{"H2": 1}, Oxidizer: map[string]float64{"O2": 1},
		EquivalenceRatio: 1, Temperature: 3000, Pressure: 101325, Mode: Isothermal}
	rep, err := PremixedEquilibrium(m, h2)
	if err != nil {
		t.Fatal(err)
	}
	// Fixed T and P: the state is at exactly the given temperature; H2/O2
	// at 3000 K is strongly dissociated (OH, H, O each above 1 %; Gordon &
	// McBride 1994 style tables, common practice, no source).
	if rep.Temperature != 3000 || rep.Mode != Isothermal {
		t.Errorf("isothermal: T %v, mode %s", rep.Temperature, rep.Mode)
	}
	for _, n := range []string{"OH", "H", "O"} {
		if rep.MoleFractions[n] < 0.01 {
			t.Errorf("X_%s = %g at 3000 K, want above 1 %%", n, rep.MoleFractions[n])
		}
	}
	// Held at zero: no NO in the products, and the flame is hotter without
	// the endothermic NO (Δh_f = +90 kJ/mol, JANAF).
	ch4 := EquilibriumRequest{Fuel: map[string]float64{"CH4": 1}, Oxidizer: air, EquivalenceRatio: 1, Temperature: 298.15, Pressure: 101325}
	with, err := PremixedEquilibrium(m, ch4)
	if err != nil {
		t.Fatal(err)
	}
	ch4.Exclude = []string{"NO", "NO2", "N2O"}
	without, err := PremixedEquilibrium(m, ch4)
	if err != nil {
		t.Fatal(err)
	}
	if _, ok := without.MoleFractions["NO"]; ok || with.MoleFractions["NO"] <= 0 {
		t.Errorf("NO: %v excluded, %v not", without.MoleFractions["NO"], with.MoleFractions["NO"])
	}
	if !(without.Temperature > with.Temperature) || len(without.Excluded) != 3 {
		t.Errorf("T without NOx %v, with %v; excluded %v", without.Temperature, with.Temperature, without.Excluded)
	}
	for _, c := range []struct {
		edit func(r *EquilibriumRequest)
		want string
	}{
		{func(r *EquilibriumRequest) { r.Mode = "hp" }, `mode "hp"`},
		{func(r *EquilibriumRequest) { r.Temperature = 0 }, "above 0 K"},
		{func(r *EquilibriumRequest) { r.Pressure = math.NaN() }, "must be positive"},
		{func(r *EquilibriumRequest) { r.Fuel = map[string]float64{"XYZ": 1} }, "not in mechanism"},
		{func(r *EquilibriumRequest) { r.EquivalenceRatio = 0 }, "equivalence ratio"},
		{func(r *EquilibriumRequest) { r.Oxidizer = map[string]float64{"N2": 1} }, "supplies no oxygen"},
		{func(r *EquilibriumRequest) { r.Exclude = []string{"FOO"} }, `no species "FOO"`},
	} {
		r := EquilibriumRequest{Fuel: map[string]float64{"CH4": 1}, Oxidizer: air, EquivalenceRatio: 1, Temperature: 300, Pressure: 101325}
		c.edit(&r)
		if _, err := PremixedEquilibrium(m, r); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%+v: err = %v, want %q", r, err, c.want)
		}
	}
}

func TestMoleFractions(t *testing.T) {
	m, _ := builtinMech(t, "smith1999-natgas")
	X, err := MoleFractions(m, "--mole-fractions", map[string]float64{"O2": 21, "N2": 79})
	if err != nil || X[m.SpeciesIndex("O2")] != 0.21 || X[m.SpeciesIndex("N2")] != 0.79 {
		t.Errorf("air: %v", err)
	}
	if _, err := MoleFractions(m, "--mole-fractions", map[string]float64{"XX": 1}); err == nil || !strings.Contains(err.Error(), "--mole-fractions: species \"XX\"") {
		t.Errorf("unknown species: %v", err)
	}
	if _, err := MoleFractions(m, "--mole-fractions", map[string]float64{"N2": 0}); err == nil || !strings.Contains(err.Error(), "sum to zero") {
		t.Errorf("zero: %v", err)
	}
}
