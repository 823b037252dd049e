package sensitivity_test

import (
	"math"
	"math/rand/v2"
	"testing"

	"flame1d/builtin"
	"flame1d/chem"
	"flame1d/flame"
	"flame1d/fuel"
	"flame1d/sensitivity"
	"flame1d/thermo"
)

// hydrogenAir solves H2/air, phi = 1, 1 atm, 298 K on Burke et al. (2012).
func hydrogenAir(t testing.TB) (*chem.Mechanism, *flame.Solver, *flame.Solution) {
	t.Helper()
	m, err := builtin.Mechanism("burke2012-hydrogen")
	if err != nil {
		t.Fatal(err)
	}
	s, err := flame.NewSolver(m)
	if err != nil {
		t.Fatal(err)
	}
	set, err := fuel.SpeciesSet(m)
	if err != nil {
		t.Fatal(err)
	}
	ch, err := fuel.Premixed(m, set, map[string]float64{"H2": 1}, map[string]float64{"O2": 0.21, "N2": 0.79}, 1)
	if err != nil {
		t.Fatal(err)
	}
	sol, err := s.Solve(flame.Inlet{T: 298, P: thermo.OneAtmosphere, Y: ch.Y}, flame.DefaultSettings())
	if err != nil {
		t.Fatal(err)
	}
	return m, s, sol
}

// TestBandAgainstMonteCarlo: the first-order 1σ band of S_L equals the
// standard deviation of S_L over 240 samples of all rate constants drawn
// log-normal (σ(ln k) = ln(2)/2, f = 2 for every step), each flame
// re-solved from the converged one on its grid, within 15%. The sampling
// error of a standard deviation from N samples is about 1/sqrt(2N) = 4.6%
// (normal data); the rest of the allowance is for the non-linearity of S_L
// in ln k over ±2σ (a factor of 2 either way), which the first-order band
// ignores.
func TestBandAgainstMonteCarlo(t *testing.T) {
	if testing.Short() {
		t.Skip("240 flame solves (about a minute)")
	}
	m, s, sol := hydrogenAir(t)
	sens, err := s.Sensitivities(sol, flame.DefaultSettings(), flame.SensitivityRequest{})
	if err != nil {
		t.Fatal(err)
	}
	factors := sensitivity.Factors(m, nil, 2)
	sigma, err := sensitivity.Band(sens.FlameSpeed, sens.RateConstants, factors)
	if err != nil {
		t.Fatal(err)
	}
	const samples = 240
	rng := rand.New(rand.NewPCG(2012, 444))
	mult := make([]float64, len(m.Reactions))
	var sum, sumSq float64
	rhoU := sol.MassFlux() / sens.FlameSpeed
	for i := 0; i < samples; i++ {
		for r := range mult {
			mult[r] = math.Exp(rng.NormFloat64() * math.Log(factors[r]) / 2)
		}
		mm, err := m.WithRateMultipliers(mult)
		if err != nil {
			t.Fatal(err)
		}
		alt, err := s.WithReactions(mm)
		if err != nil {
			t.Fatal(err)
		}
		p, err := alt.SolveOnGrid(sol, sol.Inlet, flame.DefaultSettings())
		if err != nil {
			t.Fatalf("sample %d: %v", i, err)
		}
		v := p.MassFlux() / rhoU
		sum += v
		sumSq += v * v
	}
	mean := sum / samples
	mc := math.Sqrt((sumSq - samples*mean*mean) / (samples - 1))
	t.Logf("H2/air: %s; Monte Carlo (%d samples): mean %.4f, σ %.4f m/s (first order / MC = %.3f)",
		sensitivity.FormatBand(sens.FlameSpeed, sigma), samples, mean, mc, sigma/mc)
	if math.Abs(sigma-mc) > 0.15*mc {
		t.Errorf("first-order σ %.4f m/s, Monte-Carlo σ %.4f m/s: more than 15%% apart", sigma, mc)
	}
}
