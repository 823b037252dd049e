package flame

import (
	"strings"
	"testing"

	"flame1d/thermo"
)

// airMixture is fuel/air at equivalence ratio phi, temperature T (K) and
// pressure P (atm).
func airMixture(t *testing.T, s *Solver, fuel string, phi, T, P float64) Inlet {
	t.Helper()
	in := stoichiometricAir(t, s, fuel)
	m := s.ph.mech
	kf := m.SpeciesIndex(fuel)
	// Scale the fuel's moles by phi and renormalise.
	sum := 0.0
	for k, y := range in.Y {
		n := y / s.ph.molarMass[k]
		if k == kf {
			n *= phi
		}
		in.Y[k] = n * s.ph.molarMass[k]
		sum += in.Y[k]
	}
	for k := range in.Y {
		in.Y[k] /= sum
	}
	in.T, in.P = T, P*thermo.OneAtmosphere
	return in
}

// The chain-branching crossover of the Burke et al. (2012) mechanism in
// air: about 900-950 K at 1 atm (Glassman & Yetter, Combustion, 4th ed.
// 2008, §3.3; from memory), rising with pressure. The band 850-1000 K
// allows for the collision efficiencies of air against the reference gas.
func TestCrossoverTemperature(t *testing.T) {
	s, _ := hydrogenSolver(t)
	air := airMixture(t, s, "H2", 1e-9, 300, 1)
	prev := 0.0
	for _, P := range []float64{1, 10, 40} {
		Tx, ok := crossoverTemperature(s.ph, P*thermo.OneAtmosphere, air.Y)
		if !ok {
			t.Fatalf("%g atm: no crossover found", P)
		}
		t.Logf("%g atm: crossover %.0f K", P, Tx)
		if P == 1 && (Tx < 850 || Tx > 1000) {
			t.Errorf("1 atm: crossover %.0f K, want 850-1000 K", Tx)
		}
		if Tx <= prev {
			t.Errorf("%g atm: crossover %.0f K, not above %.0f K at the lower pressure", P, Tx, prev)
		}
		prev = Tx
	}
}

// The failure note names the crossover for very lean H2/air at 40 atm
// (adiabatic 1189 K) and stays silent for the same mixture at 1 atm, which
// burns, and for stoichiometric CH4/air.
func TestCrossoverNote(t *testing.T) {
	s, _ := hydrogenSolver(t)
	for _, c := range []struct {
		P    float64
		want bool
	}{{40, true}, {1, false}} {
		in := airMixture(t, s, "H2", 0.3, 300, c.P)
		eq, err := adiabaticEquilibrium(s.ph, in)
		if err != nil {
			t.Fatal(err)
		}
		note := crossoverNote(s.ph, in, eq)
		if got := strings.Contains(note, "chain branching"); got != c.want {
			t.Errorf("H2 phi 0.3, %g atm (T_ad %.0f K): note %q, want one: %v", c.P, eq.T, note, c.want)
		}
	}
	ch4 := builtinSolver(t, "smith1999-natgas")
	in := stoichiometricAir(t, ch4, "CH4")
	eq, err := adiabaticEquilibrium(ch4.ph, in)
	if err != nil {
		t.Fatal(err)
	}
	if note := crossoverNote(ch4.ph, in, eq); note != "" {
		t.Errorf("CH4/air: note %q, want none", note)
	}
}
