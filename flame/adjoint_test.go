package flame_test

import (
	"math"
	"sort"
	"testing"

	"flame1d/chem"
	"flame1d/flame"
	"flame1d/thermo"
)

// bruteForceRate returns d ln S_L/d ln k_i by central differences: the rate
// constant of step i scaled by 1 ± 1% and the flame re-solved on the same
// grid (the discrete problem the adjoint differentiates).
func bruteForceRate(t *testing.T, s *flame.Solver, m *chem.Mechanism, sol *flame.Solution, set flame.Settings, i int) float64 {
	t.Helper()
	speed := func(f float64) float64 {
		mult := make([]float64, len(m.Reactions))
		for j := range mult {
			mult[j] = 1
		}
		mult[i] = f
		mm, err := m.WithRateMultipliers(mult)
		if err != nil {
			t.Fatal(err)
		}
		alt, err := s.WithReactions(mm)
		if err != nil {
			t.Fatal(err)
		}
		p, err := alt.SolveOnGrid(sol, sol.Inlet, set)
		if err != nil {
			t.Fatalf("re-solve with reaction %d scaled by %g: %v", i+1, f, err)
		}
		return p.MassFlux()
	}
	return math.Log(speed(1.01)/speed(0.99)) / math.Log(1.01/0.99)
}

// tightSettings converge Newton far below the 1e-4 relative changes of
// S_L the finite differences measure.
func tightSettings() flame.Settings {
	set := flame.DefaultSettings()
	set.RelTol = 1e-9
	return set
}

// checkAdjointAgainstBruteForce compares the ten largest rate-constant
// sensitivities with brute-force finite differences: 2% relative.
func checkAdjointAgainstBruteForce(t *testing.T, mech string, fuelX map[string]float64) *flame.Sensitivity {
	m, s := solverFor(t, mech)
	in := inlet(t, m, fuelX, 1.0, 298, thermo.OneAtmosphere)
	set := tightSettings()
	sol, err := s.Solve(in, set)
	if err != nil {
		t.Fatal(err)
	}
	sens, err := s.Sensitivities(sol, set, flame.SensitivityRequest{})
	if err != nil {
		t.Fatal(err)
	}
	idx := make([]int, len(sens.RateConstants))
	for i := range idx {
		idx[i] = i
	}
	sort.Slice(idx, func(a, b int) bool {
		return math.Abs(sens.RateConstants[idx[a]]) > math.Abs(sens.RateConstants[idx[b]])
	})
	t.Logf("%s: S_L = %.4f m/s, %d points; sensitivities by %d residual evaluations in %v (solve: %d residual evaluations, %d Jacobians, %v)",
		mech, sens.FlameSpeed, sol.Points(), sens.ResidualEvaluations, sens.Time,
		sol.Stats.ResidualEvaluations, sol.Stats.JacobianEvaluations, sol.Stats.WallTime)
	for _, i := range idx[:10] {
		fd := bruteForceRate(t, s, m, sol, set, i)
		adj := sens.RateConstants[i]
		t.Logf("  %-32s adjoint %+.5f  finite differences %+.5f", m.Reactions[i].Equation, adj, fd)
		if math.Abs(adj-fd) > 0.02*math.Abs(fd) {
			t.Errorf("reaction %d (%s): adjoint %.5f, finite differences %.5f: more than 2%% apart", i+1, m.Reactions[i].Equation, adj, fd)
		}
	}
	return sens
}

// TestAdjointHydrogenAir: H2/air phi = 1, 1 atm, 298 K on Burke et al.
// (2012).
func TestAdjointHydrogenAir(t *testing.T) {
	if testing.Short() {
		t.Skip("flame solves")
	}
	checkAdjointAgainstBruteForce(t, "burke2012-hydrogen", map[string]float64{"H2": 1})
}

// TestAdjointMethaneAir: CH4/air phi = 1, 1 atm, 298 K on GRI-Mech 3.0
// (Smith et al. 1999). Besides the finite-difference check, the largest
// positive coefficient must be the chain branching H + O2 <=> O + OH, as in
// published flame-speed sensitivity analyses of stoichiometric methane/air:
// Warnatz, Maas & Dibble, "Combustion", 4th ed. (Springer 2006), ch. 10
// (from memory), and the GRI-Mech 3.0 flame-speed sensitivities (Smith et
// al. 1999, from memory), both with CH3 + H (+M) <=> CH4 (+M) the most
// negative.
func TestAdjointMethaneAir(t *testing.T) {
	if testing.Short() {
		t.Skip("flame solves on GRI-Mech 3.0")
	}
	sens := checkAdjointAgainstBruteForce(t, "smith1999-natgas", map[string]float64{"CH4": 1})
	m := mechanism(t, "smith1999-natgas")
	best, worst := 0, 0
	for i, v := range sens.RateConstants {
		if v > sens.RateConstants[best] {
			best = i
		}
		if v < sens.RateConstants[worst] {
			worst = i
		}
	}
	t.Logf("largest positive: %s %+.4f; most negative: %s %+.4f", m.Reactions[best].Equation, sens.RateConstants[best],
		m.Reactions[worst].Equation, sens.RateConstants[worst])
	if eq := m.Reactions[best].Equation; eq != "H+O2<=>O+OH" {
		t.Errorf("largest positive coefficient belongs to %s, want H+O2<=>O+OH", eq)
	}
}

// TestDiffusionSensitivities: the diffusion-scale coefficients of H2, H and
// O2 in H2/air (Burke et al. 2012, phi = 1) equal central finite
// differences (the species' diffusion coefficient scaled by 1 ± 1%, the
// flame re-solved on the same grid) within 2%.
func TestDiffusionSensitivities(t *testing.T) {
	if testing.Short() {
		t.Skip("flame solves")
	}
	m, s := solverFor(t, "burke2012-hydrogen")
	in := inlet(t, m, map[string]float64{"H2": 1}, 1.0, 298, thermo.OneAtmosphere)
	set := tightSettings()
	sol, err := s.Solve(in, set)
	if err != nil {
		t.Fatal(err)
	}
	species := []string{"H2", "H", "O2", "OH"}
	var req flame.SensitivityRequest
	for _, name := range species {
		req.DiffusionSpecies = append(req.DiffusionSpecies, m.SpeciesIndex(name))
	}
	sens, err := s.Sensitivities(sol, set, req)
	if err != nil {
		t.Fatal(err)
	}
	for i, k := range req.DiffusionSpecies {
		speed := func(f float64) float64 {
			sc := set
			sc.DiffusionScale = make([]float64, len(m.Species))
			for j := range sc.DiffusionScale {
				sc.DiffusionScale[j] = 1
			}
			sc.DiffusionScale[k] = f
			p, err := s.SolveOnGrid(sol, in, sc)
			if err != nil {
				t.Fatal(err)
			}
			return p.MassFlux()
		}
		fd := math.Log(speed(1.01)/speed(0.99)) / math.Log(1.01/0.99)
		adj := sens.Diffusion[i].Value
		t.Logf("D_%s: adjoint %+.5f, finite differences %+.5f", species[i], adj, fd)
		if sens.Diffusion[i].Name != species[i] {
			t.Errorf("coefficient %d is named %s, want %s", i, sens.Diffusion[i].Name, species[i])
		}
		if math.Abs(adj-fd) > 0.02*math.Abs(fd) {
			t.Errorf("D_%s: adjoint %.5f, finite differences %.5f: more than 2%% apart", species[i], adj, fd)
		}
	}
}
