package chem_test

import (
	"testing"

	"flame1d/chem"
	"flame1d/thermo"
)

// Benchmarks at the GRI-Mech 3.0 methane flame midpoint (1800 K, 1 atm) and
// an n-heptane reaction zone (1500 K). "SameT" repeats one temperature (the
// per-T cache hits, as in the column of a Jacobian); "NewT" changes T on
// every call, so every exponential is evaluated (the flame residual: each
// grid point has its own T). Target for NetProductionRates on GRI-Mech 3.0:
// <= 15 µs per call, 0 allocations.

func benchKinetics(b *testing.B, set string, T float64, x map[string]float64) (*chem.Kinetics, []float64) {
	m := publishedMechanism(b, set)
	k, err := chem.NewKinetics(m)
	if err != nil {
		b.Fatal(err)
	}
	return k, flameState(b, m, T, thermo.OneAtmosphere, x, 1e-8)
}

func benchNetRates(b *testing.B, set string, T float64, x map[string]float64, newT bool) {
	k, C := benchKinetics(b, set, T, x)
	wdot := make([]float64, k.NumSpecies())
	b.ReportAllocs()
	for i := 0; b.Loop(); i++ {
		t := T
		if newT && i%2 == 1 {
			t = T + 1
		}
		k.NetProductionRates(t, C, wdot)
	}
}

func benchDerivatives(b *testing.B, set string, T float64, x map[string]float64, newT bool) {
	k, C := benchKinetics(b, set, T, x)
	K := k.NumSpecies()
	wdot, dWdC, dWdT := make([]float64, K), make([]float64, K*K), make([]float64, K)
	b.ReportAllocs()
	for i := 0; b.Loop(); i++ {
		t := T
		if newT && i%2 == 1 {
			t = T + 1
		}
		k.ProductionRateDerivatives(t, C, wdot, dWdC, dWdT)
	}
}

func BenchmarkNetProductionRatesGRI30SameT(b *testing.B) {
	benchNetRates(b, "smith1999-natgas", 1800, methaneFlameMidpoint, false)
}

func BenchmarkNetProductionRatesGRI30NewT(b *testing.B) {
	benchNetRates(b, "smith1999-natgas", 1800, methaneFlameMidpoint, true)
}

// unburntMethaneAir is a stoichiometric CH4/air charge at 300 K (the cold
// end of a flame grid, where |g/RT| is largest).
var unburntMethaneAir = map[string]float64{"CH4": 0.095, "O2": 0.19, "N2": 0.715}

func BenchmarkNetProductionRatesGRI30UnburntNewT(b *testing.B) {
	benchNetRates(b, "smith1999-natgas", 300, unburntMethaneAir, true)
}

func BenchmarkProductionRateDerivativesGRI30SameT(b *testing.B) {
	benchDerivatives(b, "smith1999-natgas", 1800, methaneFlameMidpoint, false)
}

func BenchmarkProductionRateDerivativesGRI30NewT(b *testing.B) {
	benchDerivatives(b, "smith1999-natgas", 1800, methaneFlameMidpoint, true)
}

func BenchmarkNetProductionRatesHeptaneNewT(b *testing.B) {
	benchNetRates(b, "lu2009-heptane", 1500, heptaneFlameState, true)
}

func BenchmarkProductionRateDerivativesHeptaneNewT(b *testing.B) {
	benchDerivatives(b, "lu2009-heptane", 1500, heptaneFlameState, true)
}

func BenchmarkHeatReleaseRateGRI30NewT(b *testing.B) {
	k, C := benchKinetics(b, "smith1999-natgas", 1800, methaneFlameMidpoint)
	b.ReportAllocs()
	for i := 0; b.Loop(); i++ {
		_ = k.HeatReleaseRate(1800+float64(i%2), C)
	}
}
