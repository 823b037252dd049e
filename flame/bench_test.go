package flame_test

import (
	"testing"

	"flame1d/flame"
	"flame1d/thermo"
)

// benchmarkFlame solves one flame per iteration from a cold start and
// reports the work split the solver measured.
func benchmarkFlame(b *testing.B, mech string, fuelX map[string]float64) {
	m := mechanism(b, mech)
	s, err := flame.NewSolver(m)
	if err != nil {
		b.Fatal(err)
	}
	in := inlet(b, m, fuelX, 1.0, 298, thermo.OneAtmosphere)
	var st flame.Stats
	var points int
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		sol, err := s.Solve(in, flame.DefaultSettings())
		if err != nil {
			b.Fatal(err)
		}
		st = sol.Stats
		points = sol.Points()
	}
	b.ReportMetric(float64(points), "points")
	b.ReportMetric(float64(st.NewtonIterations), "newton-iters")
	b.ReportMetric(float64(st.TimeSteps), "time-steps")
	b.ReportMetric(float64(st.JacobianEvaluations), "jacobians")
	b.ReportMetric(st.ResidualTime.Seconds(), "residual-s")
	b.ReportMetric(st.JacobianTime.Seconds(), "jacobian-s")
	b.ReportMetric(st.FactorTime.Seconds(), "factor-s")
}

// BenchmarkHydrogenAirFlame: H2/air, phi = 1, 1 atm, 298 K, Burke et al.
// (2012) mechanism. Target: median <= 0.5 s on a 2-core machine.
func BenchmarkHydrogenAirFlame(b *testing.B) {
	benchmarkFlame(b, "burke2012-hydrogen", map[string]float64{"H2": 1})
}

// BenchmarkMethaneAirFlame: CH4/air, phi = 1, 1 atm, 298 K, GRI-Mech 3.0,
// to a grid-converged S_L at the default criteria. Target: median <= 3 s.
func BenchmarkMethaneAirFlame(b *testing.B) {
	benchmarkFlame(b, "smith1999-natgas", map[string]float64{"CH4": 1})
}
