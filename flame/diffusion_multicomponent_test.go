package flame_test

import (
	"math"
	"testing"

	"flame1d/flame"
	"flame1d/fuel"
	"flame1d/thermo"
)

// Multicomponent diffusion: H2/air and CH4/air at phi = 1 (1 atm, 298 K)
// inside the measurement bands of TestHydrogenAirFlameSpeed and
// TestMethaneAirFlameSpeeds, with exact discrete conservation: element
// fluxes constant, diffusive fluxes summing to zero (the element fluxes add
// up to the mass flux m at every face), and the burned gas carrying the
// inlet enthalpy (its temperature recomputed from the inlet enthalpy and
// its own composition within 0.5 K; the rest is the small conductive and
// diffusive flux left at the outlet). The adiabatic equilibrium temperature
// is not the reference: with GRI-Mech 3.0 the burned gas has not yet
// formed its equilibrium NO, whose formation is endothermic.
func TestMulticomponentFlames(t *testing.T) {
	if testing.Short() {
		t.Skip("full flame solves")
	}
	for _, c := range []struct {
		mech, fuel string
		lo, hi     float64
	}{
		{"burke2012-hydrogen", "H2", 2.0, 2.4},
		{"smith1999-natgas", "CH4", 0.33, 0.41},
	} {
		m, s := solverFor(t, c.mech)
		in := inlet(t, m, map[string]float64{c.fuel: 1}, 1.0, 298, thermo.OneAtmosphere)
		set := flame.DefaultSettings()
		set.Diffusion = flame.Multicomponent
		sol, p := solve(t, s, in, set)
		st := sol.Stats
		t.Logf("%s/air phi=1 multicomponent: S_L = %.4f m/s, %d points, %d Newton iterations, %d Jacobians, %d time steps",
			c.fuel, p.FlameSpeed, sol.Points(), st.NewtonIterations, st.JacobianEvaluations, st.TimeSteps)
		if p.FlameSpeed < c.lo || p.FlameSpeed > c.hi {
			t.Errorf("%s/air: S_L = %.3f m/s, want %.2f-%.2f m/s", c.fuel, p.FlameSpeed, c.lo, c.hi)
		}
		checkConservation(t, s, sol, set)
		species, err := fuel.SpeciesSet(m)
		if err != nil {
			t.Fatal(err)
		}
		n := sol.Points() - 1
		Th, err := species.TemperatureFromEnthalpy(species.EnthalpyMass(in.T, in.Y), sol.Y(n), sol.T(n))
		if err != nil {
			t.Fatal(err)
		}
		t.Logf("%s/air: outlet T %.2f K, from the inlet enthalpy %.2f K, adiabatic equilibrium %.1f K", c.fuel, sol.T(n), Th, sol.AdiabaticT)
		if d := math.Abs(Th - sol.T(n)); d > 0.5 {
			t.Errorf("%s/air: outlet T %.2f K, but the inlet enthalpy at the outlet composition gives %.2f K", c.fuel, sol.T(n), Th)
		}
		_, flux, err := s.ElementFluxes(sol, set)
		if err != nil {
			t.Fatal(err)
		}
		worst := 0.0
		for _, row := range flux {
			sum := 0.0
			for _, v := range row {
				sum += v
			}
			worst = math.Max(worst, math.Abs(sum-sol.MassFlux())/sol.MassFlux())
		}
		if worst > 1e-12 {
			t.Errorf("%s/air: sum of element fluxes differs from the mass flux by %.2g relative: diffusive fluxes do not sum to zero", c.fuel, worst)
		}
	}
}
