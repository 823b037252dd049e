package flame_test

import (
	"math"
	"testing"

	"flame1d/flame"
	"flame1d/thermo"
)

// The same case gives the same bits: two CH4/air flames on GRI-Mech 3.0,
// each from a freshly loaded mechanism and a new solver, one with one
// residual worker and one with two, end on identical grids and identical
// unknowns, to the last bit. (Molar masses once summed element counts in
// map order, which differs from run to run.)
func TestMethaneSolutionReproducible(t *testing.T) {
	if testing.Short() {
		t.Skip("two full flame solves")
	}
	var ref *flame.Solution
	for run, workers := range []int{1, 2} {
		m, s := solverFor(t, "smith1999-natgas")
		in := inlet(t, m, map[string]float64{"CH4": 1}, 1.0, 298, thermo.OneAtmosphere)
		set := flame.DefaultSettings()
		set.Workers = workers
		sol, err := s.Solve(in, set)
		if err != nil {
			t.Fatal(err)
		}
		if run == 0 {
			ref = sol
			continue
		}
		if !sameBits(sol.X, ref.X) || !sameBits(sol.U, ref.U) {
			t.Fatalf("run with %d workers differs from the first run: %d vs %d points, m = %.17g vs %.17g kg/(m^2 s)",
				workers, sol.Points(), ref.Points(), sol.MassFlux(), ref.MassFlux())
		}
		if sol.Stats.NewtonIterations != ref.Stats.NewtonIterations || sol.Stats.JacobianEvaluations != ref.Stats.JacobianEvaluations {
			t.Errorf("work differs: %d/%d Newton iterations, %d/%d Jacobians", sol.Stats.NewtonIterations, ref.Stats.NewtonIterations,
				sol.Stats.JacobianEvaluations, ref.Stats.JacobianEvaluations)
		}
	}
}

func sameBits(a, b []float64) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if math.Float64bits(a[i]) != math.Float64bits(b[i]) {
			return false
		}
	}
	return true
}

// The zero Settings is the documented default: a flame solved with
// flame.Settings{} is the one solved with DefaultSettings(), to the last
// bit, thermal diffusion included (the zero value once left it out and
// gave a different flame speed).
func TestZeroSettingsAreTheDefaults(t *testing.T) {
	if testing.Short() {
		t.Skip("full flame solves")
	}
	m, s := solverFor(t, "burke2012-hydrogen")
	in := inlet(t, m, map[string]float64{"H2": 1}, 1.0, 298, thermo.OneAtmosphere)
	zero, err := s.Solve(in, flame.Settings{})
	if err != nil {
		t.Fatal(err)
	}
	def, err := s.Solve(in, flame.DefaultSettings())
	if err != nil {
		t.Fatal(err)
	}
	if !sameBits(zero.U, def.U) || !sameBits(zero.X, def.X) {
		t.Errorf("Settings{}: %d points, m = %.9g; DefaultSettings(): %d points, m = %.9g kg/(m^2 s)",
			zero.Points(), zero.MassFlux(), def.Points(), def.MassFlux())
	}
	noSoret := flame.DefaultSettings()
	noSoret.NoThermalDiffusion = true
	other, err := s.Solve(in, noSoret)
	if err != nil {
		t.Fatal(err)
	}
	if other.MassFlux() == def.MassFlux() {
		t.Error("NoThermalDiffusion changed nothing: the switch does not reach the equations")
	}
}
